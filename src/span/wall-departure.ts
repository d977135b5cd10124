import { pointAtArc, type RingWalk } from './ring-walk.js';
import { isNearBoundary, type SegmentGrid } from './segment-grid.js';

/**
 * Where the stations leave a common die-body wall, seen from the end of the wall's common run at arc length `s1`
 * (where they are `tolMm` apart), looking into the wall in direction `dir` (+1 counter-clockwise), at most `maxMm` in.
 * Boundaries that part at an angle spread linearly, so the spread halves halfway back to where they part: the answer
 * is s1 + dir · 2·d½, with d½ the distance in to the first point within tol/2 of every station (found by stepping
 * and bisection to tol/20), mm of arc. A sharp corner gives s1 itself; a plate turning about a pin at the wall's end
 * gives the pin's tangent point rather than wherever the turned plate first strays beyond the tolerance.
 */
export function wallDeparture(
  walk: RingWalk,
  s1: number,
  dir: 1 | -1,
  others: readonly SegmentGrid[],
  tolMm: number,
  maxMm: number,
): number {
  const tight = (d: number): boolean => {
    const p = pointAtArc(walk, s1 + dir * d);
    return others.every((g) => isNearBoundary(g, p, tolMm / 2));
  };
  const step = Math.max(tolMm / 2, 0.05);
  let lo = 0;
  let hi = -1;
  for (let d = Math.min(step, maxMm / 2); d <= maxMm / 2; d += step) {
    if (tight(d)) {
      hi = d;
      break;
    }
    lo = d;
  }
  if (hi < 0) return s1;
  while (hi - lo > tolMm / 20) {
    const mid = (lo + hi) / 2;
    if (tight(mid)) hi = mid;
    else lo = mid;
  }
  return s1 + dir * Math.min(maxMm, lo + hi);
}
