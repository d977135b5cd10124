import { BandLu } from '../numeric/index.js';
import {
  assembleJacobian,
  type ConstraintSystem,
  driverRate,
  evaluateResidual,
  updateTrig,
} from './constraint-system.js';
import type { SolveOptions, SolveStatus } from './solve-options.js';

/**
 * Newton–Raphson on the square driven system Φ(q, actuators) = 0 with the analytic Jacobian, in preallocated flat
 * arrays reused across iterations and calls (internal to this folder). The linear solve is a band LU with partial
 * pivoting; a full step that does not lower ‖Φ‖₂ is halved (Nikravesh; Haug). Once a step has cut the
 * residual a hundredfold, the next step reuses the factors (the modified Newton–Raphson method) and
 * refactors as soon as a reused step fails to halve the residual.
 *
 * After `run`, the LU factors are those of the last Jacobian evaluated (at the solution, or one iterate before it):
 * the continuation reuses them for the predictor, the determinant sign and the condition estimate.
 */
export class NewtonWorkspace {
  readonly sys: ConstraintSystem;
  readonly options: SolveOptions;
  /** Current coordinates, 3 per body (see `Pose.coordinates`). */
  readonly q: Float64Array;
  readonly lu: BandLu;
  status: SolveStatus = 'max-iterations';
  iterations = 0;
  /** Max-norm of the scaled residual at `q`, mm. */
  residual = Number.POSITIVE_INFINITY;
  /** True when `lu` holds a successful factorisation from the last run. */
  factored = false;
  private readonly qTrial: Float64Array;
  private readonly cs: Float64Array;
  private readonly sn: Float64Array;
  private readonly r: Float64Array;
  private readonly rTrial: Float64Array;
  private readonly dx: Float64Array;
  private readonly moving: Int32Array;

  constructor(sys: ConstraintSystem, options: SolveOptions) {
    if (!sys.square) throw new Error('NewtonWorkspace needs as many drivers as degrees of freedom (square system)');
    this.sys = sys;
    this.options = options;
    const n = Math.max(1, sys.nq);
    this.q = new Float64Array(3 * sys.nBodies);
    this.qTrial = new Float64Array(3 * sys.nBodies);
    this.cs = new Float64Array(sys.nBodies);
    this.sn = new Float64Array(sys.nBodies);
    this.r = new Float64Array(n);
    this.rTrial = new Float64Array(n);
    this.dx = new Float64Array(n);
    this.lu = new BandLu(n, sys.lower, sys.upper);
    this.moving = Int32Array.from(Array.from({ length: sys.nBodies }, (_, b) => b).filter((b) => b !== sys.ground));
  }

  /**
   * Runs Newton from the current `q` for the given actuator values, at most `maxIterations` iterations (default: the
   * options'); returns and records the status. With `reuseFactors`, the first step uses the factors left by the
   * previous run (valid when `q` is that run's solution: the step is then the first-order predictor along the
   * velocity equations). Every converged run ends with factors evaluated in this run, at or next to the solution.
   */
  run(actuators: ArrayLike<number>, maxIterations = this.options.maxIterations, reuseFactors = false): SolveStatus {
    const { sys, options, q, qTrial, cs, sn, r, rTrial, dx, lu, moving } = this;
    const row = sys.rowSquare;
    let reuse = reuseFactors && this.factored;
    let fresh = false;
    this.factored = false;
    this.iterations = 0;
    if (sys.nq === 0) {
      this.residual = 0;
      this.status = 'converged';
      return this.status;
    }
    const g = 3 * sys.ground;
    q[g] = 0;
    q[g + 1] = 0;
    q[g + 2] = 0;
    let extent = sys.scale;
    for (let i = 0; i < q.length; i++) if (i % 3 !== 2 && Math.abs(q[i]!) > extent) extent = Math.abs(q[i]!);
    const tol = Math.max(options.tolerances.residual, 64 * Number.EPSILON * extent);
    updateTrig(sys, q, cs, sn);
    let res = evaluateResidual(sys, q, cs, sn, actuators, row, r);
    let norm2 = sumSquares(r);
    const inv = 1 / sys.scale;
    for (;;) {
      if (!Number.isFinite(res)) {
        this.status = 'diverged';
        break;
      }
      if (res <= tol) {
        this.status = fresh || this.factor() ? 'converged' : 'singular';
        break;
      }
      if (this.iterations >= maxIterations) {
        this.status = 'max-iterations';
        break;
      }
      if (!reuse) {
        if (!this.factor()) {
          this.status = 'singular';
          break;
        }
        fresh = true;
      }
      for (let e = 0; e < sys.nq; e++) dx[e] = -r[e]!;
      lu.solve(dx);
      let lambda = 1;
      let accepted = false;
      const halvings = reuse ? 0 : options.maxHalvings;
      let norm2Trial = norm2;
      for (let h = 0; h <= halvings; h++) {
        for (let m = 0; m < moving.length; m++) {
          const b = moving[m]!;
          const c = sys.col[b]!;
          qTrial[3 * b] = q[3 * b]! + lambda * dx[c]!;
          qTrial[3 * b + 1] = q[3 * b + 1]! + lambda * dx[c + 1]!;
          qTrial[3 * b + 2] = q[3 * b + 2]! + lambda * dx[c + 2]! * inv;
        }
        updateTrig(sys, qTrial, cs, sn);
        const resTrial = evaluateResidual(sys, qTrial, cs, sn, actuators, row, rTrial);
        norm2Trial = sumSquares(rTrial);
        // A reused (chord) Jacobian must at least halve the residual; a fresh one must lower it.
        const enough = reuse ? norm2Trial <= 0.25 * norm2 : norm2Trial < norm2;
        if (Number.isFinite(resTrial) && (enough || resTrial <= tol)) {
          q.set(qTrial);
          r.set(rTrial);
          res = resTrial;
          accepted = true;
          break;
        }
        lambda *= 0.5;
      }
      this.iterations++;
      if (!accepted) {
        updateTrig(sys, q, cs, sn);
        if (reuse) {
          reuse = false;
          continue;
        }
        this.status = 'diverged';
        break;
      }
      reuse = fresh && lambda === 1 && norm2Trial <= REUSE_CONTRACTION * REUSE_CONTRACTION * norm2;
      norm2 = norm2Trial;
    }
    this.residual = res;
    return this.status;
  }

  /**
   * Sign of the determinant of the driven Jacobian in natural layout (equations in natural order, unknowns in body
   * order) from the current factors: ±1, or 0 when singular.
   */
  jacobianSign(): -1 | 0 | 1 {
    const s = this.factored ? this.lu.determinantSign * this.sys.layoutSign : 0;
    return s > 0 ? 1 : s < 0 ? -1 : 0;
  }

  /** Assembles and factors the scaled driven Jacobian at the current `q`; false when a pivot is too small. */
  factorAtCurrent(): boolean {
    updateTrig(this.sys, this.q, this.cs, this.sn);
    return this.factor();
  }

  /** Assembles and factors the scaled Jacobian at `q` (trig arrays current); false when a pivot is too small. */
  private factor(): boolean {
    const { sys, lu } = this;
    lu.clear();
    assembleJacobian(sys, this.q, this.cs, this.sn, true, sys.rowSquare, lu.a, lu.rowStride, sys.col, lu.offset);
    this.factored = lu.factor(this.options.relativePivot) < 0;
    return this.factored;
  }

  /**
   * Coordinate rates q̇ (3 per body: mm, mm, rad per unit of the path parameter) for actuator rates `rates`, from the
   * velocity equations Φq·q̇ = −Φt with the current factors. Writes `out` (length 3·bodies).
   */
  tangent(rates: ArrayLike<number>, out: Float64Array): void {
    const { sys, dx, lu, moving } = this;
    dx.fill(0);
    const base = sys.nConstraints;
    for (let d = 0; d < sys.nDrivers; d++) dx[sys.rowSquare[base + d]!] = driverRate(sys, d) * rates[d]!;
    if (sys.nq > 0) lu.solve(dx);
    out.fill(0);
    const inv = 1 / sys.scale;
    for (let m = 0; m < moving.length; m++) {
      const b = moving[m]!;
      const c = sys.col[b]!;
      out[3 * b] = dx[c]!;
      out[3 * b + 1] = dx[c + 1]!;
      out[3 * b + 2] = dx[c + 2]! * inv;
    }
  }
}

/**
 * A step that cut the residual by at least this factor leaves the factors good enough for the next step (a chord
 * step, Newton with the Jacobian held): near the solution the Jacobian changes by O(step) and the contraction stays
 * about as strong, at a solve instead of an assembly and factorisation.
 */
const REUSE_CONTRACTION = 0.01;

function sumSquares(v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i]! * v[i]!;
  return s;
}
