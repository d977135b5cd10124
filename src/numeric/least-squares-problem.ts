/**
 * Structural nonzeros of the Jacobian in compressed-row form: row i may be nonzero only in columns
 * `columns[rowStarts[i]] … columns[rowStarts[i + 1] − 1]`, listed in strictly ascending order. Entries outside the
 * pattern are ignored, so the pattern must cover every entry that can be nonzero.
 */
export interface JacobianSparsity {
  /** Start of each row in `columns`; length m + 1, `rowStarts[0] = 0`, non-decreasing, last = `columns.length`. */
  readonly rowStarts: Int32Array | readonly number[];
  /** Column index (0 … n − 1) of each structural nonzero, row after row. */
  readonly columns: Int32Array | readonly number[];
}

/**
 * A nonlinear least-squares problem: minimise F(x) = ½‖r(x)‖² over x ∈ ℝⁿ, with r: ℝⁿ → ℝᵐ. Residuals carry the units
 * the caller gives them (mm for the chain fit); weight them before returning if they mix units.
 */
export interface LeastSquaresProblem {
  /** Number n of parameters, ≥ 1. */
  readonly parameterCount: number;
  /** Number m of residuals, ≥ 1 (m < n is allowed: the damping keeps the system solvable). */
  readonly residualCount: number;
  /** Fills `r` (length m) with the residuals at `x` (length n). Must not keep or modify `x`. */
  residuals(x: Float64Array, r: Float64Array): void;
  /**
   * Fills the Jacobian ∂r_i/∂x_j at `x` into `jacobianRowMajor[i·n + j]` (m×n). The array is zeroed before each call,
   * so only nonzeros need writing. When absent, forward differences with step `finiteDifferenceStep · max(1, |x_j|)`
   * are used (n extra residual evaluations per iteration).
   */
  jacobian?(x: Float64Array, jacobianRowMajor: Float64Array): void;
  /**
   * Optional pattern of the Jacobian's nonzeros. Without it each row is scanned for exact zeros (O(m·n) per
   * iteration, small beside the solve); with it the scan is skipped. Either way JᵀJ is formed from nonzeros only.
   */
  readonly jacobianSparsity?: JacobianSparsity;
}

/**
 * How a solve ended: `converged` (a convergence test in `reason` was met: gradient, step or cost, confirmed on the
 * least-damped model when the step was damped harder), `stalled` (no step lowers the cost, or only negligibly, yet the
 * least-damped model still predicts a fall: the residuals do not follow their Jacobian near `x`, as at a kink, with
 * noise or with a wrong Jacobian; `x` is the best point found, not a certified minimum), `max-iterations` (the cap
 * was hit first), `singular` (the damped normal equations could not be factored even at the largest damping),
 * `diverged` (the residuals or the Jacobian stopped being finite).
 */
export type LeastSquaresStatus = 'converged' | 'stalled' | 'max-iterations' | 'singular' | 'diverged';

/** Outcome of `solveLeastSquares`, reported on success and failure alike. */
export interface LeastSquaresResult {
  readonly status: LeastSquaresStatus;
  /** Which test stopped the solver, in words, with the values compared. */
  readonly reason: string;
  /** Best parameters found (the last accepted iterate; the projected start when nothing was accepted). */
  readonly x: Float64Array;
  /** ½‖r(x)‖², in residual units squared; NaN when the residuals at `x` are not finite. */
  readonly cost: number;
  /** √(‖r(x)‖² / m), in residual units. */
  readonly rmsResidual: number;
  /** max_i |r_i(x)|, in residual units. */
  readonly maxAbsResidual: number;
  /** Iterations performed: Jacobians factored and stepped from; rejected trial steps within one do not count. */
  readonly iterations: number;
  /** Residual evaluations, including those spent on finite-difference Jacobians. */
  readonly evaluations: number;
  /** Jacobian evaluations (analytic or finite-difference). */
  readonly jacobianEvaluations: number;
}
