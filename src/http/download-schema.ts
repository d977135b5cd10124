import { z } from 'zod';
import { CautionWire, FindingWire } from './report-schema.js';

const MotionMetaFields = {
  schedule: z.string().describe('name of the schedule the plan was made from'),
  law: z
    .enum(['cycloidal', 'polynomial-345', 'monotone-cubic'])
    .describe(
      'motion law between stations (the schedule’s motion_law): cycloidal and polynomial-345 rest at every station (VDI 2143 Blatt 1); monotone-cubic runs through all station values without overshoot (Fritsch & Carlson 1980)',
    ),
  periodic: z
    .boolean()
    .describe(
      'true: the table covers one repeat (repeat_length_m) and its last row is its first one repeat on, so it closes on itself; false: from the first to the last station',
    ),
  units: z
    .record(z.string(), z.string())
    .describe('unit of every column: m, s, deg, mm, deg/m or mm/m (a cam slope per metre of line)'),
  columns: z.array(z.string()).describe('column names, in the order of every row (the CSV header)'),
  plan_hash: z
    .string()
    .nullable()
    .describe('SHA-256 of the stored plan (hex): the same hash, the same table; null when the store has none'),
  interpolation: z.string().describe('how the rows were computed between stations and simulation steps, in words'),
  cautions: z.array(CautionWire).describe('process-safety cautions; they travel with every export'),
};

const StationSetpointWire = z.object({
  position_m: z.number().describe('station line position, m'),
  values: z.array(z.number()).describe('each actuator at the station: degrees (rotary) or mm (linear)'),
});

export const SetpointsWire = z
  .object({
    ...MotionMetaFields,
    time_step_s: z.number().describe('time between rows, s (the schedule’s time_step_s; the last step may be shorter)'),
    puller_follows_area: z
      .boolean()
      .describe(
        'true: the puller speed follows the orifice area to hold the target draw-down and the rows are timed by it (process.puller_follows_area)',
      ),
    motion: z
      .enum(['law', 'tracked'])
      .describe(
        'law: actuator values by the motion law; tracked: the direct-mode values that follow the morph between station shapes (?motion=tracked)',
      ),
    rows: z
      .array(z.array(z.number()))
      .describe(
        'one row per time step: position_m, time_s, then each actuator (degrees or mm), then puller_speed_m_per_min, orifice_area_mm2 and draw_down_ratio from the simulated motion; as in setpoints.csv',
      ),
  })
  .describe('actuator setpoints against line position and time');

export const CamTableWire = z
  .object({
    ...MotionMetaFields,
    points: z.number().int().describe('number of master positions (rows)'),
    stations: z.array(StationSetpointWire).describe('the station values every actuator passes through'),
    rows: z
      .array(z.array(z.number()))
      .describe(
        'one row per master position: position_m (strictly increasing), then per actuator its value and its slope d(value)/d(position) per metre of line; as in cam-table.csv',
      ),
  })
  .describe('electronic cam: master line position against actuator values and slopes (PLCopen MC_CamIn style)');

/** `?points=N` of the cam table and the puller-speed table. */
export const CamTableQuery = z.object({
  points: z
    .string()
    .optional()
    .describe('number of master positions, an integer 2–10001; default 101 (else 400 malformed_request)'),
});

/** `?motion=law|tracked` of the setpoint table. */
export const SetpointsQuery = z.object({
  motion: z
    .string()
    .optional()
    .describe(
      'law (default): actuator values by the motion law; tracked: in direct mode (one actuator per chain degree of freedom, no links), the values found by least squares at every simulation step to follow the morph between station shapes (409 no_motion for other plans; else 400 malformed_request)',
    ),
});

export const PlanIdParams = z.object({ id: z.string().describe('plan id from POST /v1/plans') });

export const PullerTableWire = z
  .object({
    ...MotionMetaFields,
    points: z.number().int().describe('number of master positions (rows)'),
    puller_follows_area: z
      .boolean()
      .describe(
        'true: the puller speed holds the target draw-down as the orifice area changes (process.puller_follows_area); false: the nominal line speed throughout',
      ),
    target_draw_down_ratio: z.number().describe('the draw-down the puller holds when it follows the area'),
    throughput_kg_per_h: z.number().describe('the constant throughput of the mass balance ṁ = ρ·A·v, kg/h'),
    solid_density_g_per_cm3: z.number().describe('solid density at the puller, g/cm³'),
    rows: z
      .array(z.array(z.number()))
      .describe(
        'one row per master position: position_m (strictly increasing), time_s, puller_speed_m_per_min, orifice_area_mm2, product_area_mm2, draw_down_ratio; as in puller-speed.csv',
      ),
  })
  .describe('puller speed against line position at constant throughput, with the orifice and product areas');

const PointMmWire = z.tuple([z.number(), z.number()]).describe('[x, y] in mm');
const SeriesWire = (text: string) =>
  z
    .array(z.number().nullable())
    .describe(`${text}; one value per frame (null where not finite, e.g. a closed orifice)`);

export const MotionViewWire = z
  .object({
    plan_id: z.string().describe('the plan’s id'),
    position_m: z
      .array(z.number())
      .describe('line position of every frame, m, increasing (one repeat, or first to last station)'),
    time_s: z
      .array(z.number())
      .describe('time of every frame from the first station, s (re-keyed by the puller when it follows the area)'),
    actuators: z
      .array(
        z.object({
          id: z.string(),
          kind: z.enum(['rotary', 'linear']),
          unit: z.enum(['deg', 'mm']).describe('unit of values'),
          values: z.array(z.number()).describe('commanded value per frame'),
        }),
      )
      .describe('each actuator’s commanded value per frame'),
    joints: z
      .array(
        z.object({
          id: z.string().describe('joint id as in the plan’s mechanism'),
          positions_mm: z.array(PointMmWire).describe('the joint’s point per frame, die-body frame, mm'),
        }),
      )
      .describe('every joint of the mechanism, where the simulation put it'),
    plates: z
      .array(
        z.object({
          id: z.string(),
          pivots: z.tuple([z.string(), z.string()]).describe('the joints at the plate’s two pivots (ids in joints)'),
          outline_local_mm: z
            .array(PointMmWire)
            .describe(
              'the plate’s outer outline in its own frame: origin at the first pivot, x axis toward the second pivot, as the plate sits at the first station, mm; counter-clockwise',
            ),
        }),
      )
      .describe('the plates, drawn by placing each outline on its two pivots'),
    links: z
      .array(
        z.object({
          id: z.string(),
          pins: z.tuple([z.string(), z.string()]).describe('the joints at the link’s two pins (ids in joints)'),
        }),
      )
      .describe('binary links'),
    area_mm2: SeriesWire('orifice area (die opening − plates, clipped), mm²'),
    draw_down_ratio: SeriesWire('area draw-down ratio, orifice over product'),
    puller_speed_m_per_min: SeriesWire('puller speed, m/min'),
    die_pressure_ratio: SeriesWire('die-land pressure over the first station’s at constant throughput'),
    limits: z
      .object({
        draw_down_ratio: z
          .object({ min: z.number(), max: z.number() })
          .describe('the schedule’s draw-down range (limits.draw_down)'),
        die_pressure_ratio: z
          .object({ max: z.number() })
          .describe('the rise of the die-land pressure over the first station’s that MOTION_PRESSURE_RISE flags'),
      })
      .describe('the limits the series are held to, drawn on the review page’s charts whether or not they are broken'),
    findings: z.array(FindingWire).describe('the plan’s findings (MOTION_… ones carry position_m … to_position_m)'),
    cautions: z.array(CautionWire).describe('process-safety cautions'),
  })
  .describe(
    'the simulated motion as frames for the review page: the plan’s simulation steps, thinned evenly to at most 2000',
  );

export type MotionView = z.infer<typeof MotionViewWire>;
