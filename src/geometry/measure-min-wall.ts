import type { Tolerances } from '../numeric/index.js';
import { closestPointOnPolyline } from './closest-point-on-polyline.js';
import { type PreparedWallRegion, prepareWallRegion } from './corner-sliver.js';
import { type ThinWall, thinWallPieces } from './find-thin-walls.js';
import { type InscribedCircle, maxInscribedCircle } from './max-inscribed-circle.js';
import { normalizeRegion } from './normalize-region.js';
import { interiorPoint } from './interior-point.js';
import type { Point, Region } from './types.js';
import { resolveWallOptions, type WallOptions } from './wall-options.js';

/** The thinnest wall of a region and where it is. */
export interface MinWall {
  /** The smallest opening diameter at which a thin-wall piece appears, mm: the thinnest wall. */
  readonly minWallMm: number;
  /** A point in the middle of the thinnest wall, mm: halfway across the wall, through the largest thin-wall piece
   * found at the bracket's upper end. */
  readonly at: Point;
}

/** Bisection for the thinnest wall on a prepared region whose largest inscribed circle is known (internal). */
export function minWallOfPrepared(
  prepared: PreparedWallRegion,
  circle: InscribedCircle,
  tol: Tolerances,
  o: WallOptions,
): MinWall {
  let lo = 0;
  // No disc of this diameter fits anywhere, so the whole region is residue: every wall is thin.
  let hi = 2 * circle.upperBoundMm;
  let pieces: ThinWall[] | undefined;
  // Uniform walls (tubes, strips) are thinnest where they are thickest: one probe just below the largest inscribed
  // diameter settles them in one or two steps instead of a full bisection.
  const probe = 2 * circle.radiusMm - o.wallResolutionMm;
  if (probe > lo && probe < hi) {
    const found = thinWallPieces(prepared, probe, o);
    if (found.length > 0) {
      hi = probe;
      pieces = found;
    } else {
      lo = probe;
    }
  }
  while (hi - lo > o.wallResolutionMm) {
    const mid = (lo + hi) / 2;
    const found = thinWallPieces(prepared, mid, o);
    if (found.length > 0) {
      hi = mid;
      pieces = found;
    } else {
      lo = mid;
    }
  }
  pieces ??= thinWallPieces(prepared, hi, o);
  const piece = pieces[0];
  const at = piece === undefined ? prepared.region.outer[0]! : middleOfWall(piece, prepared.region, hi, tol);
  return { minWallMm: (lo + hi) / 2, at };
}

/**
 * A point in the middle of a thin wall of thickness under `wallMm`: from a point inside the piece (`interiorPoint`),
 * step to the nearest boundary point of the region, cross the wall along the line back through the start point (the
 * inward normal when the start is on the boundary) to the far side, and take the middle of that crossing. Falls back to
 * the start point when the crossing is longer than `wallMm` (the piece is the end of a wall, thin in another direction)
 * or finds no far side.
 */
function middleOfWall(piece: ThinWall, region: Region, wallMm: number, tol: Tolerances): Point {
  const start = interiorPoint(piece.region);
  let near: { distance: number; point: Point; a: Point; b: Point } | undefined;
  for (const ring of [region.outer, ...region.holes]) {
    const hit = closestPointOnPolyline(start, ring, true);
    if (near === undefined || hit.distance < near.distance) {
      near = { ...hit, a: ring[hit.segment]!, b: ring[(hit.segment + 1) % ring.length]! };
    }
  }
  if (near === undefined) return start;
  let dx = start[0] - near.point[0];
  let dy = start[1] - near.point[1];
  let len = Math.hypot(dx, dy);
  if (!(len > tol.lengthMm)) {
    // On the boundary: the material lies to the left of every normalised ring.
    dx = -(near.b[1] - near.a[1]);
    dy = near.b[0] - near.a[0];
    len = Math.hypot(dx, dy);
  }
  if (!(len > 0)) return start;
  const far = firstHit(near.point, [dx / len, dy / len], region, 10 * tol.lengthMm);
  // A crossing longer than the wall means the thin direction is another one (the end of a strip): keep the start.
  if (far === undefined || Math.hypot(far[0] - near.point[0], far[1] - near.point[1]) > wallMm) return start;
  return [(near.point[0] + far[0]) / 2, (near.point[1] + far[1]) / 2];
}

/** The first boundary point of `region` along the ray from `origin` in unit direction `dir`, beyond `minT` mm. */
function firstHit(origin: Point, dir: Point, region: Region, minT: number): Point | undefined {
  let bestT = Number.POSITIVE_INFINITY;
  for (const ring of [region.outer, ...region.holes]) {
    const n = ring.length;
    for (let i = 0; i < n; i++) {
      const a = ring[i]!;
      const b = ring[(i + 1) % n]!;
      const ex = b[0] - a[0];
      const ey = b[1] - a[1];
      const den = dir[0] * ey - dir[1] * ex;
      if (Math.abs(den) < 1e-15) continue;
      const wx = a[0] - origin[0];
      const wy = a[1] - origin[1];
      const t = (wx * ey - wy * ex) / den;
      const s = (wx * dir[1] - wy * dir[0]) / den;
      if (t > minT && s >= 0 && s <= 1 && t < bestT) bestT = t;
    }
  }
  return Number.isFinite(bestT) ? [origin[0] + bestT * dir[0], origin[1] + bestT * dir[1]] : undefined;
}

/**
 * The thinnest wall of a region, mm: the smallest opening diameter t at which `findThinWalls(region, t)` finds a real
 * thin-wall piece (sharp-corner slivers and negligible pieces do not count), and a point in that wall.
 *
 * Method: bisection on t between 0 and twice the largest inscribed radius (at which every wall is thin; one probe just
 * below it first, which settles uniform walls at once), until the bracket is narrower than `wallResolutionMm` (default
 * 0.01 mm). The reported value is the bracket's middle, so it is within half that of the diameter at which the flag
 * first appears; for walls bounded by straight or circular faces that is the wall itself, and on a neck the noise
 * margin delays the flag by a further amount of order `noiseMarginMm`² / (neck radius), negligible in practice. A wall
 * that narrows gradually to a neck is flagged when t passes the neck's width. Each step costs two offsets and one
 * difference; a profile of a few hundred vertices takes tens of milliseconds.
 *
 * @throws RangeError when the region has no area (check it with `validateRegion` first).
 */
export function measureMinWall(region: Region, tol: Tolerances, options: Partial<WallOptions> = {}): MinWall {
  const o = resolveWallOptions(options);
  const normalized = normalizeRegion(region, tol);
  const circle = maxInscribedCircle(normalized, tol, o);
  return minWallOfPrepared(prepareWallRegion(normalized), circle, tol, o);
}
