import type { Finding, Schedule } from '../domain/index.js';
import { messageNumber } from './message-number.js';

/**
 * Where the inputs stop describing a plausible extrusion die. Every bound is common practice, no source: it is set
 * far outside real profiles so that it catches unit mistakes and typing errors, not unusual designs.
 */
export const PLAUSIBLE = Object.freeze({
  /** Smallest orifice area, mm²: below this the profile is thinner than a fishing line (common practice, no source). */
  minAreaMm2: 1,
  /** Smallest orifice extent (longer side of its bounding box), mm (common practice, no source). */
  minExtentMm: 1,
  /** Largest orifice extent, mm: beyond any profile die (common practice, no source). */
  maxExtentMm: 1000,
  /**
   * Largest fit tolerance as a fraction of the thinnest wall: a plate edge may then wander a quarter of the wall
   * away and still count as "fitted" (common practice, no source).
   */
  fitToleranceWallFraction: 0.25,
  /**
   * Highest land pressure the isothermal power-law slit estimate is reported as a figure, bar. Extruders are rated
   * for a few hundred bar (docs/MODEL.md §4: often 70–350 bar, higher possible); above 1000 bar the estimate has left
   * its range (common practice, no source).
   */
  maxLandPressureBar: 1000,
  /**
   * Slowest and fastest puller speed, m/min, checked when the puller follows the orifice area: the range the schedule
   * accepts for `line_speed_m_per_min` (profile and pipe pullers; common practice, no source).
   */
  minPullerSpeedMPerMin: 0.01,
  maxPullerSpeedMPerMin: 200,
});

/**
 * The puller's speed range, m/min: the schedule's `limits.pullerSpeedMPerS`, or the plausible 0.01–200 m/min when it
 * gives none.
 */
export function pullerSpeedRangeMPerMin(schedule: Schedule): { readonly min: number; readonly max: number } {
  const given = schedule.limits.pullerSpeedMPerS;
  return given
    ? { min: given.min * 60, max: given.max * 60 }
    : { min: PLAUSIBLE.minPullerSpeedMPerMin, max: PLAUSIBLE.maxPullerSpeedMPerMin };
}

/** What the plausibility checks read of one station: area mm², extent mm (longer bounding-box side). */
export interface StationScale {
  readonly areaMm2: number;
  readonly extentMm: number;
}

const UNITS_HINT = 'were the coordinates drawn in metres or inches? They are read as millimetres.';

/**
 * Orifices too small or too large to be a plastics profile, one finding per station (`ORIFICE_TOO_SMALL`,
 * `ORIFICE_TOO_LARGE`, errors): the usual cause is a drawing in metres or inches read as millimetres, and every
 * figure computed from it (walls, pressure, puller speed) is then meaningless.
 *
 * @param stations  area (mm²) and extent (mm) per station, in schedule order.
 */
export function scaleFindings(schedule: Schedule, stations: readonly StationScale[]): Finding[] {
  const findings: Finding[] = [];
  stations.forEach((s, i) => {
    const at = { station: i, positionM: schedule.stations[i]?.positionM };
    if (s.areaMm2 < PLAUSIBLE.minAreaMm2 || s.extentMm < PLAUSIBLE.minExtentMm) {
      const byArea = s.areaMm2 < PLAUSIBLE.minAreaMm2;
      findings.push({
        code: 'ORIFICE_TOO_SMALL',
        severity: 'error',
        ...at,
        value: byArea ? s.areaMm2 : s.extentMm,
        limit: byArea ? PLAUSIBLE.minAreaMm2 : PLAUSIBLE.minExtentMm,
        message: `The orifice is ${messageNumber(s.areaMm2)} mm² and ${messageNumber(s.extentMm)} mm across, smaller than any plausible extrusion (at least ${PLAUSIBLE.minAreaMm2} mm² and ${PLAUSIBLE.minExtentMm} mm, common practice): ${UNITS_HINT} Walls, pressure and speeds computed from it mean nothing, so this station's other checks are held back until the scale is right.`,
      });
    } else if (s.extentMm > PLAUSIBLE.maxExtentMm) {
      findings.push({
        code: 'ORIFICE_TOO_LARGE',
        severity: 'error',
        ...at,
        value: s.extentMm,
        limit: PLAUSIBLE.maxExtentMm,
        message: `The orifice is ${messageNumber(s.extentMm)} mm across, larger than a profile die (at most ${PLAUSIBLE.maxExtentMm} mm, common practice): ${UNITS_HINT} Walls, pressure and speeds computed from it mean nothing, so this station's other checks are held back until the scale is right.`,
      });
    }
  });
  return findings;
}

/**
 * `FIT_TOLERANCE_COARSE` (warning) when `limits.fitToleranceMm` exceeds a quarter of the thinnest wall of any
 * station: a chain "fitted" within it may change the walls by more than their own tolerance. Null when it does not.
 *
 * @param minWallMm  thinnest wall over all stations, mm.
 */
export function fitToleranceFinding(schedule: Schedule, minWallMm: number): Finding | null {
  const limit = PLAUSIBLE.fitToleranceWallFraction * minWallMm;
  const tolerance = schedule.limits.fitToleranceMm;
  if (!(tolerance > limit)) return null;
  return {
    code: 'FIT_TOLERANCE_COARSE',
    severity: 'warning',
    value: tolerance,
    limit,
    message: `The fit tolerance ${messageNumber(tolerance)} mm is more than a quarter of the thinnest wall (${messageNumber(minWallMm)} mm; common practice, no source): plates fitted within it may change a wall by more than the wall can take. Give limits.fit_tolerance_mm at most ${messageNumber(limit)} mm.`,
  };
}
