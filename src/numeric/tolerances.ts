/**
 * Tolerances are passed in, named with their unit, and scaled to the part; nothing in the core compares a float with
 * `=== 0`.
 */
export interface Tolerances {
  /** Two lengths closer than this are equal, mm. @default 1e-6 */
  readonly lengthMm: number;
  /** Two angles closer than this are equal, radians. @default 1e-9 */
  readonly angleRad: number;
  /** A solver residual below this counts as converged (units of the residual). @default 1e-10 */
  readonly residual: number;
}

/** Defaults fitted to die parts of 1 mm to 1 m. */
export const DEFAULT_TOLERANCES: Tolerances = Object.freeze({ lengthMm: 1e-6, angleRad: 1e-9, residual: 1e-10 });

/** `a` and `b` equal within a relative-or-absolute tolerance: |a − b| ≤ ε·max(1, |a|, |b|). */
export function nearlyEqual(a: number, b: number, eps: number): boolean {
  return Math.abs(a - b) <= eps * Math.max(1, Math.abs(a), Math.abs(b));
}
