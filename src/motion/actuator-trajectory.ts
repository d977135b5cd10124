import type { Tolerances } from '../numeric/index.js';
import { cycloidal } from './cycloidal.js';
import { type LineTimeBase, lineTimeBase } from './line-time-base.js';
import { type MonotoneCubic, monotoneCubic } from './monotone-cubic.js';
import { polynomial345 } from './polynomial-345.js';
import type { RestToRestLaw } from './rest-to-rest-law.js';

/** What an actuator moves: `rotary` values are radians (speeds rad/s), `linear` values millimetres (mm/s). */
export type ActuatorKind = 'rotary' | 'linear';

/**
 * The motion law between stations: `cycloidal` or `polynomial-345` (rest-to-rest over each transition, C²; VDI 2143
 * Blatt 1), or `monotone-cubic` (Fritsch & Carlson 1980 through all station values, C¹).
 */
export type MotionLawName = 'cycloidal' | 'polynomial-345' | 'monotone-cubic';

/** What an actuator trajectory is built from; units in the field names, values in radians or millimetres. */
export interface ActuatorTrajectoryInput {
  readonly kind: ActuatorKind;
  /** Station line positions, m, strictly increasing. */
  readonly stationsM: readonly number[];
  /** Actuator value at each station: radians (rotary) or millimetres (linear). */
  readonly values: readonly number[];
  readonly law: MotionLawName;
  /** Line speed, m/s (> 0). */
  readonly lineSpeedMPerS: number;
  /** Repeat length of a periodic schedule, m (longer than the stations' span); null when not periodic. */
  readonly repeatLengthM: number | null;
}

/** One move between consecutive stations (or, when periodic, from the last station back to the first). */
export interface ActuatorTransition {
  /** Index in the trajectory's transitions. */
  readonly index: number;
  /** Station index the move starts at. */
  readonly fromStation: number;
  /** Station index the move ends at (0 for the closing move of a periodic trajectory). */
  readonly toStation: number;
  /** Line position where the move starts, m. */
  readonly fromM: number;
  /** Line position where the move ends, m (first station + repeat length for the closing move). */
  readonly toM: number;
  /** toM − fromM, m. */
  readonly lengthM: number;
  /** lengthM / line speed, s. */
  readonly durationS: number;
  /** Actuator value at the start, rad or mm. */
  readonly startValue: number;
  /** End value − start value (the rise h), rad or mm; negative for a return. */
  readonly rise: number;
}

/**
 * An actuator's motion over the schedule, as plain data: the stations, the transitions between them, the time base
 * and, for the monotone cubic, the spline through all station values. Sample it with `sampleTrajectory`.
 */
export interface ActuatorTrajectory {
  readonly kind: ActuatorKind;
  readonly law: MotionLawName;
  readonly stationsM: readonly number[];
  /** Station values, rad or mm. */
  readonly values: readonly number[];
  readonly timeBase: LineTimeBase;
  readonly transitions: readonly ActuatorTransition[];
  /** The Fritsch–Carlson spline (law `monotone-cubic`), rest at both ends unless periodic; null for other laws. */
  readonly cubic: MonotoneCubic | null;
}

/** The rest-to-rest law named `law`, or null for the monotone cubic. */
export function restToRestLaw(law: MotionLawName): RestToRestLaw | null {
  if (law === 'cycloidal') return cycloidal;
  if (law === 'polynomial-345') return polynomial345;
  return null;
}

/**
 * Builds the trajectory: one transition between each pair of consecutive stations spanning the full distance between
 * them, plus, when `repeatLengthM` is set, a closing transition from the last station back to the first over the rest
 * of the repeat. Time 0 is at the first station. `tol.angleRad` (rotary) or `tol.lengthMm` (linear) decides when two
 * station values are equal (a flat interval of the monotone cubic). Throws on misuse: fewer than two stations, values
 * not one per station, stations not strictly increasing, a non-positive line speed, a repeat length too short.
 */
export function actuatorTrajectory(input: ActuatorTrajectoryInput, tol: Tolerances): ActuatorTrajectory {
  const { stationsM, values, lineSpeedMPerS, repeatLengthM } = input;
  if (stationsM.length < 2) throw new Error(`actuatorTrajectory: needs at least 2 stations, got ${stationsM.length}`);
  if (values.length !== stationsM.length) throw new Error('actuatorTrajectory: one value per station expected');
  for (let i = 0; i < stationsM.length; i++) {
    if (!Number.isFinite(stationsM[i]) || !Number.isFinite(values[i])) {
      throw new Error('actuatorTrajectory: non-finite station position or value');
    }
    if (i > 0 && !(stationsM[i]! > stationsM[i - 1]!)) {
      throw new Error('actuatorTrajectory: station positions must be strictly increasing');
    }
  }
  const first = stationsM[0]!;
  const last = stationsM[stationsM.length - 1]!;
  const timeBase = lineTimeBase(first, last, lineSpeedMPerS, repeatLengthM);
  const transitions: ActuatorTransition[] = [];
  const count = timeBase.periodic ? stationsM.length : stationsM.length - 1;
  for (let i = 0; i < count; i++) {
    const closing = i === stationsM.length - 1;
    const toStation = closing ? 0 : i + 1;
    const fromM = stationsM[i]!;
    const toM = closing ? first + timeBase.spanM : stationsM[i + 1]!;
    const lengthM = toM - fromM;
    transitions.push({
      index: i,
      fromStation: i,
      toStation,
      fromM,
      toM,
      lengthM,
      durationS: lengthM / lineSpeedMPerS,
      startValue: values[i]!,
      rise: values[toStation]! - values[i]!,
    });
  }
  const flatTolerance = input.kind === 'rotary' ? tol.angleRad : tol.lengthMm;
  const cubic =
    input.law === 'monotone-cubic'
      ? monotoneCubic(
          stationsM,
          values,
          timeBase.periodic ? { kind: 'periodic', period: timeBase.spanM } : { kind: 'rest' },
          flatTolerance,
        )
      : null;
  return {
    kind: input.kind,
    law: input.law,
    stationsM: [...stationsM],
    values: [...values],
    timeBase,
    transitions,
    cubic,
  };
}
