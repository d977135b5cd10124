import { DEFAULT_TOLERANCES, type Tolerances } from '../numeric/index.js';
import type { Polyline } from './types.js';

/**
 * Signed curvature at every vertex of a polyline, 1/mm: 1/R of the circle through the vertex and its two neighbours
 * (Menger curvature, κ = 4·area(a, b, c) / (|ab|·|bc|·|ca|)), positive where the polyline turns left
 * (counter-clockwise, y up), negative where it turns right, zero where the three points are collinear.
 *
 * Points on a circle of radius R give exactly 1/R whatever their spacing. On an open polyline the two end vertices
 * have no circle; they repeat their neighbour's value. With `closed` every vertex uses its cyclic neighbours.
 *
 * @param closed Treat the polyline as a ring. @default false
 * @param tol `tol.lengthMm`: neighbours closer than this are repeated points. @default DEFAULT_TOLERANCES
 * @throws RangeError when the polyline has fewer than two points, or two neighbours coincide (normalise it first).
 */
export function discreteCurvature(polyline: Polyline, closed = false, tol: Tolerances = DEFAULT_TOLERANCES): number[] {
  const n = polyline.length;
  if (n < 2) throw new RangeError('discreteCurvature: the polyline needs at least two points');
  if (n === 2) return [0, 0];
  const kappa: number[] = new Array<number>(n).fill(0);
  const start = closed ? 0 : 1;
  const end = closed ? n : n - 1;
  for (let i = start; i < end; i++) {
    const a = polyline[(i - 1 + n) % n]!;
    const b = polyline[i]!;
    const c = polyline[(i + 1) % n]!;
    const abx = b[0] - a[0];
    const aby = b[1] - a[1];
    const bcx = c[0] - b[0];
    const bcy = c[1] - b[1];
    const ab = Math.hypot(abx, aby);
    const bc = Math.hypot(bcx, bcy);
    const ca = Math.hypot(c[0] - a[0], c[1] - a[1]);
    if (ab <= tol.lengthMm || bc <= tol.lengthMm) {
      throw new RangeError(`discreteCurvature: vertex ${i} repeats a neighbour; normalise the polyline first`);
    }
    // A spike that folds straight back (a = c) has no circle through the three points; its turn is unbounded.
    if (ca <= tol.lengthMm) throw new RangeError(`discreteCurvature: the polyline folds back on itself at vertex ${i}`);
    kappa[i] = (2 * (abx * bcy - aby * bcx)) / (ab * bc * ca);
  }
  if (!closed) {
    kappa[0] = kappa[1]!;
    kappa[n - 1] = kappa[n - 2]!;
  }
  return kappa;
}
