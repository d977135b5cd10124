import { pointToSegmentDistance } from './point-to-segment-distance.js';
import type { Point, Region } from './types.js';

/** Distance from `p` to the nearest boundary (outer ring or hole) of a region, mm (internal to the wall code). */
export function boundaryClearance(p: Point, region: Region): number {
  let best = Number.POSITIVE_INFINITY;
  for (const ring of [region.outer, ...region.holes]) {
    const n = ring.length;
    for (let i = 0; i < n; i++) {
      const d = pointToSegmentDistance(p, ring[i]!, ring[(i + 1) % n]!);
      if (d < best) best = d;
    }
  }
  return best;
}
