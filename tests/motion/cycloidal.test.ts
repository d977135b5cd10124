import { describe, expect, it } from 'vitest';
import { toRadians } from '../../src/numeric/index.js';
import { cycloidal } from '../../src/motion/index.js';

/** Largest |f(u)| over u ∈ [0, 1] on a fine grid. */
function peakOver(f: (u: number) => number, samples = 20_000): number {
  let peak = 0;
  for (let i = 0; i <= samples; i++) peak = Math.max(peak, Math.abs(f(i / samples)));
  return peak;
}

describe('cycloidal', () => {
  const h = toRadians(30);
  const T = 2;

  it('cycloidal.evaluate(u, h) follows s = h(u − sin 2πu / 2π) at u = 0.3', () => {
    // Published formula (VDI 2143 Blatt 1; Norton, Cam Design and Manufacturing Handbook).
    const u = 0.3;
    const s = cycloidal.evaluate(u, h);
    expect(s.value).toBeCloseTo(h * (u - Math.sin(2 * Math.PI * u) / (2 * Math.PI)), 14);
    expect(s.firstDerivative).toBeCloseTo(h * (1 - Math.cos(2 * Math.PI * u)), 14);
    expect(s.secondDerivative).toBeCloseTo(2 * Math.PI * h * Math.sin(2 * Math.PI * u), 14);
  });

  it('h = 30°, T = 2 s gives peak velocity 2h/T = 30°/s at u = ½', () => {
    // Peak velocity 2h/T (Norton, Cam Design and Manufacturing Handbook, cycloidal displacement; VDI 2143 Blatt 1).
    const velocity = (u: number) => cycloidal.evaluate(u, h).firstDerivative / T;
    expect(velocity(0.5)).toBeCloseTo(toRadians(30), 12);
    expect(peakOver(velocity)).toBeCloseTo(toRadians(30), 9);
    expect((cycloidal.peakVelocityFactor * h) / T).toBeCloseTo(toRadians(30), 12);
  });

  it('h = 30°, T = 2 s gives peak acceleration 2πh/T² = 47.12°/s² at u = ¼', () => {
    // Peak acceleration 2πh/T² = 2π·30/4 = 47.1239°/s² (Norton; VDI 2143 Blatt 1).
    const acceleration = (u: number) => cycloidal.evaluate(u, h).secondDerivative / (T * T);
    expect(acceleration(0.25)).toBeCloseTo(toRadians(47.1238898), 8);
    expect(peakOver(acceleration)).toBeCloseTo(toRadians(47.1238898), 8);
    expect((cycloidal.peakAccelerationFactor * h) / (T * T)).toBeCloseTo(toRadians(47.1238898), 8);
  });

  it('starts and ends at rest: s(0) = 0, s(1) = h, zero velocity and acceleration at both ends', () => {
    // Rest-to-rest boundary conditions of the cycloid (VDI 2143 Blatt 1): C² at the joins.
    for (const u of [0, 1]) {
      const s = cycloidal.evaluate(u, h);
      expect(s.value).toBeCloseTo(u * h, 14);
      expect(Math.abs(s.firstDerivative)).toBeLessThan(1e-14);
      expect(Math.abs(s.secondDerivative)).toBeLessThan(1e-14);
    }
  });

  it('derivatives agree with central differences of the position', () => {
    // Analytic check: finite differences of s(u).
    const d = 1e-5;
    for (const u of [0.1, 0.37, 0.8]) {
      const s = (x: number) => cycloidal.evaluate(x, h).value;
      const v = (x: number) => cycloidal.evaluate(x, h).firstDerivative;
      expect(cycloidal.evaluate(u, h).firstDerivative).toBeCloseTo((s(u + d) - s(u - d)) / (2 * d), 8);
      expect(cycloidal.evaluate(u, h).secondDerivative).toBeCloseTo((v(u + d) - v(u - d)) / (2 * d), 6);
    }
  });
});
