import {
  type BoundaryPath,
  DEFAULT_HAUSDORFF_ERROR_MM,
  directedHausdorffDistance,
} from './directed-hausdorff-distance.js';
import type { HausdorffResult } from './hausdorff-distance.js';
import type { Region } from './types.js';

function boundary(region: Region): BoundaryPath[] {
  return [region.outer, ...region.holes].map((points) => ({ points, closed: true }));
}

/**
 * The symmetric Hausdorff distance between the whole boundaries of two regions (outer ring and holes of each, as
 * closed rings), mm: how far any boundary point of one region lies from the nearest boundary point of the other, e.g.
 * how far an achieved orifice edge strays from its target. A hole present in only one region counts in full. The result
 * satisfies `distance ≤ exact ≤ distance + maxErrorMm` (adaptive subdivision, see `directedHausdorffDistance`).
 *
 * @param maxErrorMm Largest amount by which the result may fall short of the exact distance, mm. @default 1e-4
 */
export function regionBoundaryHausdorff(
  regionA: Region,
  regionB: Region,
  maxErrorMm: number = DEFAULT_HAUSDORFF_ERROR_MM,
): HausdorffResult {
  const a = boundary(regionA);
  const b = boundary(regionB);
  const ab = directedHausdorffDistance(a, b, maxErrorMm);
  const ba = directedHausdorffDistance(b, a, maxErrorMm);
  return ab.distance >= ba.distance
    ? { distance: ab.distance, fromA: ab.from, toB: ab.to }
    : { distance: ba.distance, fromA: ba.to, toB: ba.from };
}
