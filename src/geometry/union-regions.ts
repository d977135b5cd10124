import { booleanRegions } from './clipper-edge.js';
import type { Region } from './types.js';

/**
 * The union of regions, mm, as disjoint regions (outer rings CCW, holes CW). Overlapping inputs merge; coordinates are
 * rounded to clipper's grid of 1/CLIPPER_SCALE mm. Inputs must be simple rings; their orientation does not matter.
 */
export function unionRegions(regions: readonly Region[]): Region[] {
  return booleanRegions('union', regions, []);
}
