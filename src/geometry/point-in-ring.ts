import type { Tolerances } from '../numeric/index.js';
import { pointToSegmentDistance } from './point-to-segment-distance.js';
import type { Point, Ring } from './types.js';

/** Where a point lies against a ring or region. */
export type PointLocation = 'inside' | 'outside' | 'boundary';

/**
 * Whether `p` lies inside, outside or on a ring (either orientation), mm. Points within `tol.lengthMm` of an edge are
 * on the `boundary`; the rest are classified by the even–odd crossing rule (ray casting along +x).
 */
export function pointInRing(p: Point, ring: Ring, tol: Tolerances): PointLocation {
  const n = ring.length;
  let inside = false;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const edge = edgeAgainstPoint(p, ring[i]!, ring[j]!, tol.lengthMm);
    if (edge === 'boundary') return 'boundary';
    if (edge === 'crosses') inside = !inside;
  }
  return inside ? 'inside' : 'outside';
}

/**
 * One edge a–b of the even–odd rule for point p: `boundary` when p lies within t of it, `crosses` when the ray from p
 * along +x crosses it (half-open rule on y, so a ray through a vertex counts once), else `clear`. The distance is
 * measured only where p lies within t of the edge's bounding box (a few comparisons per far edge instead of a
 * projection and a square root: the distance to a segment is at least the distance to its bounding box).
 */
export function edgeAgainstPoint(p: Point, a: Point, b: Point, t: number): 'boundary' | 'crosses' | 'clear' {
  const [px, py] = p;
  if (
    px >= Math.min(a[0], b[0]) - t &&
    px <= Math.max(a[0], b[0]) + t &&
    py >= Math.min(a[1], b[1]) - t &&
    py <= Math.max(a[1], b[1]) + t &&
    pointToSegmentDistance(p, a, b) <= t
  ) {
    return 'boundary';
  }
  if (a[1] > py !== b[1] > py && a[0] + ((py - a[1]) * (b[0] - a[0])) / (b[1] - a[1]) > px) return 'crosses';
  return 'clear';
}
