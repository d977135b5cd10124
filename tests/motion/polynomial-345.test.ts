import { describe, expect, it } from 'vitest';
import { polynomial345 } from '../../src/motion/index.js';
import { toRadians } from '../../src/numeric/index.js';

/** Largest |f(u)| over u ∈ [0, 1] on a fine grid. */
function peakOver(f: (u: number) => number, samples = 20_000): number {
  let peak = 0;
  for (let i = 0; i <= samples; i++) peak = Math.max(peak, Math.abs(f(i / samples)));
  return peak;
}

describe('polynomial345', () => {
  const h = toRadians(30);
  const T = 2;

  it('polynomial345.evaluate(u, h) follows s = h(10u³ − 15u⁴ + 6u⁵) at u = 0.3', () => {
    // Published formula (VDI 2143 Blatt 1; Norton, Cam Design and Manufacturing Handbook, 3-4-5 polynomial).
    const u = 0.3;
    const s = polynomial345.evaluate(u, h);
    expect(s.value).toBeCloseTo(h * (10 * u ** 3 - 15 * u ** 4 + 6 * u ** 5), 14);
    expect(s.firstDerivative).toBeCloseTo(h * (30 * u ** 2 - 60 * u ** 3 + 30 * u ** 4), 14);
    expect(s.secondDerivative).toBeCloseTo(h * (60 * u - 180 * u ** 2 + 120 * u ** 3), 14);
  });

  it('h = 30°, T = 2 s gives peak velocity 1.875h/T = 28.125°/s at u = ½', () => {
    // Peak velocity factor 1.875 (Norton, Cam Design and Manufacturing Handbook).
    const velocity = (u: number) => polynomial345.evaluate(u, h).firstDerivative / T;
    expect(velocity(0.5)).toBeCloseTo(toRadians(28.125), 12);
    expect(peakOver(velocity)).toBeCloseTo(toRadians(28.125), 9);
  });

  it('h = 30°, T = 2 s gives peak acceleration 5.7735h/T² = 43.30°/s² at u = (3 − √3)/6', () => {
    // Peak acceleration factor 5.7735 = 10/√3 (Norton, Cam Design and Manufacturing Handbook).
    const acceleration = (u: number) => polynomial345.evaluate(u, h).secondDerivative / (T * T);
    const expected = toRadians((5.7735 * 30) / 4);
    expect(acceleration((3 - Math.sqrt(3)) / 6)).toBeCloseTo(expected, 5);
    expect(peakOver(acceleration)).toBeCloseTo(expected, 5);
    expect(polynomial345.peakAccelerationFactor).toBeCloseTo(5.7735, 4);
  });

  it('starts and ends at rest: s(0) = 0, s(1) = h, zero velocity and acceleration at both ends', () => {
    // Rest-to-rest boundary conditions of the 3-4-5 polynomial (VDI 2143 Blatt 1): C² at the joins.
    for (const u of [0, 1]) {
      const s = polynomial345.evaluate(u, h);
      expect(s.value).toBeCloseTo(u * h, 14);
      expect(Math.abs(s.firstDerivative)).toBeLessThan(1e-14);
      expect(Math.abs(s.secondDerivative)).toBeLessThan(1e-14);
    }
  });
});
