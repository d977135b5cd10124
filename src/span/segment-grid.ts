import { type Point, pointToSegmentDistance, type Ring } from '../geometry/index.js';

/**
 * A uniform bucket grid over a ring's edges, so "is this point within τ of that boundary?" costs a few segment tests
 * instead of one per edge. Cell size is chosen from the ring's extent and edge count.
 */
export interface SegmentGrid {
  readonly ring: Ring;
  readonly minX: number;
  readonly minY: number;
  readonly cellMm: number;
  readonly cols: number;
  readonly rows: number;
  readonly cells: ReadonlyMap<number, readonly number[]>;
}

/** Buckets every edge of `ring` into the cells it passes within `queryRadiusMm` of, mm. */
export function makeSegmentGrid(ring: Ring, queryRadiusMm: number): SegmentGrid {
  let minX = Number.POSITIVE_INFINITY;
  let minY = Number.POSITIVE_INFINITY;
  let maxX = Number.NEGATIVE_INFINITY;
  let maxY = Number.NEGATIVE_INFINITY;
  for (const [x, y] of ring) {
    minX = Math.min(minX, x);
    minY = Math.min(minY, y);
    maxX = Math.max(maxX, x);
    maxY = Math.max(maxY, y);
  }
  // widen by the query radius so a point just outside the ring's box still finds the edges within reach
  minX -= queryRadiusMm;
  minY -= queryRadiusMm;
  maxX += queryRadiusMm;
  maxY += queryRadiusMm;
  const extent = Math.max(maxX - minX, maxY - minY, 1e-9);
  const cellMm = Math.max(extent / Math.max(4, Math.sqrt(ring.length) * 2), queryRadiusMm * 2);
  const cols = Math.floor((maxX - minX) / cellMm) + 1;
  const rows = Math.floor((maxY - minY) / cellMm) + 1;
  const cells = new Map<number, number[]>();
  for (let i = 0; i < ring.length; i++) {
    const a = ring[i]!;
    const b = ring[(i + 1) % ring.length]!;
    const c0 = Math.floor((Math.min(a[0], b[0]) - queryRadiusMm - minX) / cellMm);
    const c1 = Math.floor((Math.max(a[0], b[0]) + queryRadiusMm - minX) / cellMm);
    const r0 = Math.floor((Math.min(a[1], b[1]) - queryRadiusMm - minY) / cellMm);
    const r1 = Math.floor((Math.max(a[1], b[1]) + queryRadiusMm - minY) / cellMm);
    for (let r = Math.max(0, r0); r <= Math.min(rows - 1, r1); r++) {
      for (let c = Math.max(0, c0); c <= Math.min(cols - 1, c1); c++) {
        const key = r * cols + c;
        const list = cells.get(key);
        if (list) list.push(i);
        else cells.set(key, [i]);
      }
    }
  }
  return { ring, minX, minY, cellMm, cols, rows, cells };
}

/**
 * True when `p` lies within `radiusMm` of the ring's boundary. `radiusMm` must not exceed the radius the grid was
 * built for.
 */
export function isNearBoundary(grid: SegmentGrid, p: Point, radiusMm: number): boolean {
  const c = Math.floor((p[0] - grid.minX) / grid.cellMm);
  const r = Math.floor((p[1] - grid.minY) / grid.cellMm);
  if (c < 0 || r < 0 || c >= grid.cols || r >= grid.rows) return false;
  const list = grid.cells.get(r * grid.cols + c);
  if (!list) return false;
  const ring = grid.ring;
  for (const i of list) {
    if (pointToSegmentDistance(p, ring[i]!, ring[(i + 1) % ring.length]!) <= radiusMm) return true;
  }
  return false;
}
