import { DEFAULT_TOLERANCES, type Tolerances } from '../numeric/index.js';

/** How a position solve ends (Nikravesh; Haug). */
export type SolveStatus = 'converged' | 'max-iterations' | 'singular' | 'diverged';

/** Settings of the Newton–Raphson position solver, resolved once by `resolveSolveOptions`. */
export interface SolveOptions {
  /**
   * `residual`: convergence threshold on the max-norm of the constraint residual, mm (angle equations count as
   * Lc·angle, Lc the mechanism's characteristic length). The other fields are not used by the solver.
   * @default DEFAULT_TOLERANCES (residual 1e-10 mm)
   */
  readonly tolerances: Tolerances;
  /** Newton iterations before giving up with `'max-iterations'`. @default 30 */
  readonly maxIterations: number;
  /** Step halvings tried when a full step increases the residual, before `'diverged'`. @default 12 */
  readonly maxHalvings: number;
  /**
   * A pivot smaller than this fraction of the largest Jacobian entry (dimensionless, scaled Jacobian) makes the
   * Jacobian singular. @default 1e-13
   */
  readonly relativePivot: number;
  /**
   * A converged configuration whose estimated 1-norm condition number (scaled driven Jacobian) exceeds this is
   * reported `'singular'`: the solution is not locally unique. @default 1e10
   */
  readonly conditionLimit: number;
}

/** Fills every missing setting with its documented default. */
export function resolveSolveOptions(partial: Partial<SolveOptions> = {}): SolveOptions {
  return {
    tolerances: partial.tolerances ?? DEFAULT_TOLERANCES,
    maxIterations: partial.maxIterations ?? 30,
    maxHalvings: partial.maxHalvings ?? 12,
    relativePivot: partial.relativePivot ?? 1e-13,
    conditionLimit: partial.conditionLimit ?? 1e10,
  };
}
