import type { Tolerances } from '../numeric/index.js';
import { inscribedCircleOf } from './max-inscribed-circle.js';
import { normalizeRegion } from './normalize-region.js';
import { regionArea } from './region-area.js';
import { surveyWalls, type WallSurvey } from './survey-walls.js';
import type { Point, Region } from './types.js';
import { resolveWallOptions, type WallOptions } from './wall-options.js';

/** The thinnest wall of a region and where it is. */
export interface MinWall {
  /** The thinnest wall, mm: the smallest thickness measured across the wall (see `measureMinWall`). */
  readonly minWallMm: number;
  /** The middle of the thinnest wall, mm: halfway between the two sides where it is measured. */
  readonly at: Point;
  /** The two boundary points, one on each side of the wall, that the thinnest wall spans, mm. */
  readonly across: readonly [Point, Point];
}

/** The thinnest wall of a surveyed region; the largest inscribed circle when no two faces face each other (internal). */
export function minWallOfSurvey(survey: WallSurvey, o: WallOptions): MinWall {
  const thin = survey.thinnest;
  const circle = inscribedCircleOf(survey, o);
  const maxWall = 2 * circle.radiusMm;
  if (thin === undefined || thin.hit === undefined || !(thin.thicknessMm < maxWall)) {
    // A compact shape (a triangle, a square) has no two faces facing each other: its only wall is its thickest.
    const c = circle.center;
    const r = circle.radiusMm;
    const contact = survey.thickest.at;
    const far: Point = [2 * c[0] - contact[0], 2 * c[1] - contact[1]];
    return { minWallMm: maxWall, at: c, across: [contact, r > 0 ? far : contact] };
  }
  const far = thin.hit.point;
  const at: Point = [(thin.at[0] + far[0]) / 2, (thin.at[1] + far[1]) / 2];
  return { minWallMm: thin.thicknessMm, at, across: [thin.at, far] };
}

/**
 * The thinnest wall of a region, mm, as a practitioner measures it: across the wall, from one side to the side facing
 * it, away from corners and the free ends of strips; and where it is.
 *
 * Method: at boundary samples about `sampleSpacingMm` apart, the local thickness is the smaller of (a) the diameter of
 * the medial disc touching the boundary there (the largest inscribed disc through that point: Blum's medial axis
 * transform, 1967; found by the shrinking-ball iteration of Ma, Bae & Amenta, 2012) and (b) the chord along the inward
 * normal to the opposite side, each counted only between faces that face each other within `facingAngleRad` (default
 * 45°; the object-angle test of Foskey, Lin & Manocha's θ-simplified medial axis, 2003). Corners wider than that and
 * the end faces of strips are therefore not walls, while a tapering wall is measured up to its very end (a 40 × 8 mm
 * strip is 8 mm everywhere; a wedge strip is thinnest at its thin end face). The thinnest samples are refined by
 * golden-section search along the boundary. Nearest-boundary and ray queries use a uniform grid over the segments,
 * so the cost is near-linear in the vertex count (about 30 ms for 5000 vertices). When no two faces face each other
 * (a compact shape such as a triangle), the thinnest wall is the thickest: the largest inscribed circle's diameter.
 *
 * Accuracy: exact up to floating point on walls between straight faces and across circular holes and rings measured
 * through their centre; otherwise the refinement's `refineResolutionMm` along the boundary.
 *
 * @throws RangeError when the region has no area (check it with `validateRegion` first).
 */
export function measureMinWall(region: Region, tol: Tolerances, options: Partial<WallOptions> = {}): MinWall {
  const o = resolveWallOptions(options);
  const normalized = normalizeRegion(region, tol);
  if (normalized.outer.length < 3 || !(regionArea(normalized) > tol.lengthMm * tol.lengthMm)) {
    throw new RangeError('measureMinWall: the region has no area');
  }
  return minWallOfSurvey(surveyWalls(normalized, tol, o), o);
}
