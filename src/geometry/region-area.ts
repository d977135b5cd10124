import { signedRingArea } from './signed-ring-area.js';
import type { Region } from './types.js';

/**
 * Area of a region, mm²: the outer ring's area minus each hole's area, always counted positive whatever the rings'
 * orientation. Assumes a valid region (holes inside the outer ring, not overlapping); see `validateRegion`.
 */
export function regionArea(region: Region): number {
  let area = Math.abs(signedRingArea(region.outer));
  for (const hole of region.holes) area -= Math.abs(signedRingArea(hole));
  return area;
}
