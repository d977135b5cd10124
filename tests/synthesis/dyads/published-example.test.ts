import { describe, expect, it } from 'vitest';
import {
  burmesterPoints5,
  centrePointFor3,
  circlePointForCentre,
  type RelativePose,
} from '../../../src/synthesis/dyads/index.js';
import { circumcentre, dist, type P, place } from './known-four-bar.js';

/**
 * Published linkage: Norton, *Design of Machinery*, Example 4-1 [mem] (the values of docs/MODEL.md §5): crank a = |O2A|
 * = 40, coupler b = |AB| = 120, rocker c = |O4B| = 80, ground d = |O2O4| = 100 along the x-axis from O2 = (0, 0). At
 * θ2 = 40° the open circuit has θ3 = 20.2979°, θ4 = 57.3249°, the crossed circuit θ3 = −60.9780°, θ4 = −98.0050°.
 * Those recalled angles are checked first against Freudenstein's closed form (Trans. ASME 77, 1955, in the form of
 * Norton §4.5), computed here independently of src/; the synthesis checks then use the published poses.
 */
const [a, b, c, d] = [40, 120, 80, 100];
const O2: P = [0, 0];
const O4: P = [d, 0];
const RAD = Math.PI / 180;
const PUBLISHED = {
  theta2: 40,
  open: { theta3: 20.2979, theta4: 57.3249 },
  crossed: { theta3: -60.978, theta4: -98.005 },
};

/** θ3, θ4 in degrees at crank angle θ2 (degrees) by Freudenstein's equation; sign −1 open, +1 crossed. */
function freudenstein(theta2Deg: number, sign: -1 | 1): { theta3: number; theta4: number } {
  const t = theta2Deg * RAD;
  const k1 = d / a;
  const k2 = d / c;
  const k3 = (a * a - b * b + c * c + d * d) / (2 * a * c);
  const k4 = d / b;
  const k5 = (c * c - d * d - a * a - b * b) / (2 * a * b);
  const A = Math.cos(t) - k1 - k2 * Math.cos(t) + k3;
  const B = -2 * Math.sin(t);
  const C = k1 - (k2 + 1) * Math.cos(t) + k3;
  const D = Math.cos(t) - k1 + k4 * Math.cos(t) + k5;
  const E = -2 * Math.sin(t);
  const F = k1 + (k4 - 1) * Math.cos(t) + k5;
  const theta4 = 2 * Math.atan2(-B + sign * Math.sqrt(B * B - 4 * A * C), 2 * A);
  const theta3 = 2 * Math.atan2(-E + sign * Math.sqrt(E * E - 4 * D * F), 2 * D);
  const wrap = (x: number): number => ((((x / RAD + 180) % 360) + 360) % 360) - 180;
  return { theta3: wrap(theta3), theta4: wrap(theta4) };
}

/** Coupler pose: its frame at A with x along A→B, so A = (0, 0) and B = (b, 0) in the coupler frame. */
function couplerPose(theta2Deg: number, theta3Deg: number): RelativePose {
  return { angleRad: theta3Deg * RAD, origin: [a * Math.cos(theta2Deg * RAD), a * Math.sin(theta2Deg * RAD)] };
}
const A_LOCAL: P = [0, 0];
const B_LOCAL: P = [b, 0];
const openPose = (theta2Deg: number) => couplerPose(theta2Deg, freudenstein(theta2Deg, -1).theta3);
const publishedOpen = couplerPose(PUBLISHED.theta2, PUBLISHED.open.theta3);
const publishedCrossed = couplerPose(PUBLISHED.theta2, PUBLISHED.crossed.theta3);

describe('Burmester synthesis against Norton, Design of Machinery, Ex. 4-1 (published four-bar) [mem]', () => {
  it('the recalled angles at θ2 = 40° agree with Freudenstein’s closed form within 1e-4°', () => {
    for (const [sign, published] of [
      [-1, PUBLISHED.open],
      [1, PUBLISHED.crossed],
    ] as const) {
      const computed = freudenstein(PUBLISHED.theta2, sign);
      expect(Math.abs(computed.theta3 - published.theta3)).toBeLessThan(1e-4);
      expect(Math.abs(computed.theta4 - published.theta4)).toBeLessThan(1e-4);
      // and the published pose closes the loop: B of the coupler lies on the rocker circle about O4
      const pose = couplerPose(PUBLISHED.theta2, published.theta3);
      expect(Math.abs(dist(place(pose, B_LOCAL), O4) - c)).toBeLessThan(1e-3);
    }
  });

  it('three positions (published θ2 = 40°, then 80°, 120°): the centre points of A and B are the published pivots O2 and O4', () => {
    // three-position motion generation with chosen circle points (Erdman, Sandor & Kota, Mechanism Design; Norton
    // ch. 5): the centre point is the circumcentre of the circle point's three positions
    const three = [publishedOpen, openPose(80), openPose(120)];
    for (const [local, pivot, length] of [
      [A_LOCAL, O2, a],
      [B_LOCAL, O4, c],
    ] as const) {
      const r = centrePointFor3(three, local);
      expect(r.status).toBe('ok');
      if (r.status !== 'ok') return;
      // the published θ3 is rounded to 1e-4° (B moves by ≈ 2e-5 mm), which the circumcentre amplifies: ≤ 1e-3 mm
      expect(dist(r.centre, pivot)).toBeLessThan(1e-3);
      expect(Math.abs(r.radiusMm - length)).toBeLessThan(1e-3);
      // independent check: the circumcentre of the three placed circle points by the absolute-coordinate formula
      const [p1, p2, p3] = three.map((pose) => place(pose, local)) as [P, P, P];
      expect(dist(r.centre, circumcentre(p1, p2, p3))).toBeLessThan(1e-9);
    }
  });

  it('the published crossed pose is a fourth position of the same dyads: O2 and O4 lie on the centre-point curve', () => {
    // both circuits are assemblies of one linkage, so A stays on the circle about O2 and B on the circle about O4
    const four = [publishedOpen, openPose(80), openPose(120), publishedCrossed];
    for (const [pivot, local, length] of [
      [O2, A_LOCAL, a],
      [O4, B_LOCAL, c],
    ] as const) {
      const r = circlePointForCentre(four, pivot);
      expect(r.status).toBe('ok');
      if (r.status !== 'ok') return;
      expect(dist(r.circlePointLocal, local)).toBeLessThan(1e-4);
      expect(Math.abs(r.radiusMm - length)).toBeLessThan(1e-4);
      expect(r.residualMm).toBeLessThan(1e-4);
    }
  });

  it('five exact positions of the same linkage (θ2 = 40°, 80°, 120°, 160°, 220°): its two dyads are Burmester pairs', () => {
    // Burmester: the four-bar's own dyads satisfy the five-position equations, so they are among the ≤ 4 pairs
    const five = [40, 80, 120, 160, 220].map(openPose);
    const r = burmesterPoints5(five);
    expect(r.status).toBe('ok');
    for (const [pivot, local] of [
      [O2, A_LOCAL],
      [O4, B_LOCAL],
    ] as const) {
      const hit = r.pairs.find((p) => dist(p.centre, pivot) < 1e-6);
      expect(hit).toBeDefined();
      expect(dist(hit!.circlePointLocal, local)).toBeLessThan(1e-6);
    }
  });
});
