import type { ActuatorTrajectory } from './actuator-trajectory.js';
import { restToRestLaw } from './actuator-trajectory.js';
import type { MotionLimitProblem } from './motion-limit-problem.js';
import { monotoneCubicIntervalPeaks } from './monotone-cubic.js';

/** Actuator limits: rad/s and rad/s² for a rotary actuator, mm/s and mm/s² for a linear one. */
export interface MotionLimits {
  /** Largest |speed|, rad/s or mm/s (> 0). */
  readonly maxSpeedPerS: number;
  /** Largest |acceleration|, rad/s² or mm/s² (> 0). */
  readonly maxAccelerationPerS2: number;
}

/** Peak speed and acceleration over one transition. */
export interface TransitionPeaks {
  readonly transition: number;
  /** Peak |speed|, rad/s or mm/s. */
  readonly peakSpeedPerS: number;
  /** Peak |acceleration|, rad/s² or mm/s². */
  readonly peakAccelerationPerS2: number;
  /** Shortest duration of this transition's shape that meets both limits, s. */
  readonly shortestDurationS: number;
}

/** Peaks of every transition and the problems where a limit is broken (empty when every transition is within). */
export interface MotionLimitCheck {
  readonly peaks: readonly TransitionPeaks[];
  readonly problems: readonly MotionLimitProblem[];
}

/**
 * Checks each transition's peak speed and acceleration against `limits`. Rest-to-rest laws in closed form from the
 * law's peak factors (VDI 2143 Blatt 1; Norton, *Cam Design and Manufacturing Handbook*): peak speed C_v·|h|/T and
 * acceleration C_a·|h|/T² (cycloidal C_v = 2, C_a = 2π; 3-4-5 C_v = 1.875, C_a = 10/√3 ≈ 5.7735). The monotone cubic:
 * the exact peaks of its cubic on the interval. Since speed scales as 1/T and acceleration as 1/T² for a given shape,
 * the shortest duration meeting both limits is T_min = max(T·v̂/v_max, T·√(â/a_max)); the shortest length is
 * T_min × line speed and the highest line speed is length / T_min. These are exact for the rest-to-rest laws; for the
 * monotone cubic the highest line speed is exact (the whole curve scales with the speed) and the shortest length holds
 * the interval's shape (changing one length also changes the neighbouring slopes). A problem is reported for each
 * broken limit. Throws when a limit is not positive.
 */
export function checkMotionLimits(trajectory: ActuatorTrajectory, limits: MotionLimits): MotionLimitCheck {
  const { maxSpeedPerS, maxAccelerationPerS2 } = limits;
  if (!(maxSpeedPerS > 0) || !(maxAccelerationPerS2 > 0)) {
    throw new Error('checkMotionLimits: speed and acceleration limits must be positive');
  }
  const law = restToRestLaw(trajectory.law);
  const lineSpeed = trajectory.timeBase.lineSpeedMPerS;
  const peaks: TransitionPeaks[] = [];
  const problems: MotionLimitProblem[] = [];
  for (const move of trajectory.transitions) {
    const T = move.durationS;
    let peakSpeed: number;
    let peakAcceleration: number;
    if (law !== null) {
      peakSpeed = (law.peakVelocityFactor * Math.abs(move.rise)) / T;
      peakAcceleration = (law.peakAccelerationFactor * Math.abs(move.rise)) / (T * T);
    } else {
      const cubicPeaks = monotoneCubicIntervalPeaks(trajectory.cubic!, move.index);
      peakSpeed = cubicPeaks.peakFirstDerivative * lineSpeed;
      peakAcceleration = cubicPeaks.peakSecondDerivative * lineSpeed * lineSpeed;
    }
    const shortestDurationS = Math.max(
      (T * peakSpeed) / maxSpeedPerS,
      T * Math.sqrt(peakAcceleration / maxAccelerationPerS2),
    );
    peaks.push({
      transition: move.index,
      peakSpeedPerS: peakSpeed,
      peakAccelerationPerS2: peakAcceleration,
      shortestDurationS,
    });
    const broken: { quantity: 'speed' | 'acceleration'; value: number; limit: number }[] = [];
    if (exceeds(peakSpeed, maxSpeedPerS)) broken.push({ quantity: 'speed', value: peakSpeed, limit: maxSpeedPerS });
    if (exceeds(peakAcceleration, maxAccelerationPerS2)) {
      broken.push({ quantity: 'acceleration', value: peakAcceleration, limit: maxAccelerationPerS2 });
    }
    for (const b of broken) {
      problems.push({
        transition: move.index,
        fromM: move.fromM,
        toM: move.toM,
        quantity: b.quantity,
        value: b.value,
        limit: b.limit,
        shortestLengthM: shortestDurationS * lineSpeed,
        highestLineSpeedMPerS: move.lengthM / shortestDurationS,
      });
    }
  }
  return { peaks, problems };
}

/** `value` above `limit` by more than rounding (relative 1e-12), so a peak exactly at its limit passes. */
function exceeds(value: number, limit: number): boolean {
  return value > limit * (1 + 1e-12);
}
