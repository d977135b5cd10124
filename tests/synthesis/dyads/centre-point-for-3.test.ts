import { describe, expect, it } from 'vitest';
import {
  centrePointFor3,
  circlePointForCentre,
  dyadResidual,
  invertPoses,
  kasaCircleFit,
  placePoint,
  type RelativePose,
} from '../../../src/synthesis/dyads/index.js';
import { A_LOCAL, A0, B_LOCAL, B0, CRANK, circumcentre, couplerPoses, place, ROCKER } from './known-four-bar.js';

const three = couplerPoses([20, 75, 140]);

describe('centrePointFor3', () => {
  it('the moving pivot A of a known four-bar as circle point gives the ground pivot A0 and the crank length', () => {
    // three-position motion generation (Erdman, Sandor & Kota, Mechanism Design): A moves on the circle about A0
    const r = centrePointFor3(three, A_LOCAL);
    expect(r.status).toBe('ok');
    if (r.status !== 'ok') return;
    expect(r.centre[0]).toBeCloseTo(A0[0], 9);
    expect(r.centre[1]).toBeCloseTo(A0[1], 9);
    expect(r.radiusMm).toBeCloseTo(CRANK, 9);
  });

  it('the moving pivot B gives the ground pivot B0 and the rocker length', () => {
    const r = centrePointFor3(three, B_LOCAL);
    expect(r.status).toBe('ok');
    if (r.status !== 'ok') return;
    expect(r.centre[0]).toBeCloseTo(B0[0], 9);
    expect(r.centre[1]).toBeCloseTo(B0[1], 9);
    expect(r.radiusMm).toBeCloseTo(ROCKER, 9);
  });

  it('any circle point gives the circumcentre of its three positions (absolute-coordinate formula)', () => {
    // circumcentre = meet of perpendicular bisectors, standard analytic formula in absolute coordinates
    for (const c of [
      [30, 40],
      [-70, 5],
      [200, -150],
    ] as [number, number][]) {
      const [p1, p2, p3] = three.map((pose) => place(pose, c)) as [
        [number, number],
        [number, number],
        [number, number],
      ];
      const expected = circumcentre(p1, p2, p3);
      const r = centrePointFor3(three, c);
      expect(r.status).toBe('ok');
      if (r.status !== 'ok') return;
      expect(r.centre[0]).toBeCloseTo(expected[0], 8);
      expect(r.centre[1]).toBeCloseTo(expected[1], 8);
      expect(dyadResidual(three, r.centre, c)).toBeLessThan(1e-9);
    }
  });

  it('a point moving on a straight line reports collinear at any scale (relative test)', () => {
    // pure translation along one direction: every point of B moves on a line, no finite centre (a slider fits)
    for (const s of [1e-4, 1, 1e5]) {
      const poses: RelativePose[] = [
        { angleRad: 0.2, origin: [0, 0] },
        { angleRad: 0.2, origin: [10 * s, 5 * s] },
        { angleRad: 0.2, origin: [25 * s, 12.5 * s] },
      ];
      const r = centrePointFor3(poses, [3 * s, -7 * s]);
      expect(r.status).toBe('collinear');
      expect(r.centre).toBeNull();
      expect(r.radiusMm).toBe(Number.POSITIVE_INFINITY);
    }
  });

  it('a slider-crank slider pin at three stations reports collinear', () => {
    // slider-crank r 40, l 120, e 0 (docs/MODEL.md §5): the pin B runs on the x-axis
    const poses = [10, 40, 70].map((deg): RelativePose => {
      const t = (deg * Math.PI) / 180;
      const a: [number, number] = [40 * Math.cos(t), 40 * Math.sin(t)];
      const bx = a[0] + Math.sqrt(120 * 120 - a[1] * a[1]);
      return { angleRad: Math.atan2(-a[1], bx - a[0]), origin: a };
    });
    expect(centrePointFor3(poses, [120, 0]).status).toBe('collinear');
    expect(centrePointFor3(poses, [60, 10]).status).toBe('ok');
  });

  it('throws for a pose count other than 3', () => {
    expect(() => centrePointFor3(three.slice(0, 2), A_LOCAL)).toThrow(/expected 3 poses/);
  });
});

describe('circlePointForCentre with three positions', () => {
  it('the ground pivot A0 gives back the moving pivot A (the inversion of centrePointFor3)', () => {
    // kinematic inversion (Erdman, Sandor & Kota): seen from the coupler, A0 moves on a circle about A
    const r = circlePointForCentre(three, A0);
    expect(r.status).toBe('ok');
    if (r.status !== 'ok') return;
    expect(r.circlePointLocal[0]).toBeCloseTo(A_LOCAL[0], 9);
    expect(r.circlePointLocal[1]).toBeCloseTo(A_LOCAL[1], 9);
    expect(r.radiusMm).toBeCloseTo(CRANK, 9);
    expect(r.residualMm).toBeLessThan(1e-9);
  });
});

describe('kasaCircleFit', () => {
  it('recovers a circle from points on an arc and reports collinear points', () => {
    // Kåsa, IEEE Trans. Instrum. Meas. IM-25(1) 1976: exact for points on one circle
    const pts = [0.1, 0.5, 0.9, 1.3].map((a): [number, number] => [5 + 20 * Math.cos(a), -3 + 20 * Math.sin(a)]);
    const fit = kasaCircleFit(pts);
    expect(fit.status).toBe('ok');
    if (fit.status !== 'ok') return;
    expect(fit.centre[0]).toBeCloseTo(5, 10);
    expect(fit.centre[1]).toBeCloseTo(-3, 10);
    expect(fit.radiusMm).toBeCloseTo(20, 10);
    expect(
      kasaCircleFit([
        [0, 0],
        [1, 2],
        [2, 4],
        [3, 6],
      ]).status,
    ).toBe('collinear');
  });
});

describe('invertPoses', () => {
  it('inverting twice gives the poses back, and places points consistently', () => {
    const back = invertPoses(invertPoses(three));
    back.forEach((pose, i) => {
      expect(pose.angleRad).toBeCloseTo(three[i]!.angleRad, 12);
      expect(pose.origin[0]).toBeCloseTo(three[i]!.origin[0], 10);
      expect(pose.origin[1]).toBeCloseTo(three[i]!.origin[1], 10);
    });
    // a point of B placed in A, then placed back by the inverse pose, is where it started
    const inv = invertPoses(three);
    const q = placePoint(inv[1]!, placePoint(three[1]!, [7, -4]));
    expect(q[0]).toBeCloseTo(7, 10);
    expect(q[1]).toBeCloseTo(-4, 10);
  });
});
