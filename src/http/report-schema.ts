import { z } from 'zod';

/** Response schemas: they document the wire format in OpenAPI; the mappers in `to-check-report.ts` fill them. */

const PointOut = z.tuple([z.number(), z.number()]).describe('[x, y] mm, die-body frame');

export const FindingWire = z
  .object({
    code: z.string().describe('stable upper-case code, listed in api-spec/errors.md'),
    severity: z.enum(['info', 'warning', 'error']),
    station: z.number().int().optional().describe('station index in schedule order'),
    position_m: z
      .number()
      .optional()
      .describe('line position of that station, m; for a finding along the motion, where the broken limit starts'),
    to_position_m: z
      .number()
      .optional()
      .describe('for a finding along the motion (codes MOTION_…): where the broken limit ends, m'),
    value: z.number().optional().describe('measured value, in the unit the message names'),
    limit: z.number().optional().describe('the limit it was compared with'),
    at_mm: PointOut.optional().describe('where in the die-body frame'),
    message: z.string().describe('what is wrong and what would help'),
  })
  .describe('a flagged design problem');

export const CautionWire = z
  .object({ code: z.string(), hazard: z.string(), message: z.string() })
  .describe('a process-safety caution; it defers to local codes, the machine builder and plant practice');

export const StationCheckWire = z.object({
  index: z.number().int(),
  position_m: z.number(),
  area_mm2: z.number(),
  perimeter_mm: z.number(),
  centroid_mm: PointOut,
  min_wall_mm: z
    .number()
    .describe('thinnest wall, measured across between facing sides (corners and strip ends excluded), mm'),
  min_wall_at_mm: PointOut,
  max_wall_mm: z.number().describe('thickest wall (diameter of the largest inscribed circle)'),
  max_wall_at_mm: PointOut,
  wall_ratio: z.number().describe('max_wall_mm / min_wall_mm'),
  thin_walls: z
    .array(
      z.object({
        centroid_mm: PointOut,
        area_mm2: z.number(),
        bbox_mm: z.object({ min: PointOut, max: PointOut }),
      }),
    )
    .describe('walls thinner than limits.min_wall_mm'),
  puller_speed_m_per_min: z
    .number()
    .describe(
      'puller speed this station is evaluated at: the nominal line speed, or with process.puller_follows_area the speed that holds target_draw_down here (puller_speed_for_target_m_per_min)',
    ),
  draw_down_ratio: z.number().describe('AREA draw-down ratio A_orifice / A_product at puller_speed_m_per_min'),
  velocity_draw_ratio: z.number().describe('v_puller / v_melt = draw_down_ratio · ρ_melt / ρ_solid'),
  product_area_mm2: z.number().describe('product cross-section at puller_speed_m_per_min'),
  melt_speed_m_per_min: z.number().describe('mean melt speed in the orifice'),
  puller_speed_for_target_m_per_min: z.number().describe('puller speed that holds target_draw_down here'),
  swollen_area_mm2: z.number().describe('area after free die swell, area · die_swell² (isotropic swell)'),
  equivalent_gap_mm: z.number().describe('thin-slit equivalent gap 2·area/perimeter'),
  land_pressure_bar: z.number().describe('estimated pressure drop across the die land (power-law slit, isothermal)'),
  flow_imbalance_ratio: z
    .number()
    .describe('thickest/thinnest wall flow per width at equal pressure, (Hmax/Hmin)^(2+1/n)'),
  wall_pressure_ratio: z
    .number()
    .describe('pressure to push equal flow per width through the thinnest vs the thickest wall, (Hmax/Hmin)^(1+2n)'),
  moving_span: z
    .object({
      start_mm: PointOut,
      end_mm: PointOut,
      length_mm: z.number(),
      path_mm: z.array(PointOut).describe('walked clockwise: melt on the right, plates on the left'),
    })
    .nullable()
    .describe('the part of the boundary the plates form; null when it cannot be told'),
});

export const CheckReportWire = z.object({
  name: z.string(),
  material: z.string(),
  throughput_kg_per_h: z.number(),
  throughput_source: z.enum(['request', 'first_station']),
  target_draw_down: z.number().describe('middle of limits.draw_down; the puller table holds it'),
  puller_follows_area: z
    .boolean()
    .describe(
      'process.puller_follows_area: true when every station is evaluated at the puller speed that holds target_draw_down (so its draw-down is the target, and the puller speed is checked instead); false: at the nominal line speed',
    ),
  stations: z.array(StationCheckWire),
  findings: z.array(FindingWire),
  cautions: z.array(CautionWire),
});

export const ErrorWire = z.object({
  error: z.string().describe('code from api-spec/errors.md'),
  message: z.string(),
  details: z.array(z.object({ path: z.string(), message: z.string() })),
  request_id: z.string().optional(),
});

export const HealthWire = z.object({ status: z.literal('ok'), version: z.string() });

export type CheckReport = z.infer<typeof CheckReportWire>;
export type FindingOut = z.infer<typeof FindingWire>;
