import type { Point } from '../../geometry/index.js';

/** An algebraic circle fit. `collinear`: the points lie on a line (or coincide) to within the tolerance; no centre. */
export type KasaCircle =
  | { readonly status: 'ok'; readonly centre: Point; readonly radiusMm: number }
  | { readonly status: 'collinear'; readonly centre: null; readonly radiusMm: number };

/**
 * Kåsa's algebraic circle fit (Kåsa, IEEE Trans. Instrum. Meas. IM-25(1), 1976): the centre m and radius r that
 * minimise Σ(|pᵢ − m|² − r²)², a linear least-squares problem. Solved on points centred at their centroid, where it
 * reduces to S·m' = ½·Σuᵢ|uᵢ|² with the scatter matrix S = Σuᵢuᵢᵀ and r² = mean|uᵢ − m'|². Through three points it
 * gives their circumcentre; through more points on one circle, that circle exactly.
 *
 * `collinear` when S is singular to `collinearTolerance` (its smaller eigenvalue ≤ tolerance × the larger: the
 * points' width across their best line is below √tolerance × their length), or when all points coincide; radius ∞.
 * Throws for fewer than 3 points.
 *
 * @param collinearTolerance  relative eigenvalue threshold, dimensionless. @default 1e-12
 */
export function kasaCircleFit(points: readonly Point[], collinearTolerance = 1e-12): KasaCircle {
  if (points.length < 3) throw new Error(`kasaCircleFit: needs at least 3 points, got ${points.length}`);
  let mx = 0;
  let my = 0;
  for (const p of points) {
    mx += p[0];
    my += p[1];
  }
  mx /= points.length;
  my /= points.length;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  let gx = 0;
  let gy = 0;
  let meanSq = 0;
  for (const p of points) {
    const ux = p[0] - mx;
    const uy = p[1] - my;
    const q = ux * ux + uy * uy;
    sxx += ux * ux;
    sxy += ux * uy;
    syy += uy * uy;
    gx += 0.5 * ux * q;
    gy += 0.5 * uy * q;
    meanSq += q;
  }
  meanSq /= points.length;
  const half = 0.5 * (sxx + syy);
  const root = Math.hypot(0.5 * (sxx - syy), sxy);
  const lMax = half + root;
  const lMin = half - root;
  const det = sxx * syy - sxy * sxy;
  if (!(lMax > 0) || !(lMin > collinearTolerance * lMax) || !(det > 0)) {
    return { status: 'collinear', centre: null, radiusMm: Number.POSITIVE_INFINITY };
  }
  const cx = (syy * gx - sxy * gy) / det;
  const cy = (sxx * gy - sxy * gx) / det;
  return { status: 'ok', centre: [mx + cx, my + cy], radiusMm: Math.sqrt(meanSq + cx * cx + cy * cy) };
}
