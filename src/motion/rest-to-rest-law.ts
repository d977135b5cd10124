import type { LawSample } from './law-sample.js';

/**
 * A rest-to-rest motion law over one transition: it starts and ends with zero velocity and zero acceleration, so
 * consecutive transitions and the dwells between them join with continuous position, velocity and acceleration (C²).
 * Laws and their peak factors: VDI 2143 Blatt 1 (Bewegungsgesetze für Kurvengetriebe); Norton, *Cam Design and
 * Manufacturing Handbook*, ch. 3.
 */
export interface RestToRestLaw {
  /** The law's name as the API spells it. */
  readonly name: 'cycloidal' | 'polynomial-345';
  /**
   * Displacement s(u) and its derivatives ds/du, d²s/du² for a rise `rise` (any unit; the result has the same unit)
   * at normalised progress `u` ∈ [0, 1] (clamped to it).
   */
  readonly evaluate: (u: number, rise: number) => LawSample;
  /** Peak |ds/du| divided by |rise|: the peak velocity is this × |h| / T for a transition of duration T. */
  readonly peakVelocityFactor: number;
  /** Peak |d²s/du²| divided by |rise|: the peak acceleration is this × |h| / T². */
  readonly peakAccelerationFactor: number;
  /** Continuity at the joins with the neighbouring rests: C² (position, velocity and acceleration). */
  readonly continuity: 'C2';
}

/** Clamps a progress value into [0, 1]. */
export function clampProgress(u: number): number {
  return Math.min(1, Math.max(0, u));
}
