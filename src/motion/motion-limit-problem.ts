/**
 * A transition whose peak actuator speed or acceleration breaks its limit, as plain data (the pipeline turns it into
 * a finding). Values and limits are rad/s and rad/s² for a rotary actuator, mm/s and mm/s² for a linear one.
 */
export interface MotionLimitProblem {
  /** Index of the transition in the trajectory. */
  readonly transition: number;
  /** Line position where the transition starts, m. */
  readonly fromM: number;
  /** Line position where it ends, m. */
  readonly toM: number;
  /** Which limit is broken. */
  readonly quantity: 'speed' | 'acceleration';
  /** Peak |speed| (rad/s or mm/s) or |acceleration| (rad/s² or mm/s²) over the transition. */
  readonly value: number;
  /** The limit it breaks, same unit as `value`. */
  readonly limit: number;
  /** Shortest transition length that meets both limits at the current line speed, m. */
  readonly shortestLengthM: number;
  /** Highest line speed that meets both limits over the current transition length, m/s (× 60 for m/min). */
  readonly highestLineSpeedMPerS: number;
}
