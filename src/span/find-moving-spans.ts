import { type Point, type Polyline, pointInRegion, type Region } from '../geometry/index.js';
import { DEFAULT_TOLERANCES } from '../numeric/index.js';
import { makeRingWalk, pointAtArc, type RingWalk, subpathCcw, wrapArc } from './ring-walk.js';
import { isNearBoundary, makeSegmentGrid, type SegmentGrid } from './segment-grid.js';

/** The part of one station's outer boundary that the plates form. */
export interface MovingSpan {
  /** The moving part walked clockwise: melt on the right, plates on the left, mm. */
  readonly path: Polyline;
  /** First point of `path` (where the walk leaves the die body). */
  readonly start: Point;
  /** Last point of `path`. */
  readonly end: Point;
  readonly lengthMm: number;
  /** The die-body part walked clockwise from `end` back to `start`, mm. */
  readonly fixed: Polyline;
  /** How far each end slid along a straight die-body wall beyond the part common to all stations, mm. */
  readonly slideMm: { readonly start: number; readonly end: number };
}

export type MovingSpanResult =
  | { readonly status: 'found'; readonly spans: readonly MovingSpan[] }
  | { readonly status: 'unknown'; readonly reason: string }
  | {
      readonly status: 'unreconciled';
      readonly station: number;
      readonly at: Point;
      readonly message: string;
    };

export interface MovingSpanOptions {
  /** Two boundaries closer than this are the same die-body wall, mm. */
  readonly matchToleranceMm: number;
  /** Explicit ends: the closest boundary point of each station to each; null to find the span automatically. */
  readonly ends: { readonly start: Point; readonly end: Point } | null;
}

interface Run {
  readonly from: number;
  readonly to: number;
  readonly fixed: boolean;
}

/**
 * Splits every station's outer boundary into the die-body part (the same lines and arcs in every station) and the
 * moving span the plates form. A boundary point belongs to the die body when it lies within the match tolerance of
 * every other station's boundary; each station must then change along one contiguous span. Where the plates meet a
 * straight die-body wall at a different place per station, the span's end slides along that wall: the wall is
 * recognised as the continuation of the common part's last straight edge that no station's melt crosses.
 *
 * Runs shorter than max(1 mm, 10·tolerance) of common boundary inside a span are crossings, not die body; changes
 * shorter than max(0.2 mm, 4·tolerance) are noise. Holes are left to the die body (a mandrel): they must not change.
 */
export function findMovingSpans(orifices: readonly Region[], options: MovingSpanOptions): MovingSpanResult {
  const tol = options.matchToleranceMm;
  const minFixedRun = Math.max(1.0, 10 * tol);
  const minMovingRun = Math.max(0.2, 4 * tol);
  if (orifices.length < 2 && options.ends === null) {
    return {
      status: 'unknown',
      reason: 'With a single station the moving span cannot be told from the die body; give moving_span.start and end.',
    };
  }
  const holeProblem = findChangedHole(orifices, tol);
  if (holeProblem) return holeProblem;

  const walks = orifices.map((o) => makeRingWalk(o.outer));
  const grids = orifices.map((o) => makeSegmentGrid(o.outer, tol));
  const runsPerStation = walks.map((walk, i) => classifyBoundary(walk, i, grids, tol));

  const spans: MovingSpan[] = [];
  let identical = 0;
  for (let i = 0; i < orifices.length; i++) {
    const walk = walks[i]!;
    const runs = runsPerStation[i]!;
    let region: { from: number; to: number };
    if (options.ends) {
      const chosen = spanFromEnds(walk, runs, options.ends, orifices.length > 1);
      const stray = runs.find((r) => !r.fixed && length(walk, r) >= minMovingRun && !inside(walk, r, chosen));
      if (stray) {
        const at = pointAtArc(walk, r50(walk, stray));
        return {
          status: 'unreconciled',
          station: i,
          at,
          message: `Outside the given moving span, station ${i} differs from the other stations near (${fmt(at[0])}, ${fmt(at[1])}) mm: the die body cannot hold that part. Move moving_span.start or end so the span covers it.`,
        };
      }
      region = chosen;
    } else {
      const found = spanFromRuns(walk, runs, i, minFixedRun, minMovingRun);
      if ('status' in found) {
        if (found.status === 'identical') {
          identical++;
          continue;
        }
        return found;
      }
      region = found;
    }
    const slid = snapToVertices(walk, slideAlongWalls(walk, region, i, orifices, tol), 3 * tol);
    const spanLength = wrapArc(walk, slid.to - slid.from) || walk.perimeterMm;
    if (spanLength < minMovingRun) {
      const at = pointAtArc(walk, slid.from);
      return {
        status: 'unreconciled',
        station: i,
        at,
        message: `Station ${i}'s moving span shrinks to nothing near (${fmt(at[0])}, ${fmt(at[1])}) mm once its ends follow the die-body walls.`,
      };
    }
    const ccw = subpathCcw(walk, slid.from, slid.to);
    const path = [...ccw].reverse();
    const fixed = [...subpathCcw(walk, slid.to, slid.from)].reverse();
    spans.push({
      path,
      start: path[0]!,
      end: path[path.length - 1]!,
      lengthMm: spanLength,
      fixed,
      slideMm: { start: slid.slideEnd, end: slid.slideStart },
    });
  }
  if (identical > 0) {
    return {
      status: 'unknown',
      reason:
        'Every station has the same orifice within the match tolerance: nothing moves, so there is no moving span.',
    };
  }
  return { status: 'found', spans };
}

/** Holes belong to the die body: each must appear, unchanged within tolerance, in every station. */
function findChangedHole(orifices: readonly Region[], tol: number): MovingSpanResult | null {
  const reference = orifices[0]!;
  for (let i = 1; i < orifices.length; i++) {
    const holes = orifices[i]!.holes;
    if (holes.length !== reference.holes.length) {
      const at = (holes[0] ?? reference.holes[0])![0]!;
      return {
        status: 'unreconciled',
        station: i,
        at,
        message: `Station ${i} has ${holes.length} hole(s) where station 0 has ${reference.holes.length}: holes are held by the die body and cannot change along the product.`,
      };
    }
    const grids = reference.holes.map((h) => makeSegmentGrid(h, tol));
    for (const hole of holes) {
      const stray = hole.find((p) => !grids.some((g) => isNearBoundary(g, p, tol)));
      if (stray) {
        return {
          status: 'unreconciled',
          station: i,
          at: stray,
          message: `A hole of station ${i} differs from station 0 near (${fmt(stray[0])}, ${fmt(stray[1])}) mm: the plates form only the outer boundary, so holes must stay the same in every station.`,
        };
      }
    }
  }
  return null;
}

/** Marks the boundary as runs that lie on every other station's boundary (fixed) or not (moving). */
function classifyBoundary(walk: RingWalk, self: number, grids: readonly SegmentGrid[], tol: number): Run[] {
  const others = grids.filter((_, j) => j !== self);
  const isFixed = (s: number): boolean => {
    const p = pointAtArc(walk, s);
    return others.every((g) => isNearBoundary(g, p, tol));
  };
  const step = Math.max(tol, Math.min(0.25, walk.perimeterMm / 4000));
  const samples: number[] = [];
  for (let i = 0; i < walk.ring.length; i++) {
    const s0 = walk.cumulative[i]!;
    const s1 = walk.cumulative[i + 1]!;
    const pieces = Math.max(1, Math.ceil((s1 - s0) / step));
    for (let k = 0; k < pieces; k++) samples.push(s0 + ((s1 - s0) * k) / pieces);
  }
  const flags = samples.map(isFixed);
  const n = samples.length;
  const changesAt = (k: number) => flags[k] !== flags[(k + n - 1) % n];
  const first = flags.findIndex((_, k) => changesAt(k));
  if (first < 0) return [{ from: 0, to: walk.perimeterMm, fixed: flags[0]! }];
  // the arc length where the flag changes between sample k-1 and sample k
  const transition = (k: number) => {
    const a = samples[(k + n - 1) % n]!;
    let b = samples[k]!;
    if (b < a) b += walk.perimeterMm;
    return wrapArc(walk, refineTransition(a, b, flags[(k + n - 1) % n]!, isFixed, tol));
  };
  const runs: Run[] = [];
  let from = transition(first);
  for (let offset = 1; offset <= n; offset++) {
    const k = (first + offset) % n;
    if (!changesAt(k)) continue;
    const to = transition(k);
    runs.push({ from, to, fixed: flags[(k + n - 1) % n]! });
    from = to;
  }
  return runs;
}

/** Bisection for the arc length where the fixed/moving flag changes between a and b. */
function refineTransition(a: number, b: number, flagAtA: boolean, isFixed: (s: number) => boolean, tol: number) {
  let lo = a;
  let hi = b;
  for (let k = 0; k < 40 && hi - lo > tol / 20; k++) {
    const mid = (lo + hi) / 2;
    if (isFixed(mid) === flagAtA) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

function length(walk: RingWalk, r: { from: number; to: number }): number {
  const d = r.to - r.from;
  return d >= 0 ? d : d + walk.perimeterMm;
}

function r50(walk: RingWalk, r: { from: number; to: number }): number {
  return r.from + length(walk, r) / 2;
}

/** True when run r lies inside the CCW interval [from, to]. */
function inside(walk: RingWalk, r: Run, span: { from: number; to: number }): boolean {
  const spanLength = length(walk, span);
  const a = wrapArc(walk, r.from - span.from);
  return a + length(walk, r) <= spanLength + 1e-9;
}

function spanFromRuns(
  walk: RingWalk,
  runs: readonly Run[],
  station: number,
  minFixedRun: number,
  minMovingRun: number,
): { from: number; to: number } | { status: 'identical' } | MovingSpanResult {
  const significantFixed = runs.filter((r) => r.fixed && length(walk, r) >= minFixedRun);
  const significantMoving = runs.filter((r) => !r.fixed && length(walk, r) >= minMovingRun);
  if (significantMoving.length === 0) return { status: 'identical' };
  if (significantFixed.length === 0) {
    const at = walk.ring[0]!;
    return {
      status: 'unreconciled',
      station,
      at,
      message: `Station ${station} shares no die-body wall with the other stations: no part of its boundary lies on all of theirs within the match tolerance. Check that every station is drawn in the same die-body frame.`,
    };
  }
  // gaps between consecutive significant fixed runs, in CCW order
  const sorted = [...significantFixed].sort((a, b) => a.from - b.from);
  const gaps = sorted.map((f, k) => ({ from: wrapArc(walk, f.to), to: sorted[(k + 1) % sorted.length]!.from }));
  const withMotion = gaps.filter((g) => significantMoving.some((m) => inside(walk, m, g)));
  if (withMotion.length !== 1) {
    const places = withMotion
      .slice(0, 2)
      .map((g) => pointAtArc(walk, r50(walk, g)))
      .map((p) => `(${fmt(p[0])}, ${fmt(p[1])})`);
    return {
      status: 'unreconciled',
      station,
      at: pointAtArc(walk, r50(walk, withMotion[0] ?? gaps[0]!)),
      message: `Station ${station} differs from the other stations in ${withMotion.length} separate places (near ${places.join(' and ')} mm) with die-body wall between them; one chain of plates can form only one contiguous span. Check that the fixed part of the profile is drawn the same in every station.`,
    };
  }
  return withMotion[0]!;
}

function spanFromEnds(
  walk: RingWalk,
  runs: readonly Run[],
  ends: { start: Point; end: Point },
  useMotion: boolean,
): { from: number; to: number } {
  const sStart = closestArc(walk, ends.start);
  const sEnd = closestArc(walk, ends.end);
  // the span walked clockwise from start to end is the CCW interval [end, start]
  const clockwise = { from: sEnd, to: sStart };
  if (!useMotion) return clockwise;
  const other = { from: sStart, to: sEnd };
  const moving = (g: { from: number; to: number }) =>
    runs.filter((r) => !r.fixed && inside(walk, r, g)).reduce((sum, r) => sum + length(walk, r), 0);
  return moving(other) > moving(clockwise) ? other : clockwise;
}

function closestArc(walk: RingWalk, p: Point): number {
  let best = Number.POSITIVE_INFINITY;
  let bestS = 0;
  const ring = walk.ring;
  for (let i = 0; i < ring.length; i++) {
    const a = ring[i]!;
    const b = ring[(i + 1) % ring.length]!;
    const dx = b[0] - a[0];
    const dy = b[1] - a[1];
    const len2 = dx * dx + dy * dy;
    const t = len2 > 0 ? Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2)) : 0;
    const d = Math.hypot(a[0] + t * dx - p[0], a[1] + t * dy - p[1]);
    if (d < best) {
      best = d;
      bestS = walk.cumulative[i]! + t * Math.sqrt(len2);
    }
  }
  return bestS;
}

/**
 * Moves the span's ends along straight die-body walls: from each end, while the span continues on the carrier line of
 * the die-body edge it leaves, and no station's melt lies just beyond that line, the boundary there is wall.
 */
function slideAlongWalls(
  walk: RingWalk,
  span: { from: number; to: number },
  self: number,
  orifices: readonly Region[],
  tol: number,
): { from: number; to: number; slideStart: number; slideEnd: number } {
  const spanLength = length(walk, span);
  const forward = slideOneEnd(walk, span.from, spanLength, +1, self, orifices, tol);
  const backward = slideOneEnd(walk, span.to, spanLength - forward, -1, self, orifices, tol);
  return { from: span.from + forward, to: span.to - backward, slideStart: forward, slideEnd: backward };
}

function slideOneEnd(
  walk: RingWalk,
  s0: number,
  available: number,
  dir: 1 | -1,
  self: number,
  orifices: readonly Region[],
  tol: number,
): number {
  const back = Math.min(1.0, walk.perimeterMm / 100);
  const p0 = pointAtArc(walk, s0);
  const q = pointAtArc(walk, s0 - dir * back);
  const dx = p0[0] - q[0];
  const dy = p0[1] - q[1];
  const len = Math.hypot(dx, dy);
  if (len < tol) return 0;
  const ux = dx / len;
  const uy = dy / len;
  // the die-body edge must itself be straight over `back`
  const mid = pointAtArc(walk, s0 - (dir * back) / 2);
  if (Math.abs((mid[0] - q[0]) * uy - (mid[1] - q[1]) * ux) > tol) return 0;
  // outward normal: CCW ring has the melt on the left of travel; walking backwards flips it
  const nx = dir * uy;
  const ny = dir * -ux;
  const probe = 3 * tol;
  // true while the boundary `d` mm past the end still runs on the wall line with no melt beyond it
  const onWall = (d: number, lastAlong: number): { ok: boolean; along: number } => {
    const p = pointAtArc(walk, s0 + dir * d);
    const along = (p[0] - p0[0]) * ux + (p[1] - p0[1]) * uy;
    const across = (p[0] - p0[0]) * uy - (p[1] - p0[1]) * ux;
    if (Math.abs(across) > tol || along <= lastAlong) return { ok: false, along };
    const beyond: Point = [p[0] + nx * probe, p[1] + ny * probe];
    return {
      ok: !orifices.some((o, j) => j !== self && pointInRegion(beyond, o, DEFAULT_TOLERANCES) === 'inside'),
      along,
    };
  };
  const step = Math.max(tol, 0.05);
  let slid = 0;
  let lastAlong = 0;
  while (slid < available) {
    const next = Math.min(available, slid + step);
    const probeResult = onWall(next, lastAlong);
    if (!probeResult.ok) {
      // the wall ends inside this step: bisect for where
      let lo = slid;
      let hi = next;
      for (let k = 0; k < 30 && hi - lo > tol / 20; k++) {
        const mid = (lo + hi) / 2;
        if (onWall(mid, 0).ok) lo = mid;
        else hi = mid;
      }
      return lo;
    }
    slid = next;
    lastAlong = probeResult.along;
  }
  return slid;
}

/** Moves each span end onto the nearest ring vertex within `reach` mm of arc, so spans end on drawn corners. */
function snapToVertices<T extends { from: number; to: number }>(walk: RingWalk, span: T, reach: number): T {
  const snap = (s: number): number => {
    let best = s;
    let bestGap = reach;
    for (const v of walk.cumulative) {
      const gap = Math.abs(wrapArc(walk, s - v + walk.perimeterMm / 2) - walk.perimeterMm / 2);
      if (gap <= bestGap) {
        bestGap = gap;
        best = v;
      }
    }
    return best;
  };
  return { ...span, from: snap(span.from), to: snap(span.to) };
}

function fmt(x: number): string {
  return String(Math.round(x * 100) / 100);
}
