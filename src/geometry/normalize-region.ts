import type { Tolerances } from '../numeric/index.js';
import { normalizeRing } from './normalize-ring.js';
import type { Region } from './types.js';

/**
 * A cleaned copy of a region: the outer ring counter-clockwise and every hole clockwise (y up), each cleaned by
 * `normalizeRing` (repeated and collinear points within `tol.lengthMm` dropped). Holes that collapse to fewer than
 * three points enclose nothing and are dropped; a collapsed outer ring is kept for `validateRegion` to report.
 */
export function normalizeRegion(region: Region, tol: Tolerances): Region {
  const outer = normalizeRing(region.outer, tol, 'ccw');
  const holes = region.holes.map((h) => normalizeRing(h, tol, 'cw')).filter((h) => h.length >= 3);
  return { outer, holes };
}
