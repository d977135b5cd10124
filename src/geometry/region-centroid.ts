import { boundingBox } from './bounding-box.js';
import type { Point, Region, Ring } from './types.js';

interface RingMoments {
  readonly area: number;
  readonly mx: number;
  readonly my: number;
}

/** Unsigned area and first moments of a ring about the origin (shoelace form of the polygon centroid). */
function ringMoments(ring: Ring): RingMoments {
  const n = ring.length;
  let a2 = 0;
  let cx = 0;
  let cy = 0;
  if (n < 3) return { area: 0, mx: 0, my: 0 };
  // Shift to the first point for precision, and shift the moments back at the end.
  const [ox, oy] = ring[0]!;
  for (let i = 0; i < n; i++) {
    const p = ring[i]!;
    const q = ring[(i + 1) % n]!;
    const x0 = p[0] - ox;
    const y0 = p[1] - oy;
    const x1 = q[0] - ox;
    const y1 = q[1] - oy;
    const cross = x0 * y1 - x1 * y0;
    a2 += cross;
    cx += (x0 + x1) * cross;
    cy += (y0 + y1) * cross;
  }
  const sign = a2 < 0 ? -1 : 1;
  const area = (sign * a2) / 2;
  // Moment of the shifted ring is (c/6)·sign; add area·origin to move it back.
  return { area, mx: (sign * cx) / 6 + area * ox, my: (sign * cy) / 6 + area * oy };
}

/**
 * Area centroid of a region, mm: the outer ring's centroid with the holes' areas taken away (composite-area rule,
 * polygon centroid by the shoelace moments). Any ring orientation is accepted.
 *
 * The centroid of a non-convex region may lie outside the material (an annulus's centroid is its centre).
 *
 * @throws RangeError when the region's area is negligible against its size (no centroid exists).
 */
export function regionCentroid(region: Region): Point {
  const outer = ringMoments(region.outer);
  let area = outer.area;
  let mx = outer.mx;
  let my = outer.my;
  for (const hole of region.holes) {
    const h = ringMoments(hole);
    area -= h.area;
    mx -= h.mx;
    my -= h.my;
  }
  const box = region.outer.length > 0 ? boundingBox(region.outer) : undefined;
  const size = box ? Math.hypot(box.maxX - box.minX, box.maxY - box.minY) : 0;
  if (!(area > 1e-12 * size * size) || !(size > 0)) {
    throw new RangeError('regionCentroid: the region has no area, so it has no centroid');
  }
  return [mx / area, my / area];
}
