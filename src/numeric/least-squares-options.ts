/**
 * Settings of `solveLeastSquares`, resolved once by `resolveLeastSquaresOptions`; the solver trusts what it receives.
 * The stopping tests follow Madsen, Nielsen & Tingleff, *Methods for non-linear least squares problems*, 2nd ed.,
 * IMM DTU (2004), §3.2, with the relative cost test of MINPACK (Moré, Garbow & Hillstrom, ANL-80-74, 1980).
 */
export interface LeastSquaresOptions {
  /** Largest number of iterations (one Jacobian each; rejected trial steps do not count). @default 200 */
  readonly maxIterations: number;
  /**
   * Converged when the projected gradient satisfies ‖Jᵀr‖∞ ≤ this, in units of residual² per parameter unit.
   * @default 1e-10
   */
  readonly gradientTolerance: number;
  /** Converged when a step satisfies ‖Δx‖₂ ≤ this · (‖x‖₂ + this); relative to the parameters. @default 1e-10 */
  readonly stepTolerance: number;
  /**
   * Converged when an accepted step lowers the cost ½‖r‖² by no more than this fraction of it, and the linear model
   * predicts no more either. Dimensionless. @default 1e-14
   */
  readonly costTolerance: number;
  /**
   * Starting damping λ relative to Marquardt's scale diag(JᵀJ): the first system is (JᵀJ + λ·D)·h = −Jᵀr.
   * Small values start close to Gauss–Newton. Also the damping of the least-damped model that must confirm a step or
   * cost test met by a step damped harder (else the solve is `stalled`). Dimensionless, > 0. @default 1e-3
   */
  readonly initialDamping: number;
  /**
   * Damping beyond which the solver gives up: `singular` when the damped system still cannot be factored; when no step
   * lowers the cost, `converged` if the least-damped model confirms a step or cost test, else `stalled`.
   * Dimensionless. @default 1e16
   */
  readonly maxDamping: number;
  /**
   * The Cholesky factorisation counts as failed when a pivot drops to this fraction of its diagonal entry or below
   * (a lower bound on the reciprocal condition of the damped system; λ is then raised and the system refactored).
   * @default 1e-13
   */
  readonly pivotTolerance: number;
  /**
   * Relative step of the forward-difference Jacobian used when the problem has none: h_j = step · max(1, |x_j|),
   * taken backward when it would leave the box. √ε for forward differences (Dennis & Schnabel, *Numerical Methods
   * for Unconstrained Optimization and Nonlinear Equations*, §5.4). @default 1.4901161193847656e-8
   */
  readonly finiteDifferenceStep: number;
  /** Lower bound of each parameter (length n); iterates are projected onto the box. @default undefined (none) */
  readonly lowerBounds: Float64Array | readonly number[] | undefined;
  /** Upper bound of each parameter (length n); iterates are projected onto the box. @default undefined (none) */
  readonly upperBounds: Float64Array | readonly number[] | undefined;
}

/** Defaults of every `LeastSquaresOptions` field. */
export const DEFAULT_LEAST_SQUARES_OPTIONS: LeastSquaresOptions = Object.freeze({
  maxIterations: 200,
  gradientTolerance: 1e-10,
  stepTolerance: 1e-10,
  costTolerance: 1e-14,
  initialDamping: 1e-3,
  maxDamping: 1e16,
  pivotTolerance: 1e-13,
  finiteDifferenceStep: Math.sqrt(Number.EPSILON),
  lowerBounds: undefined,
  upperBounds: undefined,
});

/**
 * Fills every missing field of `partial` from `DEFAULT_LEAST_SQUARES_OPTIONS` and checks the values. Throws on a
 * negative or non-finite tolerance, a non-positive damping or step, or a non-integer iteration cap (programmer misuse).
 * The bound lengths are checked by the solver, which knows n.
 */
export function resolveLeastSquaresOptions(partial: Partial<LeastSquaresOptions> = {}): LeastSquaresOptions {
  const resolved: LeastSquaresOptions = { ...DEFAULT_LEAST_SQUARES_OPTIONS, ...withoutUndefined(partial) };
  const { maxIterations } = resolved;
  if (!Number.isInteger(maxIterations) || maxIterations < 0) {
    throw new Error(`resolveLeastSquaresOptions: maxIterations must be a non-negative integer, got ${maxIterations}`);
  }
  for (const key of ['gradientTolerance', 'stepTolerance', 'costTolerance', 'pivotTolerance'] as const) {
    const value = resolved[key];
    if (!(Number.isFinite(value) && value >= 0)) {
      throw new Error(`resolveLeastSquaresOptions: ${key} must be finite and ≥ 0, got ${value}`);
    }
  }
  for (const key of ['initialDamping', 'maxDamping', 'finiteDifferenceStep'] as const) {
    const value = resolved[key];
    if (!(Number.isFinite(value) && value > 0)) {
      throw new Error(`resolveLeastSquaresOptions: ${key} must be finite and > 0, got ${value}`);
    }
  }
  if (resolved.maxDamping < resolved.initialDamping) {
    throw new Error('resolveLeastSquaresOptions: maxDamping must not be below initialDamping');
  }
  return Object.freeze(resolved);
}

function withoutUndefined(partial: Partial<LeastSquaresOptions>): Partial<LeastSquaresOptions> {
  return Object.fromEntries(Object.entries(partial).filter(([, value]) => value !== undefined));
}
