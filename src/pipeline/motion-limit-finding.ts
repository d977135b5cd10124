import type { Finding } from '../domain/index.js';
import { type MotionLimitProblem, metresPerMinute } from '../motion/index.js';
import { toDegrees } from '../numeric/index.js';

/**
 * An `ACTUATOR_LIMIT` warning for an actuator's broken limit: value and limit in °/s or °/s² (rotary) or mm/s or
 * mm/s² (linear), the transition's
 * line positions, the shortest transition length (m, rounded up to 3 significant figures) and the highest line speed
 * (m/min, rounded down to 3 significant figures) that meet both limits, so that either figure, applied as written,
 * clears the finding. `index` counts actuators from 0 (the message counts from 1).
 */
export function motionLimitFinding(
  index: number,
  actuatorId: string,
  kind: 'rotary' | 'linear',
  problem: MotionLimitProblem,
): Finding {
  const rotary = kind === 'rotary';
  const unit = rotary
    ? problem.quantity === 'speed'
      ? '°/s'
      : '°/s²'
    : problem.quantity === 'speed'
      ? 'mm/s'
      : 'mm/s²';
  const value = rotary ? toDegrees(problem.value) : problem.value;
  const limit = rotary ? toDegrees(problem.limit) : problem.limit;
  const shortest = roundSignificant(problem.shortestLengthM, 'up');
  const highest = roundSignificant(metresPerMinute(problem.highestLineSpeedMPerS), 'down');
  return {
    code: 'ACTUATOR_LIMIT',
    severity: 'warning',
    positionM: problem.fromM,
    value,
    limit,
    message:
      `Actuator ${index + 1} (${actuatorId}) needs a peak ${problem.quantity} of ${roundSignificant(value, 'nearest')} ${unit} ` +
      `between ${positionText(problem.fromM)} m and ${positionText(problem.toM)} m of line, above its limit of ${roundSignificant(limit, 'nearest')} ${unit}. ` +
      `Lengthen that transition to at least ${shortest} m, or run the line at ${highest} m/min or slower.`,
  };
}

/** `x` to 3 significant figures, rounded as asked (`up`/`down` away from or toward zero for positive x). */
function roundSignificant(x: number, direction: 'up' | 'down' | 'nearest'): number {
  if (!Number.isFinite(x) || x === 0) return x;
  const decimals = 2 - Math.floor(Math.log10(Math.abs(x)));
  const f = 10 ** decimals;
  const scaled = x * f;
  // a hair of slack so that an exact figure (1.5 → 150.00000000000003) is not pushed to the next step
  const r =
    direction === 'up'
      ? Math.ceil(scaled - 1e-9)
      : direction === 'down'
        ? Math.floor(scaled + 1e-9)
        : Math.round(scaled);
  return Number((r / f).toFixed(Math.max(0, decimals)));
}

/** A line position in a message, to 0.1 mm. */
function positionText(x: number): string {
  return String(Math.round(x * 1e4) / 1e4);
}
