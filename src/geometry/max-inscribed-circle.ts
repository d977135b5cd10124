import type { Tolerances } from '../numeric/index.js';
import { normalizeRegion } from './normalize-region.js';
import { regionArea } from './region-area.js';
import { surveyWalls, type WallSurvey } from './survey-walls.js';
import { nearestBoundaryPoint } from './nearest-boundary-point.js';
import type { Point, Region } from './types.js';
import { resolveWallOptions, type WallOptions } from './wall-options.js';

/** The largest circle that fits inside a region. */
export interface InscribedCircle {
  /** Radius of a circle at `center` that lies inside the region, mm; the largest such radius to within the accuracy
   * stated on `maxInscribedCircle`. Twice this is the region's thickest wall. */
  readonly radiusMm: number;
  /** Centre of that circle, mm, in the region's frame. */
  readonly center: Point;
  /** No circle of a larger radius than this fits, to within the accuracy stated on `maxInscribedCircle`, mm. */
  readonly upperBoundMm: number;
}

/**
 * The largest circle inscribed in a region (the thickest wall is its diameter), mm.
 *
 * Method: the largest inscribed circle is the largest disc of the medial axis transform (Blum, 1967), and every medial
 * disc touches the boundary; so the medial disc touching each boundary sample is found by the shrinking-ball iteration
 * (Ma, Bae & Amenta, 2012) against a uniform grid of the boundary segments, and the largest few are refined by
 * golden-section search along the boundary (`WallOptions.sampleSpacingMm`, `refineResolutionMm`). Reflex vertices are
 * sampled over their fan of normals, since medial discs also touch the boundary there.
 *
 * Accuracy: `radiusMm` is the measured clearance of `center`, so the circle always fits; it is exact on walls bounded
 * by straight edges and regular polygons, and within 1e-4 mm of a brute-force search on random polygons (tests).
 * `upperBoundMm` adds `refineResolutionMm` to it. Near-linear time: about 20 ms for 5000 vertices. Rings are normalised
 * first.
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
  return inscribedCircleOf(surveyWalls(r, tol, o), o);
}

/** The inscribed circle of a surveyed region's thickest probe, its radius the centre's measured clearance (internal). */
export function inscribedCircleOf(survey: WallSurvey, o: WallOptions): InscribedCircle {
  const { center, radius } = survey.thickest;
  const radiusMm = Math.min(radius, nearestBoundaryPoint(survey.grid, center).distance);
  return { radiusMm, center, upperBoundMm: radius + o.refineResolutionMm };
}
