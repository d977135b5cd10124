import type { Point, Ring } from '../geometry/index.js';

/**
 * A closed ring parametrised by arc length s ∈ [0, perimeter), counter-clockwise from vertex 0, mm. Lets the span
 * finder cut and walk a boundary by length rather than by vertex.
 */
export interface RingWalk {
  readonly ring: Ring;
  /** cumulative[i] = arc length at vertex i; cumulative[n] = perimeter. */
  readonly cumulative: readonly number[];
  readonly perimeterMm: number;
}

/** The arc-length walk of a ring: cumulative edge lengths from vertex 0, mm. */
export function makeRingWalk(ring: Ring): RingWalk {
  const cumulative = [0];
  let s = 0;
  for (let i = 0; i < ring.length; i++) {
    const a = ring[i]!;
    const b = ring[(i + 1) % ring.length]!;
    s += Math.hypot(b[0] - a[0], b[1] - a[1]);
    cumulative.push(s);
  }
  return { ring, cumulative, perimeterMm: s };
}

/** Wraps an arc length into [0, perimeter). */
export function wrapArc(walk: RingWalk, s: number): number {
  const p = walk.perimeterMm;
  const w = s % p;
  return w < 0 ? w + p : w;
}

/** Edge index holding arc length s (s wrapped first). */
export function edgeAt(walk: RingWalk, s: number): number {
  const w = wrapArc(walk, s);
  let lo = 0;
  let hi = walk.ring.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (walk.cumulative[mid]! <= w) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/** The point at arc length s. */
export function pointAtArc(walk: RingWalk, s: number): Point {
  const w = wrapArc(walk, s);
  const i = edgeAt(walk, w);
  const a = walk.ring[i]!;
  const b = walk.ring[(i + 1) % walk.ring.length]!;
  const len = walk.cumulative[i + 1]! - walk.cumulative[i]!;
  const t = len > 0 ? (w - walk.cumulative[i]!) / len : 0;
  return [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
}

/**
 * The open polyline from arc length `from` to `to`, counter-clockwise, wrapping through vertex 0 when `to` < `from`;
 * both cut points included, interior vertices kept.
 */
export function subpathCcw(walk: RingWalk, from: number, to: number): Point[] {
  const p = walk.perimeterMm;
  const start = wrapArc(walk, from);
  let length = wrapArc(walk, to) - start;
  if (length <= 0) length += p;
  const out: Point[] = [pointAtArc(walk, start)];
  const n = walk.ring.length;
  // vertices strictly inside (start, start + length), walking forward
  const firstEdge = edgeAt(walk, start);
  for (let k = 1; k <= n; k++) {
    const vi = (firstEdge + k) % n;
    let sv = walk.cumulative[vi]!;
    if (sv <= start) sv += p;
    if (sv >= start + length) break;
    out.push(walk.ring[vi]!);
  }
  out.push(pointAtArc(walk, start + length));
  return out;
}

/** Arc lengths every `stepMm` or closer along each edge, vertices included, mm. */
export function sampleArcs(walk: RingWalk, stepMm: number): number[] {
  const samples: number[] = [];
  for (let i = 0; i < walk.ring.length; i++) {
    const s0 = walk.cumulative[i]!;
    const s1 = walk.cumulative[i + 1]!;
    const pieces = Math.max(1, Math.ceil((s1 - s0) / stepMm));
    for (let k = 0; k < pieces; k++) samples.push(s0 + ((s1 - s0) * k) / pieces);
  }
  return samples;
}
