import type { LawSample } from './law-sample.js';
import { clampProgress, type RestToRestLaw } from './rest-to-rest-law.js';

const TWO_PI = 2 * Math.PI;

/**
 * Cycloidal motion law: s = h·(u − sin(2πu)/(2π)), ds/du = h·(1 − cos 2πu), d²s/du² = 2πh·sin 2πu, for
 * u ∈ [0, 1]. Zero velocity and acceleration at both ends, so it is C² at rest-to-rest joins. Peak velocity 2h/T at
 * u = ½, peak acceleration 2πh/T² at u = ¼ and ¾ (VDI 2143 Blatt 1; Norton, *Cam Design and Manufacturing
 * Handbook*, §3 "cycloidal displacement").
 */
export const cycloidal: RestToRestLaw = Object.freeze({
  name: 'cycloidal',
  evaluate(u: number, rise: number): LawSample {
    const p = clampProgress(u);
    const angle = TWO_PI * p;
    return {
      value: rise * (p - Math.sin(angle) / TWO_PI),
      firstDerivative: rise * (1 - Math.cos(angle)),
      secondDerivative: rise * TWO_PI * Math.sin(angle),
    };
  },
  peakVelocityFactor: 2,
  peakAccelerationFactor: TWO_PI,
  continuity: 'C2',
});
