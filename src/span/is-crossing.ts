import type { BoundaryRun } from './boundary-run.js';
import { pointAtArc, type RingWalk } from './ring-walk.js';
import { isNearBoundary, type SegmentGrid } from './segment-grid.js';

/** Share of a common run, by length, that lies within half the tolerance of every station, below which it crosses. */
const CROSSING_SHARE = 0.75;

/**
 * True when a common run (every station within `tolMm` of it) is a crossing rather than die-body wall. Where
 * boundaries meet at an angle, however shallow, their spread grows linearly either side of the meeting point, so only
 * half the run lies within tol/2 of every station (a tangential touch: 1/√2); where they coincide in place and
 * direction, nearly all of it does. The run is a crossing when less than 3/4 of it lies within tol/2. Assumes the die
 * body is drawn the same in every station to well within half the match tolerance.
 *
 * @param others one grid per other station, built for a query radius of at least `tolMm`.
 */
export function isCrossing(walk: RingWalk, run: BoundaryRun, others: readonly SegmentGrid[], tolMm: number): boolean {
  const count = Math.min(400, Math.max(40, Math.ceil(run.length / Math.max(tolMm / 2, 0.01))));
  let tight = 0;
  for (let k = 0; k < count; k++) {
    const p = pointAtArc(walk, run.from + ((k + 0.5) / count) * run.length);
    if (others.every((g) => isNearBoundary(g, p, tolMm / 2))) tight++;
  }
  return tight < CROSSING_SHARE * count;
}
