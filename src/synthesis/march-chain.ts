import type { Point, Polyline } from '../geometry/index.js';

/** Arc-length bookkeeping of an open polyline, mm. */
interface Walk {
  readonly points: Polyline;
  readonly cumulative: readonly number[];
  readonly length: number;
}

function makeWalk(points: Polyline): Walk {
  const cumulative = [0];
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1]!;
    const b = points[i]!;
    cumulative.push(cumulative[i - 1]! + Math.hypot(b[0] - a[0], b[1] - a[1]));
  }
  return { points, cumulative, length: cumulative[cumulative.length - 1]! };
}

function pointAt(w: Walk, s: number): Point {
  const c = w.cumulative;
  let i = 1;
  while (i < c.length - 1 && c[i]! < s) i++;
  const a = w.points[i - 1]!;
  const b = w.points[i]!;
  const seg = c[i]! - c[i - 1]!;
  const t = seg > 0 ? Math.min(1, Math.max(0, (s - c[i - 1]!) / seg)) : 0;
  return [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
}

/**
 * The first arc length s' > s where the polyline is `chord` mm (straight-line) from the point at s, or null when the
 * rest of the polyline stays closer.
 */
function chordAhead(w: Walk, s: number, chord: number): number | null {
  const p = pointAt(w, s);
  const c = w.cumulative;
  let i = 1;
  while (i < c.length && c[i]! <= s) i++;
  let prev = s;
  for (; i < c.length; i++) {
    const b = w.points[i]!;
    if (Math.hypot(b[0] - p[0], b[1] - p[1]) >= chord) {
      // solve |a + t(b − a) − p| = chord on this segment for the smallest t ≥ 0 past `prev`
      const a = pointAt(w, prev);
      const dx = b[0] - a[0];
      const dy = b[1] - a[1];
      const fx = a[0] - p[0];
      const fy = a[1] - p[1];
      const qa = dx * dx + dy * dy;
      const qb = 2 * (fx * dx + fy * dy);
      const qc = fx * fx + fy * fy - chord * chord;
      const disc = Math.max(0, qb * qb - 4 * qa * qc);
      const t = qa > 0 ? (-qb + Math.sqrt(disc)) / (2 * qa) : 0;
      return prev + Math.max(0, Math.min(1, t)) * Math.sqrt(qa);
    }
    prev = c[i]!;
  }
  return null;
}

/** Largest distance of the polyline between arc lengths s0 and s1 from the chord joining their points, mm. */
function chordDeviation(w: Walk, s0: number, s1: number): number {
  const a = pointAt(w, s0);
  const b = pointAt(w, s1);
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len = Math.hypot(dx, dy);
  if (len === 0) return 0;
  let worst = 0;
  for (let i = 0; i < w.points.length; i++) {
    const s = w.cumulative[i]!;
    if (s <= s0 || s >= s1) continue;
    const p = w.points[i]!;
    worst = Math.max(worst, Math.abs((p[0] - a[0]) * dy - (p[1] - a[1]) * dx) / len);
  }
  return worst;
}

export interface MarchResult {
  /** Pivot-to-pivot lengths found, mm; the last plate closes onto each line's end and differs per station. */
  readonly lengthsMm: readonly number[];
  /** pivots[i][k] on station i's pivot line, mm. */
  readonly pivots: readonly (readonly Point[])[];
}

/**
 * Greedy marching: from the start of every station's pivot line, take the longest chord that every station's line
 * follows within `toleranceMm` (binary search between `minLengthMm` and the rest of the line), step all stations by
 * that chord, and repeat until the lines end. Gives a plate count and lengths to start the least-squares refinement;
 * pivots sit at the same chord distances in every station, as rigid plates require.
 */
export function marchChain(
  lines: readonly Polyline[],
  toleranceMm: number,
  minLengthMm: number,
  maxPlates: number,
): MarchResult {
  const walks = lines.map(makeWalk);
  let at = walks.map(() => 0);
  const lengths: number[] = [];
  const pivots: Point[][] = walks.map((w) => [pointAt(w, 0)]);
  while (lengths.length < maxPlates) {
    const remaining = Math.min(...walks.map((w, i) => Math.hypot(...diff(pointAt(w, w.length), pointAt(w, at[i]!)))));
    const fits = (chord: number): number[] | null => {
      const next: number[] = [];
      for (let i = 0; i < walks.length; i++) {
        const s = chordAhead(walks[i]!, at[i]!, chord);
        if (s === null || chordDeviation(walks[i]!, at[i]!, s) > toleranceMm) return null;
        next.push(s);
      }
      return next;
    };
    if (fits(remaining) !== null || remaining <= minLengthMm) {
      // the rest closes in one plate (its length differs a little per station; the refinement settles it)
      const last = walks.map((w, i) => Math.hypot(...diff(pointAt(w, w.length), pointAt(w, at[i]!))));
      lengths.push(last.reduce((a, b) => a + b, 0) / last.length);
      walks.forEach((w, i) => {
        pivots[i]!.push(pointAt(w, w.length));
      });
      break;
    }
    let lo = minLengthMm;
    let hi = remaining;
    let best = fits(lo) ?? walks.map((w, i) => chordAhead(w, at[i]!, lo) ?? w.length);
    for (let k = 0; k < 30 && hi - lo > 1e-3; k++) {
      const mid = (lo + hi) / 2;
      const next = fits(mid);
      if (next) {
        lo = mid;
        best = next;
      } else hi = mid;
    }
    lengths.push(lo);
    at = best;
    walks.forEach((w, i) => {
      pivots[i]!.push(pointAt(w, at[i]!));
    });
  }
  return { lengthsMm: lengths, pivots };
}

/** Pivots at equal arc-length fractions of each line: the simplest start for a given plate count. */
export function equalArcPivots(lines: readonly Polyline[], plateCount: number): Point[][] {
  return lines.map((line) => {
    const w = makeWalk(line);
    const out: Point[] = [];
    for (let k = 0; k <= plateCount; k++) out.push(pointAt(w, (w.length * k) / plateCount));
    return out;
  });
}

function diff(a: Point, b: Point): [number, number] {
  return [a[0] - b[0], a[1] - b[1]];
}
