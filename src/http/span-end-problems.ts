import type { Schedule } from '../domain/index.js';
import { closestPointOnPolyline, type Point } from '../geometry/index.js';
import type { FieldProblem } from './to-schedule.js';

/**
 * How far an explicit `moving_span.start` or `end` may lie from any station's outer boundary, mm. The span in each
 * station starts at its boundary point closest to the given one, so a point a little off a station (a corner that
 * moves, a rounded coordinate) is fine; one further off most likely belongs to another drawing or frame.
 */
export const SPAN_END_REACH_MM = 1.0;

/**
 * The explicit span ends that do not lie within `SPAN_END_REACH_MM` of every station's outer boundary: one problem per
 * end, naming the farthest station and its distance. Empty when the ends are automatic or both fit.
 */
export function spanEndProblems(schedule: Schedule): FieldProblem[] {
  const ends = schedule.movingSpan.ends;
  if (!ends) return [];
  const problems: FieldProblem[] = [];
  for (const key of ['start', 'end'] as const) {
    const point: Point = ends[key];
    let worst = { station: -1, distance: 0 };
    schedule.stations.forEach((station, i) => {
      const d = closestPointOnPolyline(point, station.orifice.outer, true).distance;
      if (d > worst.distance) worst = { station: i, distance: d };
    });
    if (worst.distance > SPAN_END_REACH_MM) {
      problems.push({
        path: `moving_span.${key}`,
        message: `the span ${key} (${round(point[0])}, ${round(point[1])}) mm lies ${round(worst.distance)} mm from the boundary of station ${worst.station}; each end must lie within ${SPAN_END_REACH_MM} mm of every station's outer boundary, where the plates meet the die body`,
      });
    }
  }
  return problems;
}

function round(x: number): number {
  return Math.round(x * 100) / 100;
}
