import {
  differenceRegions,
  intersectRegions,
  normalizeRegion,
  type Point,
  type Polyline,
  type Region,
  regionsArea,
  unionRegions,
} from '../geometry/index.js';
import { DEFAULT_TOLERANCES } from '../numeric/index.js';

/**
 * The die body's fixed opening: the die-body part of a station's boundary (walked clockwise from the span's end back
 * to its start) with its two end walls carried on straight, away from the melt, by `reachMm`, and closed there. The
 * plates cover whatever of it is not orifice. Walls are continued along the direction of their last `wallSampleMm`.
 */
export function dieOpening(fixed: Polyline, reachMm: number, wallSampleMm = 1.0): Region {
  const n = fixed.length;
  const startDir = directionOver(fixed, n - 1, -1, wallSampleMm);
  const endDir = directionOver(fixed, 0, +1, wallSampleMm);
  const start = fixed[n - 1]!;
  const end = fixed[0]!;
  const ring: Point[] = [
    ...fixed,
    [start[0] + startDir[0] * reachMm, start[1] + startDir[1] * reachMm],
    [end[0] - endDir[0] * reachMm, end[1] - endDir[1] * reachMm],
  ];
  // the ring may touch itself where walls converge: a union cleans it into simple rings
  const cleaned = unionRegions([normalizeRegion({ outer: ring, holes: [] }, DEFAULT_TOLERANCES)]);
  return cleaned.reduce((a, b) => (regionsArea([b]) > regionsArea([a]) ? b : a));
}

/**
 * Unit direction of the polyline at vertex `at`, measured over `sample` mm of it: `step` −1 looks backward (arriving
 * direction), +1 forward (leaving direction).
 */
function directionOver(line: Polyline, at: number, step: 1 | -1, sample: number): Point {
  const p = line[at]!;
  let q = p;
  let walked = 0;
  for (let i = at + step; i >= 0 && i < line.length; i += step) {
    const r = line[i]!;
    walked += Math.hypot(r[0] - q[0], r[1] - q[1]);
    q = r;
    if (walked >= sample) break;
  }
  const dx = step === -1 ? p[0] - q[0] : q[0] - p[0];
  const dy = step === -1 ? p[1] - q[1] : q[1] - p[1];
  const len = Math.hypot(dx, dy);
  return len > 0 ? [dx / len, dy / len] : [0, 1];
}

/**
 * The orifice a set of plates leaves: opening − union(plates), keeping the piece that overlaps the target most (pieces
 * cut off behind the plates are steel, not melt channel), less the station's holes (a mandrel). Empty outer ring when
 * the plates close the orifice completely.
 */
export function achievedOrifice(opening: Region, plates: readonly Region[], target: Region): Region {
  const open = differenceRegions([opening], unionRegions(plates));
  let best: Region | null = null;
  let bestArea = 0;
  for (const piece of open) {
    const overlap = regionsArea(intersectRegions([piece], [{ outer: target.outer, holes: [] }]));
    if (overlap > bestArea) {
      bestArea = overlap;
      best = piece;
    }
  }
  if (!best) return { outer: [], holes: [] };
  if (target.holes.length === 0) return best;
  const withHoles = differenceRegions(
    [best],
    target.holes.map((h) => ({ outer: [...h].reverse(), holes: [] })),
  );
  return withHoles.reduce((a, b) => (regionsArea([b]) > regionsArea([a]) ? b : a), withHoles[0] ?? best);
}
