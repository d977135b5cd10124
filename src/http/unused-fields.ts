import type { Finding } from '../domain/index.js';

/** Which route a schedule is posted to: a check reads less of it than a plan. */
export type ScheduleRoute = 'checks' | 'plans';

/**
 * Fields of the schedule format that no stage reads yet, with the stage that will: accepted so line controllers can
 * send whole recipes now, reported so nobody believes they took effect.
 */
const NOT_USED_YET: Readonly<Record<string, string>> = {
  'plates.thickness_mm': 'the plate drawings',
};

/** Fields only a plan reads: the chain fit, the links, the actuators and their motion. */
const PLAN_ONLY: readonly string[] = [
  'limits.max_plates',
  'limits.min_plates',
  'limits.plate_count',
  'plates.pivot_hole_diameter_mm',
  'plates.ligament_mm',
  'plates.depth_mm',
  'links.min_length_mm',
  'links.max_length_mm',
  'actuators.count',
  'actuators.max_speed_deg_per_s',
  'actuators.max_accel_deg_per_s2',
  'actuators.max_speed_mm_per_s',
  'actuators.max_accel_mm_per_s2',
  'time_step_s',
  'repeat_length_m',
  'motion_law',
];

/**
 * Info findings for fields present in the request that the route does not use: fields no stage reads yet (with the
 * stage that will), and, on `POST /v1/checks`, the fields only a plan reads. Paths as in the 400 details.
 */
export function unusedFields(body: unknown, route: ScheduleRoute): Finding[] {
  const out: Finding[] = [];
  const present = (path: string): boolean => {
    let node: unknown = body;
    for (const key of path.split('.')) {
      if (node === null || typeof node !== 'object' || !Object.hasOwn(node, key)) return false;
      node = (node as Record<string, unknown>)[key];
    }
    return node !== undefined;
  };
  for (const [path, stage] of Object.entries(NOT_USED_YET)) {
    if (present(path)) {
      out.push({
        code: 'UNUSED_FIELD',
        severity: 'info',
        message: `The field ${path} is accepted but not used yet: it is meant for ${stage}, which this version does not compute.`,
      });
    }
  }
  if (route === 'checks') {
    for (const path of PLAN_ONLY) {
      if (present(path)) {
        out.push({
          code: 'UNUSED_FIELD',
          severity: 'info',
          message: `The field ${path} is used when planning (POST /v1/plans), not by a check.`,
        });
      }
    }
  }
  return out;
}
