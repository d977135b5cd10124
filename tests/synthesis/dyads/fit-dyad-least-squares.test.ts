import { describe, expect, it } from 'vitest';
import {
  dyadResidual,
  fitDyadLeastSquares,
  multistartDyads,
  type RelativePose,
} from '../../../src/synthesis/dyads/index.js';
import { A_LOCAL, A0, B_LOCAL, B0, CRANK, couplerPoses, dist } from './known-four-bar.js';

const eight = couplerPoses([0, 45, 90, 135, 180, 225, 270, 315]);

/** The same poses with deterministic small errors: ±0.003 rad and ±0.05 mm. */
const perturbed: RelativePose[] = eight.map((p, i) => ({
  angleRad: p.angleRad + 0.003 * Math.sin(1.7 * i + 0.3),
  origin: [p.origin[0] + 0.05 * Math.cos(2.3 * i), p.origin[1] + 0.05 * Math.sin(3.1 * i + 1)],
}));

describe('fitDyadLeastSquares', () => {
  it('recovers the crank pivots of a known four-bar from 8 stations with ~0 residual', () => {
    // self-consistent case (docs/MODEL.md §5); Kåsa fit alternated with the circle-point solve, then LM
    const fit = fitDyadLeastSquares(eight, { circlePointLocal: [A_LOCAL[0] + 3, A_LOCAL[1] - 2] });
    expect(fit.status).toBe('converged');
    expect(dist(fit.centre, A0)).toBeLessThan(1e-8);
    expect(dist(fit.circlePointLocal, A_LOCAL)).toBeLessThan(1e-8);
    expect(fit.radiusMm).toBeCloseTo(CRANK, 8);
    expect(fit.residualMaxMm).toBeLessThan(1e-9);
    expect(dyadResidual(eight, fit.centre, fit.circlePointLocal)).toBeLessThan(1e-9);
  });

  it('on perturbed poses converges near the pivot and reports a non-zero residual', () => {
    const fit = fitDyadLeastSquares(perturbed, { circlePointLocal: A_LOCAL });
    expect(fit.status).toBe('converged');
    expect(fit.residualRmsMm).toBeGreaterThan(1e-3);
    expect(fit.residualMaxMm).toBeGreaterThanOrEqual(fit.residualRmsMm);
    expect(dist(fit.centre, A0)).toBeLessThan(2);
    // it is a least-squares optimum: the exact pivots of the unperturbed linkage fit the perturbed poses worse
    const rms = (c: readonly [number, number], m: readonly [number, number], r: number): number => {
      const e = perturbed.map((p) => {
        const x = Math.cos(p.angleRad) * m[0] - Math.sin(p.angleRad) * m[1] + p.origin[0];
        const y = Math.sin(p.angleRad) * m[0] + Math.cos(p.angleRad) * m[1] + p.origin[1];
        return Math.hypot(x - c[0], y - c[1]) - r;
      });
      return Math.sqrt(e.reduce((s, v) => s + v * v, 0) / e.length);
    };
    expect(fit.residualRmsMm).toBeLessThanOrEqual(rms(A0, A_LOCAL, CRANK) + 1e-12);
  });

  it('reports singular when the circle point runs on a line (a slider, not a pin)', () => {
    const poses: RelativePose[] = [0, 1, 2, 3, 4, 5].map((k) => ({ angleRad: 0.2, origin: [10 * k, 4 * k] }));
    const fit = fitDyadLeastSquares(poses, { circlePointLocal: [1, 2] });
    expect(fit.status).toBe('singular');
    expect(fit.reason).toMatch(/collinear/);
  });
});

describe('multistartDyads', () => {
  it('a grid of starts over the coupler finds both known pivot pairs, best first with ~0 residual', () => {
    const r = multistartDyads(eight, { circlePointMin: [-40, -60], circlePointMax: [140, 40], steps: 5 });
    expect(r.starts).toBe(25);
    expect(r.candidates.length).toBeGreaterThanOrEqual(2);
    expect(r.candidates[0]!.residualRmsMm).toBeLessThan(1e-8);
    for (let i = 1; i < r.candidates.length; i++) {
      expect(r.candidates[i]!.residualRmsMm).toBeGreaterThanOrEqual(r.candidates[i - 1]!.residualRmsMm);
    }
    for (const [g, m] of [
      [A0, A_LOCAL],
      [B0, B_LOCAL],
    ] as const) {
      const hit = r.candidates.find((c) => dist(c.centre, g) < 1e-6);
      expect(hit).toBeDefined();
      expect(dist(hit!.circlePointLocal, m)).toBeLessThan(1e-6);
    }
  });
});
