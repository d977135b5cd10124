import { boundingBox } from './bounding-box.js';
import { regionArea } from './region-area.js';
import { regionCentroid } from './region-centroid.js';
import type { Point, Region } from './types.js';

/**
 * A point inside the material of a region, mm, e.g. for a label or to mark a piece: the middle of the widest stretch
 * of material along the horizontal line through the centroid (through the middle of the bounding box when the region
 * has no area). Unlike the centroid, it always lies in the region, even a curved or holed one. Rings may run either
 * way; the region should be valid.
 *
 * @throws RangeError when the region's outer ring has fewer than three points.
 */
export function interiorPoint(region: Region): Point {
  if (region.outer.length < 3) throw new RangeError('interiorPoint: the outer ring needs at least three points');
  const box = boundingBox(region.outer);
  const size2 = (box.maxX - box.minX) ** 2 + (box.maxY - box.minY) ** 2;
  // Same threshold as regionCentroid, which refuses regions without area.
  const y = regionArea(region) > 1e-12 * size2 ? regionCentroid(region)[1] : (box.minY + box.maxY) / 2;
  // A line through a vertex would pair crossings wrongly; the half-open rule below counts each vertex once.
  const xs: number[] = [];
  for (const ring of [region.outer, ...region.holes]) {
    const n = ring.length;
    for (let i = 0; i < n; i++) {
      const a = ring[i]!;
      const b = ring[(i + 1) % n]!;
      if (a[1] > y !== b[1] > y) xs.push(a[0] + ((y - a[1]) * (b[0] - a[0])) / (b[1] - a[1]));
    }
  }
  xs.sort((p, q) => p - q);
  let best: Point = region.outer[0]!;
  let widest = -1;
  for (let k = 0; k + 1 < xs.length; k += 2) {
    const width = xs[k + 1]! - xs[k]!;
    if (width > widest) {
      widest = width;
      best = [(xs[k]! + xs[k + 1]!) / 2, y];
    }
  }
  return best;
}
