import { cellOf, type SegmentGrid } from './segment-grid.js';
import type { Point } from './types.js';

/** The boundary point nearest a query point. */
export interface BoundaryHit {
  /** Distance from the query point, mm. */
  readonly distance: number;
  /** The boundary point, mm. */
  readonly point: Point;
  /** Index of the segment in the grid. */
  readonly segment: number;
}

/**
 * The boundary point of a gridded region nearest to `p` (which may lie anywhere, also outside the grid), mm.
 *
 * Method: examine the cells in square rings of growing Chebyshev radius round the cell of `p`, and stop once the
 * nearest segment found is no farther than every cell not yet examined (the standard uniform-grid nearest-neighbour
 * search). Exact up to floating point; about constant time when segments are spread along the boundary. With
 * `stopBelow` > 0 it returns the first boundary point found nearer than that instead (a yes/no emptiness test).
 */
export function nearestBoundaryPoint(grid: SegmentGrid, p: Point, stopBelow = 0): BoundaryHit {
  const { cell, nx, ny, minX, minY } = grid;
  const stampValue = ++grid.query;
  const [px, py] = p;
  const ci = cellOf(px, minX, cell, nx);
  const cj = cellOf(py, minY, cell, ny);
  const found: Scan = { best: Number.POSITIVE_INFINITY, seg: -1, x: px, y: py };
  const maxRing = Math.max(nx, ny);
  // Every cell nearer than emptyRings holds no segment: start the rings there.
  for (let r = grid.emptyRings[ci + nx * cj]!; r <= maxRing; r++) {
    const i0 = ci - r;
    const i1 = ci + r;
    const j0 = cj - r;
    const j1 = cj + r;
    for (let i = Math.max(i0, 0); i <= Math.min(i1, nx - 1); i++) {
      if (j0 >= 0) scanCell(grid, i + nx * j0, px, py, stampValue, found);
      if (j1 < ny && j1 !== j0) scanCell(grid, i + nx * j1, px, py, stampValue, found);
    }
    for (let j = Math.max(j0 + 1, 0); j <= Math.min(j1 - 1, ny - 1); j++) {
      if (i0 >= 0) scanCell(grid, i0 + nx * j, px, py, stampValue, found);
      if (i1 < nx && i1 !== i0) scanCell(grid, i1 + nx * j, px, py, stampValue, found);
    }
    if (found.seg < 0) continue;
    const best = found.best;
    if (best < stopBelow * stopBelow) break;
    // Every cell not yet examined lies beyond one of the four sides of the examined block that is still inside the grid.
    let bound = Number.POSITIVE_INFINITY;
    if (i0 > 0) bound = Math.min(bound, px - (minX + i0 * cell));
    if (i1 < nx - 1) bound = Math.min(bound, minX + (i1 + 1) * cell - px);
    if (j0 > 0) bound = Math.min(bound, py - (minY + j0 * cell));
    if (j1 < ny - 1) bound = Math.min(bound, minY + (j1 + 1) * cell - py);
    if (bound > 0 && bound * bound >= best) break;
    if (!Number.isFinite(bound)) break;
  }
  return { distance: Math.sqrt(found.best), point: [found.x, found.y], segment: found.seg };
}

/** The best squared distance, segment and point found so far. */
interface Scan {
  best: number;
  seg: number;
  x: number;
  y: number;
}

/** Tests the segments of cell c not yet tested in this query against the point (px, py); skips a cell farther than
 * the best so far. */
function scanCell(grid: SegmentGrid, c: number, px: number, py: number, stampValue: number, found: Scan): void {
  const { ax, ay, bx, by, cell, nx, minX, minY, cellStart, cellItems, stamp } = grid;
  const i = c % nx;
  const j = (c - i) / nx;
  const x0 = minX + i * cell;
  const y0 = minY + j * cell;
  const gx = px < x0 ? x0 - px : px > x0 + cell ? px - x0 - cell : 0;
  const gy = py < y0 ? y0 - py : py > y0 + cell ? py - y0 - cell : 0;
  if (gx * gx + gy * gy >= found.best) return;
  for (let k = cellStart[c]!; k < cellStart[c + 1]!; k++) {
    const s = cellItems[k]!;
    if (stamp[s] === stampValue) continue;
    stamp[s] = stampValue;
    const ex = bx[s]! - ax[s]!;
    const ey = by[s]! - ay[s]!;
    const len2 = ex * ex + ey * ey;
    let t = len2 > 0 ? ((px - ax[s]!) * ex + (py - ay[s]!) * ey) / len2 : 0;
    t = Math.max(0, Math.min(1, t));
    const qx = ax[s]! + t * ex;
    const qy = ay[s]! + t * ey;
    const d2 = (px - qx) ** 2 + (py - qy) ** 2;
    if (d2 < found.best) {
      found.best = d2;
      found.seg = s;
      found.x = qx;
      found.y = qy;
    }
  }
}
