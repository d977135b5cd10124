import type { Tolerances } from '../numeric/index.js';
import { type PointLocation, pointInRing } from './point-in-ring.js';
import type { Point, Region } from './types.js';

/**
 * Whether `p` lies in the material of a region (inside the outer ring and outside every hole), outside it, or on any
 * of its boundaries within `tol.lengthMm`, mm.
 */
export function pointInRegion(p: Point, region: Region, tol: Tolerances): PointLocation {
  const outer = pointInRing(p, region.outer, tol);
  if (outer !== 'inside') return outer;
  for (const hole of region.holes) {
    const h = pointInRing(p, hole, tol);
    if (h === 'boundary') return 'boundary';
    if (h === 'inside') return 'outside';
  }
  return 'inside';
}
