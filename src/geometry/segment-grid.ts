import type { Region } from './types.js';

/**
 * The boundary segments of a region bucketed in a uniform grid, for nearest-point and ray queries in about constant time
 * per query on profiles whose vertices are spread along the boundary (internal to the wall measurement).
 *
 * Segment k runs from (ax[k], ay[k]) to (bx[k], by[k]), mm; it is edge `edge[k]` of ring `ring[k]` (0 outer, then holes
 * in order). `cellStart`/`cellItems` list, for cell i + nx·j, the segments whose bounding box meets that cell.
 */
export interface SegmentGrid {
  readonly ax: Float64Array;
  readonly ay: Float64Array;
  readonly bx: Float64Array;
  readonly by: Float64Array;
  readonly ring: Int32Array;
  readonly edge: Int32Array;
  /** Lower-left corner of the grid, mm. */
  readonly minX: number;
  readonly minY: number;
  /** Cell side, mm. */
  readonly cell: number;
  readonly nx: number;
  readonly ny: number;
  readonly cellStart: Int32Array;
  readonly cellItems: Int32Array;
  /** For each cell, its chessboard distance in cells to the nearest cell holding a segment: every cell closer than that
   * is empty, so a nearest-point search may start there. */
  readonly emptyRings: Int32Array;
  /** Scratch stamps so a segment listed in several cells is tested once per query. */
  readonly stamp: Int32Array;
  /** The current query's stamp value (incremented per query). */
  query: number;
}

/** The cell index along one axis of coordinate v, clamped to the grid. */
export function cellOf(v: number, min: number, cell: number, count: number): number {
  const i = Math.floor((v - min) / cell);
  return i < 0 ? 0 : i >= count ? count - 1 : i;
}

/**
 * Buckets every boundary segment of a region (outer ring and holes, closing edges included) in a uniform grid of about
 * one cell per segment, with at most 1024 cells a side. A uniform grid is the classic spatial index for nearest-feature
 * queries on evenly spread data (Akman, Franklin et al., "Geometric computing and uniform grid technique",
 * Computer-Aided Design 21(7), 1989). Building is linear in the number of segments plus the cells they span.
 */
export function buildSegmentGrid(region: Region): SegmentGrid {
  const rings = [region.outer, ...region.holes];
  const count = rings.reduce((s, r) => s + r.length, 0);
  const ax = new Float64Array(count);
  const ay = new Float64Array(count);
  const bx = new Float64Array(count);
  const by = new Float64Array(count);
  const ring = new Int32Array(count);
  const edge = new Int32Array(count);
  let minX = Number.POSITIVE_INFINITY;
  let minY = Number.POSITIVE_INFINITY;
  let maxX = Number.NEGATIVE_INFINITY;
  let maxY = Number.NEGATIVE_INFINITY;
  let k = 0;
  rings.forEach((points, r) => {
    const n = points.length;
    for (let i = 0; i < n; i++) {
      const a = points[i]!;
      const b = points[(i + 1) % n]!;
      ax[k] = a[0];
      ay[k] = a[1];
      bx[k] = b[0];
      by[k] = b[1];
      ring[k] = r;
      edge[k] = i;
      k++;
      if (a[0] < minX) minX = a[0];
      if (a[0] > maxX) maxX = a[0];
      if (a[1] < minY) minY = a[1];
      if (a[1] > maxY) maxY = a[1];
    }
  });
  const w = Math.max(maxX - minX, 1e-9);
  const h = Math.max(maxY - minY, 1e-9);
  const cell = Math.max(Math.sqrt((w * h) / Math.max(count, 1)), Math.max(w, h) / 1024);
  const nx = Math.max(1, Math.ceil(w / cell));
  const ny = Math.max(1, Math.ceil(h / cell));
  const counts = new Int32Array(nx * ny + 1);
  const span = (s: number): [number, number, number, number] => [
    cellOf(Math.min(ax[s]!, bx[s]!), minX, cell, nx),
    cellOf(Math.max(ax[s]!, bx[s]!), minX, cell, nx),
    cellOf(Math.min(ay[s]!, by[s]!), minY, cell, ny),
    cellOf(Math.max(ay[s]!, by[s]!), minY, cell, ny),
  ];
  for (let s = 0; s < count; s++) {
    const [i0, i1, j0, j1] = span(s);
    for (let j = j0; j <= j1; j++) for (let i = i0; i <= i1; i++) counts[i + nx * j]!++;
  }
  const cellStart = new Int32Array(nx * ny + 1);
  for (let c = 0; c < nx * ny; c++) cellStart[c + 1] = cellStart[c]! + counts[c]!;
  const fill = cellStart.slice(0, nx * ny);
  const cellItems = new Int32Array(cellStart[nx * ny]!);
  for (let s = 0; s < count; s++) {
    const [i0, i1, j0, j1] = span(s);
    for (let j = j0; j <= j1; j++) for (let i = i0; i <= i1; i++) cellItems[fill[i + nx * j]!++] = s;
  }
  return {
    emptyRings: chessboardDistance(cellStart, nx, ny),
    ax,
    ay,
    bx,
    by,
    ring,
    edge,
    minX,
    minY,
    cell,
    nx,
    ny,
    cellStart,
    cellItems,
    stamp: new Int32Array(count),
    query: 0,
  };
}

/**
 * Chessboard (L∞) distance, in cells, from every cell to the nearest non-empty cell, by the two-pass sequential
 * distance transform (Rosenfeld & Pfaltz, "Sequential operations in digital picture processing", J. ACM 13(4), 1966).
 */
function chessboardDistance(cellStart: Int32Array, nx: number, ny: number): Int32Array {
  const far = nx + ny;
  const d = new Int32Array(nx * ny);
  for (let c = 0; c < nx * ny; c++) d[c] = cellStart[c + 1]! > cellStart[c]! ? 0 : far;
  const at = (i: number, j: number): number => (i < 0 || j < 0 || i >= nx || j >= ny ? far : d[i + nx * j]!);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const c = i + nx * j;
      d[c] = Math.min(d[c]!, at(i - 1, j) + 1, at(i - 1, j - 1) + 1, at(i, j - 1) + 1, at(i + 1, j - 1) + 1);
    }
  }
  for (let j = ny - 1; j >= 0; j--) {
    for (let i = nx - 1; i >= 0; i--) {
      const c = i + nx * j;
      d[c] = Math.min(d[c]!, at(i + 1, j) + 1, at(i + 1, j + 1) + 1, at(i, j + 1) + 1, at(i - 1, j + 1) + 1);
    }
  }
  return d;
}
