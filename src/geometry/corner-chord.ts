import type { SegmentGrid } from './segment-grid.js';

/** Per ring of a gridded region: the first segment index, the count, the turn at each vertex and the arc length up to
 * each vertex (internal to the wall measurement). */
export interface RingTurns {
  readonly first: readonly number[];
  readonly count: readonly number[];
  /** Signed exterior angle at vertex i (the start of segment i), radians; positive at convex corners of the material. */
  readonly turn: Float64Array;
  /** Arc length from the ring's first vertex to vertex i, mm. */
  readonly along: Float64Array;
  /** Perimeter of each ring, mm. */
  readonly perimeter: readonly number[];
}

/** Turns and arc lengths of every ring of a gridded region (material on the left of every segment). */
export function ringTurns(grid: SegmentGrid): RingTurns {
  const n = grid.ax.length;
  const turn = new Float64Array(n);
  const along = new Float64Array(n);
  const first: number[] = [];
  const count: number[] = [];
  const perimeter: number[] = [];
  for (let s = 0; s < n; s++) {
    if (s === 0 || grid.ring[s] !== grid.ring[s - 1]) {
      first.push(s);
      count.push(0);
      perimeter.push(0);
    }
    const r = first.length - 1;
    count[r]!++;
    along[s] = perimeter[r]!;
    perimeter[r]! += Math.hypot(grid.bx[s]! - grid.ax[s]!, grid.by[s]! - grid.ay[s]!);
  }
  for (let r = 0; r < first.length; r++) {
    const f = first[r]!;
    const m = count[r]!;
    for (let k = 0; k < m; k++) {
      const s = f + k;
      const p = f + ((k - 1 + m) % m);
      const ux = grid.bx[p]! - grid.ax[p]!;
      const uy = grid.by[p]! - grid.ay[p]!;
      const vx = grid.bx[s]! - grid.ax[s]!;
      const vy = grid.by[s]! - grid.ay[s]!;
      turn[s] = Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy);
    }
  }
  return { first, count, turn, along, perimeter };
}

/**
 * Whether the chord from a point on segment `sp` at fraction `up` to a point on segment `sq` at fraction `uq` spans
 * only a corner, not a wall: both ends on one ring, and the shorter way along the ring between them turns at one corner
 * only, while elsewhere it turns by less than `straightRad` in all. A corner is a single convex vertex (a sharp corner,
 * whatever its angle), or a run of convex vertices joined by edges no longer than `detailMm` (a fillet or chamfer)
 * that turns by less than π − `facingRad`. A run turning further (the rounded tip of a fin) ends a wall: chords round it
 * are walls. Two corners on the way (the two ends of a strip's end face) make a wall too.
 *
 * Reference: the corner-sliver rule of the morphological method (`findThinWalls`), restated for chords: a disc or
 * calliper set into one corner measures the corner, not a wall (docs/MODEL.md §3).
 */
export function isCornerChord(
  grid: SegmentGrid,
  turns: RingTurns,
  sp: number,
  up: number,
  sq: number,
  uq: number,
  facingRad: number,
  detailMm: number,
  straightRad: number,
): boolean {
  const ring = grid.ring[sp]!;
  if (grid.ring[sq] !== ring) return false;
  const f = turns.first[ring]!;
  const m = turns.count[ring]!;
  const per = turns.perimeter[ring]!;
  const len = (s: number): number => Math.hypot(grid.bx[s]! - grid.ax[s]!, grid.by[s]! - grid.ay[s]!);
  const posP = turns.along[sp]! + up * len(sp);
  const posQ = turns.along[sq]! + uq * len(sq);
  const forward = (((posQ - posP) % per) + per) % per;
  // Walk the vertices strictly between the two ends, the shorter way round.
  const step = forward <= per - forward ? 1 : -1;
  // A chord end sitting on a vertex (a reflex vertex's fan, or a hit on a segment's start) does not pass it.
  let k = step > 0 ? (sp - f + 1) % m : up > 0 ? sp - f : (sp - f - 1 + m) % m;
  const end = step > 0 ? (uq > 0 ? (sq - f + 1) % m : sq - f) : sq - f;
  let corners = 0;
  let inRun = false;
  let runTurn = 0;
  let runLength = 0;
  let other = 0;
  for (let guard = 0; guard < m && k !== end; guard++) {
    const s = f + k;
    const t = turns.turn[s]!;
    // The edge joining this vertex to the previous one on the way.
    const joining = step > 0 ? f + ((k - 1 + m) % m) : s;
    if (t > 1e-9) {
      if (!(inRun && len(joining) <= detailMm)) {
        corners++;
        runTurn = 0;
        runLength = 0;
        if (corners > 1) return false;
      }
      inRun = true;
      runTurn += t;
      runLength++;
      // A sharp vertex is a corner whatever its angle; a rounded run turning this far is the tip of a fin.
      if (runLength > 1 && runTurn >= Math.PI - facingRad) return false;
    } else {
      inRun = false;
      other += Math.abs(t);
      if (other >= straightRad) return false;
    }
    k = (((k + step) % m) + m) % m;
  }
  return corners === 1;
}
