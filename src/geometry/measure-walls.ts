import type { Tolerances } from '../numeric/index.js';
import { prepareWallRegion } from './corner-sliver.js';
import { maxInscribedCircle } from './max-inscribed-circle.js';
import { minWallOfPrepared } from './measure-min-wall.js';
import { normalizeRegion } from './normalize-region.js';
import type { Point, Region } from './types.js';
import { resolveWallOptions, type WallOptions } from './wall-options.js';

/** Thinnest and thickest wall of a region. */
export interface WallMeasurement {
  /** Thinnest wall, mm (see `measureMinWall`). */
  readonly minWallMm: number;
  /** Thickest wall, mm: the diameter of the largest inscribed circle. */
  readonly maxWallMm: number;
  /** maxWallMm / minWallMm (≥ 1): thick and thin walls cool and flow at very different rates, so a high ratio warns of
   * uneven flow from the die. */
  readonly thickThinRatio: number;
  /** A point in the thinnest wall, mm. */
  readonly minAt: Point;
  /** The centre of the largest inscribed circle, mm. */
  readonly maxAt: Point;
}

/**
 * Thinnest and thickest walls of a region, mm: the thickest is twice the largest inscribed radius
 * (`maxInscribedCircle`, within about 0.007 mm), the thinnest the smallest opening diameter that flags a thin wall
 * (`measureMinWall`, within about 0.008 mm with the defaults). The inscribed circle is computed once and bounds the
 * thin-wall search. Rings are normalised first.
 *
 * @throws RangeError when the region has no area (check it with `validateRegion` first).
 */
export function measureWalls(region: Region, tol: Tolerances, options: Partial<WallOptions> = {}): WallMeasurement {
  const o = resolveWallOptions(options);
  const normalized = normalizeRegion(region, tol);
  const circle = maxInscribedCircle(normalized, tol, o);
  const min = minWallOfPrepared(prepareWallRegion(normalized), circle, tol, o);
  const maxWallMm = 2 * circle.radiusMm;
  // The two bisections have separate errors, so a uniform wall may measure a hair thicker at its thinnest.
  const minWallMm = Math.min(min.minWallMm, maxWallMm);
  return {
    minWallMm,
    maxWallMm,
    thickThinRatio: maxWallMm / minWallMm,
    minAt: min.at,
    maxAt: circle.center,
  };
}
