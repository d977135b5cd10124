import type { Tolerances } from '../numeric/index.js';
import { type BoundingBox, boundingBox } from './bounding-box.js';
import { CLIPPER_SCALE } from './clipper-edge.js';
import { isCornerSliver, type PreparedWallRegion, prepareWallRegion } from './corner-sliver.js';
import { differenceRegions } from './difference-regions.js';
import { normalizeRegion } from './normalize-region.js';
import { offsetRegions } from './offset-regions.js';
import { regionArea } from './region-area.js';
import { intersectRegions } from './intersect-regions.js';
import { unionRegions } from './union-regions.js';
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
 * Method (mathematical morphology, docs/MODEL.md §3): the opening of the region by a disc of diameter t (offset in by
 * t/2, then out by t/2, round joins) keeps exactly the material a disc of diameter t can reach, so `region − opening`
 * is every wall thinner than t, plus slivers in sharp convex corners. A residue piece that lies within r·cot(α/2) + ε
 * of a single convex corner of interior angle α (r = t/2, ε = `cornerSlackMm`) is only a sharp corner and is dropped; a
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
  if (!(normalized.outer.length >= 3 && regionArea(normalized) > tol.lengthMm * tol.lengthMm)) {
    return thinWallPieces(prepareWallRegion(normalized), minWallMm, o);
  }
  // The opening costs seconds on profiles of thousands of vertices; the survey (near-linear) rules most of them out,
  // and otherwise says where to look.
  const survey = surveyWalls(normalized, tol, o);
  if (!(minWallOfSurvey(survey, o).minWallMm < minWallMm)) return [];
  const chords: [Point, Point][] = [];
  survey.probes.forEach((p, i) => {
    if (p.hit !== undefined && p.thicknessMm < minWallMm && survey.wallAt(i) < minWallMm)
      chords.push([p.at, p.hit.point]);
  });
  const t = survey.thinnest;
  if (t?.hit !== undefined && t.thicknessMm < minWallMm) chords.push([t.at, t.hit.point]);
  // A compact shape with no facing sides is thin all over: open the whole of it.
  if (chords.length === 0) return thinWallPieces(prepareWallRegion(normalized), minWallMm, o);
  return thinWallsNearChords(normalized, chords, minWallMm, o);
}

/**
 * The thin-wall pieces of a region near chords known to be thinner than `t`: the opening runs only on the region
 * clipped to windows reaching at least 2t round those chords (whole cells of a t-sized grid, merged along rows so
 * the clip stays small), and a piece counts only when it meets the chords' own boxes grown by t/2, so the windows'
 * cut edges add nothing.
 */
function thinWallsNearChords(region: Region, chords: readonly [Point, Point][], t: number, o: WallOptions): ThinWall[] {
  const box = (c: readonly [Point, Point], grow: number): BoundingBox => ({
    minX: Math.min(c[0][0], c[1][0]) - grow,
    maxX: Math.max(c[0][0], c[1][0]) + grow,
    minY: Math.min(c[0][1], c[1][1]) - grow,
    maxY: Math.max(c[0][1], c[1][1]) + grow,
  });
  const rows = new Map<number, Set<number>>();
  for (const c of chords) {
    const b = box(c, 2 * t);
    for (let j = Math.floor(b.minY / t); j <= Math.floor(b.maxY / t); j++) {
      const row = rows.get(j) ?? new Set<number>();
      rows.set(j, row);
      for (let i = Math.floor(b.minX / t); i <= Math.floor(b.maxX / t); i++) row.add(i);
    }
  }
  const windows: Region[] = [];
  for (const [j, row] of rows) {
    const cells = [...row].sort((a, b) => a - b);
    let start = cells[0]!;
    for (let k = 1; k <= cells.length; k++) {
      if (k < cells.length && cells[k] === cells[k - 1]! + 1) continue;
      const end = cells[k - 1]! + 1;
      windows.push({
        outer: [
          [start * t, j * t],
          [end * t, j * t],
          [end * t, (j + 1) * t],
          [start * t, (j + 1) * t],
        ],
        holes: [],
      });
      if (k < cells.length) start = cells[k]!;
    }
  }
  const inner = chords.map((c) => box(c, t / 2));
  const meets = (b: BoundingBox): boolean =>
    inner.some((q) => b.minX <= q.maxX && b.maxX >= q.minX && b.minY <= q.maxY && b.maxY >= q.minY);
  const walls: ThinWall[] = [];
  for (const local of intersectRegions([region], unionRegions(windows))) {
    for (const piece of thinWallPieces(prepareWallRegion(local), t, o)) if (meets(piece.bbox)) walls.push(piece);
  }
  return walls.sort((a, b) => b.areaMm2 - a.areaMm2);
}
