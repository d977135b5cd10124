import type { Point, Polyline } from './types.js';

/** A point found by its distance along a polyline. */
export interface ArcLengthPoint {
  /** The point, mm. */
  readonly point: Point;
  /** Unit tangent of the segment holding the point, in the direction of travel. [1, 0] when that segment has no
   * length. */
  readonly tangent: Point;
  /** Index of that segment: segment i runs from vertex i to vertex i + 1 (to vertex 0 for a ring's closing segment). */
  readonly segment: number;
  /** Position along that segment: 0 at its start, 1 at its end. */
  readonly t: number;
}

/**
 * The point at arc length `s` (mm from the first vertex, along the polyline) with its unit tangent. An open polyline
 * clamps `s` to [0, length]; a ring (`closed`) wraps it modulo the perimeter, so any finite `s` is accepted. A vertex
 * shared by two segments belongs to the later one.
 *
 * @param closed Treat the polyline as a ring. @default false
 * @throws RangeError when `s` is not finite or the polyline has fewer than two points.
 */
export function pointAtArcLength(polyline: Polyline, s: number, closed = false): ArcLengthPoint {
  const n = polyline.length;
  if (!Number.isFinite(s)) throw new RangeError('pointAtArcLength: s must be finite');
  if (n < 2) throw new RangeError('pointAtArcLength: the polyline needs at least two points');
  const segments = closed && n > 2 ? n : n - 1;
  const lengths: number[] = [];
  let total = 0;
  for (let i = 0; i < segments; i++) {
    const a = polyline[i]!;
    const b = polyline[(i + 1) % n]!;
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    lengths.push(len);
    total += len;
  }
  let rest = closed ? ((s % total) + total) % total : Math.min(Math.max(s, 0), total);
  for (let i = 0; i < segments; i++) {
    const len = lengths[i]!;
    // The last segment takes whatever round-off leaves over.
    if (rest < len || i === segments - 1) {
      const a = polyline[i]!;
      const b = polyline[(i + 1) % n]!;
      const t = len > 0 ? Math.min(rest / len, 1) : 0;
      const tangent: Point = len > 0 ? [(b[0] - a[0]) / len, (b[1] - a[1]) / len] : [1, 0];
      return { point: [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])], tangent, segment: i, t };
    }
    rest -= len;
  }
  throw new Error('pointAtArcLength: unreachable');
}
