import type { Tolerances } from '../numeric/index.js';
import { inscribedCircleOf } from './max-inscribed-circle.js';
import { minWallOfSurvey } from './measure-min-wall.js';
import { normalizeRegion } from './normalize-region.js';
import { regionArea } from './region-area.js';
import { surveyWalls } from './survey-walls.js';
import type { Point, Region } from './types.js';
import { resolveWallOptions, type WallOptions } from './wall-options.js';

/** Thinnest and thickest wall of a region. */
export interface WallMeasurement {
  /** Thinnest wall, mm, measured across the wall away from corners and strip ends (see `measureMinWall`). */
  readonly minWallMm: number;
  /** Thickest wall, mm: the diameter of the largest inscribed circle. */
  readonly maxWallMm: number;
  /** maxWallMm / minWallMm (≥ 1): thick and thin walls cool and flow at very different rates, so a high ratio warns of
   * uneven flow from the die. */
  readonly thickThinRatio: number;
  /** The middle of the thinnest wall, mm. */
  readonly minAt: Point;
  /** The two boundary points the thinnest wall spans, one on each side, mm. */
  readonly minAcross: readonly [Point, Point];
  /** The centre of the largest inscribed circle, mm. */
  readonly maxAt: Point;
}

/**
 * Thinnest and thickest walls of a region, mm, from one survey of the boundary: the thickest is the diameter of the
 * largest inscribed circle (`maxInscribedCircle`), the thinnest the smallest thickness across the wall between facing
 * sides, corners and strip ends excluded (`measureMinWall`); both by medial discs (Blum 1967) from the shrinking-ball
 * iteration (Ma, Bae & Amenta 2012) and normal chords over a uniform grid of the boundary segments, near-linear in the
 * vertex count. A 40 × 8 mm strip gives 8 mm for both; an annulus R − r for both. Rings are normalised first.
 *
 * @throws RangeError when the region has no area (check it with `validateRegion` first).
 */
export function measureWalls(region: Region, tol: Tolerances, options: Partial<WallOptions> = {}): WallMeasurement {
  const o = resolveWallOptions(options);
  const normalized = normalizeRegion(region, tol);
  if (normalized.outer.length < 3 || !(regionArea(normalized) > tol.lengthMm * tol.lengthMm)) {
    throw new RangeError('measureWalls: the region has no area');
  }
  const survey = surveyWalls(normalized, tol, o);
  const circle = inscribedCircleOf(survey, o);
  const min = minWallOfSurvey(survey, o);
  const maxWallMm = 2 * circle.radiusMm;
  const minWallMm = Math.min(min.minWallMm, maxWallMm);
  return {
    minWallMm,
    maxWallMm,
    thickThinRatio: minWallMm > 0 ? maxWallMm / minWallMm : Number.POSITIVE_INFINITY,
    minAt: min.at,
    minAcross: min.across,
    maxAt: circle.center,
  };
}
