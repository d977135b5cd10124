import { describe, expect, it } from 'vitest';
import {
  analyseMobility,
  bodyPose,
  buildBracedChain,
  buildFourBar,
  buildFromPins,
  buildPinnedChain,
  buildSixBar,
  buildSliderCrank,
  grublerMobility,
  initialPose,
  jointPoint,
  solvePosition,
} from '../../src/kinematics/index.js';
import { toRadians } from '../../src/numeric/index.js';

describe('mobility', () => {
  it('grublerMobility and analyseMobility give 1 for a four-bar and a slider-crank', () => {
    // Reference: Grübler–Kutzbach M = 3(n − 1) − 2·j1: 3·3 − 2·4 = 1 (docs/MODEL.md §3)
    for (const m of [buildFourBar({ a: 40, b: 120, c: 80, d: 100 }), buildSliderCrank({ r: 40, l: 120, e: 0 })]) {
      expect(grublerMobility(m)).toBe(1);
      const mob = analyseMobility(initialPose(m));
      expect(mob.numerical).toBe(1);
      expect(mob.redundantConstraints).toBe(0);
      expect(mob.drivers).toBe(1);
    }
  });

  for (const chain of ['watt', 'stephenson'] as const) {
    it(`analyseMobility(${chain} six-bar) gives Grübler 1 and numerical 1`, () => {
      // Reference: 6 bodies, 7 revolute joints: 3·5 − 2·7 = 1 (Grübler–Kutzbach)
      const m = buildSixBar(chain);
      expect(m.bodies).toHaveLength(6);
      expect(m.joints).toHaveLength(7);
      const mob = analyseMobility(initialPose(m));
      expect(mob.grubler).toBe(1);
      expect(mob.numerical).toBe(1);
      expect(mob.singularValues.at(-1)!).toBeGreaterThan(1e-3);
    });
  }

  it('buildSixBar: the Watt ternary bodies share a joint, the Stephenson ones do not', () => {
    // Reference: definition of the Watt and Stephenson chains (Erdman, Sandor & Kota, Mechanism Design)
    const ternaries = (chain: 'watt' | 'stephenson') => {
      const m = buildSixBar(chain);
      const count = (id: string) => m.joints.filter((j) => j.bodyI === id || j.bodyJ === id).length;
      const ids = m.bodies.filter((b) => count(b.id) === 3).map((b) => b.id);
      const shared = m.joints.some((j) => ids.includes(j.bodyI) && ids.includes(j.bodyJ));
      return { ids, shared };
    };
    expect(ternaries('watt')).toEqual({ ids: ['die_body', 'rocker'], shared: true });
    expect(ternaries('stephenson')).toEqual({ ids: ['die_body', 'coupler'], shared: false });
  });

  for (const n of [2, 3, 4, 5, 8, 12]) {
    it(`analyseMobility(chain of ${n} plates pinned at both ends) gives ${n - 2}`, () => {
      // Reference: docs/MODEL.md §3: a chain of N plates pinned at both ends has N − 2 degrees of freedom
      const m = buildPinnedChain(
        Array.from({ length: n }, (_, k) => 20 + 3 * k),
        [0, 0],
        [12 * n, 5],
      );
      expect(grublerMobility(m)).toBe(n - 2);
      expect(analyseMobility(initialPose(m)).numerical).toBe(n - 2);
    });
  }

  it('buildPinnedChain assembles exactly and, fully driven, solves to given pivot angles', () => {
    // Reference: self-consistency: the arc assembly closes the chain; N − 2 drivers make the system square
    const lengths = [30, 25, 35, 30, 20];
    const m = buildPinnedChain(lengths, [0, 0], [90, 10], { drive: true });
    const start = initialPose(m);
    expect(jointPoint(start, 'P5')[0]).toBeCloseTo(90, 9);
    const targets = [0, 1, 2].map((k) => {
      const i = bodyPose(start, `plate${k + 1}`).phi;
      const prev = k === 0 ? 0 : bodyPose(start, `plate${k}`).phi;
      return i - prev + 0.003; // small: the end dyad is nearly stretched in this drawing
    });
    const r = solvePosition(m, targets, { start: { ...start, actuators: targets } });
    expect(r.status).toBe('converged');
    expect(bodyPose(r.pose, 'plate1').phi).toBeCloseTo(targets[0]!, 12);
  });

  for (const plates of [3, 6, 10, 21]) {
    it(`analyseMobility(braced chain of ${plates} plates, ${2 * plates - 2} bodies) gives 1`, () => {
      // Reference: N − 2 for the chain, minus one per binary link (N − 3 links) = 1 (docs/MODEL.md §3)
      const m = buildBracedChain(plates);
      expect(m.bodies).toHaveLength(2 * plates - 2);
      expect(grublerMobility(m)).toBe(1);
      expect(analyseMobility(initialPose(m)).numerical).toBe(1);
    });
  }

  it('analyseMobility(parallelogram with a redundant parallel link) gives Grübler 0 but numerical 1', () => {
    // Reference: the classic exception to the Grübler–Kutzbach count (special geometry; docs/MODEL.md §3)
    const pins = {
      O2: [0, 0],
      O4: [100, 0],
      O6: [50, 0],
      A: [20, 34.64],
      B: [120, 34.64],
      C: [70, 34.64],
    } as const;
    const m = buildFromPins({
      pins,
      bodies: [
        { id: 'die_body', kind: 'die_body', pins: ['O2', 'O4', 'O6'] },
        { id: 'crank', kind: 'link', pins: ['O2', 'A'] },
        { id: 'coupler', kind: 'plate', pins: ['A', 'B', 'C'] },
        { id: 'rocker', kind: 'link', pins: ['O4', 'B'] },
        { id: 'extra', kind: 'link', pins: ['O6', 'C'] },
      ],
      drivers: [{ id: 'crank', joint: 'O2' }],
    });
    const start = initialPose(m, [bodyPose(initialPose(m), 'crank').phi]);
    const mob = analyseMobility(start);
    expect(mob.grubler).toBe(0);
    expect(mob.numerical).toBe(1);
    expect(mob.redundantConstraints).toBe(1);
    // More equations than unknowns: the least-squares path still drives it.
    const r = solvePosition(m, [toRadians(75)], { start });
    expect(r.status).toBe('converged');
    expect(bodyPose(r.pose, 'coupler').phi).toBeCloseTo(0, 9);
    expect(bodyPose(r.pose, 'extra').phi).toBeCloseTo(toRadians(75), 9);
  });
});
