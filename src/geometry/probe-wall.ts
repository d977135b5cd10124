import { castRay, type RayHit } from './cast-ray.js';
import type { SegmentGrid } from './segment-grid.js';
import type { Point } from './types.js';
import { sitePoint, type WallSite } from './wall-site.js';

/** What one boundary point says about the wall behind it (internal to the wall measurement). */
export interface WallProbe {
  readonly at: Point;
  /** Inward unit normal at `at`. */
  readonly normal: Point;
  /** Where the chord along the inward normal first meets the boundary; undefined if it never does (numerically). */
  readonly hit: RayHit | undefined;
  /** The wall thickness at `at`, mm: the chord length when the face it meets faces `at`'s face (see `probeWall`);
   * +∞ otherwise. */
  readonly thicknessMm: number;
}

/**
 * The wall at one boundary point of a site: the chord along the inward normal to the first boundary it meets (the
 * calliper reading across the wall), counted only when the face met turns back within `facingRad` of facing the
 * start's face (their inward normals at least π − `facingRad` apart, the object-angle test of Foskey, Lin & Manocha's
 * θ-simplified medial axis, 2003, applied to the chord's two ends). Two faces meeting at a convex corner wider than
 * `facingRad` (a 90° corner, the end face of a strip) never face each other, so corners and strip ends are not walls;
 * faces closer to parallel than that (a tapering wall, a knife edge) are the two sides of one wall.
 */
export function probeWall(
  grid: SegmentGrid,
  site: WallSite,
  u: number,
  facingRad: number,
  toleranceMm: number,
): WallProbe {
  const { at, normal } = sitePoint(grid, site, u);
  const hit = castRay(grid, at, normal, toleranceMm, site.kind === 'edge' ? site.segment : -1);
  let thicknessMm = Number.POSITIVE_INFINITY;
  if (hit !== undefined) {
    const s = hit.segment;
    const ex = grid.bx[s]! - grid.ax[s]!;
    const ey = grid.by[s]! - grid.ay[s]!;
    const dot = (normal[0] * -ey + normal[1] * ex) / Math.hypot(ex, ey);
    if (dot <= -Math.cos(facingRad)) thicknessMm = hit.distance;
  }
  return { at, normal, hit, thicknessMm };
}
