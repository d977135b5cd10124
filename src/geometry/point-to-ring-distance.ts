import { pointToSegmentDistance } from './point-to-segment-distance.js';
import type { Point, Ring } from './types.js';

/**
 * Euclidean distance from `p` to the nearest edge of a closed ring (closing edge included), mm; +∞ for an empty ring.
 * An edge is measured only when its bounding box lies nearer than the best distance so far (the distance to a segment
 * is at least the distance to its bounding box), so a dense ring costs a few comparisons per far edge.
 */
export function pointToRingDistance(p: Point, ring: Ring): number {
  const [px, py] = p;
  let best = Number.POSITIVE_INFINITY;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const a = ring[j]!;
    const b = ring[i]!;
    const gx = Math.max(Math.min(a[0], b[0]) - px, 0, px - Math.max(a[0], b[0]));
    const gy = Math.max(Math.min(a[1], b[1]) - py, 0, py - Math.max(a[1], b[1]));
    if (gx * gx + gy * gy >= best * best) continue;
    best = Math.min(best, pointToSegmentDistance(p, a, b));
  }
  return best;
}
