import type { LeastSquaresProblem } from './least-squares-problem.js';

/** Box of a least-squares solve; either side may be absent. */
export interface ParameterBox {
  readonly lower: Float64Array | readonly number[] | undefined;
  readonly upper: Float64Array | readonly number[] | undefined;
}

/**
 * Forward-difference Jacobian ∂r_i/∂x_j ≈ (r_i(x + h_j·e_j) − r_i(x)) / h_j into the m×n row-major `jacobian`, with
 * h_j = `relativeStep` · max(1, |x_j|) (Dennis & Schnabel, *Numerical Methods for Unconstrained Optimization and
 * Nonlinear Equations*, §5.4: √ε balances truncation against rounding). The step turns backward when it would leave
 * the box, and shrinks to the room left when the box is narrower than h_j; a parameter with no room (lower = upper)
 * gets a zero column. `x` is perturbed in place and restored; `r` holds r(x); `work` (length m) is scratch.
 * Returns the number of residual evaluations spent (n, less the pinned parameters).
 */
export function forwardDifferenceJacobian(
  problem: LeastSquaresProblem,
  x: Float64Array,
  r: Float64Array,
  relativeStep: number,
  box: ParameterBox,
  jacobian: Float64Array,
  work: Float64Array,
): number {
  const n = x.length;
  const m = r.length;
  let evaluations = 0;
  for (let j = 0; j < n; j++) {
    const xj = x[j]!;
    const step = chooseStep(xj, relativeStep * Math.max(1, Math.abs(xj)), box.lower?.[j], box.upper?.[j]);
    if (step === 0) continue;
    x[j] = xj + step;
    // The step actually taken, as rounded into x, keeps the quotient consistent.
    const taken = x[j]! - xj;
    if (taken === 0) {
      // The room left is below the resolution of x_j: the parameter is pinned.
      x[j] = xj;
      continue;
    }
    problem.residuals(x, work);
    evaluations++;
    x[j] = xj;
    for (let i = 0; i < m; i++) jacobian[i * n + j] = (work[i]! - r[i]!) / taken;
  }
  return evaluations;
}

function chooseStep(xj: number, h: number, lower: number | undefined, upper: number | undefined): number {
  const roomUp = upper === undefined ? Number.POSITIVE_INFINITY : upper - xj;
  const roomDown = lower === undefined ? Number.POSITIVE_INFINITY : xj - lower;
  if (roomUp >= h) return h;
  if (roomDown >= h) return -h;
  if (roomUp >= roomDown) return Math.max(roomUp, 0);
  return -roomDown;
}
