import type { Point } from '../../geometry/index.js';
import { checkPoint, checkPoses, invertPoses, placePoint, type RelativePose } from './relative-pose.js';

/** A straight slot fitted to a point's positions (total least squares). */
export interface SliderFit {
  /** `coincident`: the point hardly moves (spread ≤ 1e-12 of its distance from the origin, or exactly 0); no line. */
  readonly status: 'ok' | 'coincident';
  /** A point on the line (the centroid of the positions), frame of the slotted body, mm. */
  readonly linePoint: Point;
  /** Unit direction of the line, oriented so travel runs from the first station towards the last. */
  readonly direction: Point;
  /** Position of the pin's foot on the line at each station, measured from `linePoint` along `direction`, mm. */
  readonly travelMm: readonly number[];
  /** √(mean squared perpendicular distance) of the positions from the line, mm. */
  readonly residualRmsMm: number;
  /** Largest perpendicular distance of a position from the line, mm. */
  readonly residualMaxMm: number;
}

/**
 * An RP dyad: a pin fixed in B (`circlePointLocal`, B's frame) running in a straight slot of A. The slot is the
 * total-least-squares line through the pin's positions (the principal axis of their scatter matrix, Pearson 1901),
 * reported with its residual; exact (residual 0) only when the point moves on a line, which a circle point at
 * infinity of Burmester theory does (Erdman, Sandor & Kota, *Mechanism Design*, slider dyads). Line in A's frame.
 *
 * @param poses  pose of B relative to A at ≥ 2 stations
 */
export function sliderDyad(poses: readonly RelativePose[], circlePointLocal: Point): SliderFit {
  checkPoses(poses, 'sliderDyad', 2, Number.POSITIVE_INFINITY);
  checkPoint(circlePointLocal, 'sliderDyad', 'circlePointLocal');
  return fitLine(poses.map((pose) => placePoint(pose, circlePointLocal)));
}

/**
 * The PR inversion: a pin fixed in A (`pinInA`, A's frame) running in a straight slot of B; `sliderDyad` on the
 * inverted poses (`invertPoses`), so the line, travel and residuals are in B's frame.
 */
export function invertedSliderDyad(poses: readonly RelativePose[], pinInA: Point): SliderFit {
  checkPoses(poses, 'invertedSliderDyad', 2, Number.POSITIVE_INFINITY);
  checkPoint(pinInA, 'invertedSliderDyad', 'pinInA');
  return fitLine(invertPoses(poses).map((pose) => placePoint(pose, pinInA)));
}

function fitLine(points: readonly Point[]): SliderFit {
  const n = points.length;
  let mx = 0;
  let my = 0;
  for (const p of points) {
    mx += p[0];
    my += p[1];
  }
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  let size = 0;
  for (const p of points) {
    const ux = p[0] - mx;
    const uy = p[1] - my;
    sxx += ux * ux;
    sxy += ux * uy;
    syy += uy * uy;
    size = Math.max(size, Math.abs(p[0]), Math.abs(p[1]));
  }
  const linePoint: Point = [mx, my];
  if (!(sxx + syy > 1e-24 * n * size * size)) {
    return {
      status: 'coincident',
      linePoint,
      direction: [1, 0],
      travelMm: points.map(() => 0),
      residualRmsMm: Math.sqrt((sxx + syy) / n),
      residualMaxMm: Math.max(...points.map((p) => Math.hypot(p[0] - mx, p[1] - my))),
    };
  }
  const angle = 0.5 * Math.atan2(2 * sxy, sxx - syy);
  let dx = Math.cos(angle);
  let dy = Math.sin(angle);
  const first = points[0]!;
  const last = points[n - 1]!;
  if ((last[0] - first[0]) * dx + (last[1] - first[1]) * dy < 0) {
    dx = -dx;
    dy = -dy;
  }
  let sum = 0;
  let max = 0;
  const travelMm = points.map((p) => {
    const ux = p[0] - mx;
    const uy = p[1] - my;
    const e = Math.abs(-dy * ux + dx * uy);
    sum += e * e;
    max = Math.max(max, e);
    return dx * ux + dy * uy;
  });
  return {
    status: 'ok',
    linePoint,
    direction: [dx, dy],
    travelMm,
    residualRmsMm: Math.sqrt(sum / n),
    residualMaxMm: max,
  };
}
