import { describe, expect, it } from 'vitest';
import { actuatorTrajectory, checkMotionLimits, metresPerMinute, type MotionLawName } from '../../src/motion/index.js';
import { DEFAULT_TOLERANCES, toRadians } from '../../src/numeric/index.js';

/** A 60° rise over `lengthM` at 2 m/min, checked against 60°/s and 300°/s². */
function check(lengthM: number, law: MotionLawName = 'cycloidal') {
  const trajectory = actuatorTrajectory(
    {
      kind: 'rotary',
      stationsM: [0, lengthM],
      values: [0, toRadians(60)],
      law,
      lineSpeedMPerS: 2 / 60,
      repeatLengthM: null,
    },
    DEFAULT_TOLERANCES,
  );
  return checkMotionLimits(trajectory, { maxSpeedPerS: toRadians(60), maxAccelerationPerS2: toRadians(300) });
}

describe('checkMotionLimits', () => {
  it('60° over 0.1 m at 2 m/min (T = 3 s) peaks at 40°/s: within a 60°/s limit', () => {
    // Hand computation: T = 0.1 m / (2/60 m/s) = 3 s; cycloidal peak 2h/T = 2·60/3 = 40°/s (Norton; VDI 2143);
    // acceleration 2πh/T² = 2π·60/9 = 41.89°/s² < 300.
    const result = check(0.1);
    expect(result.problems).toEqual([]);
    expect(result.peaks[0]!.peakSpeedPerS).toBeCloseTo(toRadians(40), 12);
    expect(result.peaks[0]!.peakAccelerationPerS2).toBeCloseTo(toRadians((2 * Math.PI * 60) / 9), 12);
  });

  it('60° over 0.05 m at 2 m/min (T = 1.5 s) peaks at 80°/s: shortest length 1/15 m, highest line speed 1.5 m/min', () => {
    // Hand computation: T = 0.05 / (2/60) = 1.5 s; peak 2·60/1.5 = 80°/s > 60°/s. Speed needs T ≥ 2h/v_max =
    // 2·60/60 = 2 s; acceleration needs T ≥ √(2π·60/300) = 1.121 s, so T_min = 2 s. Shortest length =
    // 2 s × 2/60 m/s = 1/15 m = 0.0667 m; highest line speed = 0.05 m / 2 s = 0.025 m/s = 1.5 m/min.
    const result = check(0.05);
    expect(result.problems).toHaveLength(1);
    const problem = result.problems[0]!;
    expect(problem.transition).toBe(0);
    expect(problem.fromM).toBe(0);
    expect(problem.toM).toBe(0.05);
    expect(problem.quantity).toBe('speed');
    expect(problem.value).toBeCloseTo(toRadians(80), 12);
    expect(problem.limit).toBeCloseTo(toRadians(60), 15);
    expect(problem.shortestLengthM).toBeCloseTo(1 / 15, 12);
    expect(problem.highestLineSpeedMPerS).toBeCloseTo(0.025, 12);
    expect(metresPerMinute(problem.highestLineSpeedMPerS)).toBeCloseTo(1.5, 12);
  });

  it('the 3-4-5 law over 0.01 m breaks both limits; the acceleration limit sets the shortest length', () => {
    // Hand computation (Norton's factors 1.875 and 5.7735): T = 0.01 / (2/60) = 0.3 s; peak speed 1.875·60/0.3 =
    // 375°/s > 60; peak acceleration 5.7735·60/0.09 = 3849°/s² > 300. Speed needs T ≥ 1.875·60/60 = 1.875 s,
    // acceleration T ≥ √(5.7735·60/300) = 1.0746 s, so T_min = 1.875 s: shortest length 1.875·2/60 = 0.0625 m,
    // highest line speed 0.01 / 1.875 m/s = 0.32 m/min.
    const result = check(0.01, 'polynomial-345');
    expect(result.problems.map((p) => p.quantity)).toEqual(['speed', 'acceleration']);
    expect(result.problems[0]!.value).toBeCloseTo(toRadians(375), 10);
    expect(result.problems[1]!.value).toBeCloseTo(toRadians((5.7735 * 60) / 0.09), 2);
    for (const p of result.problems) {
      expect(p.shortestLengthM).toBeCloseTo(0.0625, 12);
      expect(metresPerMinute(p.highestLineSpeedMPerS)).toBeCloseTo(0.32, 12);
    }
  });

  it('a transition rebuilt at the shortest length meets both limits exactly at the speed limit', () => {
    // Consistency: at the suggested length the cycloidal peak is 2h/T_min = 60°/s, the limit itself.
    const shortest = check(0.05).problems[0]!.shortestLengthM;
    const again = check(shortest);
    expect(again.problems).toEqual([]);
    expect(again.peaks[0]!.peakSpeedPerS).toBeCloseTo(toRadians(60), 12);
  });

  it('the monotone cubic reports the highest line speed at which its peaks meet the limits', () => {
    // Hand computation: two stations at rest give the Hermite blend 3t² − 2t³, peak slope 1.5h/T. Over 0.04 m at
    // 2 m/min T = 1.2 s, peak 1.5·60/1.2 = 75°/s > 60; T_min = 1.5·60/60 = 1.5 s (acceleration needs only
    // √(6·60/300) = 1.095 s), so the highest line speed is 0.04/1.5 m/s = 1.6 m/min. Scaling (speed ∝ line speed,
    // acceleration ∝ line speed²) is then checked by rebuilding the trajectory at that speed.
    const result = check(0.04, 'monotone-cubic');
    expect(result.problems).toHaveLength(1);
    expect(result.problems[0]!.value).toBeCloseTo(toRadians(75), 12);
    const highest = result.problems[0]!.highestLineSpeedMPerS;
    expect(metresPerMinute(highest)).toBeCloseTo(1.6, 12);
    const trajectory = actuatorTrajectory(
      {
        kind: 'rotary',
        stationsM: [0, 0.04],
        values: [0, toRadians(60)],
        law: 'monotone-cubic',
        lineSpeedMPerS: highest,
        repeatLengthM: null,
      },
      DEFAULT_TOLERANCES,
    );
    const atHighest = checkMotionLimits(trajectory, {
      maxSpeedPerS: toRadians(60),
      maxAccelerationPerS2: toRadians(300),
    });
    expect(atHighest.problems).toEqual([]);
    const peak = atHighest.peaks[0]!;
    const binding = Math.max(peak.peakSpeedPerS / toRadians(60), peak.peakAccelerationPerS2 / toRadians(300));
    expect(binding).toBeCloseTo(1, 12);
  });
});
