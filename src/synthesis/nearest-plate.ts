import type { Point } from '../geometry/index.js';

/** Where a point meets a chain of pivots: the nearest plate, the position along it, the distance. */
export interface PlateProjection {
  /** Index of the nearest plate (segment k joins pivots k and k + 1). */
  readonly plate: number;
  /** Position of the nearest point along that plate: 0 at its first pivot, 1 at its second. */
  readonly t: number;
  /** Distance from the point to the pivot polyline, mm. */
  readonly distance: number;
  /** Length of that plate at this pose, mm. */
  readonly plateLengthMm: number;
}

/**
 * The nearest plate of a pivot polyline to `q` (brute force over the plates: chains have tens of plates). The plates'
 * melt edge lies at e from this polyline, so `distance − e` is how far q misses the straight-edged plates.
 */
export function nearestPlate(q: Point, pivots: readonly Point[]): PlateProjection {
  let best = Number.POSITIVE_INFINITY;
  let plate = 0;
  let bestT = 0;
  let bestLength = 0;
  for (let k = 0; k + 1 < pivots.length; k++) {
    const a = pivots[k]!;
    const b = pivots[k + 1]!;
    const dx = b[0] - a[0];
    const dy = b[1] - a[1];
    const l2 = dx * dx + dy * dy;
    const t = l2 > 0 ? Math.max(0, Math.min(1, ((q[0] - a[0]) * dx + (q[1] - a[1]) * dy) / l2)) : 0;
    const ex = a[0] + t * dx - q[0];
    const ey = a[1] + t * dy - q[1];
    const d2 = ex * ex + ey * ey;
    if (d2 < best) {
      best = d2;
      plate = k;
      bestT = t;
      bestLength = Math.sqrt(l2);
    }
  }
  return { plate, t: bestT, distance: Math.sqrt(best), plateLengthMm: bestLength };
}
