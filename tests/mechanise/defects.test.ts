import { describe, expect, it } from 'vitest';
import {
  buildFourBar,
  buildFromPins,
  initialPose,
  type Mechanism,
  type Pose,
  resolveTraceOptions,
  solvePosition,
} from '../../src/kinematics/index.js';
import { driveThroughStations } from '../../src/mechanise/index.js';
import { toRadians } from '../../src/numeric/index.js';
import type { P } from '../support/known-chain.js';
import { freeStations } from './known-linkage.js';

const SETTINGS = { trace: resolveTraceOptions(), arrivalToleranceMm: 1e-6, transmissionLimitDeg: [30, 150] as const };

/** A four-bar of `buildFourBar` solved at crank angle θ2 on a circuit, as a pose of the mechanism `m`. */
function fourBarAt(
  m: Mechanism,
  dims: { a: number; b: number; c: number; d: number },
  deg: number,
  circuit: 'open' | 'crossed',
) {
  const drawn = initialPose(buildFourBar(dims, { theta2: toRadians(deg), circuit }));
  const start: Pose = { mechanism: m, coordinates: drawn.coordinates, actuators: [toRadians(deg)] };
  return solvePosition(m, [toRadians(deg)], { start });
}

describe('driveThroughStations', () => {
  it('a crank whose straight path between two stations crosses its dead points is an order defect', () => {
    // non-Grashof four-bar a 40, b 70, c 60, d 100: |A − O4|² = a² + d² − 2ad·cos θ2 exceeds (b + c)² = 130² when
    // cos θ2 < −0.6625, i.e. for 131.5° < θ2 < 228.5° [derived, law of cosines]; stations at 100° and 260° on the
    // same branch: driving 100° → 260° must stop at the dead point near 131.5° (Chase & Mirth 1993)
    const dims = { a: 40, b: 70, c: 60, d: 100 };
    const m = buildFourBar(dims, { theta2: toRadians(100) });
    const first = fourBarAt(m, dims, 100, 'open');
    const second = (['open', 'crossed'] as const)
      .map((c) => fourBarAt(m, dims, 260, c))
      .find((r) => r.status === 'converged' && r.jacobianSign === first.jacobianSign)!;
    const check = driveThroughStations([first.pose, second.pose], [[0, 1]], SETTINGS);
    expect(check.ok).toBe(false);
    const order = check.defects.find((d) => d.code === 'ORDER_DEFECT')!;
    expect(order).toBeDefined();
    // stopped at (131.5 − 100)/160 of the leg
    expect(order.value!).toBeCloseTo((Math.acos(-0.6625) * (180 / Math.PI) - 100) / 160, 2);
  });

  it('stations on opposite circuits of a crank-rocker are a branch defect, and the leg is not traced', () => {
    // Grashof crank-rocker 40/120/80/100 (docs/MODEL.md §5): open and crossed assemblies at θ2 60° and 80° have
    // opposite signs of the driven-Jacobian determinant (Haug; Chase & Mirth 1993)
    const dims = { a: 40, b: 120, c: 80, d: 100 };
    const m = buildFourBar(dims, { theta2: toRadians(60) });
    const open = fourBarAt(m, dims, 60, 'open');
    const crossed = fourBarAt(m, dims, 80, 'crossed');
    expect(open.jacobianSign).toBe(-crossed.jacobianSign);
    const check = driveThroughStations([open.pose, crossed.pose], [[0, 1]], SETTINGS);
    expect(check.defects.map((d) => d.code)).toEqual(['BRANCH_DEFECT']);
    expect(check.legs[0]!.status).toBe('not-traced');
  });

  it('the same crank-rocker driven 60° → 80° on one circuit passes and reports the classic transmission angle', () => {
    // Norton, Design of Machinery: transmission angle of 40/120/80/100 is 37.03° at θ2 40° and rises toward 90°
    const dims = { a: 40, b: 120, c: 80, d: 100 };
    const m = buildFourBar(dims, { theta2: toRadians(60) });
    const check = driveThroughStations(
      [fourBarAt(m, dims, 60, 'open').pose, fourBarAt(m, dims, 80, 'open').pose],
      [[0, 1]],
      SETTINGS,
    );
    expect(check.ok).toBe(true);
    expect(check.transmission.length).toBeGreaterThan(0);
  });
});

describe('a binary link whose dyad flips between stations (constructed)', () => {
  // three free stations of the four-plate chain; a circle point on plate 2 whose circumcentre G keeps the link rigid,
  // but the triangle (pivot 1, pin, G) turns over between stations 0 and 1: the plate–link dyad must pass its dead
  // point (pins in line) on the way, a branch defect (Chase & Mirth 1993). Everything here is computed in the test.
  const stations = freeStations([
    [0.35, 0.0],
    [0.2, -0.1],
    [0.5, 0.05],
  ]);
  const place = (s: P[], local: P): P => {
    const [a, b] = [s[1]!, s[2]!];
    const phi = Math.atan2(b[1] - a[1], b[0] - a[0]);
    return [
      a[0] + Math.cos(phi) * local[0] - Math.sin(phi) * local[1],
      a[1] + Math.sin(phi) * local[0] + Math.cos(phi) * local[1],
    ];
  };
  const circumcentre = (p: P, q: P, r: P): P => {
    const d = 2 * (p[0] * (q[1] - r[1]) + q[0] * (r[1] - p[1]) + r[0] * (p[1] - q[1]));
    const s = (x: P) => x[0] * x[0] + x[1] * x[1];
    return [
      (s(p) * (q[1] - r[1]) + s(q) * (r[1] - p[1]) + s(r) * (p[1] - q[1])) / d,
      (s(p) * (r[0] - q[0]) + s(q) * (p[0] - r[0]) + s(r) * (q[0] - p[0])) / d,
    ];
  };
  const side = (s: P[], c: P, g: P) => {
    const j = s[1]!;
    return Math.sign((c[0] - j[0]) * (g[1] - c[1]) - (c[1] - j[1]) * (g[0] - c[0]));
  };
  let flip: { local: P; ground: P } | null = null;
  for (let x = -30; x <= 30 && !flip; x += 1) {
    for (let y = -30; y <= 30 && !flip; y += 1) {
      const local: P = [x, y];
      const pins = stations.map((s) => place(s, local));
      const g = circumcentre(pins[0]!, pins[1]!, pins[2]!);
      const r = Math.hypot(g[0] - pins[0]![0], g[1] - pins[0]![1]);
      if (!(r > 5 && r < 150)) continue;
      const sides = stations.map((s, i) => side(s, pins[i]!, g));
      if (sides[0] !== sides[1] && sides[1] === sides[2]) flip = { local, ground: g };
    }
  }

  it('is found, and driving chain + link through the stations reports a branch defect between stations 0 and 1', () => {
    expect(flip).not.toBeNull();
    const { local, ground } = flip!;
    const s0 = stations[0]!;
    const pins: Record<string, P> = { G: ground, C: place(s0, local) };
    s0.forEach((p, k) => {
      pins[`P${k}`] = p;
    });
    const m = buildFromPins({
      pins,
      bodies: [
        { id: 'die_body', kind: 'die_body', pins: ['P0', 'P4', 'G'] },
        { id: 'plate_1', kind: 'plate', pins: ['P0', 'P1'] },
        { id: 'plate_2', kind: 'plate', pins: ['P1', 'P2', 'C'] },
        { id: 'plate_3', kind: 'plate', pins: ['P2', 'P3'] },
        { id: 'plate_4', kind: 'plate', pins: ['P3', 'P4'] },
        { id: 'link', kind: 'link', pins: ['G', 'C'] },
      ],
      drivers: [{ id: 'actuator_1', joint: 'P0' }],
    });
    // each station drawn as buildFromPins frames it: origin at the first pin, x toward the second
    const poses: Pose[] = stations.map((s) => {
      const c = place(s, local);
      const frames = [
        [s[0]!, s[1]!],
        [s[1]!, s[2]!],
        [s[2]!, s[3]!],
        [s[3]!, s[4]!],
        [ground, c],
      ];
      const q = new Float64Array(3 * m.bodies.length);
      frames.forEach(([o, t], i) => {
        q.set([o![0], o![1], Math.atan2(t![1] - o![1], t![0] - o![0])], 3 * (i + 1));
      });
      return { mechanism: m, coordinates: q, actuators: [q[5]!] };
    });
    const check = driveThroughStations(
      poses,
      [
        [0, 1],
        [1, 2],
      ],
      SETTINGS,
    );
    expect(check.defects.find((d) => d.code === 'BRANCH_DEFECT')?.leg).toEqual([0, 1]);
  });
});
