import type { LineTimeBase } from './line-time-base.js';

/** The rows of a setpoint table: times and the line positions they fall on. */
export interface StepGrid {
  /** Times from 0 to the base's duration, s, strictly increasing. */
  readonly timesS: readonly number[];
  /** Line positions at those times, m (not wrapped: the last row of a periodic grid is origin + repeat). */
  readonly positionsM: readonly number[];
  /** Duration the grid covers, s (span / line speed). */
  readonly durationS: number;
  /** True when the last row is the first row one repeat on, so the table closes on itself. */
  readonly closes: boolean;
}

/**
 * Times every `timeStepS` (s) from 0 over the base's span, and the end time itself as the last row (that last step is
 * shorter when the duration is not a whole number of steps; a step within 1e-9 of the end is merged into it). A
 * periodic base closes: its last row is one repeat after the first.
 */
export function stepGrid(base: LineTimeBase, timeStepS: number): StepGrid {
  if (!(timeStepS > 0) || !Number.isFinite(timeStepS)) throw new Error(`stepGrid: time step must be positive`);
  const durationS = base.spanM / base.lineSpeedMPerS;
  const timesS = timeStepsOver(durationS, timeStepS);
  return {
    timesS,
    positionsM: timesS.map((t) => base.originM + base.lineSpeedMPerS * t),
    durationS,
    closes: base.periodic,
  };
}

/**
 * Times every `timeStepS` (s) from 0 to `durationS`, the end itself as the last (that last step is shorter when the
 * duration is not a whole number of steps; a step within 1e-9 of the end is merged into it). Throws on a step that is
 * not positive, or on more than 1 000 000 steps.
 */
export function timeStepsOver(durationS: number, timeStepS: number): number[] {
  if (!(timeStepS > 0) || !Number.isFinite(timeStepS)) throw new Error(`stepGrid: time step must be positive`);
  const steps = Math.floor(durationS / timeStepS + 1e-9);
  if (steps > 1_000_000) throw new Error(`stepGrid: ${steps} rows; choose a longer time step`);
  const timesS: number[] = [];
  for (let i = 0; i <= steps; i++) timesS.push(i * timeStepS);
  const last = timesS[timesS.length - 1]!;
  if (durationS - last > 1e-9 * Math.max(1, durationS)) timesS.push(durationS);
  else timesS[timesS.length - 1] = durationS;
  return timesS;
}
