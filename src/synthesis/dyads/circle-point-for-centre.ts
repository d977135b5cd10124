import type { Point } from '../../geometry/index.js';
import { kasaCircleFit } from './kasa-circle-fit.js';
import { type Dyad, measureDyad } from './measure-dyad.js';
import { checkPoint, checkPoses, localPoint, type RelativePose } from './relative-pose.js';

/** The circle point for a given centre, or `collinear` when the centre's inverted positions lie on a line. */
export type CirclePointSolve =
  | ({ readonly status: 'ok' } & Dyad)
  | {
      readonly status: 'collinear';
      readonly centre: Point;
      readonly circlePointLocal: null;
      readonly radiusMm: number;
      readonly residualMm: number;
    };

/**
 * The circle point for a chosen centre point, by kinematic inversion (Erdman, Sandor & Kota, *Mechanism Design*;
 * McCarthy & Soh, *Geometric Design of Linkages*, ch. 4): seen from B, the centre occupies Cᵢ' = R(−θᵢ)(C − dᵢ), and
 * the circle point is the point of B equidistant from all of them. The conditions 2Cᵢ'·c + k = |Cᵢ'|² are linear in
 * (c, k), solved by the Kåsa fit (`kasaCircleFit`): exact for 3 positions; for 4 or more exact only when `centre`
 * lies on the centre-point curve (4) or is a Burmester point (5), otherwise a least-squares circle point whose
 * `residualMm` (from `measureDyad`) says how far the link is from rigid.
 *
 * `collinear` when the Cᵢ' lie on a line: the circle point is at infinity (a slider in B would fit instead).
 *
 * @param poses   pose of B relative to A at ≥ 3 stations
 * @param centre  pin fixed in A, A's frame, mm
 */
export function circlePointForCentre(poses: readonly RelativePose[], centre: Point): CirclePointSolve {
  checkPoses(poses, 'circlePointForCentre', 3, Number.POSITIVE_INFINITY);
  checkPoint(centre, 'circlePointForCentre', 'centre');
  const fit = kasaCircleFit(poses.map((pose) => localPoint(pose, centre)));
  if (fit.status === 'collinear') {
    return {
      status: 'collinear',
      centre,
      circlePointLocal: null,
      radiusMm: Number.POSITIVE_INFINITY,
      residualMm: Number.POSITIVE_INFINITY,
    };
  }
  return { status: 'ok', ...measureDyad(poses, centre, fit.centre) };
}
