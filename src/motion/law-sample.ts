/**
 * One point of a motion law: the displacement and its first and second derivatives with respect to the law's own
 * parameter (the normalised progress u ∈ [0, 1] for a rest-to-rest law, line position in metres for the monotone
 * cubic). Units follow the values the law moves: radians for a rotary actuator, millimetres for a linear one.
 */
export interface LawSample {
  /** Displacement (rest-to-rest: from the start of the transition; monotone cubic: the value itself). */
  readonly value: number;
  /** First derivative of `value` with respect to the law's parameter. */
  readonly firstDerivative: number;
  /** Second derivative of `value` with respect to the law's parameter. */
  readonly secondDerivative: number;
}
