import type { Point, Polyline } from './types.js';

/** The point of a polyline or ring nearest a query point. */
export interface PolylineProjection {
  /** Distance from the query point to the polyline, mm. */
  readonly distance: number;
  /** The nearest point on the polyline, mm. */
  readonly point: Point;
  /** Index of the segment holding `point`: segment i runs from vertex i to vertex i + 1 (to vertex 0 for the closing
   * segment of a ring). */
  readonly segment: number;
  /** Position of `point` along that segment: 0 at its start, 1 at its end. */
  readonly t: number;
}

/**
 * The point of a polyline nearest `point`, mm, by projecting onto every segment (O(n)). With `closed` the polyline is
 * a ring and the closing segment from the last vertex back to the first counts too. A single-point polyline is that
 * point (segment 0, t 0). The first of equally near segments wins.
 *
 * @param closed Treat the polyline as a ring. @default false
 * @throws RangeError when the polyline has no points.
 */
export function closestPointOnPolyline(point: Point, polyline: Polyline, closed = false): PolylineProjection {
  const n = polyline.length;
  if (n === 0) throw new RangeError('closestPointOnPolyline: the polyline has no points');
  const [px, py] = point;
  const first = polyline[0]!;
  let best: PolylineProjection = {
    distance: Math.hypot(px - first[0], py - first[1]),
    point: first,
    segment: 0,
    t: 0,
  };
  const segments = closed && n > 2 ? n : n - 1;
  let bestD2 = best.distance * best.distance;
  for (let i = 0; i < segments; i++) {
    const a = polyline[i]!;
    const b = polyline[(i + 1) % n]!;
    const dx = b[0] - a[0];
    const dy = b[1] - a[1];
    const len2 = dx * dx + dy * dy;
    let t = len2 > 0 ? ((px - a[0]) * dx + (py - a[1]) * dy) / len2 : 0;
    t = Math.min(Math.max(t, 0), 1);
    const qx = a[0] + t * dx;
    const qy = a[1] + t * dy;
    const d2 = (px - qx) * (px - qx) + (py - qy) * (py - qy);
    if (d2 < bestD2) {
      bestD2 = d2;
      best = { distance: Math.sqrt(d2), point: [qx, qy], segment: i, t };
    }
  }
  return best;
}
