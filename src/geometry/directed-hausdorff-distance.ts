import type { Point, Polyline } from './types.js';

/** A polyline or ring taking part in a Hausdorff distance. */
export interface BoundaryPath {
  readonly points: Polyline;
  /** True for a ring: the closing segment from the last point back to the first belongs to it. */
  readonly closed: boolean;
}

/** The farthest a point of one boundary gets from another boundary. */
export interface DirectedHausdorff {
  /** sup over points p of the first boundary of dist(p, second boundary), mm, to within the requested error. */
  readonly distance: number;
  /** The point of the first boundary where that distance is reached, mm. */
  readonly from: Point;
  /** The point of the second boundary nearest `from`, mm. */
  readonly to: Point;
}

/** Default bound on the Hausdorff error, mm (0.1 µm, the clipper grid). */
export const DEFAULT_HAUSDORFF_ERROR_MM = 1e-4;

/** Flattened segments of a boundary set: [ax, ay, bx, by] per segment; lone points as zero-length segments. */
function flatten(paths: readonly BoundaryPath[]): Float64Array {
  const out: number[] = [];
  for (const { points, closed } of paths) {
    const n = points.length;
    if (n === 1) out.push(points[0]![0], points[0]![1], points[0]![0], points[0]![1]);
    const segments = closed && n > 2 ? n : n - 1;
    for (let i = 0; i < segments; i++) {
      const a = points[i]!;
      const b = points[(i + 1) % n]!;
      out.push(a[0], a[1], b[0], b[1]);
    }
  }
  return Float64Array.from(out);
}

/** A point of the first boundary with its squared distance to each of a set of segments of the second. */
interface Probe {
  readonly x: number;
  readonly y: number;
  /** The segments measured against ([ax, ay, bx, by] each): all of the second boundary, or the few that can matter. */
  readonly segs: Float64Array;
  /** Squared distance to each of those segments, mm². */
  readonly d2: Float64Array;
  /** Distance to the second boundary (the nearest segment), mm. */
  readonly f: number;
}

function probe(x: number, y: number, segs: Float64Array): Probe {
  const d2 = new Float64Array(segs.length / 4);
  let best = Number.POSITIVE_INFINITY;
  for (let k = 0, j = 0; k < segs.length; k += 4, j++) {
    const e2 = pointSegmentDistance2(x, y, segs[k]!, segs[k + 1]!, segs[k + 2]!, segs[k + 3]!);
    d2[j] = e2;
    if (e2 < best) best = e2;
  }
  return { x, y, segs, d2, f: Math.sqrt(best) };
}

function pointSegmentDistance2(x: number, y: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  const len2 = dx * dx + dy * dy;
  const t = len2 > 0 ? Math.min(Math.max(((x - ax) * dx + (y - ay) * dy) / len2, 0), 1) : 0;
  const ex = ax + t * dx - x;
  const ey = ay + t * dy - y;
  return ex * ex + ey * ey;
}

/** Squared distance between segments p–q and a–b (zero when they cross), mm². */
function segmentDistance2(p: Probe, q: Probe, segs: Float64Array, k: number): number {
  const ax = segs[k]!;
  const ay = segs[k + 1]!;
  const bx = segs[k + 2]!;
  const by = segs[k + 3]!;
  const side = (ox: number, oy: number, ux: number, uy: number, vx: number, vy: number): number =>
    (ux - ox) * (vy - oy) - (uy - oy) * (vx - ox);
  const d1 = side(p.x, p.y, q.x, q.y, ax, ay);
  const d2 = side(p.x, p.y, q.x, q.y, bx, by);
  const d3 = side(ax, ay, bx, by, p.x, p.y);
  const d4 = side(ax, ay, bx, by, q.x, q.y);
  if (d1 * d2 < 0 && d3 * d4 < 0) return 0;
  return Math.min(
    pointSegmentDistance2(p.x, p.y, ax, ay, bx, by),
    pointSegmentDistance2(q.x, q.y, ax, ay, bx, by),
    pointSegmentDistance2(ax, ay, p.x, p.y, q.x, q.y),
    pointSegmentDistance2(bx, by, p.x, p.y, q.x, q.y),
  );
}

/** The point of the second boundary nearest a probe. */
function nearestPoint(p: Probe): Point {
  let j = 0;
  for (let i = 1; i < p.d2.length; i++) if (p.d2[i]! < p.d2[j]!) j = i;
  const k = 4 * j;
  const ax = p.segs[k]!;
  const ay = p.segs[k + 1]!;
  const dx = p.segs[k + 2]! - ax;
  const dy = p.segs[k + 3]! - ay;
  const len2 = dx * dx + dy * dy;
  const t = len2 > 0 ? Math.min(Math.max(((p.x - ax) * dx + (p.y - ay) * dy) / len2, 0), 1) : 0;
  return [ax + t * dx, ay + t * dy];
}

/**
 * min over segments j of max(d_j(p)², d_j(q)²), mm²: since each d_j is convex along a line, no point of p–q is farther
 * than this from the second boundary. Exact where the piece runs parallel to its nearest segment.
 */
function convexBound2(p: Probe, q: Probe): number {
  let bound = Number.POSITIVE_INFINITY;
  for (let j = 0; j < p.d2.length; j++) {
    const m = Math.max(p.d2[j]!, q.d2[j]!);
    if (m < bound) bound = m;
  }
  return bound;
}

/** An upper bound on the distance to the second boundary anywhere on p–q, mm: the convex bound or the Lipschitz one. */
function upperBound(p: Probe, q: Probe): number {
  const lipschitz = (p.f + q.f + Math.hypot(q.x - p.x, q.y - p.y)) / 2;
  return Math.min(Math.sqrt(convexBound2(p, q)), lipschitz);
}

/**
 * The same two probes measured against only the segments of the second boundary that can be nearest to some point of
 * p–q: those no farther from the piece than the piece's upper bound `u2` (squared). The nearest segment of every
 * point of the piece is among them, so distances and bounds are unchanged, only cheaper.
 */
function restrict(p: Probe, q: Probe, u2: number): [Probe, Probe] {
  const keep: number[] = [];
  for (let k = 0, j = 0; k < p.segs.length; k += 4, j++) if (segmentDistance2(p, q, p.segs, k) <= u2) keep.push(j);
  const segs = new Float64Array(4 * keep.length);
  const dp = new Float64Array(keep.length);
  const dq = new Float64Array(keep.length);
  keep.forEach((j, i) => {
    segs.set(p.segs.subarray(4 * j, 4 * j + 4), 4 * i);
    dp[i] = p.d2[j]!;
    dq[i] = q.d2[j]!;
  });
  return [
    { x: p.x, y: p.y, segs, d2: dp, f: p.f },
    { x: q.x, y: q.y, segs, d2: dq, f: q.f },
  ];
}

/**
 * The directed Hausdorff distance from boundary set `a` to boundary set `b`, mm: the largest distance from any point
 * of `a` (vertices and every point along its segments) to the nearest point of `b`.
 *
 * The farthest point need not be a vertex of `a` (it may lie where two segments of `b` are equally near), so segments
 * of `a` are subdivided adaptively, branch and bound. On a piece p–q, the distance to each segment of `b` is convex, so
 * it cannot exceed min over segments of the larger end value; and the distance to `b` is 1-Lipschitz, so it cannot
 * exceed (f(p) + f(q) + |pq|)/2. Pieces whose bound is within `maxErrorMm` of the best value found are dropped, so the
 * result satisfies `distance ≤ exact ≤ distance + maxErrorMm` (plus floating-point round-off), and `from`/`to`
 * realise `distance` exactly. The convex bound settles stretches that run parallel to `b` (offset curves) at once;
 * where the farthest point lies between two equally near segments, the work grows as log(length/maxErrorMm). Cost
 * O(|a|·|b|) for the vertices, then each subdivision measures only the few segments of `b` that can be nearest.
 *
 * @param maxErrorMm Largest amount by which the result may fall short of the exact distance, mm.
 *   @default DEFAULT_HAUSDORFF_ERROR_MM (1e-4)
 * @throws RangeError when either set has no points or `maxErrorMm` is not positive.
 */
export function directedHausdorffDistance(
  a: readonly BoundaryPath[],
  b: readonly BoundaryPath[],
  maxErrorMm: number = DEFAULT_HAUSDORFF_ERROR_MM,
): DirectedHausdorff {
  if (!(maxErrorMm > 0)) throw new RangeError('directedHausdorffDistance: maxErrorMm must be positive');
  const segsB = flatten(b);
  const segsA = flatten(a);
  if (segsA.length === 0 || segsB.length === 0) {
    throw new RangeError('directedHausdorffDistance: both boundaries need at least one point');
  }
  let best: Probe | undefined;
  const look = (x: number, y: number, segs: Float64Array): Probe => {
    const p = probe(x, y, segs);
    if (best === undefined || p.f > best.f) best = p;
    return p;
  };
  // Vertices first, so the bound has a good lower value before any subdivision.
  const ends: [Probe, Probe][] = [];
  for (let k = 0; k < segsA.length; k += 4) {
    ends.push([look(segsA[k]!, segsA[k + 1]!, segsB), look(segsA[k + 2]!, segsA[k + 3]!, segsB)]);
  }
  const stack: [Probe, Probe][] = [];
  for (const [p, q] of ends) {
    const u2 = convexBound2(p, q);
    if (upperBound(p, q) <= best!.f + maxErrorMm) continue;
    // Allow for round-off in the segment distances, so no segment that can be nearest is dropped.
    stack.push(restrict(p, q, u2 * (1 + 1e-9) + 1e-18));
    while (stack.length > 0) {
      const [a0, a1] = stack.pop()!;
      if (upperBound(a0, a1) <= best!.f + maxErrorMm) continue;
      const m = look((a0.x + a1.x) / 2, (a0.y + a1.y) / 2, a0.segs);
      stack.push([a0, m], [m, a1]);
    }
  }
  return { distance: best!.f, from: [best!.x, best!.y], to: nearestPoint(best!) };
}
