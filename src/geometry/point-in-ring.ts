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
  const [px, py] = p;
  const t = tol.lengthMm;
  let inside = false;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const a = ring[i]!;
    const b = ring[j]!;
    // the distance to an edge is at least the distance to its bounding box: measure it only where p lies within t of
    // that box (a few comparisons per edge instead of a projection and a square root)
    if (
      px >= Math.min(a[0], b[0]) - t &&
      px <= Math.max(a[0], b[0]) + t &&
      py >= Math.min(a[1], b[1]) - t &&
      py <= Math.max(a[1], b[1]) + t &&
      pointToSegmentDistance(p, a, b) <= t
    ) {
      return 'boundary';
    }
    // Half-open rule on y so a ray through a vertex counts once.
    if (a[1] > py !== b[1] > py) {
      const x = a[0] + ((py - a[1]) * (b[0] - a[0])) / (b[1] - a[1]);
      if (x > px) inside = !inside;
    }
  }
  return inside ? 'inside' : 'outside';
}
