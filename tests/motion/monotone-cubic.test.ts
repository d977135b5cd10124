import { describe, expect, it } from 'vitest';
import { monotoneCubic, monotoneCubicIntervalPeaks, sampleMonotoneCubic } from '../../src/motion/index.js';

describe('monotoneCubic', () => {
  it('monotoneCubic on Fritsch and Carlson’s RPN 14 data is non-decreasing and never leaves [0, 1]', () => {
    // Data set of Fritsch & Carlson, SIAM J. Numer. Anal. 17(2), 1980 [mem]; property: monotone data give a monotone
    // interpolant with no overshoot (their Theorem on the region α² + β² ≤ 9).
    const x = [7.99, 8.09, 8.19, 8.7, 9.2, 10, 12, 15, 20];
    const y = [0, 2.76429e-5, 4.37498e-2, 0.169183, 0.469428, 0.94374, 0.998636, 0.999919, 0.999994];
    const cubic = monotoneCubic(x, y, { kind: 'secant' }, 1e-12);
    x.forEach((xi, i) => {
      expect(sampleMonotoneCubic(cubic, xi).value).toBeCloseTo(y[i]!, 12);
    });
    let previous = -Infinity;
    for (let i = 0; i <= 12_000; i++) {
      const at = 7.99 + (i / 12_000) * (20 - 7.99);
      const s = sampleMonotoneCubic(cubic, at);
      expect(s.value).toBeGreaterThanOrEqual(previous - 1e-15);
      expect(s.value).toBeGreaterThanOrEqual(-1e-15);
      expect(s.value).toBeLessThanOrEqual(0.999994 + 1e-15);
      previous = s.value;
    }
  });

  it('a step 0, 0, 1, 1 gives zero slopes at every knot and 0.15625 at x = 1.25 (no overshoot)', () => {
    // Hand case: flat neighbours set both slopes to zero (Fritsch & Carlson step 2), so the middle interval is the
    // Hermite blend 3t² − 2t³; at t = ¼: 3/16 − 2/64 = 0.15625.
    const cubic = monotoneCubic([0, 1, 2, 3], [0, 0, 1, 1], { kind: 'secant' }, 1e-12);
    expect(cubic.slopes).toEqual([0, 0, 0, 0]);
    expect(sampleMonotoneCubic(cubic, 1.25).value).toBeCloseTo(0.15625, 14);
    expect(sampleMonotoneCubic(cubic, 0.5).value).toBeCloseTo(0, 14);
    expect(sampleMonotoneCubic(cubic, 2.5).value).toBeCloseTo(1, 14);
  });

  it('values 0, 0.1, 10 scale the steep slopes back into the circle α² + β² ≤ 9', () => {
    // Hand case (Fritsch & Carlson step 3): secants 0.1 and 9.9; three-point slope at x = 1 is (0.1 + 9.9)/2 = 5,
    // end slope 0.1. On [0, 1]: α = 1, β = 50, τ = 3/√2501, so slopes 0.1τ and 5τ; on [1, 2]: α = 5τ/9.9 ≈ 0.03, β = 1.
    const cubic = monotoneCubic([0, 1, 2], [0, 0.1, 10], { kind: 'secant' }, 1e-12);
    const tau = 3 / Math.sqrt(2501);
    expect(cubic.slopes[0]).toBeCloseTo(0.1 * tau, 14);
    expect(cubic.slopes[1]).toBeCloseTo(5 * tau, 14);
    expect(cubic.slopes[2]).toBeCloseTo(9.9, 14);
    for (let i = 0; i <= 1000; i++) {
      const v = sampleMonotoneCubic(cubic, i / 1000).value;
      expect(v).toBeGreaterThanOrEqual(-1e-15);
      expect(v).toBeLessThanOrEqual(0.1 + 1e-15);
    }
  });

  it('is C¹: value and slope agree on both sides of every knot', () => {
    // Property of the piecewise cubic Hermite form (Fritsch & Carlson 1980): C¹ at the knots.
    const cubic = monotoneCubic([0, 0.3, 0.5, 1.2, 1.4], [0, 0.2, 0.9, 1.0, 0.4], { kind: 'rest' }, 1e-12);
    for (const knot of [0.3, 0.5, 1.2]) {
      const before = sampleMonotoneCubic(cubic, knot - 1e-9);
      const after = sampleMonotoneCubic(cubic, knot + 1e-9);
      expect(after.value).toBeCloseTo(before.value, 7);
      expect(after.firstDerivative).toBeCloseTo(before.firstDerivative, 6);
    }
  });

  it('monotoneCubicIntervalPeaks matches a dense scan of the derivatives', () => {
    // Analytic peaks of the quadratic first derivative and linear second derivative against sampling.
    const cubic = monotoneCubic([0, 0.3, 0.5, 1.2], [0, 0.2, 0.9, 1.0], { kind: 'rest' }, 1e-12);
    const peaks = monotoneCubicIntervalPeaks(cubic, 1);
    let v = 0;
    let a = 0;
    for (let i = 1; i < 10_000; i++) {
      const s = sampleMonotoneCubic(cubic, 0.3 + (0.2 * i) / 10_000);
      v = Math.max(v, Math.abs(s.firstDerivative));
      a = Math.max(a, Math.abs(s.secondDerivative));
    }
    expect(peaks.peakFirstDerivative).toBeCloseTo(v, 6);
    // The scan stops 1/10 000 of the interval short of its ends, where the linear second derivative peaks.
    expect(Math.abs(peaks.peakSecondDerivative - a) / a).toBeLessThan(1e-3);
  });

  it('throws when the knots are not strictly increasing', () => {
    expect(() => monotoneCubic([0, 1, 1], [0, 1, 2], { kind: 'secant' }, 1e-12)).toThrow(/strictly increasing/);
  });
});
