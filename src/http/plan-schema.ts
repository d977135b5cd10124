import { z } from 'zod';
import { CautionWire, FindingWire } from './report-schema.js';

const PointOut = z.tuple([z.number(), z.number()]);
const RegionOut = z
  .object({ outer: z.array(PointOut), holes: z.array(z.array(PointOut)) })
  .describe('orifice in mm: outer ring counter-clockwise, holes clockwise');

const PlanStatusWire = z
  .enum(['queued', 'running', 'done', 'incomplete', 'failed'])
  .describe(
    'done: every station within the fit tolerance and driven by the requested actuators; incomplete: computed but short of the request (see outcome.shortfalls; the best mechanism found is returned); failed: no chain could be fitted (see error)',
  );

export const PlanAcceptedWire = z.object({
  id: z.string(),
  status: PlanStatusWire,
});

export const PlanStationWire = z.object({
  index: z.number().int(),
  position_m: z.number(),
  target_orifice: RegionOut,
  achieved_orifice: RegionOut.describe('computed from the plates at this station: opening − union(plates)'),
  fit: z.object({
    max_deviation_mm: z.number().describe('symmetric Hausdorff distance between target and achieved boundaries'),
    area_error_pct: z.number().describe('(achieved − target) / target area'),
    symmetric_difference_mm2: z.number().describe('area covered by exactly one of target and achieved'),
    worst_target_mm: PointOut.describe('target point at the largest deviation'),
    worst_achieved_mm: PointOut.describe('achieved point at the largest deviation'),
  }),
  plates: z
    .array(z.object({ plate: z.string(), pivots_mm: z.tuple([PointOut, PointOut]) }))
    .describe('each plate’s two pivots at this station'),
});

export const MechanismWire = z.object({
  mobility: z
    .number()
    .int()
    .describe(
      'degrees of freedom of the mechanism without its actuators, by the Grübler–Kutzbach count: the one place that says how many actuators drive the plan (each takes one); for a mechanism that passed, it equals the actuator count',
    ),
  mobility_by_jacobian_rank: z
    .number()
    .int()
    .nullable()
    .describe(
      'the same checked numerically: unknowns − rank of the constraint Jacobian at the first station; null for the bare chain',
    ),
  bodies: z.array(z.object({ id: z.string(), kind: z.enum(['die_body', 'plate', 'link']), layer: z.number().int() })),
  joints: z.array(
    z.object({
      id: z.string(),
      type: z.enum(['revolute', 'prismatic']),
      bodies: z.tuple([z.string(), z.string()]),
      station_positions: z.array(PointOut).describe('joint point in the die-body frame at each station, mm'),
    }),
  ),
  actuators: z.array(
    z.object({
      id: z.string(),
      joint: z.string(),
      kind: z.enum(['rotary', 'linear']),
      station_values: z.array(z.number()).describe('degrees (rotary) or mm (linear) at each station'),
    }),
  ),
});

export const ChainWire = z.object({
  status: z.enum(['fitted', 'best-effort']),
  plate_count: z.number().int(),
  plate_lengths_mm: z.array(z.number()).describe('pivot-to-pivot length of each plate, the same in every station'),
  edge_offset_mm: z.number().describe('e = pivot hole radius + ligament: pivot line to melt edge'),
  start: z.object({ kind: z.enum(['pivot', 'slot']), travel_mm: z.array(z.number()).optional() }),
  end: z.object({ kind: z.enum(['pivot', 'slot']), travel_mm: z.array(z.number()).optional() }),
  telescoping: z
    .array(z.object({ plate: z.string(), station_lengths_mm: z.array(z.number()), stroke_mm: z.number() }))
    .describe('plates whose pivot-to-pivot length changes between stations (a pair sliding on a prismatic joint)'),
  solver: z.object({ status: z.string(), iterations: z.number().int(), reason: z.string() }),
  search: z
    .object({
      lowest_plate_count_tried: z.number().int(),
      highest_plate_count_tried: z.number().int(),
      forms: z.array(z.string()),
      stopped_early: z.boolean().describe('the plan’s time limit ended the search before it was complete'),
      below_answer: z
        .object({
          plate_count: z.number().int(),
          starts: z.number().int().describe('independent starts solved at this count'),
          best_miss_mm: z.number().nullable().describe('smallest miss among them; null when none closed'),
        })
        .nullable()
        .describe('the evidence that one plate fewer misses the tolerance'),
    })
    .describe('the plate counts and forms the fit searched'),
  attempts: z.array(
    z.object({
      plate_count: z.number().int(),
      form: z.string().describe('pinned, slot at start/end, or telescoping plate k'),
      solver_status: z.string(),
      iterations: z.number().int(),
      max_sample_residual_mm: z.number().describe('largest |distance − e| over the span samples after the solve'),
      closure_gap_mm: z.number().describe('largest gap between the last pivot and its end pin'),
      max_deviation_mm: z.number().nullable(),
    }),
  ),
});

export const MechanisationWire = z.object({
  status: z.enum(['mechanised', 'no-mechanism']),
  mode: z
    .enum(['direct', 'reduced'])
    .nullable()
    .describe('direct: one actuator per degree of freedom; reduced: binary links take up the rest'),
  requested_actuators: z.number().int().describe('actuators the schedule asks for'),
  actuator_count: z.number().int().describe('actuators of the mechanism returned'),
  chain_degrees_of_freedom: z.number().int(),
  smallest_actuator_count: z.number().int().nullable().describe('fewest actuators found to work'),
  distinct_positions: z.number().int(),
  synthesis: z.string().describe('how the binary links were synthesised (Burmester theory by position count)'),
  ground_pivot_rule: z.string(),
  layer_model: z.string(),
  link_count: z.number().int(),
  transmission_angle_deg: z
    .object({
      min: z.number().nullable(),
      max: z.number().nullable(),
      joints: z
        .array(z.object({ joint: z.string(), min: z.number(), max: z.number(), worst: z.number() }))
        .describe('plate–plate joints where two plates drive each other (the middle joint of a dyad), over the motion'),
    })
    .describe('binary links (min, max) and plate–plate joints, over the whole motion, degrees'),
  clearances: z
    .array(
      z.object({
        kind: z
          .enum(['ground-pivot', 'pin-through-layer', 'same-layer', 'link-in-melt'])
          .describe(
            'ground-pivot: a die-body pin against a plate; pin-through-layer: a link pin against a part on a layer it passes; same-layer: two plates on one layer; link-in-melt: how far inside the plates a link over the opening stays',
          ),
        parts: z.tuple([z.string(), z.string()]),
        clearance_mm: z.number().describe('smallest gap over the whole motion; negative where the parts overlap'),
        station: z.number().int().nullable().describe('where it occurs: at this station, or on the leg after it'),
        leg_to_station: z.number().int().nullable().describe('the station the leg runs to; null at a station'),
        leg_fraction: z.number().describe('0–1 along the leg'),
      }),
    )
    .describe('the tightest room between parts over the whole motion, smallest first (at most 12)'),
  stations: z.array(
    z.object({
      residual_mm: z.number().describe('driven pivots vs fitted pivots'),
      deviation_mm: z.number().describe('achieved orifice of the driven mechanism vs target'),
    }),
  ),
});

export const ChainTriedWire = z.object({
  variant: z.string().describe('what differs from the schedule’s own settings'),
  plate_count: z.number().int().nullable().describe('null when the chain was not fitted (time limit)'),
  fit_status: z.enum(['fitted', 'best-effort']),
  max_deviation_mm: z.number().nullable(),
  chain_degrees_of_freedom: z.number().int().nullable(),
  mechanised: z.boolean(),
  actuator_count: z.number().int().nullable(),
  verdict: z.string().describe('chosen, or why this chain was not the answer'),
});

const RangeWire = (unit: string) =>
  z
    .object({ min: z.number().nullable(), max: z.number().nullable() })
    .describe(`smallest and largest over the steps, ${unit} (null when not finite)`);

export const SimulationWire = z.object({
  steps: z
    .number()
    .int()
    .describe('steps simulated: one per time step over one repeat (or first to last station) and every station'),
  time_step_s: z
    .number()
    .describe('time between steps at the nominal line speed, s (time_step_s, or coarser when capped)'),
  capped: z
    .boolean()
    .describe('true: time_step_s would have given more than 2000 steps, so a coarser step was simulated'),
  wall_stride: z
    .number()
    .int()
    .describe('walls, transmission angles and room were measured every this many steps and at every station'),
  puller_follows_area: z.boolean().describe('process.puller_follows_area'),
  target_draw_down_ratio: z.number().describe('the draw-down the puller holds when it follows the area'),
  duration_s: z.number().describe('time of one repeat (or first to last station) at the simulated puller speed, s'),
  area_mm2: RangeWire('mm²'),
  draw_down_ratio: RangeWire('orifice over product'),
  puller_speed_m_per_min: RangeWire('m/min'),
  die_pressure_ratio: RangeWire('die-land pressure over the first station’s'),
  min_wall_mm: z.number().nullable().describe('thinnest wall measured along the motion, mm'),
  max_leak_area_mm2: z
    .number()
    .describe('largest uncovered opening apart from the orifice, mm² (0: sealed throughout)'),
  max_tip_speed_mm_per_s: z.number().describe('fastest plate tip (pivot) speed, mm/s'),
  transmission_angle_deg: RangeWire('degrees, binary links and dyad joints'),
  min_clearance_mm: z.number().nullable().describe('tightest room between parts along the motion, mm'),
  unsolved_steps: z
    .number()
    .int()
    .describe('steps where the mechanism could not be assembled (0 when it moves throughout)'),
  tracking: z
    .object({
      law_max_residual_mm: z
        .number()
        .describe('largest RMS distance of the pivots from the morph between station shapes, motion-law values, mm'),
      tracked_max_residual_mm: z
        .number()
        .describe('the same with actuator values found by least squares at every step, mm'),
    })
    .nullable()
    .describe(
      'direct mode only (one actuator per chain degree of freedom, no links): following the morph between stations',
    ),
});

export const PlanWire = z.object({
  id: z.string(),
  name: z.string(),
  status: PlanStatusWire,
  error: z.string().optional(),
  outcome: z
    .object({
      meets_request: z.boolean(),
      shortfalls: z.array(z.string()).describe('one sentence per way the plan falls short of the schedule'),
    })
    .describe('whether the plan does what the schedule asks'),
  chains_tried: z.array(ChainTriedWire).describe('every chain fitted and tried, the chosen one marked'),
  created_at: z.string(),
  findings: z.array(FindingWire),
  cautions: z.array(CautionWire),
  stations: z.array(PlanStationWire),
  chain: ChainWire.nullable(),
  mechanisation: MechanisationWire.nullable(),
  mechanism: MechanismWire.nullable(),
  motion: z
    .object({
      law: z
        .enum(['cycloidal', 'polynomial-345', 'monotone-cubic'])
        .describe(
          'motion law between stations (the schedule’s motion_law): cycloidal and polynomial-345 rest at every station (VDI 2143 Blatt 1); monotone-cubic runs through the station values without overshoot (Fritsch & Carlson 1980)',
        ),
      rest_to_rest: z.boolean().describe('true: every actuator comes to rest at every station'),
      time_step_s: z.number().describe('time between rows of the setpoint table, s'),
      periodic: z
        .boolean()
        .describe('true: the motion repeats every repeat_length_m and its tables close on themselves'),
    })
    .nullable()
    .describe(
      'how the actuators move between stations (downloads: setpoints.csv/.json, cam-table.csv/.json); null when the plan failed or has no actuators',
    ),
  simulation: SimulationWire.nullable().describe(
    'the commanded motion simulated step by step (downloads: puller-speed.csv/.json, motion.json; findings MOTION_…); null when the plan has no driven mechanism',
  ),
});

export type PlanReport = z.infer<typeof PlanWire>;
