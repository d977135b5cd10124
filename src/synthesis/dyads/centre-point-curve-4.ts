import type { Point } from '../../geometry/index.js';
import { circlePointForCentre } from './circle-point-for-centre.js';
import { compatibilityCubic } from './compatibility-cubic.js';
import { type DisplacementPole, displacementPoles } from './displacement-poles.js';
import { type Dyad, measureDyad } from './measure-dyad.js';
import { polishDyad } from './polish-dyad.js';
import { checkPoses, placePoint, poseScale, type RelativePose } from './relative-pose.js';
import { quadraticRoots } from './small-linear.js';

/** Settings of `centrePointCurve4`; `resolveCentrePointCurveOptions` fills the defaults. */
export interface CentrePointCurveOptions {
  /** Rays through the base pole, evenly spaced in direction over [0, π). @default 720 */
  readonly directions: number;
  /**
   * Samples whose centre, or circle point at station 1, lies farther than this from the centroid of the pose
   * origins are left out, mm (the curve's unbounded branch runs to infinity). @default 1000
   */
  readonly extentMm: number;
  /** Neighbouring samples of one ray root farther apart than this get rays in between, mm. @default 5 */
  readonly maxGapMm: number;
  /** Most halvings of one ray interval when closing gaps. @default 8 */
  readonly maxRefinements: number;
  /** A sample is kept only when its `dyadResidual` over the four positions is at most this, mm. @default 1e-9 */
  readonly acceptResidualMm: number;
}

export function resolveCentrePointCurveOptions(
  partial: Partial<CentrePointCurveOptions> = {},
): CentrePointCurveOptions {
  const o = { directions: 720, extentMm: 1000, maxGapMm: 5, maxRefinements: 8, acceptResidualMm: 1e-9, ...partial };
  if (!Number.isInteger(o.directions) || o.directions < 4) throw new Error('centrePointCurve4: directions must be ≥ 4');
  if (!(o.extentMm > 0) || !(o.maxGapMm > 0) || !(o.acceptResidualMm > 0)) {
    throw new Error('centrePointCurve4: extentMm, maxGapMm and acceptResidualMm must be > 0');
  }
  if (!Number.isInteger(o.maxRefinements) || o.maxRefinements < 0) {
    throw new Error('centrePointCurve4: maxRefinements must be an integer ≥ 0');
  }
  return o;
}

/** One point of the centre-point curve with its circle point: an exact dyad for the four positions. */
export interface CurveSample extends Dyad {
  /** Direction of the ray from the base pole that found it, radians in [0, π). */
  readonly directionRad: number;
  /** Signed distance along that ray before polishing, mm. */
  readonly rayParameterMm: number;
}

export interface CentrePointCurve {
  /** `degenerate`: no pole at a finite place (the four positions are nearly pure translations); no samples. */
  readonly status: 'ok' | 'degenerate';
  /** The pole the rays start from, A's frame, mm. */
  readonly basePole: Point | null;
  /** The six poles Pᵢⱼ (0-based stations); every finite one lies on the curve. */
  readonly poles: readonly DisplacementPole[];
  /** Samples in ray order (direction, then distance along the ray). */
  readonly samples: readonly CurveSample[];
  /** Ray meets left out: outside `extentMm`, with no finite circle point, or with residual above the acceptance. */
  readonly dropped: number;
}

interface Ray {
  readonly phi: number;
  readonly u: Point;
  /** Distances along the ray to the curve, ascending; the base pole (t = 0) excluded. */
  readonly roots: readonly number[];
  /** Discriminant of the ray's quadratic, normalised; its sign says whether the ray meets the curve twice. */
  readonly disc: number;
}

/**
 * Four finitely separated positions: samples of the centre-point curve, the circular cubic of all centre points whose
 * circle point keeps one distance at all four positions, which passes through the six poles (Burmester; Sandor &
 * Erdman, *Advanced Mechanism Design* vol. 2, ch. 3; McCarthy & Soh, *Geometric Design of Linkages*, ch. 4).
 *
 * Method: the curve is det M(C) = 0 with the compatibility rows of `compatibilityCubic`. A line through a pole P meets
 * the cubic at P and at two more points, the roots of a quadratic in the distance t along the line; sweeping the line's
 * direction over [0, π) reaches every point of every real branch (the oval too). Rays are added between neighbours
 * whose samples lie more than `maxGapMm` apart, and at the directions where a ray touches the curve (found by
 * bisection on the discriminant). Each meet C is given its circle point by `circlePointForCentre`, then (C, c) is
 * polished by Newton's method on the equal-distance equations (`polishDyad`) and kept only if its residual over the
 * four positions is within `acceptResidualMm`. The base pole is the finite pole of the largest relative rotation.
 *
 * @param poses  pose of B relative to A at exactly 4 stations (throws otherwise)
 */
export function centrePointCurve4(
  poses: readonly RelativePose[],
  partialOptions: Partial<CentrePointCurveOptions> = {},
): CentrePointCurve {
  checkPoses(poses, 'centrePointCurve4', 4);
  const options = resolveCentrePointCurveOptions(partialOptions);
  const poles = displacementPoles(poses);
  let best: DisplacementPole | null = null;
  let bestSine = 1e-6;
  for (const p of poles) {
    const sine = Math.abs(Math.sin((poses[p.j]!.angleRad - poses[p.i]!.angleRad) / 2));
    if (p.pole && sine > bestSine) {
      best = p;
      bestSine = sine;
    }
  }
  if (!best?.pole) return { status: 'degenerate', basePole: null, poles, samples: [], dropped: 0 };
  const base = best.pole;
  const { reference, scaleMm } = poseScale(poses);
  const scale = Math.max(scaleMm, Math.hypot(base[0] - reference[0], base[1] - reference[1]));
  const within = (p: Point): boolean => Math.hypot(p[0] - reference[0], p[1] - reference[1]) <= options.extentMm;

  const rayAt = (phi: number): Ray => {
    const u: Point = [Math.cos(phi), Math.sin(phi)];
    const k = compatibilityCubic(poses, 0, [1, 2, 3], base, u);
    const s = Math.max(Math.abs(k[1]), Math.abs(k[2]), Math.abs(k[3])) || 1;
    const a = k[3] / s;
    const b = k[2] / s;
    const c = k[1] / s;
    return { phi, u, roots: quadraticRoots(a, b, c) ?? [], disc: b * b - 4 * a * c };
  };
  const pointOn = (ray: Ray, t: number): Point => [base[0] + t * ray.u[0], base[1] + t * ray.u[1]];

  const rays: Ray[] = [];
  const refine = (a: Ray, b: Ray, depth: number): void => {
    if (depth >= options.maxRefinements) return;
    if (a.roots.length !== b.roots.length) {
      // Bisect on the discriminant for the ray that touches the curve; keep the side where it meets it.
      let lo = a;
      let hi = b;
      for (let i = 0; i < 60 && hi.phi - lo.phi > 1e-15; i++) {
        const mid = rayAt(0.5 * (lo.phi + hi.phi));
        if (mid.roots.length === lo.roots.length) lo = mid;
        else hi = mid;
      }
      const touch = lo.roots.length > hi.roots.length ? lo : hi;
      if (touch === a || touch === b) return;
      rays.push(touch);
      if (touch === lo) refine(a, lo, depth + 1);
      else refine(hi, b, depth + 1);
      return;
    }
    for (let k = 0; k < a.roots.length; k++) {
      const pa = pointOn(a, a.roots[k]!);
      const pb = pointOn(b, b.roots[k]!);
      if (within(pa) && within(pb) && Math.hypot(pa[0] - pb[0], pa[1] - pb[1]) > options.maxGapMm) {
        const mid = rayAt(0.5 * (a.phi + b.phi));
        rays.push(mid);
        refine(a, mid, depth + 1);
        refine(mid, b, depth + 1);
        return;
      }
    }
  };
  const sweep = Array.from({ length: options.directions + 1 }, (_, i) => rayAt((Math.PI * i) / options.directions));
  for (let i = 0; i < options.directions; i++) {
    rays.push(sweep[i]!);
    refine(sweep[i]!, sweep[i + 1]!, 0);
  }
  rays.sort((p, q) => p.phi - q.phi);

  const samples: CurveSample[] = [];
  let dropped = 0;
  for (const ray of rays) {
    for (const t of ray.roots) {
      const sample = sampleAt(poses, pointOn(ray, t), scale);
      if (sample && sample.residualMm <= options.acceptResidualMm && within(sample.centre)) {
        const p1 = placePoint(poses[0]!, sample.circlePointLocal);
        if (within(p1)) {
          samples.push({ ...sample, directionRad: ray.phi, rayParameterMm: t });
          continue;
        }
      }
      dropped++;
    }
  }
  return { status: 'ok', basePole: base, poles, samples, dropped };
}

function sampleAt(poses: readonly RelativePose[], centre: Point, scaleMm: number): Dyad | null {
  const seed = circlePointForCentre(poses, centre);
  if (seed.status !== 'ok') return null;
  const polished = polishDyad(poses, centre, seed.circlePointLocal, scaleMm);
  const dyad = measureDyad(poses, polished.centre, polished.circlePointLocal);
  return Number.isFinite(dyad.residualMm) ? dyad : null;
}
