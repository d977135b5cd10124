import type { Tolerances } from '../numeric/index.js';
import { type BoundingBox, boundingBox } from './bounding-box.js';
import { CLIPPER_SCALE } from './clipper-edge.js';
import { isCornerSliver, type PreparedWallRegion, prepareWallRegion } from './corner-sliver.js';
import { differenceRegions } from './difference-regions.js';
import { normalizeRegion } from './normalize-region.js';
import { offsetRegions } from './offset-regions.js';
import { regionArea } from './region-area.js';
import { minWallOfSurvey } from './measure-min-wall.js';
import { surveyWalls } from './survey-walls.js';
import { regionCentroid } from './region-centroid.js';
import type { Point, Region } from './types.js';
import { resolveWallOptions, type WallOptions } from './wall-options.js';

/** A part of a region where the wall is thinner than asked. */
export interface ThinWall {
  /** The thin part itself, mm (outer ring CCW, holes CW). */
  readonly region: Region;
  /** Its area centroid, mm (may lie outside the piece when the piece is curved, e.g. a whole thin ring). */
  readonly centroid: Point;
  /** Its area, mm². */
  readonly areaMm2: number;
  /** Its bounding box, mm. */
  readonly bbox: BoundingBox;
}

/**
 * The thin-wall pieces of a prepared region at opening diameter `t`, mm (internal; `findThinWalls` and
 * `measureMinWall` share it). Pieces are in decreasing order of area.
 */
export function thinWallPieces(prepared: PreparedWallRegion, t: number, o: WallOptions): ThinWall[] {
  const r = t / 2;
  const join = { join: 'round', arcToleranceMm: o.openingArcToleranceMm } as const;
  const eroded = offsetRegions([prepared.region], -r, join);
  const opened = eroded.length > 0 ? offsetRegions(eroded, r + o.noiseMarginMm, join) : [];
  const residue = differenceRegions([prepared.region], opened);
  const near = 2 * o.noiseMarginMm + 2 / CLIPPER_SCALE;
  const walls: ThinWall[] = [];
  for (const piece of residue) {
    const areaMm2 = regionArea(piece);
    if (areaMm2 < o.minPieceAreaMm2) continue;
    if (isCornerSliver(piece, prepared, r, near, o.cornerSlackMm, o.cornerDetailMm)) continue;
    walls.push({ region: piece, centroid: regionCentroid(piece), areaMm2, bbox: boundingBox(piece.outer) });
  }
  return walls.sort((a, b) => b.areaMm2 - a.areaMm2);
}

/**
 * The parts of a region where the wall is thinner than `minWallMm`, mm; empty when every wall is thick enough.
 *
 * Method (mathematical morphology, DOMAIN.md §3): the opening of the region by a disc of diameter t (offset in by t/2,
 * then out by t/2, round joins) keeps exactly the material a disc of diameter t can reach, so `region − opening` is
 * every wall thinner than t, plus slivers in sharp convex corners. A residue piece that lies within r·cot(α/2) + ε of a
 * single convex corner of interior angle α (r = t/2, ε = `cornerSlackMm`) is only a sharp corner and is dropped; a
 * corner rounded or chamfered by convex vertices joined by edges no longer than `cornerDetailMm` counts as one corner
 * at the meeting point of its outer edges. Pieces smaller than `minPieceAreaMm2` (default 0.001 mm²) are dropped too.
 * Before subtracting, the opening is grown by `noiseMarginMm` (default 0.005 mm) so clipper's arc chords and 1e-4 mm
 * grid leave no hairlines along sound walls. Pieces come largest first. Rings are normalised first; the region should
 * be valid (`validateRegion`). When the thinnest wall measured across (`measureMinWall`) is at least `minWallMm`, there
 * is no thin wall and the opening is skipped: the answer is then `[]` at near-linear cost.
 *
 * @throws RangeError when `minWallMm` is not a positive finite number, or an option is out of range.
 */
export function findThinWalls(
  region: Region,
  minWallMm: number,
  tol: Tolerances,
  options: Partial<WallOptions> = {},
): ThinWall[] {
  if (!(Number.isFinite(minWallMm) && minWallMm > 0)) {
    throw new RangeError('findThinWalls: minWallMm must be a positive number');
  }
  const o = resolveWallOptions(options);
  const normalized = normalizeRegion(region, tol);
  // The opening costs seconds on profiles of thousands of vertices; the survey (near-linear) rules most of them out.
  if (normalized.outer.length >= 3 && regionArea(normalized) > tol.lengthMm * tol.lengthMm) {
    if (!(minWallOfSurvey(surveyWalls(normalized, tol, o), o).minWallMm < minWallMm)) return [];
  }
  return thinWallPieces(prepareWallRegion(normalized), minWallMm, o);
}
