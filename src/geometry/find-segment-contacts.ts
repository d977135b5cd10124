import type { Point } from './types.js';

/** A segment tagged with where it came from (internal to the geometry folder). */
export interface TaggedSegment {
  readonly a: Point;
  readonly b: Point;
  /** Which ring the segment belongs to: -1 for the outer ring, otherwise the hole index. */
  readonly ring: number;
  /** Edge index within that ring, in the caller's numbering. */
  readonly edge: number;
}

/** Where two segments meet. */
export interface SegmentContact {
  /** The crossing point, or the midpoint of the nearest pair of points when the segments only touch, mm. */
  readonly point: Point;
  /** True when the segments cross properly (each passes from one side of the other to the other). */
  readonly proper: boolean;
}

function cross(o: Point, a: Point, b: Point): number {
  return (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
}

function nearest(p: Point, a: Point, b: Point): { readonly d: number; readonly q: Point } {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len2 = dx * dx + dy * dy;
  let t = len2 > 0 ? ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2 : 0;
  t = Math.min(Math.max(t, 0), 1);
  const q: Point = [a[0] + t * dx, a[1] + t * dy];
  return { d: Math.hypot(p[0] - q[0], p[1] - q[1]), q };
}

/**
 * Whether segments p0–p1 and q0–q1 cross, or come within `eps` mm of each other; `undefined` when they stay apart.
 */
export function segmentContact(p0: Point, p1: Point, q0: Point, q1: Point, eps: number): SegmentContact | undefined {
  const d1 = cross(p0, p1, q0);
  const d2 = cross(p0, p1, q1);
  const d3 = cross(q0, q1, p0);
  const d4 = cross(q0, q1, p1);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) {
    const s = d3 / (d3 - d4);
    return { point: [p0[0] + s * (p1[0] - p0[0]), p0[1] + s * (p1[1] - p0[1])], proper: true };
  }
  let best: { d: number; from: Point; to: Point } | undefined;
  for (const [p, a, b] of [
    [p0, q0, q1],
    [p1, q0, q1],
    [q0, p0, p1],
    [q1, p0, p1],
  ] as const) {
    const n = nearest(p, a, b);
    if (best === undefined || n.d < best.d) best = { d: n.d, from: p, to: n.q };
  }
  if (best === undefined || best.d > eps) return undefined;
  return { point: [(best.from[0] + best.to[0]) / 2, (best.from[1] + best.to[1]) / 2], proper: false };
}

/**
 * Calls `visit(i, j)` (i < j in sweep order, not index order) for every pair of segments whose bounding boxes, grown
 * by `eps`, overlap: a sort-and-sweep along x, O(n log n + pairs) for ordinary profiles, O(n²) at worst.
 */
export function forEachNearbySegmentPair(
  segments: readonly TaggedSegment[],
  eps: number,
  visit: (i: number, j: number) => void,
): void {
  const n = segments.length;
  const minX = new Float64Array(n);
  const maxX = new Float64Array(n);
  const minY = new Float64Array(n);
  const maxY = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = segments[i]!;
    minX[i] = Math.min(s.a[0], s.b[0]);
    maxX[i] = Math.max(s.a[0], s.b[0]);
    minY[i] = Math.min(s.a[1], s.b[1]);
    maxY[i] = Math.max(s.a[1], s.b[1]);
  }
  const order = Array.from({ length: n }, (_, i) => i).sort((i, j) => minX[i]! - minX[j]!);
  let active: number[] = [];
  for (const i of order) {
    const x0 = minX[i]! - eps;
    active = active.filter((j) => maxX[j]! >= x0);
    for (const j of active) {
      if (minY[i]! - eps <= maxY[j]! && minY[j]! - eps <= maxY[i]!) visit(j, i);
    }
    active.push(i);
  }
}
