import { z } from 'zod';
import { WIRE_LIMITS } from './wire-limits.js';

/**
 * The wire format of a schedule (public contract v1, api-spec/openapi.json): snake_case, units in the names,
 * millimetres and degrees, metres and minutes where the name says so. Only `stations` is required; every default is stated in the field description and
 * resolved in `toSchedule`. Fields may be added, never renamed.
 */

const finite = (what: string) =>
  z.number({ error: (iss) => (iss.input === undefined ? `${what} is required` : `${what} must be a number`) });

/** Writes a range bound the way an engineer reads it: 10000 → "10 000", 1e7 → "10 000 000", 0.01 → "0.01". */
function formatBound(x: number): string {
  const [whole, fraction] = String(x).split('.');
  const grouped = whole!.length > 4 ? whole!.replace(/\B(?=(\d{3})+(?!\d))/g, '\u202f') : whole!;
  return fraction === undefined ? grouped : `${grouped}.${fraction}`;
}

/**
 * The plausible physical range of one numeric field, stated once: the field's `.describe()` text and its 400 message
 * both come from here, so the OpenAPI description and the error say the same range.
 */
export interface FieldRange {
  readonly min: number;
  readonly max: number;
  /** Unit as the field name carries it, written out ('m/min', 'mm', '' for a ratio). */
  readonly unit: string;
  /** Why the range is what it is, and its source ("common practice, no source" where it is a judgement). */
  readonly basis: string;
}

/** `0.01–200 m/min` */
export function formatRange(r: FieldRange): string {
  return `${formatBound(r.min)}–${formatBound(r.max)}${r.unit === '' ? '' : ` ${r.unit}`}`;
}

/**
 * A number within `range`, both ends included. The 400 message names the field, the range and its basis, e.g.
 * "line_speed_m_per_min must lie within 0.01–200 m/min (…)"; the path comes from zod.
 */
const ranged = (what: string, range: FieldRange) => {
  const error = `${what} must lie within ${formatRange(range)} (${range.basis})`;
  return finite(what).min(range.min, { error }).max(range.max, { error });
};

/** Description text of a ranged field: what it is, its default, then its range and basis. */
const withRange = (text: string, range: FieldRange) =>
  `${text}; plausible range ${formatRange(range)} (${range.basis})`;

const JUDGEMENT = 'common practice, no source';

/**
 * Plausible physical ranges of every numeric schedule field. They keep every intermediate of the checks and the fit
 * finite (a power-law index of 1e-300 or a throughput of 1e308 gives infinite pressures), and lengths fit the ±2000 mm
 * coordinate range (4000 mm is the longest distance inside it).
 */
export const FIELD_RANGES = Object.freeze({
  position_m: { min: -10_000, max: 10_000, unit: 'm', basis: `ten kilometres of product either way; ${JUDGEMENT}` },
  line_speed_m_per_min: { min: 0.01, max: 200, unit: 'm/min', basis: `profile and pipe pullers; ${JUDGEMENT}` },
  throughput_kg_per_h: {
    min: 0.01,
    max: 10_000,
    unit: 'kg/h',
    basis: `laboratory to large pipe extruders; ${JUDGEMENT}`,
  },
  density_g_per_cm3: { min: 0.3, max: 3, unit: 'g/cm³', basis: `foamed to heavily filled compounds; ${JUDGEMENT}` },
  die_swell: {
    min: 1,
    max: 3,
    unit: '',
    basis: `extrudate thickness over die gap for profile extrusion; ${JUDGEMENT}`,
  },
  power_law_n: {
    min: 0.1,
    max: 1,
    unit: '',
    basis: `shear-thinning polymer melts lie between 0.1 and 1; ${JUDGEMENT}`,
  },
  power_law_m_pa_s_n: { min: 1, max: 1e7, unit: 'Pa·sⁿ', basis: `consistency of polymer melts; ${JUDGEMENT}` },
  die_temperature_c: {
    min: 20,
    max: 450,
    unit: '°C',
    basis: `room temperature to the hottest engineering melts; ${JUDGEMENT}`,
  },
  die_land_length_mm: { min: 0.5, max: 500, unit: 'mm', basis: `${JUDGEMENT}` },
  draw_down: {
    min: 0.2,
    max: 50,
    unit: '',
    basis: `area draw-down of profile, pipe and sheet extrusion; ${JUDGEMENT}`,
  },
  min_wall_mm: { min: 0.01, max: 500, unit: 'mm', basis: `foil to the thickest solid profile; ${JUDGEMENT}` },
  max_wall_ratio: { min: 1, max: 100, unit: '', basis: `thickest over thinnest wall; ${JUDGEMENT}` },
  fit_tolerance_mm: { min: 0.001, max: 10, unit: 'mm', basis: `1 µm to a coarse first sketch; ${JUDGEMENT}` },
  pivot_hole_diameter_mm: { min: 0.5, max: 100, unit: 'mm', basis: `${JUDGEMENT}` },
  ligament_mm: { min: 0.1, max: 100, unit: 'mm', basis: `${JUDGEMENT}` },
  thickness_mm: { min: 0.5, max: 200, unit: 'mm', basis: `${JUDGEMENT}` },
  depth_mm: { min: 1, max: 1000, unit: 'mm', basis: `${JUDGEMENT}` },
  link_length_mm: {
    min: 0.5,
    max: 4000,
    unit: 'mm',
    basis: `up to the longest distance inside the ±2000 mm coordinate range; ${JUDGEMENT}`,
  },
  max_speed_deg_per_s: { min: 0.1, max: 3600, unit: '°/s', basis: `${JUDGEMENT}` },
  max_accel_deg_per_s2: { min: 0.1, max: 100_000, unit: '°/s²', basis: `${JUDGEMENT}` },
  max_speed_mm_per_s: { min: 0.01, max: 5000, unit: 'mm/s', basis: `${JUDGEMENT}` },
  max_accel_mm_per_s2: { min: 0.01, max: 100_000, unit: 'mm/s²', basis: `${JUDGEMENT}` },
  match_tolerance_mm: { min: 0.0001, max: 10, unit: 'mm', basis: `0.1 µm (the clipping grid) to 10 mm; ${JUDGEMENT}` },
  time_step_s: {
    min: 0.001,
    max: 10,
    unit: 's',
    basis: `a setpoint table between 1 ms and 10 s per row; ${JUDGEMENT}`,
  },
  repeat_length_m: { min: 0.001, max: 10_000, unit: 'm', basis: `${JUDGEMENT}` },
} satisfies Record<string, FieldRange>);
const R = FIELD_RANGES;

export const PointWire = z
  .tuple([finite('x (mm)'), finite('y (mm)')], { error: 'a point is a pair [x, y] of numbers in millimetres' })
  .refine((p) => Math.abs(p[0]) <= WIRE_LIMITS.coordinateMm && Math.abs(p[1]) <= WIRE_LIMITS.coordinateMm, {
    error: `coordinates must lie within ±${WIRE_LIMITS.coordinateMm} mm of the die-body origin`,
  })
  .describe('[x, y] in mm, die-body frame, y up');

export const RingWire = z
  .array(PointWire, { error: 'a ring is a list of [x, y] points' })
  .min(3, { error: 'a ring needs at least 3 points' })
  .max(WIRE_LIMITS.ringVertices, { error: `a ring may have at most ${WIRE_LIMITS.ringVertices} points` })
  .describe('closed ring of points, either orientation (normalised on input); do not repeat the first point');

export const OrificeWire = z
  .object({
    outer: RingWire,
    holes: z
      .array(RingWire)
      .max(WIRE_LIMITS.holes, { error: `an orifice may have at most ${WIRE_LIMITS.holes} holes` })
      .optional()
      .describe('holes (e.g. a mandrel in a hollow profile); default none'),
  })
  .describe('orifice region in mm: outer ring plus optional holes');

export const StationWire = z.object({
  position_m: ranged('position_m', R.position_m).describe(
    withRange('line position along the product, m', R.position_m),
  ),
  orifice: OrificeWire,
});

const materialNames = ['PVC-U', 'HDPE', 'PP', 'ABS', 'TPE', 'custom'] as const;

/** Motion laws as the wire spells them. */
export const motionLawNames = ['cycloidal', 'polynomial_345', 'monotone_cubic'] as const;

export const ProcessWire = z
  .object({
    line_speed_m_per_min: ranged('line_speed_m_per_min', R.line_speed_m_per_min)
      .optional()
      .describe(withRange('nominal puller speed, m/min; default 2.0', R.line_speed_m_per_min)),
    throughput_kg_per_h: ranged('throughput_kg_per_h', R.throughput_kg_per_h)
      .optional()
      .describe(
        withRange(
          'mass throughput, kg/h; default: the first station sets it at the middle of the draw-down range',
          R.throughput_kg_per_h,
        ),
      ),
    melt_density_g_per_cm3: ranged('melt_density_g_per_cm3', R.density_g_per_cm3)
      .optional()
      .describe(withRange('melt density, g/cm³; default: material preset', R.density_g_per_cm3)),
    solid_density_g_per_cm3: ranged('solid_density_g_per_cm3', R.density_g_per_cm3)
      .optional()
      .describe(withRange('solid density, g/cm³; default: material preset', R.density_g_per_cm3)),
    die_swell: ranged('die_swell', R.die_swell)
      .optional()
      .describe(withRange('linear die swell ratio; default: material preset', R.die_swell)),
    power_law_n: ranged('power_law_n', R.power_law_n)
      .optional()
      .describe(withRange('power-law flow index; default: material preset', R.power_law_n)),
    power_law_m_pa_s_n: ranged('power_law_m_pa_s_n', R.power_law_m_pa_s_n)
      .optional()
      .describe(withRange('power-law consistency, Pa·sⁿ; default: material preset', R.power_law_m_pa_s_n)),
    die_temperature_c: ranged('die_temperature_c', R.die_temperature_c)
      .optional()
      .describe(withRange('die temperature, °C; default: material preset', R.die_temperature_c)),
    die_land_length_mm: ranged('die_land_length_mm', R.die_land_length_mm)
      .optional()
      .describe(withRange('die land length for the pressure estimate, mm; default 20', R.die_land_length_mm)),
    puller_follows_area: z
      .boolean({ error: 'puller_follows_area must be true or false' })
      .optional()
      .describe(
        'true: the puller speed follows the orifice area so the draw-down stays at the middle of the draw-down range at constant throughput (ṁ = ρ·A·v): the station checks (POST /v1/checks and a plan’s stations) take each station at that speed and check the speed instead of the draw-down, a plan’s puller-speed table follows it along the motion, and the setpoint table is timed by it; false: the puller runs at line_speed_m_per_min; default false',
      ),
  })
  .describe('process data; every value defaults from the material preset');

export const LimitsWire = z.object({
  draw_down: z
    .object({ min: ranged('draw_down.min', R.draw_down), max: ranged('draw_down.max', R.draw_down) })
    .refine((d) => d.min <= d.max, { error: 'draw_down.min must not exceed draw_down.max' })
    .optional()
    .describe(withRange('area draw-down range; default: material preset', R.draw_down)),
  min_wall_mm: ranged('min_wall_mm', R.min_wall_mm)
    .optional()
    .describe(withRange('thinnest allowed wall, mm; default 1.0', R.min_wall_mm)),
  max_wall_ratio: ranged('max_wall_ratio', R.max_wall_ratio)
    .optional()
    .describe(withRange('largest thickest/thinnest wall ratio; default 2.5', R.max_wall_ratio)),
  fit_tolerance_mm: ranged('fit_tolerance_mm', R.fit_tolerance_mm)
    .optional()
    .describe(withRange('largest boundary deviation of the fit, mm; default 0.1', R.fit_tolerance_mm)),
  max_plates: z
    .number({ error: 'max_plates must be a whole number' })
    .int({ error: 'max_plates must be a whole number' })
    .min(1, { error: 'max_plates must be at least 1' })
    .max(60, { error: 'max_plates may be at most 60' })
    .optional()
    .describe('largest plate count; default 24'),
  min_plates: z
    .number({ error: 'min_plates must be a whole number' })
    .int({ error: 'min_plates must be a whole number' })
    .min(1, { error: 'min_plates must be at least 1' })
    .max(60, { error: 'min_plates may be at most 60' })
    .optional()
    .describe('fewest plates the search may return; default 1'),
  plate_count: z
    .number({ error: 'plate_count must be a whole number' })
    .int({ error: 'plate_count must be a whole number' })
    .min(1, { error: 'plate_count must be at least 1' })
    .max(60, { error: 'plate_count may be at most 60' })
    .optional()
    .describe('fit exactly this many plates instead of searching for the fewest; default: search'),
  puller_speed_m_per_min: z
    .object({
      min: ranged('puller_speed_m_per_min.min', R.line_speed_m_per_min),
      max: ranged('puller_speed_m_per_min.max', R.line_speed_m_per_min),
    })
    .refine((d) => d.min <= d.max, { error: 'puller_speed_m_per_min.min must not exceed puller_speed_m_per_min.max' })
    .optional()
    .describe(
      withRange(
        'speeds the puller can run at, m/min (its data sheet): with process.puller_follows_area the speed that holds the target draw-down at each station and along the motion is checked against it (PULLER_SPEED_OUT_OF_RANGE, MOTION_PULLER_SPEED_OUT_OF_RANGE), else the line speed; default: the whole plausible range',
        R.line_speed_m_per_min,
      ),
    ),
});

export const PlatesWire = z.object({
  pivot_hole_diameter_mm: ranged('pivot_hole_diameter_mm', R.pivot_hole_diameter_mm)
    .optional()
    .describe(withRange('pivot hole diameter, mm; default 4.0', R.pivot_hole_diameter_mm)),
  ligament_mm: ranged('ligament_mm', R.ligament_mm)
    .optional()
    .describe(withRange('steel between pivot hole and orifice edge, mm; default 3.0', R.ligament_mm)),
  thickness_mm: ranged('thickness_mm', R.thickness_mm)
    .optional()
    .describe(withRange('plate thickness along the extrusion direction, mm; default 6.0', R.thickness_mm)),
  depth_mm: ranged('depth_mm', R.depth_mm)
    .optional()
    .describe(withRange('plate body depth away from the melt, mm; default 25.0', R.depth_mm)),
});

export const LinksWire = z.object({
  min_length_mm: ranged('min_length_mm', R.link_length_mm)
    .optional()
    .describe(
      withRange(
        'shortest binary link, pin centre to pin centre, mm; default pivot_hole_diameter_mm + ligament_mm',
        R.link_length_mm,
      ),
    ),
  max_length_mm: ranged('max_length_mm', R.link_length_mm)
    .optional()
    .describe(withRange('longest binary link, mm; default 200', R.link_length_mm)),
});

export const ActuatorsWire = z.object({
  count: z
    .number({ error: 'count must be a whole number' })
    .int({ error: 'count must be a whole number' })
    .min(1, { error: 'count must be at least 1' })
    .max(8, { error: 'count may be at most 8' })
    .optional()
    .describe('number of actuators; default 1'),
  max_speed_deg_per_s: ranged('max_speed_deg_per_s', R.max_speed_deg_per_s)
    .optional()
    .describe(withRange('fastest actuator speed, °/s; default 60', R.max_speed_deg_per_s)),
  max_accel_deg_per_s2: ranged('max_accel_deg_per_s2', R.max_accel_deg_per_s2)
    .optional()
    .describe(withRange('largest actuator acceleration, °/s²; default 300', R.max_accel_deg_per_s2)),
  max_speed_mm_per_s: ranged('max_speed_mm_per_s', R.max_speed_mm_per_s)
    .optional()
    .describe(withRange('fastest linear actuator (slot) speed, mm/s; default 50', R.max_speed_mm_per_s)),
  max_accel_mm_per_s2: ranged('max_accel_mm_per_s2', R.max_accel_mm_per_s2)
    .optional()
    .describe(withRange('largest linear actuator acceleration, mm/s²; default 250', R.max_accel_mm_per_s2)),
});

export const MovingSpanWire = z
  .object({
    start: PointWire.optional().describe('where the plates start, mm (the closest boundary point in each station)'),
    end: PointWire.optional().describe('where the plates end, mm'),
    match_tolerance_mm: ranged('match_tolerance_mm', R.match_tolerance_mm)
      .optional()
      .describe(
        withRange(
          'two station boundaries closer than this are the same die-body wall, mm; default 0.02',
          R.match_tolerance_mm,
        ),
      ),
  })
  .refine((s) => (s.start === undefined) === (s.end === undefined), {
    error: 'give both start and end of the moving span, or neither',
  });

export const ScheduleWire = z
  .object(
    {
      name: z.string({ error: 'name must be text' }).max(200).optional().describe('default "unnamed-schedule"'),
      material: z
        .enum(materialNames, { error: `material must be one of ${materialNames.join(', ')}` })
        .optional()
        .describe('material preset; default PVC-U'),
      process: ProcessWire.optional(),
      limits: LimitsWire.optional(),
      plates: PlatesWire.optional(),
      links: LinksWire.optional(),
      actuators: ActuatorsWire.optional(),
      time_step_s: ranged('time_step_s', R.time_step_s)
        .optional()
        .describe(withRange('setpoint table time step, s; default 0.05', R.time_step_s)),
      repeat_length_m: ranged('repeat_length_m', R.repeat_length_m)
        .optional()
        .describe(withRange('length of one repeat when periodic, m', R.repeat_length_m)),
      motion_law: z
        .enum(motionLawNames, { error: `motion_law must be one of ${motionLawNames.join(', ')}` })
        .optional()
        .describe(
          'actuator motion between stations: cycloidal or polynomial_345 (3-4-5; both rest at every station, VDI 2143 Blatt 1), or monotone_cubic (Fritsch & Carlson 1980, through all station values without overshoot, no rest); default cycloidal',
        ),
      moving_span: MovingSpanWire.optional(),
      stations: z
        .array(StationWire, {
          error: (iss) =>
            iss.input === undefined
              ? 'stations is required: a list of { position_m, orifice }'
              : 'stations must be a list of { position_m, orifice }',
        })
        .min(1, { error: 'at least one station is needed' })
        .max(WIRE_LIMITS.stations, { error: `a schedule may have at most ${WIRE_LIMITS.stations} stations` }),
    },
    { error: 'the body must be a JSON object describing a schedule' },
  )
  .describe('a schedule of orifice profiles against line position');

export type ScheduleWireInput = z.input<typeof ScheduleWire>;
export type ScheduleWireValue = z.output<typeof ScheduleWire>;
