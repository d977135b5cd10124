import { regionArea } from './region-area.js';
import { unionRegions } from './union-regions.js';
import type { Region } from './types.js';

/**
 * Area covered by a set of regions, mm², overlaps counted once (the regions are united by clipper first, so the
 * result carries clipper's grid rounding of 1/CLIPPER_SCALE mm on every vertex).
 */
export function regionsArea(regions: readonly Region[]): number {
  let area = 0;
  for (const r of unionRegions(regions)) area += regionArea(r);
  return area;
}
