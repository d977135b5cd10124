import { describe, expect, it } from 'vitest';
import {
  type ActuatorTrajectoryInput,
  actuatorTrajectory,
  type MotionLawName,
  sampleTrajectory,
  sampleTrajectoryAtTime,
} from '../../src/motion/index.js';
import { DEFAULT_TOLERANCES, toRadians } from '../../src/numeric/index.js';

const LAWS: readonly MotionLawName[] = ['cycloidal', 'polynomial-345', 'monotone-cubic'];

function input(law: MotionLawName, repeatLengthM: number | null): ActuatorTrajectoryInput {
  return {
    kind: 'rotary',
    stationsM: [0, 0.3, 0.5, 0.9, 1.2],
    values: [0, 0.4, 0.1, 0.1, 0.6].map((deg) => toRadians(deg * 100)),
    law,
    lineSpeedMPerS: 2 / 60,
    repeatLengthM,
  };
}

describe('actuatorTrajectory', () => {
  it('passes through every station value for every law', () => {
    // Interpolation property of each law: s(0) = 0, s(1) = h; Fritsch–Carlson passes through its data.
    for (const law of LAWS) {
      const trajectory = actuatorTrajectory(input(law, null), DEFAULT_TOLERANCES);
      trajectory.stationsM.forEach((x, i) => {
        expect(sampleTrajectory(trajectory, x).value).toBeCloseTo(trajectory.values[i]!, 12);
      });
    }
  });

  it('keeps position and velocity continuous across every station for every law', () => {
    // C² joins of the rest-to-rest laws (VDI 2143 Blatt 1), C¹ of the monotone cubic (Fritsch & Carlson 1980).
    for (const law of LAWS) {
      const trajectory = actuatorTrajectory(input(law, 1.5), DEFAULT_TOLERANCES);
      for (const x of [0.3, 0.5, 0.9, 1.2, 1.5]) {
        const before = sampleTrajectory(trajectory, x - 1e-9);
        const after = sampleTrajectory(trajectory, x + 1e-9);
        expect(after.value).toBeCloseTo(before.value, 7);
        expect(after.velocityPerS).toBeCloseTo(before.velocityPerS, 6);
      }
    }
  });

  it('rest-to-rest laws stop at every station: zero velocity and acceleration there', () => {
    // Rest-to-rest boundary conditions (VDI 2143 Blatt 1; Norton, Cam Design and Manufacturing Handbook).
    for (const law of ['cycloidal', 'polynomial-345'] as const) {
      const trajectory = actuatorTrajectory(input(law, null), DEFAULT_TOLERANCES);
      for (const x of trajectory.stationsM) {
        const s = sampleTrajectory(trajectory, x);
        expect(Math.abs(s.velocityPerS)).toBeLessThan(1e-12);
        expect(Math.abs(s.accelerationPerS2)).toBeLessThan(1e-12);
      }
    }
  });

  it('a cycloidal move of 30° over 2 s peaks at 30°/s halfway, in time as in position', () => {
    // Peak velocity 2h/T (Norton; VDI 2143 Blatt 1): h = 30°, T = 2 s; at 1/30 m/s the move spans 2/30 m.
    const trajectory = actuatorTrajectory(
      {
        kind: 'rotary',
        stationsM: [0, 2 / 30],
        values: [0, toRadians(30)],
        law: 'cycloidal',
        lineSpeedMPerS: 1 / 30,
        repeatLengthM: null,
      },
      DEFAULT_TOLERANCES,
    );
    expect(trajectory.transitions[0]!.durationS).toBeCloseTo(2, 12);
    expect(sampleTrajectoryAtTime(trajectory, 1).velocityPerS).toBeCloseTo(toRadians(30), 12);
    expect(sampleTrajectory(trajectory, 1 / 30).velocityPerS).toBeCloseTo(toRadians(30), 12);
    expect(sampleTrajectoryAtTime(trajectory, 0.5).accelerationPerS2).toBeCloseTo(toRadians(47.1238898), 8);
  });

  it('a periodic trajectory closes on itself: equal value and velocity at x and x + repeat length', () => {
    // Periodic closure: the last station moves back to the first over the remaining 0.3 m of the 1.5 m repeat.
    for (const law of LAWS) {
      const trajectory = actuatorTrajectory(input(law, 1.5), DEFAULT_TOLERANCES);
      const closing = trajectory.transitions[trajectory.transitions.length - 1]!;
      expect(closing.toStation).toBe(0);
      expect(closing.lengthM).toBeCloseTo(0.3, 14);
      for (const x of [0, 0.17, 0.77, 1.31, 1.49]) {
        const here = sampleTrajectory(trajectory, x);
        const next = sampleTrajectory(trajectory, x + 1.5);
        expect(next.value).toBeCloseTo(here.value, 12);
        expect(next.velocityPerS).toBeCloseTo(here.velocityPerS, 12);
      }
      const end = sampleTrajectory(trajectory, 1.5 - 1e-9);
      const start = sampleTrajectory(trajectory, 1e-9);
      expect(end.value).toBeCloseTo(start.value, 7);
      expect(end.velocityPerS).toBeCloseTo(start.velocityPerS, 6);
    }
  });

  it('a non-periodic trajectory holds its end values at rest outside the stations', () => {
    // Convention of this module: before the first and after the last station the actuator holds.
    const trajectory = actuatorTrajectory(input('monotone-cubic', null), DEFAULT_TOLERANCES);
    const after = sampleTrajectory(trajectory, 2);
    expect(after.value).toBeCloseTo(toRadians(60), 12);
    expect(after.velocityPerS).toBe(0);
    expect(after.transition).toBeNull();
  });

  it('the monotone cubic does not overshoot monotone station values', () => {
    // Fritsch & Carlson 1980: monotone data give a monotone interpolant.
    const trajectory = actuatorTrajectory(
      { ...input('monotone-cubic', null), values: [0, 0.01, 0.5, 0.51, 1.2] },
      DEFAULT_TOLERANCES,
    );
    let previous = -Infinity;
    for (let i = 0; i <= 2400; i++) {
      const v = sampleTrajectory(trajectory, (1.2 * i) / 2400).value;
      expect(v).toBeGreaterThanOrEqual(previous - 1e-15);
      expect(v).toBeLessThanOrEqual(1.2 + 1e-15);
      previous = v;
    }
  });

  it('throws when stations are not strictly increasing or values do not match them', () => {
    expect(() =>
      actuatorTrajectory({ ...input('cycloidal', null), stationsM: [0, 0.3, 0.3, 0.9, 1.2] }, DEFAULT_TOLERANCES),
    ).toThrow(/strictly increasing/);
    expect(() => actuatorTrajectory({ ...input('cycloidal', null), values: [0, 1] }, DEFAULT_TOLERANCES)).toThrow(
      /one value per station/,
    );
  });
});
