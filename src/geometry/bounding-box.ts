import type { Point } from './types.js';

/** An axis-aligned bounding box, mm, in the same frame as the points it bounds (y up). */
export interface BoundingBox {
  readonly minX: number;
  readonly minY: number;
  readonly maxX: number;
  readonly maxY: number;
}

/**
 * The smallest axis-aligned box holding every point, mm.
 *
 * @throws RangeError when `points` is empty (there is nothing to bound).
 */
export function boundingBox(points: readonly Point[]): BoundingBox {
  if (points.length === 0) throw new RangeError('boundingBox: no points');
  let minX = Number.POSITIVE_INFINITY;
  let minY = Number.POSITIVE_INFINITY;
  let maxX = Number.NEGATIVE_INFINITY;
  let maxY = Number.NEGATIVE_INFINITY;
  for (const [x, y] of points) {
    if (x < minX) minX = x;
    if (y < minY) minY = y;
    if (x > maxX) maxX = x;
    if (y > maxY) maxY = y;
  }
  return { minX, minY, maxX, maxY };
}
