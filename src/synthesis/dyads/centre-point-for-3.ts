import type { Point } from '../../geometry/index.js';
import { checkPoint, checkPoses, placePoint, type RelativePose } from './relative-pose.js';

/** The centre point for three positions, or `collinear` when the circle point's positions admit no finite centre. */
export type CentrePoint3 =
  | {
      readonly status: 'ok';
      /** Circumcentre of the three circle-point positions, A's frame, mm. */
      readonly centre: Point;
      /** Link length, mm. */
      readonly radiusMm: number;
      /** The circle point at stations 1, 2, 3, A's frame, mm. */
      readonly circlePoints: readonly Point[];
    }
  | {
      readonly status: 'collinear';
      readonly centre: null;
      readonly radiusMm: number;
      readonly circlePoints: readonly Point[];
    };

/**
 * Three finitely separated positions: the centre point of a chosen circle point is the circumcentre of its three
 * positions, the meet of the perpendicular bisectors of P₁P₂ and P₂P₃ (Erdman, Sandor & Kota, *Mechanism Design*,
 * three-position motion generation; McCarthy & Soh, *Geometric Design of Linkages*, ch. 4). Computed relative to P₁:
 * with a = P₂ − P₁, b = P₃ − P₁ and D = 2·(a × b), centre = P₁ + (b_y|a|² − a_y|b|², a_x|b|² − b_x|a|²)/D.
 *
 * `collinear` (the point moves on a line: a slider, not a pin, fits it; or two positions coincide) when
 * |a × b| ≤ `collinearTolerance`·L², L the longest side: a relative test, scale-free. Then centre null, radius ∞.
 *
 * @param poses             pose of B relative to A at 3 stations
 * @param circlePointLocal  the chosen pin in B's frame, mm
 * @param collinearTolerance  dimensionless. @default 1e-9
 */
export function centrePointFor3(
  poses: readonly RelativePose[],
  circlePointLocal: Point,
  collinearTolerance = 1e-9,
): CentrePoint3 {
  checkPoses(poses, 'centrePointFor3', 3);
  checkPoint(circlePointLocal, 'centrePointFor3', 'circlePointLocal');
  const circlePoints = poses.map((pose) => placePoint(pose, circlePointLocal));
  const [p1, p2, p3] = circlePoints as [Point, Point, Point];
  const ax = p2[0] - p1[0];
  const ay = p2[1] - p1[1];
  const bx = p3[0] - p1[0];
  const by = p3[1] - p1[1];
  const aa = ax * ax + ay * ay;
  const bb = bx * bx + by * by;
  const longest = Math.max(aa, bb, (bx - ax) ** 2 + (by - ay) ** 2);
  const cross = ax * by - ay * bx;
  if (!(Math.abs(cross) > collinearTolerance * longest)) {
    return { status: 'collinear', centre: null, radiusMm: Number.POSITIVE_INFINITY, circlePoints };
  }
  const d = 2 * cross;
  const ux = (by * aa - ay * bb) / d;
  const uy = (ax * bb - bx * aa) / d;
  return { status: 'ok', centre: [p1[0] + ux, p1[1] + uy], radiusMm: Math.hypot(ux, uy), circlePoints };
}
