import { describe, expect, it } from 'vitest';
import { actuatorTrajectory, camTable, setpointTable } from '../../src/motion/index.js';
import { DEFAULT_TOLERANCES } from '../../src/numeric/index.js';

/** A linear actuator rising 10 mm from 0 to 0.5 m, then back, cycloidal, at 3 m/min. */
function trajectory(repeatLengthM: number | null) {
  return actuatorTrajectory(
    {
      kind: 'linear',
      stationsM: [0, 0.5, 1],
      values: [0, 10, 0],
      law: 'cycloidal',
      lineSpeedMPerS: 3 / 60,
      repeatLengthM,
    },
    DEFAULT_TOLERANCES,
  );
}

describe('setpointTable', () => {
  it('a periodic table covers one repeat and its last row repeats the first exactly', () => {
    const table = setpointTable([trajectory(1.5)], 0.1);
    // 1.5 m at 0.05 m/s = 30 s: 300 steps of 0.1 s, 301 rows
    expect(table.timesS).toHaveLength(301);
    expect(table.positionsM.at(-1)).toBeCloseTo(1.5, 12);
    expect(table.values[0]!.at(-1)).toBe(table.values[0]![0]);
    expect(table.periodic).toBe(true);
  });

  it('a non-periodic table runs from the first to the last station', () => {
    const table = setpointTable([trajectory(null)], 0.1);
    expect(table.positionsM[0]).toBe(0);
    expect(table.positionsM.at(-1)).toBeCloseTo(1, 12);
    expect(table.values[0]!.at(-1)).toBeCloseTo(0, 12);
    expect(table.periodic).toBe(false);
  });
});

describe('camTable', () => {
  it('slope mid-rise is the cycloidal peak 2h/L (VDI 2143: peak velocity 2h/T, with T = L/v)', () => {
    const cam = camTable([trajectory(null)], 5);
    expect(cam.positionsM).toEqual([0, 0.25, 0.5, 0.75, 1]);
    // h = 10 mm over L = 0.5 m: 2·10/0.5 = 40 mm/m at the middle of the rise, −40 mm/m mid-return
    expect(cam.slopesPerM[0]![1]).toBeCloseTo(40, 9);
    expect(cam.slopesPerM[0]![3]).toBeCloseTo(-40, 9);
    for (const [i, v] of [0, 5, 10, 5, 0].entries()) expect(cam.values[0]![i]).toBeCloseTo(v, 9);
  });

  it('throws on fewer than 2 points', () => {
    expect(() => camTable([trajectory(null)], 1)).toThrow();
  });
});
