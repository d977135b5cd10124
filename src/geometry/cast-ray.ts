import { cellOf, type SegmentGrid } from './segment-grid.js';
import type { Point } from './types.js';

/** Where a ray first meets the boundary. */
export interface RayHit {
  /** Distance along the ray, mm. */
  readonly distance: number;
  /** The boundary point hit, mm. */
  readonly point: Point;
  /** Index of the segment hit in the grid. */
  readonly segment: number;
}

/**
 * The first boundary segment of a gridded region met by the ray from `origin` along the unit direction `dir`, beyond
 * `minDistance` mm and other than segment `skip` (the one the ray starts on; −1 for none); undefined when the ray leaves
 * the grid without a hit.
 *
 * Method: walk the grid cells the ray crosses in order (Amanatides & Woo, "A fast voxel traversal algorithm for ray
 * tracing", Eurographics 1987) and stop at the first cell holding a hit that lies inside that cell's stretch of the ray.
 */
export function castRay(
  grid: SegmentGrid,
  origin: Point,
  dir: Point,
  minDistance: number,
  skip: number,
): RayHit | undefined {
  const { ax, ay, bx, by, cell, nx, ny, minX, minY, cellStart, cellItems, stamp } = grid;
  const [ox, oy] = origin;
  const [dx, dy] = dir;
  const stampValue = ++grid.query;
  let i = cellOf(ox, minX, cell, nx);
  let j = cellOf(oy, minY, cell, ny);
  const stepI = dx > 0 ? 1 : -1;
  const stepJ = dy > 0 ? 1 : -1;
  const big = Number.POSITIVE_INFINITY;
  const nextX = minX + (dx > 0 ? i + 1 : i) * cell;
  const nextY = minY + (dy > 0 ? j + 1 : j) * cell;
  let tMaxX = Math.abs(dx) > 1e-300 ? (nextX - ox) / dx : big;
  let tMaxY = Math.abs(dy) > 1e-300 ? (nextY - oy) / dy : big;
  const tDeltaX = Math.abs(dx) > 1e-300 ? cell / Math.abs(dx) : big;
  const tDeltaY = Math.abs(dy) > 1e-300 ? cell / Math.abs(dy) : big;
  let bestT = big;
  let bestSeg = -1;
  for (;;) {
    const c = i + nx * j;
    for (let k = cellStart[c]!; k < cellStart[c + 1]!; k++) {
      const s = cellItems[k]!;
      if (s === skip || stamp[s] === stampValue) continue;
      stamp[s] = stampValue;
      const ex = bx[s]! - ax[s]!;
      const ey = by[s]! - ay[s]!;
      const den = dx * ey - dy * ex;
      if (den * den <= 1e-30 * (ex * ex + ey * ey)) continue;
      const wx = ax[s]! - ox;
      const wy = ay[s]! - oy;
      const t = (wx * ey - wy * ex) / den;
      const u = (wx * dy - wy * dx) / den;
      if (t > minDistance && u >= 0 && u <= 1 && t < bestT) {
        bestT = t;
        bestSeg = s;
      }
    }
    // A hit beyond this cell may be beaten by a segment in a later cell only if it lies beyond the cell's exit.
    const exit = Math.min(tMaxX, tMaxY);
    if (bestSeg >= 0 && bestT <= exit) break;
    if (tMaxX < tMaxY) {
      i += stepI;
      tMaxX += tDeltaX;
    } else {
      j += stepJ;
      tMaxY += tDeltaY;
    }
    if (i < 0 || j < 0 || i >= nx || j >= ny) break;
  }
  if (bestSeg < 0) return undefined;
  return { distance: bestT, point: [ox + bestT * dx, oy + bestT * dy], segment: bestSeg };
}
