import { z } from 'zod';
import { WIRE_LIMITS } from './wire-limits.js';

/**
 * The wire format of a schedule (CONTRACT.md v1): snake_case, units in the names, millimetres and degrees, metres and
 * minutes where the name says so. Only `stations` is required; every default is stated in the field description and
 * resolved in `toSchedule`. Fields may be added, never renamed.
 */

const finite = (what: string) =>
  z.number({ error: (iss) => (iss.input === undefined ? `${what} is required` : `${what} must be a number`) });
const positive = (what: string) => finite(what).positive({ error: `${what} must be greater than zero` });

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
  position_m: finite('position_m').describe('line position along the product, m'),
  orifice: OrificeWire,
});

const materialNames = ['PVC-U', 'HDPE', 'PP', 'ABS', 'TPE', 'custom'] as const;

export const ProcessWire = z
  .object({
    line_speed_m_per_min: positive('line_speed_m_per_min')
      .optional()
      .describe('nominal puller speed, m/min; default 2.0'),
    throughput_kg_per_h: positive('throughput_kg_per_h')
      .optional()
      .describe('mass throughput, kg/h; default: the first station sets it at the middle of the draw-down range'),
    melt_density_g_per_cm3: positive('melt_density_g_per_cm3').optional().describe('default: material preset'),
    solid_density_g_per_cm3: positive('solid_density_g_per_cm3').optional().describe('default: material preset'),
    die_swell: finite('die_swell')
      .min(1, { error: 'die_swell is a ratio of at least 1 (extrudate thickness / die gap)' })
      .max(3, { error: 'die_swell above 3 is not a profile-extrusion value' })
      .optional()
      .describe('linear die swell ratio; default: material preset'),
    power_law_n: finite('power_law_n')
      .positive({ error: 'power_law_n must be greater than zero' })
      .max(1, { error: 'power_law_n above 1 describes a shear-thickening fluid, not a polymer melt' })
      .optional()
      .describe('power-law flow index; default: material preset'),
    power_law_m_pa_s_n: positive('power_law_m_pa_s_n')
      .optional()
      .describe('power-law consistency, Pa·sⁿ; default: material preset'),
    die_temperature_c: finite('die_temperature_c')
      .min(20, { error: 'die_temperature_c below 20 °C cannot melt a polymer' })
      .max(450, { error: 'die_temperature_c above 450 °C is beyond any extrusion die' })
      .optional()
      .describe('die temperature, °C; default: material preset'),
    die_land_length_mm: positive('die_land_length_mm')
      .optional()
      .describe('die land length for the pressure estimate, mm; default 20'),
  })
  .describe('process data; every value defaults from the material preset');

export const LimitsWire = z.object({
  draw_down: z
    .object({ min: positive('draw_down.min'), max: positive('draw_down.max') })
    .refine((d) => d.min <= d.max, { error: 'draw_down.min must not exceed draw_down.max' })
    .optional()
    .describe('area draw-down range; default: material preset'),
  min_wall_mm: positive('min_wall_mm').optional().describe('thinnest allowed wall, mm; default 1.0'),
  max_wall_ratio: finite('max_wall_ratio')
    .min(1, { error: 'max_wall_ratio is thickest over thinnest wall, at least 1' })
    .optional()
    .describe('largest thickest/thinnest wall ratio; default 2.5'),
  fit_tolerance_mm: positive('fit_tolerance_mm')
    .optional()
    .describe('largest boundary deviation of the fit, mm; default 0.1'),
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
});

export const PlatesWire = z.object({
  pivot_hole_diameter_mm: positive('pivot_hole_diameter_mm').optional().describe('default 4.0'),
  ligament_mm: positive('ligament_mm')
    .optional()
    .describe('steel between pivot hole and orifice edge, mm; default 3.0'),
  thickness_mm: positive('thickness_mm')
    .optional()
    .describe('plate thickness along the extrusion direction, mm; default 6.0'),
  depth_mm: positive('depth_mm').optional().describe('plate body depth away from the melt, mm; default 25.0'),
});

export const LinksWire = z.object({
  min_length_mm: positive('min_length_mm')
    .optional()
    .describe('shortest binary link, pin centre to pin centre, mm; default pivot_hole_diameter_mm + ligament_mm'),
  max_length_mm: positive('max_length_mm').optional().describe('longest binary link, mm; default 200'),
});

export const ActuatorsWire = z.object({
  count: z
    .number({ error: 'count must be a whole number' })
    .int({ error: 'count must be a whole number' })
    .min(1, { error: 'count must be at least 1' })
    .max(8, { error: 'count may be at most 8' })
    .optional()
    .describe('number of actuators; default 1'),
  max_speed_deg_per_s: positive('max_speed_deg_per_s').optional().describe('default 60'),
  max_accel_deg_per_s2: positive('max_accel_deg_per_s2').optional().describe('default 300'),
});

export const MovingSpanWire = z
  .object({
    start: PointWire.optional().describe('where the plates start, mm (the closest boundary point in each station)'),
    end: PointWire.optional().describe('where the plates end, mm'),
    match_tolerance_mm: positive('match_tolerance_mm')
      .optional()
      .describe('two station boundaries closer than this are the same die-body wall, mm; default 0.02'),
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
      time_step_s: positive('time_step_s')
        .max(10, { error: 'time_step_s above 10 s is too coarse for a setpoint table' })
        .optional()
        .describe('setpoint table time step, s; default 0.05'),
      repeat_length_m: positive('repeat_length_m').optional().describe('length of one repeat when periodic, m'),
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
