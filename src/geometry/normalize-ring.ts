import type { Tolerances } from '../numeric/index.js';
import { orientRing, type RingOrientation } from './orient-ring.js';
import type { Point, Ring } from './types.js';

/**
 * Whether `p` adds nothing to the ring between its neighbours `a` and `b`: it repeats `b`, or lies on the line through
 * them, or is the tip of a spike that comes straight back (`a` and `b` coincide).
 */
function isRedundant(p: Point, a: Point, b: Point, eps: number): boolean {
  if (Math.hypot(p[0] - b[0], p[1] - b[1]) <= eps) return true;
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len = Math.hypot(dx, dy);
  if (len <= eps) return true;
  return Math.abs(dx * (p[1] - a[1]) - dy * (p[0] - a[0])) / len <= eps;
}

/**
 * A cleaned copy of a ring, mm: points within `tol.lengthMm` of the previous kept point are dropped (this removes a
 * repeated closing point too), then every point lying within `tol.lengthMm` of the line through its two neighbours is
 * dropped (collinear points, and zero-width spikes that fold back along an edge), repeating until none is left; the
 * result runs counter-clockwise (y up) unless `orientation` says otherwise.
 *
 * A ring that collapses to fewer than three points is returned as what is left (`validateRegion` reports it); it is
 * not an error here.
 *
 * @param orientation Turning sense of the result. @default 'ccw'
 */
export function normalizeRing(ring: Ring, tol: Tolerances, orientation: RingOrientation = 'ccw'): Ring {
  const eps = tol.lengthMm;
  const pts: Point[] = [];
  for (const p of ring) {
    const last = pts[pts.length - 1];
    if (last === undefined || Math.hypot(p[0] - last[0], p[1] - last[1]) > eps) pts.push(p);
  }
  while (pts.length > 1) {
    const first = pts[0]!;
    const last = pts[pts.length - 1]!;
    if (Math.hypot(first[0] - last[0], first[1] - last[1]) > eps) break;
    pts.pop();
  }
  // Removing one point changes its neighbours' test, so sweep until a whole pass removes nothing.
  let changed = true;
  while (changed && pts.length > 2) {
    changed = false;
    for (let i = 0; i < pts.length && pts.length > 2; ) {
      const prev = pts[(i - 1 + pts.length) % pts.length]!;
      const next = pts[(i + 1) % pts.length]!;
      if (isRedundant(pts[i]!, prev, next, eps)) {
        pts.splice(i, 1);
        changed = true;
      } else {
        i++;
      }
    }
  }
  return orientRing(pts, orientation);
}
