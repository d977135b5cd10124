import type { ActuatorTrajectory } from './actuator-trajectory.js';
import { restToRestLaw } from './actuator-trajectory.js';
import { positionAtTime, wrapPosition } from './line-time-base.js';
import { sampleMonotoneCubic } from './monotone-cubic.js';

/** An actuator's state at one line position; value unit rad (rotary) or mm (linear). */
export interface ActuatorSample {
  /** Line position, m (wrapped into one repeat when periodic). */
  readonly positionM: number;
  /** Time since the first station, s (within one repeat when periodic). */
  readonly timeS: number;
  /** Actuator value, rad or mm. */
  readonly value: number;
  /** Actuator velocity, rad/s or mm/s. */
  readonly velocityPerS: number;
  /** Actuator acceleration, rad/s² or mm/s². */
  readonly accelerationPerS2: number;
  /** Transition the position falls in; null before the first or after the last station of a non-periodic schedule. */
  readonly transition: number | null;
}

/**
 * The actuator at line position `positionM` (m). Rest-to-rest laws: u = (x − from)/length within the transition,
 * value = start + s(u), velocity = s′(u)/T, acceleration = s″(u)/T² (T the transition's duration, since du/dt = 1/T).
 * Monotone cubic: velocity = (dvalue/dx)·v, acceleration = (d²value/dx²)·v² at line speed v. Outside the stations of a
 * non-periodic schedule the actuator holds its end value at rest; a periodic schedule wraps x into one repeat.
 */
export function sampleTrajectory(trajectory: ActuatorTrajectory, positionM: number): ActuatorSample {
  const base = trajectory.timeBase;
  const x = wrapPosition(base, positionM);
  const timeS = (x - base.originM) / base.lineSpeedMPerS;
  const { transitions } = trajectory;
  const lastTransition = transitions[transitions.length - 1]!;
  if (!base.periodic && (x <= base.originM || x >= lastTransition.toM)) {
    const before = x <= base.originM;
    const value = before ? trajectory.values[0]! : trajectory.values[trajectory.values.length - 1]!;
    return { positionM: x, timeS, value, velocityPerS: 0, accelerationPerS2: 0, transition: null };
  }
  const index = transitionAt(trajectory, x);
  const speed = base.lineSpeedMPerS;
  if (trajectory.cubic !== null) {
    const s = sampleMonotoneCubic(trajectory.cubic, x);
    return {
      positionM: x,
      timeS,
      value: s.value,
      velocityPerS: s.firstDerivative * speed,
      accelerationPerS2: s.secondDerivative * speed * speed,
      transition: index,
    };
  }
  const law = restToRestLaw(trajectory.law)!;
  const move = transitions[index]!;
  const s = law.evaluate((x - move.fromM) / move.lengthM, move.rise);
  return {
    positionM: x,
    timeS,
    value: move.startValue + s.value,
    velocityPerS: s.firstDerivative / move.durationS,
    accelerationPerS2: s.secondDerivative / (move.durationS * move.durationS),
    transition: index,
  };
}

/** The actuator at time `timeS` (s since the first station; wrapped into one repeat when periodic). */
export function sampleTrajectoryAtTime(trajectory: ActuatorTrajectory, timeS: number): ActuatorSample {
  return sampleTrajectory(trajectory, positionAtTime(trajectory.timeBase, timeS));
}

/** Index of the transition whose [fromM, toM) holds x (x inside the trajectory's span), by bisection. */
function transitionAt(trajectory: ActuatorTrajectory, x: number): number {
  const { transitions } = trajectory;
  let lo = 0;
  let hi = transitions.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (transitions[mid]!.fromM <= x) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}
