import type { Point, Polyline, Region } from '../geometry/index.js';
import { relabelRuns } from './boundary-run.js';
import { findCommonRuns } from './find-common-runs.js';
import { isCrossing } from './is-crossing.js';
import { locateOnRing } from './locate-on-ring.js';
import { makeRingWalk, pointAtArc, type RingWalk, sampleArcs, subpathCcw, wrapArc } from './ring-walk.js';
import { runAlongWall } from './run-along-wall.js';
import { isNearBoundary, makeSegmentGrid } from './segment-grid.js';
import { wallClearance } from './wall-clearance.js';
import { wallDeparture } from './wall-departure.js';
import { wallLineAt } from './wall-line.js';

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

/** Span ends in the die-body frame, mm: the span is walked clockwise (melt on the right) from `start` to `end`. */
export interface SpanEnds {
  readonly start: Point;
  readonly end: Point;
}

export type MovingSpanResult =
  | {
      readonly status: 'found';
      readonly spans: readonly MovingSpan[];
      /**
       * With explicit ends only: the first place where a station differs from station 0 outside its span, more than
       * max(1 mm, 10 × tolerance) of arc from the span's ends, mm; null when the die-body parts agree.
       */
      readonly differsOutside: { readonly station: number; readonly at: Point } | null;
    }
  | { readonly status: 'unknown'; readonly reason: string }
  | {
      readonly status: 'unreconciled';
      readonly station: number;
      readonly at: Point;
      readonly message: string;
      /** The explicit ends the service would suggest (round the longest common die-body wall), or null. */
      readonly suggestedEnds: SpanEnds | null;
    };

export interface MovingSpanOptions {
  /** Two boundaries closer than this are the same die-body wall, mm. */
  readonly matchToleranceMm: number;
  /** Explicit ends: the closest boundary point of each station to each; null to find the span automatically. */
  readonly ends: SpanEnds | null;
}

interface ArcInterval {
  /** Counter-clockwise start, mm of arc. */
  readonly from: number;
  /** Counter-clockwise end, mm of arc. */
  readonly to: number;
}

/**
 * Splits every station's outer boundary into the die-body part and the moving span the plates form.
 *
 * Automatic: station 0's boundary is split into runs that lie within the match tolerance of every station's boundary
 * (common) and runs that do not. Differing runs shorter than max(0.2 mm, 4·tolerance) are noise; common runs shorter
 * than max(1 mm, 10·tolerance) are too short to hold a plate end. A common run where the boundaries meet at an angle
 * (see `isCrossing`) is a crossing, not wall: the span runs through it. What is left common is die-body wall; the
 * span is the one stretch outside the longest wall, mapped onto every station through its closest boundary points,
 * and each end slides along a straight die-body wall that no station's melt lies beyond. Two separate walls with
 * motion between them cannot be reconciled; the answer then suggests explicit ends. Cost grows linearly with the
 * number of stations (each is compared with station 0 and located once).
 *
 * Explicit: the span in every station runs clockwise from its boundary point closest to `ends.start` to the one
 * closest to `ends.end`, whatever the stations do in between; a difference outside it is reported, not refused.
 * Holes are left to the die body (a mandrel): they must not change.
 *
 * @throws RangeError with no stations or a tolerance that is not positive.
 */
export function findMovingSpans(orifices: readonly Region[], options: MovingSpanOptions): MovingSpanResult {
  const tol = options.matchToleranceMm;
  if (orifices.length === 0) throw new RangeError('findMovingSpans: no stations');
  if (!(tol > 0)) throw new RangeError(`findMovingSpans: matchToleranceMm must be positive, got ${tol}`);
  if (orifices.length < 2 && options.ends === null) {
    return {
      status: 'unknown',
      reason: 'With a single station the moving span cannot be told from the die body; give moving_span.start and end.',
    };
  }
  const holeProblem = findChangedHole(orifices, tol);
  if (holeProblem) return holeProblem;
  const walks = orifices.map((o) => makeRingWalk(o.outer));
  return options.ends ? spansBetweenEnds(walks, options.ends, tol) : spansRoundWall(orifices, walks, tol);
}

function spansBetweenEnds(walks: readonly RingWalk[], ends: SpanEnds, tol: number): MovingSpanResult {
  const regions = walks.map((walk) => ({
    from: locateOnRing(walk, ends.end).arcMm,
    to: locateOnRing(walk, ends.start).arcMm,
  }));
  const spans = walks.map((walk, i) => {
    const region = regions[i]!;
    const raw = wrapArc(walk, region.to - region.from);
    // start and end on the same point: the whole ring moves
    return makeSpan(walk, region, raw < tol / 1000 ? walk.perimeterMm : raw, { start: 0, end: 0 });
  });
  return { status: 'found', spans, differsOutside: findDifferenceOutside(walks, regions, tol) };
}

function spansRoundWall(orifices: readonly Region[], walks: readonly RingWalk[], tol: number): MovingSpanResult {
  const minFixedRun = Math.max(1.0, 10 * tol);
  const minMovingRun = Math.max(0.2, 4 * tol);
  const ref = walks[0]!;
  const others = orifices.slice(1).map((o) => makeSegmentGrid(o.outer, tol));
  let runs = findCommonRuns(ref, others, tol);
  runs = relabelRuns(ref, runs, (r) => !r.common && r.length < minMovingRun);
  runs = relabelRuns(ref, runs, (r) => r.common && r.length < minFixedRun);
  if (runs.every((r) => r.common)) {
    return {
      status: 'unknown',
      reason:
        'Every station has the same orifice within the match tolerance: nothing moves, so there is no moving span.',
    };
  }
  runs = relabelRuns(ref, runs, (r) => r.common && isCrossing(ref, r, others, tol));
  const walls = runs.filter((r) => r.common);
  if (walls.length === 0) {
    return {
      status: 'unreconciled',
      station: 0,
      at: ref.ring[0]!,
      message: `The stations share no die-body wall: no stretch of boundary lies on all of them, in the same place and direction, within the match tolerance of ${tol} mm. Check that every station is drawn in the same die-body frame (raise moving_span.match_tolerance_mm if the die body is drawn less precisely than that in some stations), or give moving_span.start and end where the plates meet the die body.`,
      suggestedEnds: null,
    };
  }
  const longest = walls.reduce((a, b) => (b.length > a.length ? b : a));
  // the wall proper ends where the stations part, not where they have parted by the whole tolerance
  const wallFrom = wallDeparture(ref, longest.from, 1, others, tol, longest.length / 2);
  const wallTo = wallDeparture(ref, longest.from + longest.length, -1, others, tol, longest.length / 2);
  const wall = { from: wrapArc(ref, wallFrom), length: wallTo - wallFrom };
  const suggestedEnds = { start: pointAtArc(ref, wall.from), end: pointAtArc(ref, wall.from + wall.length) };
  const suggestion = `give moving_span.start ${fmtPoint(suggestedEnds.start)} and end ${fmtPoint(suggestedEnds.end)} (the span round the longest wall common to all stations)`;
  if (walls.length > 1) {
    const places = runs.filter((r) => !r.common).map((r) => pointAtArc(ref, r.from + r.length / 2));
    return {
      status: 'unreconciled',
      station: 0,
      at: places[0]!,
      message: `The stations differ from each other in ${places.length} separate places (near ${places
        .slice(0, 2)
        .map(fmtPlace)
        .join(
          ' and ',
        )} mm) with die-body wall common to all of them between; one chain of plates can form only one contiguous span. If the plates are to form everything between, ${suggestion}; otherwise check that the fixed part of the profile is drawn the same in every station.`,
      suggestedEnds,
    };
  }
  const regions: ArcInterval[] = walks.map((walk, i) =>
    i === 0
      ? { from: wrapArc(ref, wall.from + wall.length), to: wall.from }
      : { from: locateOnRing(walk, suggestedEnds.end).arcMm, to: locateOnRing(walk, suggestedEnds.start).arcMm },
  );
  const lengths = walks.map((walk, i) => wrapArc(walk, regions[i]!.to - regions[i]!.from));
  const forward = slideEnds(
    walks,
    regions.map((r) => r.from),
    lengths,
    1,
    orifices,
    tol,
  );
  const backward = slideEnds(
    walks,
    regions.map((r) => r.to),
    lengths.map((l, i) => l - forward[i]!),
    -1,
    orifices,
    tol,
  );
  const spans: MovingSpan[] = [];
  for (let i = 0; i < walks.length; i++) {
    const walk = walks[i]!;
    const slid = snapToVertices(
      walk,
      { from: regions[i]!.from + forward[i]!, to: regions[i]!.to - backward[i]! },
      3 * tol,
    );
    const lengthMm = wrapArc(walk, slid.to - slid.from);
    if (lengthMm < minMovingRun) {
      const at = pointAtArc(walk, slid.from);
      return {
        status: 'unreconciled',
        station: i,
        at,
        message: `Station ${i}'s moving span shrinks to nothing near ${fmtPlace(at)} mm once its ends follow the die-body walls; ${suggestion}.`,
        suggestedEnds,
      };
    }
    spans.push(makeSpan(walk, slid, lengthMm, { start: backward[i]!, end: forward[i]! }));
  }
  return { status: 'found', spans, differsOutside: null };
}

/**
 * How far each station's span end slides along the straight die-body wall it sits on, mm: as far as the station's
 * own boundary stays on the wall line, and no further than any station's melt lies just beyond that line.
 */
function slideEnds(
  walks: readonly RingWalk[],
  arcs: readonly number[],
  available: readonly number[],
  dir: 1 | -1,
  orifices: readonly Region[],
  tol: number,
): number[] {
  const lines = walks.map((walk, i) => wallLineAt(walk, arcs[i]!, dir, tol));
  const own = walks.map((walk, i) => {
    const line = lines[i];
    return line ? runAlongWall(walk, arcs[i]!, dir, line, available[i]!, tol) : 0;
  });
  let lead = 0;
  for (let i = 1; i < own.length; i++) if (own[i]! > own[lead]!) lead = i;
  const line = lines[lead];
  if (!line || !(own[lead]! > 0)) return own.map(() => 0);
  // one clearance for every station: their lines agree within the match tolerance, which the 3·tol probe covers
  const clear = wallClearance(line, orifices, 3 * tol, own[lead]! + 1);
  return own.map((run, i) => {
    const o = lines[i]?.origin ?? line.origin;
    const offset = (o[0] - line.origin[0]) * line.along[0] + (o[1] - line.origin[1]) * line.along[1];
    return Math.max(0, Math.min(run, clear - offset));
  });
}

function makeSpan(
  walk: RingWalk,
  region: ArcInterval,
  lengthMm: number,
  slideMm: { start: number; end: number },
): MovingSpan {
  const path = [...subpathCcw(walk, region.from, region.to)].reverse();
  const fixed = [...subpathCcw(walk, region.to, region.from)].reverse();
  return { path, start: path[0]!, end: path[path.length - 1]!, lengthMm, fixed, slideMm };
}

/**
 * The first point of a station's die-body part (outside its span, away from the span's ends) that is not on station
 * 0's boundary; each station is compared with station 0 only, so the cost grows linearly.
 */
function findDifferenceOutside(
  walks: readonly RingWalk[],
  regions: readonly ArcInterval[],
  tol: number,
): { station: number; at: Point } | null {
  if (walks.length < 2) return null;
  const margin = Math.max(1.0, 10 * tol);
  const reference = makeSegmentGrid(walks[0]!.ring, tol);
  for (let i = 1; i < walks.length; i++) {
    const walk = walks[i]!;
    const { from, to } = regions[i]!;
    const fixedLength = wrapArc(walk, from - to);
    for (const s of sampleArcs(walk, Math.max(tol, Math.min(0.25, walk.perimeterMm / 4000)))) {
      const into = wrapArc(walk, s - to);
      if (into < margin || into > fixedLength - margin) continue;
      const p = pointAtArc(walk, s);
      if (!isNearBoundary(reference, p, tol)) return { station: i, at: p };
    }
  }
  return null;
}

/** Holes belong to the die body: each must appear, unchanged within tolerance, in every station. */
function findChangedHole(orifices: readonly Region[], tol: number): MovingSpanResult | null {
  const reference = orifices[0]!;
  const grids = reference.holes.map((h) => makeSegmentGrid(h, tol));
  for (let i = 1; i < orifices.length; i++) {
    const holes = orifices[i]!.holes;
    if (holes.length !== reference.holes.length) {
      const at = (holes[0] ?? reference.holes[0])![0]!;
      return {
        status: 'unreconciled',
        station: i,
        at,
        message: `Station ${i} has ${holes.length} hole(s) where station 0 has ${reference.holes.length}: holes are held by the die body and cannot change along the product.`,
        suggestedEnds: null,
      };
    }
    for (const hole of holes) {
      const stray = hole.find((p) => !grids.some((g) => isNearBoundary(g, p, tol)));
      if (stray) {
        return {
          status: 'unreconciled',
          station: i,
          at: stray,
          message: `A hole of station ${i} differs from station 0 near ${fmtPlace(stray)} mm: the plates form only the outer boundary, so holes must stay the same in every station.`,
          suggestedEnds: null,
        };
      }
    }
  }
  return null;
}

/** Moves each span end onto the nearest ring vertex within `reach` mm of arc, so spans end on drawn corners. */
function snapToVertices(walk: RingWalk, span: ArcInterval, reach: number): ArcInterval {
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
  return { from: snap(span.from), to: snap(span.to) };
}

/** A place in a sentence: (x, y). */
function fmtPlace(p: Point): string {
  return `(${fmt(p[0])}, ${fmt(p[1])})`;
}

/** A point as it is written in the request: [x, y]. */
function fmtPoint(p: Point): string {
  return `[${fmt(p[0])}, ${fmt(p[1])}]`;
}

function fmt(x: number): string {
  return String(Math.round(x * 100) / 100);
}
