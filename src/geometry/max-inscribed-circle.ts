import type { Tolerances } from '../numeric/index.js';
import { boundingBox } from './bounding-box.js';
import { CLIPPER_SCALE } from './clipper-edge.js';
import { normalizeRegion } from './normalize-region.js';
import { offsetRegions } from './offset-regions.js';
import { pointInRegion } from './point-in-region.js';
import { regionArea } from './region-area.js';
import { regionCentroid } from './region-centroid.js';
import { boundaryClearance } from './ring-clearance.js';
import type { Point, Region } from './types.js';
import { resolveWallOptions, type WallOptions } from './wall-options.js';

/** The largest circle that fits inside a region. */
export interface InscribedCircle {
  /** Radius of a circle at `center` that lies inside the region, mm; the largest such radius to within the accuracy
   * stated on `maxInscribedCircle`. Twice this is the region's thickest wall. */
  readonly radiusMm: number;
  /** Centre of that circle, mm, in the region's frame. */
  readonly center: Point;
  /** No circle of a larger radius than this fits, mm. */
  readonly upperBoundMm: number;
}

/** Half the smaller side of the outer ring's bounding box, mm: no disc of larger radius fits in the region. */
function upperRadius(region: Region): number {
  const box = boundingBox(region.outer);
  return Math.min(box.maxX - box.minX, box.maxY - box.minY) / 2;
}

/**
 * The largest circle inscribed in a region (the thickest wall is its diameter), mm.
 *
 * Method: the inward offset (erosion by a disc) of a region is non-empty exactly while a disc of that radius fits, so
 * the radius is bracketed by bisection on the inward offset until the region vanishes (DOMAIN.md §3); the centre is
 * then the point of the last non-empty offset (its centroid when inside it, or one of its vertices) farthest from the
 * region's boundary, and `radiusMm` is that point's measured clearance, so the circle reported always fits.
 *
 * Accuracy: exact − `radiusMm` ≤ `radiusResolutionMm` + 2.25 × `arcToleranceMm` + 2e-4 mm (about 0.0035 mm with the
 * defaults), from the bisection bracket, clipper's arc chords and its 1e-4 mm grid. Rings are normalised first.
 *
 * @throws RangeError when the region has no area (check it with `validateRegion` first).
 */
export function maxInscribedCircle(
  region: Region,
  tol: Tolerances,
  options: Partial<WallOptions> = {},
): InscribedCircle {
  const o = resolveWallOptions(options);
  const r = normalizeRegion(region, tol);
  if (r.outer.length < 3 || !(regionArea(r) > tol.lengthMm * tol.lengthMm)) {
    throw new RangeError('maxInscribedCircle: the region has no area');
  }
  const join = { join: 'round', arcToleranceMm: o.arcToleranceMm } as const;
  const erode = (d: number): Region[] => offsetRegions([r], -d, join);
  let lo = 0;
  let loPieces: Region[] = [r];
  // A disc fits in neither more than the region's area nor its bounding box; the grid step covers rounding.
  let hi = Math.min(upperRadius(r), Math.sqrt(regionArea(r) / Math.PI)) + 2 / CLIPPER_SCALE;
  while (hi - lo > o.radiusResolutionMm) {
    const mid = (lo + hi) / 2;
    const pieces = erode(mid);
    if (pieces.length > 0) {
      lo = mid;
      loPieces = pieces;
      // Eroding by mid then by s is eroding by mid + s, so what is left bounds the rest: straight walls close at once.
      hi = Math.min(hi, mid + Math.max(...pieces.map(upperRadius)) + 2 / CLIPPER_SCALE);
    } else {
      hi = mid;
    }
  }
  let center: Point = r.outer[0]!;
  let radius = -1;
  const consider = (p: Point): void => {
    if (pointInRegion(p, r, tol) !== 'inside') return;
    const c = boundaryClearance(p, r);
    if (c > radius) {
      radius = c;
      center = p;
    }
  };
  for (const piece of loPieces) {
    const b = boundingBox(piece.outer);
    const size2 = (b.maxX - b.minX) ** 2 + (b.maxY - b.minY) ** 2;
    // regionCentroid refuses slivers without area; such a piece still offers its vertices.
    const c = regionArea(piece) > 1e-9 * size2 ? regionCentroid(piece) : undefined;
    if (c !== undefined && pointInRegion(c, piece, tol) === 'inside') consider(c);
    // Every vertex of the last offset is about `lo` from the boundary; a few dozen spread round it are plenty.
    const step = Math.max(1, Math.floor(piece.outer.length / 32));
    for (let i = 0; i < piece.outer.length; i += step) consider(piece.outer[i]!);
  }
  if (radius < 0) radius = 0;
  return { radiusMm: radius, center, upperBoundMm: Math.max(hi + 1 / CLIPPER_SCALE, radius) };
}
