import { boundingBox } from './bounding-box.js';
import { pointInRegion } from './point-in-region.js';
import type { Point, Region } from './types.js';

/** A normalised region with the turn at each vertex, prepared once for the thin-wall search (internal). */
export interface PreparedWallRegion {
  /** The region, outer ring CCW and holes CW, so the material is on the left of every ring. */
  readonly region: Region;
  /** Rings in order: outer, then holes. */
  readonly rings: readonly (readonly Point[])[];
  /** Signed exterior angle at each vertex of each ring, radians: positive at convex corners of the material. */
  readonly turns: readonly (readonly number[])[];
}

/** Prepares a normalised region (outer CCW, holes CW) for `isCornerSliver`. */
export function prepareWallRegion(region: Region): PreparedWallRegion {
  const rings = [region.outer, ...region.holes];
  const turns = rings.map((ring) => {
    const n = ring.length;
    return ring.map((b, i) => {
      const a = ring[(i - 1 + n) % n]!;
      const c = ring[(i + 1) % n]!;
      const ux = b[0] - a[0];
      const uy = b[1] - a[1];
      const vx = c[0] - b[0];
      const vy = c[1] - b[1];
      return Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy);
    });
  });
  return { region, rings, turns };
}

function lineIntersection(p: Point, d: Point, q: Point, e: Point): Point | undefined {
  const den = d[0] * e[1] - d[1] * e[0];
  if (!(Math.abs(den) > 1e-12 * Math.hypot(...d) * Math.hypot(...e))) return undefined;
  const s = ((q[0] - p[0]) * e[1] - (q[1] - p[1]) * e[0]) / den;
  return [p[0] + s * d[0], p[1] + s * d[1]];
}

/**
 * Whether a residue piece of `region − opening(region, 2r)` is only the sliver a disc of radius r cannot reach in a
 * sharp convex corner, rather than a thin wall.
 *
 * A disc of radius r set into a corner of interior angle α touches both edges at r·cot(α/2) from the apex, so the
 * unreachable sliver lies within that distance of the apex. The piece is a corner when the region's vertices it holds
 * (within `nearMm`) are one unbroken run of convex vertices on one ring, turning by less than π in all, and every point
 * of the piece lies within r·cot(α/2) + `slackMm` of the run's apex. A run of one vertex is a sharp corner. A longer
 * run is a rounded or chamfered corner, with its apex where the edges either side of it meet, only when every edge
 * inside it is at most `detailMm` long (a polygonal fillet, a small chamfer); a longer edge is an end face, such as the
 * end of a strip, and the piece is a real wall. A run turning through π or more (the rounded tip of a fin) is a wall.
 */
export function isCornerSliver(
  piece: Region,
  prepared: PreparedWallRegion,
  r: number,
  nearMm: number,
  slackMm: number,
  detailMm: number,
): boolean {
  const box = boundingBox(piece.outer);
  const tol = { lengthMm: nearMm, angleRad: 0, residual: 0 };
  let ringIndex = -1;
  const held: number[] = [];
  for (let k = 0; k < prepared.rings.length; k++) {
    const ring = prepared.rings[k]!;
    for (let i = 0; i < ring.length; i++) {
      const [x, y] = ring[i]!;
      if (x < box.minX - nearMm || x > box.maxX + nearMm || y < box.minY - nearMm || y > box.maxY + nearMm) continue;
      if (pointInRegion(ring[i]!, piece, tol) === 'outside') continue;
      if (ringIndex !== -1 && ringIndex !== k) return false;
      ringIndex = k;
      held.push(i);
    }
  }
  if (ringIndex < 0) return false;
  const ring = prepared.rings[ringIndex]!;
  const turns = prepared.turns[ringIndex]!;
  const n = ring.length;
  if (held.length >= n) return false;
  let turn = 0;
  for (const i of held) {
    if (!(turns[i]! > 0)) return false;
    turn += turns[i]!;
  }
  const alpha = Math.PI - turn;
  if (!(alpha > 1e-9)) return false;
  // The run is unbroken when exactly one held vertex has a predecessor that is not held.
  const isHeld = new Set(held);
  const starts = held.filter((i) => !isHeld.has((i - 1 + n) % n));
  if (starts.length !== 1) return false;
  const first = starts[0]!;
  const last = (first + held.length - 1) % n;
  let apex: Point | undefined = ring[first]!;
  if (held.length > 1) {
    // Short edges (a fillet, a chamfer, a finely drawn curve beside a sharp vertex) only round off a corner; a long
    // edge inside the run is an end face, the end of a wall. The test does not depend on r, so a piece that is a real wall
    // at one opening stays one at larger openings, which the bisection in measureMinWall relies on.
    for (let k = 1; k < held.length; k++) {
      const i = (first + k) % n;
      const p = ring[(i - 1 + n) % n]!;
      if (Math.hypot(ring[i]![0] - p[0], ring[i]![1] - p[1]) > detailMm) return false;
    }
    const a = ring[(first - 1 + n) % n]!;
    const b = ring[first]!;
    const c = ring[last]!;
    const d = ring[(last + 1) % n]!;
    apex = lineIntersection(a, [b[0] - a[0], b[1] - a[1]], c, [d[0] - c[0], d[1] - c[1]]);
  }
  if (apex === undefined) return false;
  const reach = r / Math.tan(alpha / 2) + slackMm;
  for (const ringOfPiece of [piece.outer, ...piece.holes]) {
    for (const p of ringOfPiece) if (Math.hypot(p[0] - apex[0], p[1] - apex[1]) > reach) return false;
  }
  return true;
}
