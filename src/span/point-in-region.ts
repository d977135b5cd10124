import type { Point, Region, Ring } from '../geometry/index.js';

/** Even–odd crossing test: true when `p` lies strictly inside the ring (points on the edge may go either way). */
export function pointInRing(p: Point, ring: Ring): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const a = ring[i]!;
    const b = ring[j]!;
    if (a[1] > p[1] !== b[1] > p[1] && p[0] < ((b[0] - a[0]) * (p[1] - a[1])) / (b[1] - a[1]) + a[0]) inside = !inside;
  }
  return inside;
}

/** True when `p` lies inside the outer ring and outside every hole. */
export function pointInRegion(p: Point, region: Region): boolean {
  return pointInRing(p, region.outer) && !region.holes.some((h) => pointInRing(p, h));
}
