import { booleanRegions } from './clipper-edge.js';
import { regionArea } from './region-area.js';
import type { Region } from './types.js';

/**
 * Area covered by exactly one of `a` and `b` (the exclusive-or), mm²: zero for identical shapes, and a plain measure
 * of how far an achieved orifice misses its target. Computed by clipper on its 1/CLIPPER_SCALE mm grid.
 */
export function symmetricDifferenceArea(a: readonly Region[], b: readonly Region[]): number {
  let area = 0;
  for (const r of booleanRegions('xor', a, b)) area += regionArea(r);
  return area;
}
