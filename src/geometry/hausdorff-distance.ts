import { DEFAULT_HAUSDORFF_ERROR_MM, directedHausdorffDistance } from './directed-hausdorff-distance.js';
import type { Point, Polyline } from './types.js';

/** The symmetric Hausdorff distance between two boundaries and a pair of points that realises it. */
export interface HausdorffResult {
  /** max(sup over a of dist(a, B), sup over b of dist(b, A)), mm, to within the requested error (never above). */
  readonly distance: number;
  /** The point of A at the ends of the realising pair, mm: the farthest point of A when A→B is the larger direction,
   * otherwise the point of A nearest the farthest point of B. */
  readonly fromA: Point;
  /** The point of B at the other end of the realising pair, mm; |fromA − toB| = distance. */
  readonly toB: Point;
}

/** Options for `hausdorffDistance`. */
export interface HausdorffOptions {
  /** A is a ring (its closing segment counts). @default false */
  readonly closedA?: boolean;
  /** B is a ring (its closing segment counts). @default false */
  readonly closedB?: boolean;
  /** Largest amount by which the result may fall short of the exact distance, mm. @default 1e-4 */
  readonly maxErrorMm?: number;
}

/**
 * The symmetric Hausdorff distance between two boundaries (polylines or rings), mm: how far the worst point of either
 * boundary lies from the other. All points along segments count, not only vertices; see `directedHausdorffDistance`
 * for the adaptive subdivision and the bound `distance ≤ exact ≤ distance + maxErrorMm`.
 *
 * Example: a chord of length L and the arc of radius R it cuts are a sagitta R − √(R² − L²/4) apart.
 *
 * @throws RangeError when either boundary has no points.
 */
export function hausdorffDistance(a: Polyline, b: Polyline, options: HausdorffOptions = {}): HausdorffResult {
  const maxError = options.maxErrorMm ?? DEFAULT_HAUSDORFF_ERROR_MM;
  const pa = [{ points: a, closed: options.closedA ?? false }];
  const pb = [{ points: b, closed: options.closedB ?? false }];
  const ab = directedHausdorffDistance(pa, pb, maxError);
  const ba = directedHausdorffDistance(pb, pa, maxError);
  return ab.distance >= ba.distance
    ? { distance: ab.distance, fromA: ab.from, toB: ab.to }
    : { distance: ba.distance, fromA: ba.to, toB: ba.from };
}
