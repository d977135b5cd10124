import { type Point, pointInRegion, pointToSegmentDistance, type Region } from '../geometry/index.js';
import { DEFAULT_TOLERANCES } from '../numeric/index.js';

/**
 * Clearance between the segment a–b (a link's centre line) and a region (an orifice), mm: 0 when the segment enters
 * the region or crosses its boundary, else the shortest distance between them.
 */
export function segmentClearance(a: Point, b: Point, region: Region): number {
  if (pointInRegion(a, region, DEFAULT_TOLERANCES) !== 'outside') return 0;
  let best = Number.POSITIVE_INFINITY;
  for (const ring of [region.outer, ...region.holes]) {
    for (let k = 0; k < ring.length; k++) {
      const p = ring[k]!;
      const q = ring[(k + 1) % ring.length]!;
      if (segmentsCross(a, b, p, q)) return 0;
      best = Math.min(
        best,
        pointToSegmentDistance(p, a, b),
        pointToSegmentDistance(a, p, q),
        pointToSegmentDistance(b, p, q),
      );
    }
  }
  return best;
}

function segmentsCross(a: Point, b: Point, p: Point, q: Point): boolean {
  const d1 = cross(p, q, a);
  const d2 = cross(p, q, b);
  const d3 = cross(a, b, p);
  const d4 = cross(a, b, q);
  // proper crossings only: touching and collinear overlaps have distance 0 and are caught by the caller's minimum
  return d1 * d2 < 0 && d3 * d4 < 0;
}

function cross(o: Point, a: Point, b: Point): number {
  return (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
}
