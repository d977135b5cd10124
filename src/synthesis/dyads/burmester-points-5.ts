import type { Point } from '../../geometry/index.js';
import { circlePointForCentre } from './circle-point-for-centre.js';
import { compatibilityCubic } from './compatibility-cubic.js';
import { type DisplacementPole, displacementPole, displacementPoles } from './displacement-poles.js';
import { type Dyad, measureDyad } from './measure-dyad.js';
import { polishDyad } from './polish-dyad.js';
import { checkPoses, placePoint, poseScale, type RelativePose } from './relative-pose.js';
import { quadraticRoots } from './small-linear.js';

/** Settings of `burmesterPoints5`; `resolveBurmesterOptions` fills the defaults. */
export interface BurmesterOptions {
  /** Ray directions scanned per base pole over [0, π). @default 1440 */
  readonly directions: number;
  /** Position triples (each with its three poles as bases) scanned, best-conditioned first. @default 2 */
  readonly triples: number;
  /**
   * Pairs whose centre, or circle point at station 1, lies farther than this from the pose origins' centroid are
   * left out (and counted in `beyondExtent`), mm. @default Infinity (every real pair is returned)
   */
  readonly extentMm: number;
  /**
   * A pair is returned only when its `dyadResidual` over the five positions is at most this fraction of its length
   * scale (the largest of the pose scale, the link length and the distances of its pins from the pose origins'
   * centroid): far pairs carry rounding in proportion to their coordinates. Dimensionless. @default 1e-10
   */
  readonly acceptRelative: number;
  /**
   * Two pairs are one (the same root reached from several seeds) when their centres and circle points both agree
   * within this · L · (L / S), L their length scale and S the pose scale (`poseScale`, ≥ 1 mm): a root far from the
   * poses is fixed only to about L/S times the rounding of a near one. Dimensionless. @default 1e-7
   */
  readonly mergeRelative: number;
}

export function resolveBurmesterOptions(partial: Partial<BurmesterOptions> = {}): BurmesterOptions {
  const o = {
    directions: 1440,
    triples: 2,
    extentMm: Number.POSITIVE_INFINITY,
    acceptRelative: 1e-10,
    mergeRelative: 1e-7,
    ...partial,
  };
  if (!Number.isInteger(o.directions) || o.directions < 8) throw new Error('burmesterPoints5: directions must be ≥ 8');
  if (!Number.isInteger(o.triples) || o.triples < 1) throw new Error('burmesterPoints5: triples must be ≥ 1');
  if (!(o.extentMm > 0) || !(o.acceptRelative > 0) || !(o.mergeRelative > 0)) {
    throw new Error('burmesterPoints5: extentMm, acceptRelative and mergeRelative must be > 0');
  }
  return o;
}

export interface BurmesterPoints {
  /**
   * `ok`: `pairs` holds every real pair found within `extentMm` (0, 2 or 4 with those beyond it, generically; 1 or 3
   * only when two roots meet). `degenerate`: two positions coincide (only four distinct positions: a whole curve of
   * centre points, see `centrePointCurve4`), B turns about one fixed point, no three positions have three finite
   * poles (nearly pure translation), or more than four distinct pairs (a special motion with infinitely many).
   */
  readonly status: 'ok' | 'degenerate';
  readonly reason: string;
  /** Verified Burmester point pairs (centre in A, circle point in B), ordered by centre x then y. */
  readonly pairs: readonly Dyad[];
  /** Verified pairs left out because a pin lies beyond `extentMm`. */
  readonly beyondExtent: number;
  /** The ten poles Pᵢⱼ (0-based stations). */
  readonly poles: readonly DisplacementPole[];
}

interface Triple {
  readonly ref: number;
  readonly q: number;
  readonly s: number;
  readonly fourth: number;
  readonly fifth: number;
  readonly bases: readonly Point[];
  readonly conditioning: number;
}

/** A verified pair with the length its tolerances scale with, mm. */
interface Found {
  readonly dyad: Dyad;
  readonly lengthMm: number;
}

/**
 * Five finitely separated positions: the Burmester point pairs, the centre and circle points of the dyads that keep
 * one length at all five positions; at most four are real (Burmester 1888; Sandor & Erdman, *Advanced Mechanism
 * Design* vol. 2, ch. 3; McCarthy & Soh, *Geometric Design of Linkages*, ch. 4).
 *
 * Method: the centre points are the meets of the centre-point curves of positions {i, j, k, l} and {i, j, k, m}
 * (two circular cubics: nine meets less the two circular points at infinity and the three common poles Pᵢⱼ, Pᵢₖ,
 * Pⱼₖ leave four). Both cubics pass through each common pole, so along a ray from one of them each reduces to a
 * quadratic in the distance t (`compatibilityCubic`); the rays on which the two quadratics share a root are the zeros
 * of their resultant, a smooth function of the ray direction. The resultant is scanned over [0, π), its sign changes
 * bisected and its near-zero local minima kept, for each of the three common poles of the best-conditioned
 * `triples` triples. Every shared root seeds Newton's method on the four equal-distance equations (`polishDyad`,
 * started from `circlePointForCentre`); a seed is kept only when Newton converges and the residual over all five
 * positions is within `acceptRelative` of the pair's length scale L (the largest of the pose scale, the link length
 * and its pins' distances from the pose origins' centroid). The common poles themselves (where the scan also finds
 * zeros) fail that check. Seeds that reach one root agree to rounding, which grows with L and, as a far root is
 * ill-conditioned, with L/S (S the pose scale), so two pairs are merged when centres and circle points both agree
 * within `mergeRelative`·L·(L/S): an absolute tolerance kept far pairs (L of metres) many times over and reported
 * ordinary positions as having more than four.
 *
 * Degenerate input, judged before the scan: two positions that coincide (rotation within 1e-9 rad and origins within
 * 1e-9 of the pose scale; the fifth position then adds no condition), a pure rotation about one point (all ten poles
 * coincide), or no triple with three finite poles. After it: more than four distinct pairs.
 *
 * @param poses  pose of B relative to A at exactly 5 stations (throws otherwise)
 */
export function burmesterPoints5(
  poses: readonly RelativePose[],
  partialOptions: Partial<BurmesterOptions> = {},
): BurmesterPoints {
  checkPoses(poses, 'burmesterPoints5', 5);
  const options = resolveBurmesterOptions(partialOptions);
  const poles = displacementPoles(poses);
  const { reference, scaleMm } = poseScale(poses);
  const degenerate = (reason: string): BurmesterPoints => ({
    status: 'degenerate',
    reason,
    pairs: [],
    beyondExtent: 0,
    poles,
  });
  const repeated = coincidentPositions(poses, scaleMm);
  if (repeated) {
    return degenerate(
      `positions ${repeated[0] + 1} and ${repeated[1] + 1} coincide: only four distinct positions, whose centre points ` +
        'fill a curve (use the centre-point curve)',
    );
  }
  const pivot = commonPole(poles, reference, scaleMm);
  if (pivot) {
    return degenerate(
      `B turns about one fixed point (${pivot[0].toFixed(3)}, ${pivot[1].toFixed(3)}) mm at all five positions: every ` +
        'point of B keeps its distance to it, a whole family of links rather than Burmester pairs',
    );
  }
  const triples = usableTriples(poses).slice(0, options.triples);
  if (triples.length === 0) {
    return degenerate('no three positions have three finite poles: the positions are nearly pure translations');
  }
  const fromReference = (p: Point): number => Math.hypot(p[0] - reference[0], p[1] - reference[1]);
  const found: Found[] = [];
  const consider = (centre: Point, scale: number): void => {
    const seed = circlePointForCentre(poses, centre);
    if (seed.status !== 'ok') return;
    const polished = polishDyad(poses, centre, seed.circlePointLocal, scale);
    if (!polished.converged) return;
    const dyad = measureDyad(poses, polished.centre, polished.circlePointLocal);
    const lengthMm = Math.max(
      scaleMm,
      dyad.radiusMm,
      fromReference(dyad.centre),
      fromReference(placePoint(poses[0]!, dyad.circlePointLocal)),
    );
    if (!(dyad.residualMm <= options.acceptRelative * lengthMm)) return;
    const same = found.findIndex((f) => {
      const length = Math.max(lengthMm, f.lengthMm);
      const limit = options.mergeRelative * length * (length / scaleMm);
      return (
        Math.hypot(f.dyad.centre[0] - dyad.centre[0], f.dyad.centre[1] - dyad.centre[1]) <= limit &&
        Math.hypot(
          f.dyad.circlePointLocal[0] - dyad.circlePointLocal[0],
          f.dyad.circlePointLocal[1] - dyad.circlePointLocal[1],
        ) <= limit
      );
    });
    if (same < 0) found.push({ dyad, lengthMm });
    else if (dyad.residualMm < found[same]!.dyad.residualMm) found[same] = { dyad, lengthMm };
  };

  for (const triple of triples) {
    for (const base of triple.bases) {
      const scale = Math.max(scaleMm, fromReference(base));
      for (const centre of sharedRootSeeds(poses, triple, base, options.directions)) consider(centre, scale);
    }
  }
  const within = (f: Found): boolean =>
    fromReference(f.dyad.centre) <= options.extentMm &&
    fromReference(placePoint(poses[0]!, f.dyad.circlePointLocal)) <= options.extentMm;
  const pairs = found
    .filter(within)
    .map((f) => f.dyad)
    .sort((p, q) => p.centre[0] - q.centre[0] || p.centre[1] - q.centre[1]);
  const beyondExtent = found.length - pairs.length;
  if (found.length > 4) {
    return {
      status: 'degenerate',
      reason: `${found.length} distinct pairs: more than Burmester's four, so the positions are special (every point of a curve may fit)`,
      pairs,
      beyondExtent,
      poles,
    };
  }
  const beyond = beyondExtent > 0 ? `, ${beyondExtent} more beyond extentMm ${options.extentMm} mm` : '';
  return { status: 'ok', reason: `${pairs.length} real pair(s) found${beyond}`, pairs, beyondExtent, poles };
}

/** The pole shared by all ten displacements (a pure rotation about one point), within 1e-9 of the scale; else null. */
function commonPole(poles: readonly DisplacementPole[], reference: Point, scaleMm: number): Point | null {
  const first = poles[0]?.pole;
  if (!first) return null;
  const limit = 1e-9 * Math.max(scaleMm, Math.hypot(first[0] - reference[0], first[1] - reference[1]));
  for (const { pole } of poles) {
    if (!pole || !(Math.hypot(pole[0] - first[0], pole[1] - first[1]) <= limit)) return null;
  }
  return first;
}

/**
 * The first two positions (0-based) that coincide: rotations within 1e-9 rad (half-angle sine) and origins within
 * 1e-9 of the pose scale; null when all five are distinct.
 */
function coincidentPositions(poses: readonly RelativePose[], scaleMm: number): [number, number] | null {
  for (let i = 0; i < poses.length; i++) {
    for (let j = i + 1; j < poses.length; j++) {
      const a = poses[i]!;
      const b = poses[j]!;
      const turn = Math.abs(Math.sin((b.angleRad - a.angleRad) / 2));
      const shift = Math.hypot(b.origin[0] - a.origin[0], b.origin[1] - a.origin[1]);
      if (turn <= 1e-9 && shift <= 1e-9 * scaleMm) return [i, j];
    }
  }
  return null;
}

/** Triples of positions whose three poles are finite, best-conditioned (largest smallest half-angle sine) first. */
function usableTriples(poses: readonly RelativePose[]): Triple[] {
  const out: Triple[] = [];
  const sine = (i: number, j: number): number => Math.abs(Math.sin((poses[j]!.angleRad - poses[i]!.angleRad) / 2));
  for (let a = 0; a < 5; a++) {
    for (let b = a + 1; b < 5; b++) {
      for (let c = b + 1; c < 5; c++) {
        const pab = displacementPole(poses[a]!, poses[b]!);
        const pac = displacementPole(poses[a]!, poses[c]!);
        const pbc = displacementPole(poses[b]!, poses[c]!);
        const conditioning = Math.min(sine(a, b), sine(a, c), sine(b, c));
        if (!pab || !pac || !pbc || !(conditioning > 1e-6)) continue;
        const [fourth, fifth] = [0, 1, 2, 3, 4].filter((k) => k !== a && k !== b && k !== c) as [number, number];
        out.push({ ref: a, q: b, s: c, fourth, fifth, bases: [pab, pac, pbc], conditioning });
      }
    }
  }
  return out.sort((x, y) => y.conditioning - x.conditioning);
}

/**
 * Centre points where the rays from `base` meet both curves at one point: the real roots of either quadratic on the
 * rays where the resultant of the two quadratics vanishes (bisected sign changes) or comes closest to it (local
 * minima of its magnitude).
 */
function sharedRootSeeds(poses: readonly RelativePose[], triple: Triple, base: Point, directions: number): Point[] {
  const quadratics = (phi: number): { q1: number[]; q2: number[]; u: Point } => {
    const u: Point = [Math.cos(phi), Math.sin(phi)];
    const k1 = compatibilityCubic(poses, triple.ref, [triple.q, triple.s, triple.fourth], base, u);
    const k2 = compatibilityCubic(poses, triple.ref, [triple.q, triple.s, triple.fifth], base, u);
    return { q1: normalised([k1[3], k1[2], k1[1]]), q2: normalised([k2[3], k2[2], k2[1]]), u };
  };
  const resultant = (phi: number): number => {
    const { q1, q2 } = quadratics(phi);
    const [a1, b1, c1] = q1 as [number, number, number];
    const [a2, b2, c2] = q2 as [number, number, number];
    return (a1 * c2 - a2 * c1) ** 2 - (a1 * b2 - a2 * b1) * (b1 * c2 - b2 * c1);
  };
  const phis = Array.from({ length: directions + 1 }, (_, i) => (Math.PI * i) / directions);
  const values = phis.map(resultant);
  const found: number[] = [];
  for (let i = 0; i < directions; i++) {
    const ra = values[i]!;
    const rb = values[i + 1]!;
    if (ra === 0) found.push(phis[i]!);
    else if (ra * rb < 0) {
      let lo = phis[i]!;
      let hi = phis[i + 1]!;
      let flo = ra;
      for (let k = 0; k < 60 && hi - lo > 1e-16; k++) {
        const mid = 0.5 * (lo + hi);
        const fm = resultant(mid);
        if (fm * flo > 0) {
          lo = mid;
          flo = fm;
        } else hi = mid;
      }
      found.push(0.5 * (lo + hi));
    }
    const prev = values[(i + directions - 1) % directions]!;
    if (i > 0 && Math.abs(ra) <= Math.abs(prev) && Math.abs(ra) <= Math.abs(rb)) found.push(phis[i]!);
  }
  const seeds: Point[] = [];
  for (const phi of found) {
    const { q1, q2, u } = quadratics(phi);
    for (const q of [q1, q2]) {
      for (const t of quadraticRoots(q[0]!, q[1]!, q[2]!) ?? []) seeds.push([base[0] + t * u[0], base[1] + t * u[1]]);
    }
  }
  return seeds;
}

function normalised(q: number[]): number[] {
  const s = Math.max(...q.map(Math.abs));
  return s > 0 ? q.map((v) => v / s) : q;
}
