import { describe, expect, it } from 'vitest';
import { centrePointCurve4, circlePointForCentre, type RelativePose } from '../../../src/synthesis/dyads/index.js';
import { A_LOCAL, A0, B_LOCAL, B0, couplerPoses, dist, linkSpread } from './known-four-bar.js';

const four = couplerPoses([20, 75, 140, 200]);
const curve = centrePointCurve4(four, { maxGapMm: 1 });

describe('centrePointCurve4', () => {
  it('every sample is an exact dyad for all four positions (residual ≤ 1e-9 mm, measured independently)', () => {
    // centre-point curve: centres whose circle point keeps one distance at four positions (Sandor & Erdman vol. 2)
    expect(curve.status).toBe('ok');
    expect(curve.samples.length).toBeGreaterThan(200);
    for (const s of curve.samples) {
      expect(linkSpread(four, s.centre, s.circlePointLocal)).toBeLessThan(1e-9);
      expect(s.residualMm).toBeLessThan(1e-9);
    }
  });

  it('the known ground pivots A0 and B0 lie on the sampled curve, with the known moving pivots', () => {
    // self-consistent case (docs/MODEL.md §5): a four-bar's pivots are dyads for any of its coupler positions
    for (const [g, m] of [
      [A0, A_LOCAL],
      [B0, B_LOCAL],
    ] as const) {
      let nearest = curve.samples[0]!;
      for (const s of curve.samples) if (dist(s.centre, g) < dist(nearest.centre, g)) nearest = s;
      expect(dist(nearest.centre, g)).toBeLessThan(1);
      expect(dist(nearest.circlePointLocal, m)).toBeLessThan(5);
      const exact = circlePointForCentre(four, g);
      expect(exact.status).toBe('ok');
      if (exact.status !== 'ok') return;
      expect(dist(exact.circlePointLocal, m)).toBeLessThan(1e-8);
      expect(exact.residualMm).toBeLessThan(1e-9);
    }
  });

  it('the curve passes through all six poles, and points off it are not dyads', () => {
    // Burmester: the centre-point curve of four positions passes through the six poles P12 … P34
    expect(curve.poles).toHaveLength(6);
    for (const p of curve.poles) {
      expect(p.pole).not.toBeNull();
      expect(circlePointForCentre(four, p.pole!).residualMm).toBeLessThan(1e-8);
    }
    expect(circlePointForCentre(four, [A0[0] + 5, A0[1]]).residualMm).toBeGreaterThan(1e-3);
  });

  it('samples stay within extentMm and the meets outside it are counted as dropped', () => {
    const small = centrePointCurve4(four, { extentMm: 300 });
    const ref = four.reduce<[number, number]>((s, p) => [s[0] + p.origin[0] / 4, s[1] + p.origin[1] / 4], [0, 0]);
    for (const s of small.samples) expect(dist(s.centre, ref)).toBeLessThanOrEqual(300);
    expect(small.dropped).toBeGreaterThan(0);
  });

  it('pure translations have no finite pole: degenerate, no samples', () => {
    const poses: RelativePose[] = [0, 1, 2, 3].map((k) => ({ angleRad: 0.3, origin: [10 * k, k * k] }));
    const r = centrePointCurve4(poses);
    expect(r.status).toBe('degenerate');
    expect(r.samples).toHaveLength(0);
  });
});
