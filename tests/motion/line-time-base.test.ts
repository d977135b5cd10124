import { describe, expect, it } from 'vitest';
import {
  lineTimeBase,
  metresPerMinute,
  metresPerSecond,
  positionAtTime,
  stepGrid,
  timeAtPosition,
} from '../../src/motion/index.js';

describe('lineTimeBase', () => {
  it('2 m/min is 1/30 m/s, and 0.1 m of line passes in 3 s', () => {
    // Arithmetic: t = x / v, 2 m/min = 2/60 m/s [derived].
    const v = metresPerSecond(2);
    expect(v).toBeCloseTo(1 / 30, 15);
    expect(metresPerMinute(v)).toBeCloseTo(2, 14);
    const base = lineTimeBase(0.2, 0.3, v, null);
    expect(timeAtPosition(base, 0.3)).toBeCloseTo(3, 12);
    expect(positionAtTime(base, 3)).toBeCloseTo(0.3, 14);
  });

  it('a periodic base wraps positions and times into one repeat', () => {
    // Periodic schedule: x and x + repeat are the same point of the table [derived].
    const base = lineTimeBase(0, 1.2, 0.05, 1.5);
    expect(timeAtPosition(base, 0.4)).toBeCloseTo(8, 12);
    expect(timeAtPosition(base, 0.4 + 1.5)).toBeCloseTo(8, 12);
    expect(timeAtPosition(base, 0.4 - 3)).toBeCloseTo(8, 12);
    expect(positionAtTime(base, 8 + 30)).toBeCloseTo(0.4, 12);
  });

  it('throws when the repeat length does not exceed the stations’ span', () => {
    expect(() => lineTimeBase(0, 1.5, 0.05, 1.5)).toThrow(/repeat length/);
    expect(() => lineTimeBase(0, 1, 0, null)).toThrow(/line speed/);
  });
});

describe('stepGrid', () => {
  it('a 1.5 m repeat at 2 m/min and 0.05 s steps has 901 rows from 0 to 45 s and closes', () => {
    // 1.5 m / (2/60 m/s) = 45 s; 45 / 0.05 = 900 steps, 901 rows [derived].
    const grid = stepGrid(lineTimeBase(0, 1.2, metresPerSecond(2), 1.5), 0.05);
    expect(grid.durationS).toBeCloseTo(45, 12);
    expect(grid.timesS.length).toBe(901);
    expect(grid.timesS[900]).toBe(45);
    expect(grid.positionsM[900]).toBeCloseTo(1.5, 12);
    expect(grid.closes).toBe(true);
  });

  it('a duration that is not a whole number of steps ends on a shorter last step', () => {
    // 0.1 m at 2 m/min is 3 s; steps of 0.4 s: 0, 0.4, …, 2.8, then 3.0 [derived].
    const grid = stepGrid(lineTimeBase(0, 0.1, metresPerSecond(2), null), 0.4);
    expect(grid.timesS.length).toBe(9);
    expect(grid.timesS[7]).toBeCloseTo(2.8, 12);
    expect(grid.timesS[8]).toBe(3);
    expect(grid.closes).toBe(false);
  });
});
