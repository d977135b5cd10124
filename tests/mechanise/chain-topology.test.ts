import { describe, expect, it } from 'vitest';
import { grublerMobility } from '../../src/kinematics/index.js';
import { buildMechanism, chainTopology, groundPivotRegion } from '../../src/mechanise/index.js';
import type { P } from '../support/known-chain.js';
import { fourPlateFit, freeStations } from './known-linkage.js';

const STATIONS = freeStations([
  [0.35, 0.0],
  [0.2, -0.1],
]);

describe('chainTopology', () => {
  it('a chain of 4 plates pinned at both ends has 4 − 2 = 2 degrees of freedom', () => {
    // Grübler–Kutzbach M = 3(n − 1) − 2·j1 (docs/MODEL.md §3): n = 5 bodies, j1 = 5 pins
    const t = chainTopology(fourPlateFit(STATIONS));
    expect(t.degreesOfFreedom).toBe(2);
    expect(grublerMobility(buildMechanism(t, [], [], t.fittedPoses[0]!))).toBe(2);
    expect(t.joints.map((j) => j.id)).toEqual(['pivot_0', 'pivot_1', 'pivot_2', 'pivot_3', 'pivot_4']);
    expect(t.bodies.map((b) => b.layer)).toEqual([1, 2, 1, 2]);
  });

  it('a slotted end adds one degree of freedom and a telescoping pair another', () => {
    // docs/MODEL.md §3: each prismatic joint adds one
    const base = fourPlateFit(STATIONS);
    const slotted = {
      ...base,
      chain: {
        ...base.chain,
        end: { kind: 'slot' as const, origin: [46, 14] as P, direction: [1, 0] as P, travelMm: [0, 0] },
        telescoping: [{ plate: 1, stationLengthsMm: [14, 14] }],
      },
    };
    const t = chainTopology(slotted);
    expect(t.degreesOfFreedom).toBe(4);
    expect(grublerMobility(buildMechanism(t, [], [], t.fittedPoses[0]!))).toBe(4);
    expect(t.joints.map((j) => j.id)).toEqual([
      'pivot_0',
      'pivot_1',
      'telescope_2',
      'pivot_2',
      'pivot_3',
      'pivot_4',
      'slot_end',
    ]);
  });

  it('plate frames put pivot 0 of each plate at its origin, the x axis toward its next pivot', () => {
    const t = chainTopology(fourPlateFit(STATIONS));
    const [a, b] = [STATIONS[1]![1]!, STATIONS[1]![2]!];
    const pose = t.fittedPoses[1]![1]!;
    expect(pose.x).toBeCloseTo(a[0], 12);
    expect(pose.y).toBeCloseTo(a[1], 12);
    expect(pose.phi).toBeCloseTo(Math.atan2(b[1] - a[1], b[0] - a[0]), 12);
  });
});

describe('groundPivotRegion', () => {
  it('allows the die body round the opening, within the frame, a pin clearance away from opening and melt', () => {
    // the stated rule: outside the opening and every orifice by ≥ clearance, inside the opening's box grown by 80 mm
    const fit = fourPlateFit(STATIONS);
    const region = groundPivotRegion(
      fit.opening,
      fit.stations.map((s) => s.targetOrifice),
      80,
      5,
    );
    // the opening is the envelope of the stations (a 40 mm channel under the chain): die steel beside and above it
    expect(region.check([-20, 30])).toBeNull();
    expect(region.check([20, 40])).toBeNull();
    expect(region.check([20, 5])).toBe('GROUND_IN_OPENING');
    expect(region.check([-3, 5])).toBe('GROUND_IN_OPENING');
    expect(region.check([-100, 30])).toBe('GROUND_OUTSIDE_FRAME');
    expect(region.check([20, 90])).toBeNull();
    expect(region.check([20, 150])).toBe('GROUND_OUTSIDE_FRAME');
    expect(region.rule).toMatch(/outside the die opening/);
  });
});
