import { MATERIAL_PRESETS, type MotionLaw, type Schedule, type Station } from '../domain/index.js';
import { normalizeRegion, normalizeRing, type Point, type Region, validateRegion } from '../geometry/index.js';
import { DEFAULT_TOLERANCES, toRadians } from '../numeric/index.js';
import { formatFieldPath } from './field-path.js';
import type { ScheduleWireValue } from './schedule-schema.js';
import { sig } from './wire-format.js';
import { WIRE_LIMITS } from './wire-limits.js';

/** One bad field: where it is and what is wrong, in words a process engineer reads. */
export interface FieldProblem {
  readonly path: string;
  readonly message: string;
}

export type ScheduleMapping =
  | { readonly ok: true; readonly schedule: Schedule }
  | { readonly ok: false; readonly problems: readonly FieldProblem[] };

/** Documented defaults of the wire format (also stated in the OpenAPI field descriptions). */
export const WIRE_DEFAULTS = Object.freeze({
  name: 'unnamed-schedule',
  material: 'PVC-U' as const,
  lineSpeedMPerMin: 2.0,
  dieLandLengthMm: 20, // common practice, no source: a land of 10–30 wall thicknesses for a 1–2 mm wall
  minWallMm: 1.0, // common practice, no source
  maxWallRatio: 2.5, // common practice, no source
  fitToleranceMm: 0.1,
  maxPlates: 24,
  pivotHoleDiameterMm: 4.0,
  ligamentMm: 3.0,
  thicknessMm: 6.0,
  depthMm: 25.0,
  actuatorCount: 1,
  linkMaxLengthMm: 200, // common practice, no source
  maxSpeedDegPerS: 60,
  maxAccelDegPerS2: 300,
  maxSpeedMmPerS: 50, // common practice, no source: a small servo slide
  maxAccelMmPerS2: 250, // common practice, no source
  timeStepS: 0.05,
  matchToleranceMm: 0.02,
});

/** Wire spelling of a motion law → the domain's. */
const WIRE_MOTION_LAW = Object.freeze({
  cycloidal: 'cycloidal',
  polynomial_345: 'polynomial-345',
  monotone_cubic: 'monotone-cubic',
} as const satisfies Record<string, MotionLaw>);

/**
 * The one place where wire units become domain units: resolves every default (material preset first, then the
 * service's own), normalises ring orientation, and checks what zod cannot: ring validity, station order, the periodic
 * length, the total vertex count. Returns every problem found, each with its field path.
 */
export function toSchedule(wire: ScheduleWireValue): ScheduleMapping {
  const problems: FieldProblem[] = [];
  const material = wire.material ?? WIRE_DEFAULTS.material;
  const preset = material === 'custom' ? null : MATERIAL_PRESETS[material];
  const p = wire.process ?? {};

  const fromPreset = (value: number | undefined, presetValue: number | undefined, field: string): number => {
    if (value !== undefined) return value;
    if (presetValue !== undefined) return presetValue;
    problems.push({
      path: `process.${field}`,
      message: `${field} is required when material is "custom" (there is no preset to take it from)`,
    });
    return Number.NaN;
  };

  const meltDensity = fromPreset(p.melt_density_g_per_cm3, preset?.meltDensityGPerCm3, 'melt_density_g_per_cm3');
  const solidDensity = fromPreset(p.solid_density_g_per_cm3, preset?.solidDensityGPerCm3, 'solid_density_g_per_cm3');
  const dieSwell = fromPreset(p.die_swell, preset?.dieSwell, 'die_swell');
  const powerLawN = fromPreset(p.power_law_n, preset?.powerLawN, 'power_law_n');
  const powerLawM = fromPreset(p.power_law_m_pa_s_n, preset?.powerLawMPaSn, 'power_law_m_pa_s_n');
  const dieTemperature = fromPreset(p.die_temperature_c, preset?.dieTemperatureC, 'die_temperature_c');
  const drawDown = wire.limits?.draw_down ?? (preset ? preset.drawDown : { min: 1.0, max: 1.3 });

  const stations: Station[] = [];
  let totalVertices = 0;
  wire.stations.forEach((s, i) => {
    const path = ['stations', i, 'orifice'] as const;
    const raw: Region = { outer: s.orifice.outer as Point[], holes: (s.orifice.holes ?? []) as Point[][] };
    totalVertices += raw.outer.length + raw.holes.reduce((n, h) => n + h.length, 0);
    // The rings as sent are judged first: normalising drops folded-back spikes and collapsed holes, which would
    // otherwise pass unseen; the normalised region is judged again for anything the clean-up itself leaves.
    const region = normalizeRegion(raw, DEFAULT_TOLERANCES);
    const asSent = validateRegion(raw, DEFAULT_TOLERANCES);
    const faults = asSent.length > 0 ? asSent : validateRegion(region, DEFAULT_TOLERANCES);
    if (faults.length === 0 && region.holes.length < raw.holes.length) {
      raw.holes.forEach((hole, h) => {
        if (normalizeRing(hole, DEFAULT_TOLERANCES, 'cw').length >= 3) return;
        problems.push({
          path: formatFieldPath([...path, 'holes', h]),
          message: `Hole ${h} encloses no area once repeated and collinear points are dropped; remove it or draw it as a closed outline.`,
        });
      });
    }
    for (const fault of faults) {
      const ringPath = fault.ring === 'outer' ? [...path, 'outer'] : [...path, 'holes', fault.ring];
      problems.push({ path: formatFieldPath(ringPath), message: fault.message });
    }
    if (i > 0) {
      const before = wire.stations[i - 1]!.position_m;
      if (!(s.position_m > before)) {
        problems.push({
          path: formatFieldPath(['stations', i, 'position_m']),
          message: `stations must be in increasing line position: ${s.position_m} m follows ${before} m`,
        });
      }
    }
    stations.push({ index: i, positionM: s.position_m, orifice: region });
  });
  if (totalVertices > WIRE_LIMITS.totalVertices) {
    problems.push({
      path: 'stations',
      message: `the schedule has ${totalVertices} vertices in all; at most ${WIRE_LIMITS.totalVertices} are accepted`,
    });
  }
  const first = wire.stations[0]!.position_m;
  const last = wire.stations[wire.stations.length - 1]!.position_m;
  if (wire.repeat_length_m !== undefined && !(last - first < wire.repeat_length_m)) {
    problems.push({
      path: 'repeat_length_m',
      message: `a periodic schedule's stations must fit inside one repeat: they span ${last - first} m but repeat_length_m is ${wire.repeat_length_m} m`,
    });
  }
  const maxPlates = wire.limits?.max_plates ?? WIRE_DEFAULTS.maxPlates;
  const minPlates = wire.limits?.min_plates ?? 1;
  if (minPlates > maxPlates) {
    problems.push({
      path: 'limits.min_plates',
      message: `min_plates (${minPlates}) is more than max_plates (${maxPlates}): no plate count satisfies both`,
    });
  }
  const plateCount = wire.limits?.plate_count;
  if (plateCount !== undefined && (plateCount < minPlates || plateCount > maxPlates)) {
    problems.push({
      path: 'limits.plate_count',
      message: `plate_count (${plateCount}) lies outside min_plates–max_plates (${minPlates}–${maxPlates})`,
    });
  }
  const linkMin =
    wire.links?.min_length_mm ??
    (wire.plates?.pivot_hole_diameter_mm ?? WIRE_DEFAULTS.pivotHoleDiameterMm) +
      (wire.plates?.ligament_mm ?? WIRE_DEFAULTS.ligamentMm);
  const linkMax = wire.links?.max_length_mm ?? WIRE_DEFAULTS.linkMaxLengthMm;
  if (!(linkMin < linkMax)) {
    problems.push({
      path: wire.links?.max_length_mm !== undefined ? 'links.max_length_mm' : 'links.min_length_mm',
      message: `the shortest link (${sig(linkMin)} mm) must be shorter than the longest (${sig(linkMax)} mm)`,
    });
  }
  if (problems.length > 0) return { ok: false, problems };

  const span = wire.moving_span;
  const schedule: Schedule = {
    name: wire.name ?? WIRE_DEFAULTS.name,
    material,
    process: {
      lineSpeedMPerS: (p.line_speed_m_per_min ?? WIRE_DEFAULTS.lineSpeedMPerMin) / 60,
      throughputKgPerS: p.throughput_kg_per_h === undefined ? null : p.throughput_kg_per_h / 3600,
      meltDensityKgPerM3: meltDensity * 1000,
      solidDensityKgPerM3: solidDensity * 1000,
      dieSwell,
      powerLawN,
      powerLawMPaSn: powerLawM,
      dieTemperatureC: dieTemperature,
      dieLandLengthMm: p.die_land_length_mm ?? WIRE_DEFAULTS.dieLandLengthMm,
      pullerFollowsArea: p.puller_follows_area ?? false,
    },
    limits: {
      drawDownMin: drawDown.min,
      drawDownMax: drawDown.max,
      minWallMm: wire.limits?.min_wall_mm ?? WIRE_DEFAULTS.minWallMm,
      maxWallRatio: wire.limits?.max_wall_ratio ?? WIRE_DEFAULTS.maxWallRatio,
      fitToleranceMm: wire.limits?.fit_tolerance_mm ?? WIRE_DEFAULTS.fitToleranceMm,
      maxPlates,
      minPlates,
      plateCount: plateCount ?? null,
      ...(wire.limits?.puller_speed_m_per_min
        ? {
            pullerSpeedMPerS: {
              min: wire.limits.puller_speed_m_per_min.min / 60,
              max: wire.limits.puller_speed_m_per_min.max / 60,
            },
          }
        : {}),
    },
    plates: {
      pivotHoleDiameterMm: wire.plates?.pivot_hole_diameter_mm ?? WIRE_DEFAULTS.pivotHoleDiameterMm,
      ligamentMm: wire.plates?.ligament_mm ?? WIRE_DEFAULTS.ligamentMm,
      thicknessMm: wire.plates?.thickness_mm ?? WIRE_DEFAULTS.thicknessMm,
      depthMm: wire.plates?.depth_mm ?? WIRE_DEFAULTS.depthMm,
    },
    // a link, like the shortest plate, needs two pin holes and the ligament between them
    links: { minLengthMm: linkMin, maxLengthMm: linkMax },
    actuators: {
      count: wire.actuators?.count ?? WIRE_DEFAULTS.actuatorCount,
      maxSpeedRadPerS: toRadians(wire.actuators?.max_speed_deg_per_s ?? WIRE_DEFAULTS.maxSpeedDegPerS),
      maxAccelRadPerS2: toRadians(wire.actuators?.max_accel_deg_per_s2 ?? WIRE_DEFAULTS.maxAccelDegPerS2),
      maxSpeedMmPerS: wire.actuators?.max_speed_mm_per_s ?? WIRE_DEFAULTS.maxSpeedMmPerS,
      maxAccelMmPerS2: wire.actuators?.max_accel_mm_per_s2 ?? WIRE_DEFAULTS.maxAccelMmPerS2,
    },
    timeStepS: wire.time_step_s ?? WIRE_DEFAULTS.timeStepS,
    repeatLengthM: wire.repeat_length_m ?? null,
    motionLaw: wire.motion_law === undefined ? 'cycloidal' : WIRE_MOTION_LAW[wire.motion_law],
    movingSpan: {
      ends:
        span?.start !== undefined && span.end !== undefined
          ? { start: span.start as unknown as Point, end: span.end as unknown as Point }
          : null,
      matchToleranceMm: span?.match_tolerance_mm ?? WIRE_DEFAULTS.matchToleranceMm,
    },
    stations,
  };
  return { ok: true, schedule };
}
