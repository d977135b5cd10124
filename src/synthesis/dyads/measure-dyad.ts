import type { Point } from '../../geometry/index.js';
import { placePoint, type RelativePose } from './relative-pose.js';

/**
 * A binary link (RR dyad) between body A and body B: one pin fixed in A, one fixed in B, a constant distance apart
 * over the stations (Erdman, Sandor & Kota, *Mechanism Design*, dyad form of the standard synthesis).
 */
export interface Dyad {
  /** Pin fixed in A (the centre point when A is the die body), A's frame, mm. */
  readonly centre: Point;
  /** Pin fixed in B (the circle point), B's frame, mm. */
  readonly circlePointLocal: Point;
  /** Link length: the mean centre–circle-point distance over the stations, mm. */
  readonly radiusMm: number;
  /** Largest |distance − radiusMm| over the stations, mm (see `dyadResidual`). */
  readonly residualMm: number;
}

/** Centre–circle-point distance at every station, mm. */
export function dyadDistances(poses: readonly RelativePose[], centre: Point, circlePointLocal: Point): number[] {
  return poses.map((pose) => {
    const p = placePoint(pose, circlePointLocal);
    return Math.hypot(p[0] - centre[0], p[1] - centre[1]);
  });
}

/**
 * How far a candidate link is from rigid, mm: max over stations of |distance − mean distance|, where distance is
 * between `centre` (A's frame) and the circle point `circlePointLocal` (B's frame) placed by each pose. 0 for an
 * exact dyad. NaN when an input is NaN.
 */
export function dyadResidual(poses: readonly RelativePose[], centre: Point, circlePointLocal: Point): number {
  return measureDyad(poses, centre, circlePointLocal).residualMm;
}

/** The dyad with its link length (mean distance) and residual (`dyadResidual`) measured over `poses`. */
export function measureDyad(poses: readonly RelativePose[], centre: Point, circlePointLocal: Point): Dyad {
  const d = dyadDistances(poses, centre, circlePointLocal);
  const mean = d.reduce((s, v) => s + v, 0) / d.length;
  let residualMm = 0;
  for (const v of d) {
    const e = Math.abs(v - mean);
    // NaN must win over any finite maximum.
    if (!(e <= residualMm)) residualMm = e;
  }
  return { centre, circlePointLocal, radiusMm: mean, residualMm };
}
