import type { LawSample } from './law-sample.js';
import { clampProgress, type RestToRestLaw } from './rest-to-rest-law.js';

/**
 * 3-4-5 polynomial motion law (5th order): s = h·(10u³ − 15u⁴ + 6u⁵), ds/du = 30h·u²(1 − u)²,
 * d²s/du² = 60h·u(1 − u)(1 − 2u), for u ∈ [0, 1]. Zero velocity and acceleration at both ends, so it is C² at
 * rest-to-rest joins. Peak velocity 1.875h/T at u = ½; peak acceleration (10/√3)·h/T² ≈ 5.7735h/T² at
 * u = (3 ∓ √3)/6 (VDI 2143 Blatt 1; Norton, *Cam Design and Manufacturing Handbook*, §3 "3-4-5 polynomial").
 */
export const polynomial345: RestToRestLaw = Object.freeze({
  name: 'polynomial-345',
  evaluate(u: number, rise: number): LawSample {
    const p = clampProgress(u);
    const q = 1 - p;
    return {
      value: rise * p * p * p * (10 - 15 * p + 6 * p * p),
      firstDerivative: 30 * rise * p * p * q * q,
      secondDerivative: 60 * rise * p * q * (1 - 2 * p),
    };
  },
  peakVelocityFactor: 1.875,
  peakAccelerationFactor: 10 / Math.sqrt(3),
  continuity: 'C2',
});
