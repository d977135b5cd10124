import { booleanRegions } from './clipper-edge.js';
import type { Region } from './types.js';

/**
 * The parts covered by both `a` and `b`, mm, as disjoint regions (outer rings CCW, holes CW). Coordinates are rounded
 * to clipper's grid of 1/CLIPPER_SCALE mm.
 */
export function intersectRegions(a: readonly Region[], b: readonly Region[]): Region[] {
  return booleanRegions('intersection', a, b);
}
