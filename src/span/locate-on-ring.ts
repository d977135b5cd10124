import type { Point } from '../geometry/index.js';
import type { RingWalk } from './ring-walk.js';

/** Where a point falls on a ring: the closest boundary point, its arc length and its distance from the point. */
export interface RingLocation {
  /** Arc length of the closest boundary point, counter-clockwise from vertex 0, mm. */
  readonly arcMm: number;
  /** The closest boundary point, mm. */
  readonly point: Point;
  /** Distance from the query point to `point`, mm. */
  readonly distanceMm: number;
}

/** The boundary point of a ring closest to `p`, by projection onto every edge (O(n)); the first of equals wins. */
export function locateOnRing(walk: RingWalk, p: Point): RingLocation {
  let best: RingLocation = { arcMm: 0, point: walk.ring[0]!, distanceMm: Number.POSITIVE_INFINITY };
  const ring = walk.ring;
  for (let i = 0; i < ring.length; i++) {
    const a = ring[i]!;
    const b = ring[(i + 1) % ring.length]!;
    const dx = b[0] - a[0];
    const dy = b[1] - a[1];
    const len2 = dx * dx + dy * dy;
    const t = len2 > 0 ? Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2)) : 0;
    const q: Point = [a[0] + t * dx, a[1] + t * dy];
    const d = Math.hypot(q[0] - p[0], q[1] - p[1]);
    if (d < best.distanceMm) best = { arcMm: walk.cumulative[i]! + t * Math.sqrt(len2), point: q, distanceMm: d };
  }
  return best;
}
