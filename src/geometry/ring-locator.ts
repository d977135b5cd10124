import type { Tolerances } from '../numeric/index.js';
import { edgeAgainstPoint, type PointLocation, pointInRing } from './point-in-ring.js';
import type { Point, Ring } from './types.js';

/** Locates points against one ring, as `pointInRing` does, after bucketing its edges once. */
export type RingLocator = (p: Point) => PointLocation;

/** Rings with fewer edges than this are located by `pointInRing` directly (bucketing would not pay). */
const BUCKET_FROM_EDGES = 64;

const built = new WeakMap<Ring, Map<number, RingLocator>>();

/**
 * A point locator for a ring that is queried many times (a die opening or a station's boundary checked at every step
 * of a motion): the same answers as `pointInRing(p, ring, tol)` (inside, outside, or boundary within `tol.lengthMm`
 * of an edge; even–odd rule along +x with the half-open rule on y), but each query looks only at the edges whose y
 * range, widened by the tolerance, meets a horizontal band round p: the only edges that can be within the tolerance
 * of p or cross the ray from it. About √n bands of equal height (the slab idea of Dobkin and Lipton, "Multidimensional
 * searching problems", SIAM J. Comput. 5(2), 1976, without its sorting). Built once per ring and tolerance and kept
 * with the ring (weakly), so pass the same ring object each time.
 */
export function ringLocator(ring: Ring, tol: Tolerances): RingLocator {
  const t = tol.lengthMm;
  let byTol = built.get(ring);
  const known = byTol?.get(t);
  if (known) return known;
  const locate = ring.length < BUCKET_FROM_EDGES ? (p: Point) => pointInRing(p, ring, tol) : bucketed(ring, t);
  if (!byTol) {
    byTol = new Map();
    built.set(ring, byTol);
  }
  byTol.set(t, locate);
  return locate;
}

function bucketed(ring: Ring, t: number): RingLocator {
  const n = ring.length;
  let minY = Number.POSITIVE_INFINITY;
  let maxY = Number.NEGATIVE_INFINITY;
  for (const p of ring) {
    minY = Math.min(minY, p[1]);
    maxY = Math.max(maxY, p[1]);
  }
  const bands = Math.max(1, Math.round(Math.sqrt(n)));
  const low = minY - t;
  const height = (maxY + t - low) / bands || 1;
  const bandOf = (y: number) => Math.min(bands - 1, Math.max(0, Math.floor((y - low) / height)));
  const members: number[][] = Array.from({ length: bands }, () => []);
  // edge k runs from ring[k] to ring[k − 1] (ring[n − 1] for k = 0), as pointInRing walks them
  for (let k = 0; k < n; k++) {
    const a = ring[k]!;
    const b = ring[k === 0 ? n - 1 : k - 1]!;
    const from = bandOf(Math.min(a[1], b[1]) - t);
    const to = bandOf(Math.max(a[1], b[1]) + t);
    for (let band = from; band <= to; band++) members[band]!.push(k);
  }
  return (p) => {
    const py = p[1];
    if (py < minY - t || py > maxY + t) return 'outside';
    let inside = false;
    for (const k of members[bandOf(py)]!) {
      const edge = edgeAgainstPoint(p, ring[k]!, ring[k === 0 ? n - 1 : k - 1]!, t);
      if (edge === 'boundary') return 'boundary';
      if (edge === 'crosses') inside = !inside;
    }
    return inside ? 'inside' : 'outside';
  };
}
