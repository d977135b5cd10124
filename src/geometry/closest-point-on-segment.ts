import type { Point } from './types.js';

/** The point of a segment nearest a query point. */
export interface SegmentProjection {
  /** Distance from the query point to the segment, mm. */
  readonly distance: number;
  /** The nearest point on the segment, mm. */
  readonly point: Point;
  /** Position of `point` along the segment: 0 at `a`, 1 at `b`. */
  readonly t: number;
}

/**
 * The point of segment `a`–`b` nearest `p` (orthogonal projection clamped to the segment), mm. A segment whose ends
 * coincide is treated as the point `a` (t = 0).
 */
export function closestPointOnSegment(p: Point, a: Point, b: Point): SegmentProjection {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len2 = dx * dx + dy * dy;
  let t = len2 > 0 ? ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2 : 0;
  t = Math.min(Math.max(t, 0), 1);
  const point: Point = [a[0] + t * dx, a[1] + t * dy];
  return { distance: Math.hypot(p[0] - point[0], p[1] - point[1]), point, t };
}
