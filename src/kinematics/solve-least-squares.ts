import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { assembleJacobian, type ConstraintSystem, evaluateResidual, updateTrig } from './constraint-system.js';
import type { SolveOptions, SolveStatus } from './solve-options.js';

/** Outcome of `solveLeastSquares` (internal). */
export interface LeastSquaresOutcome {
  readonly status: SolveStatus;
  readonly iterations: number;
  readonly residual: number;
  readonly conditionEstimate: number;
}

/**
 * Gauss–Newton with minimum-norm SVD steps (ml-matrix) for driven systems that are not square: redundant constraints
 * (more equations than unknowns, consistent at special geometry such as a parallelogram with a parallel extra link)
 * or fewer drivers than degrees of freedom (the step then stays as close to the start as the constraints allow).
 * Updates `q` in place. Slow, allocating, general: the square case goes through `NewtonWorkspace` instead.
 */
export function solveLeastSquares(
  sys: ConstraintSystem,
  options: SolveOptions,
  q: Float64Array,
  actuators: ArrayLike<number>,
): LeastSquaresOutcome {
  const nEq = sys.nEquations;
  const nq = sys.nq;
  const row = Int32Array.from({ length: nEq }, (_, e) => e);
  const cs = new Float64Array(sys.nBodies);
  const sn = new Float64Array(sys.nBodies);
  const r = new Float64Array(nEq);
  const rTrial = new Float64Array(nEq);
  const qTrial = new Float64Array(q.length);
  const tol = options.tolerances.residual;
  updateTrig(sys, q, cs, sn);
  let res = evaluateResidual(sys, q, cs, sn, actuators, row, r);
  let norm2 = sumSquares(r);
  let iterations = 0;
  let condition = Number.POSITIVE_INFINITY;
  let status: SolveStatus = 'max-iterations';
  const inv = 1 / sys.scale;
  for (;;) {
    if (!Number.isFinite(res)) {
      status = 'diverged';
      break;
    }
    const a = new Float64Array(nEq * nq);
    assembleJacobian(sys, q, cs, sn, true, row, a, nq);
    const jac = new Matrix(Array.from({ length: nEq }, (_, e) => Array.from(a.subarray(e * nq, (e + 1) * nq))));
    const svd = new SingularValueDecomposition(jac, { autoTranspose: true });
    const sigma = svd.diagonal;
    const smallest = sigma[Math.min(nEq, nq) - 1] ?? 0;
    condition = smallest > 0 ? (sigma[0] ?? 0) / smallest : Number.POSITIVE_INFINITY;
    if (res <= tol) {
      status = 'converged';
      break;
    }
    if (iterations >= options.maxIterations) break;
    const step = svd.solve(Matrix.columnVector(Array.from(r, (v) => -v)));
    let lambda = 1;
    let accepted = false;
    for (let h = 0; h <= options.maxHalvings; h++) {
      qTrial.set(q);
      for (let b = 0; b < sys.nBodies; b++) {
        const c = sys.col[b]!;
        if (c < 0) continue;
        qTrial[3 * b] = q[3 * b]! + lambda * step.get(c, 0);
        qTrial[3 * b + 1] = q[3 * b + 1]! + lambda * step.get(c + 1, 0);
        qTrial[3 * b + 2] = q[3 * b + 2]! + lambda * step.get(c + 2, 0) * inv;
      }
      updateTrig(sys, qTrial, cs, sn);
      const resTrial = evaluateResidual(sys, qTrial, cs, sn, actuators, row, rTrial);
      const norm2Trial = sumSquares(rTrial);
      if (Number.isFinite(resTrial) && (norm2Trial < norm2 || resTrial <= tol)) {
        q.set(qTrial);
        r.set(rTrial);
        res = resTrial;
        norm2 = norm2Trial;
        accepted = true;
        break;
      }
      lambda *= 0.5;
    }
    iterations++;
    if (!accepted) {
      status = 'diverged';
      break;
    }
  }
  return { status, iterations, residual: res, conditionEstimate: condition };
}

function sumSquares(v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i]! * v[i]!;
  return s;
}
