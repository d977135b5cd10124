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
  /** Pairs whose centre, or circle point at station 1, lies farther than this from the pose origins' centroid are left out, mm. @default 10000 */
  readonly extentMm: number;
  /** A pair is returned only when its `dyadResidual` over the five positions is at most this, mm. @default 1e-8 */
  readonly acceptResidualMm: number;
  /** Two pairs whose centres and circle points both agree within this are one, mm. @default 1e-6 */
  readonly mergeMm: number;
}

export function resolveBurmesterOptions(partial: Partial<BurmesterOptions> = {}): BurmesterOptions {
  const o = { directions: 1440, triples: 2, extentMm: 10_000, acceptResidualMm: 1e-8, mergeMm: 1e-6, ...partial };
  if (!Number.isInteger(o.directions) || o.directions < 8) throw new Error('burmesterPoints5: directions must be ≥ 8');
  if (!Number.isInteger(o.triples) || o.triples < 1) throw new Error('burmesterPoints5: triples must be ≥ 1');
  if (!(o.extentMm > 0) || !(o.acceptResidualMm > 0) || !(o.mergeMm > 0)) {
    throw new Error('burmesterPoints5: extentMm, acceptResidualMm and mergeMm must be > 0');
  }
  return o;
}

export interface BurmesterPoints {
  /**
   * `ok`: `pairs` holds every real pair found (0, 2 or 4 generically). `degenerate`: no three positions with three
   * finite poles (nearly pure translation), or more than four distinct pairs (a special motion with infinitely many).
   */
  readonly status: 'ok' | 'degenerate';
  readonly reason: string;
  /** Verified Burmester point pairs (centre in A, circle point in B), ordered by centre x then y. */
  readonly pairs: readonly Dyad[];
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
 * started from `circlePointForCentre`); a seed is kept only when Newton converges, the residual over all five
 * positions is within `acceptResidualMm` and the pair lies within `extentMm`. The common poles themselves (where the
 * scan also finds zeros) fail that check. Duplicates within `mergeMm` are merged.
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
  const triples = usableTriples(poses).slice(0, options.triples);
  if (triples.length === 0) {
    return {
      status: 'degenerate',
      reason: 'no three positions have three finite poles: the positions are nearly pure translations',
      pairs: [],
      poles,
    };
  }
  const { reference, scaleMm } = poseScale(poses);
  const within = (p: Point): boolean => Math.hypot(p[0] - reference[0], p[1] - reference[1]) <= options.extentMm;
  const pairs: Dyad[] = [];
  const consider = (centre: Point, scale: number): void => {
    const seed = circlePointForCentre(poses, centre);
    if (seed.status !== 'ok') return;
    const polished = polishDyad(poses, centre, seed.circlePointLocal, scale);
    if (!polished.converged) return;
    const dyad = measureDyad(poses, polished.centre, polished.circlePointLocal);
    if (!(dyad.residualMm <= options.acceptResidualMm)) return;
    if (!within(dyad.centre) || !within(placePoint(poses[0]!, dyad.circlePointLocal))) return;
    const same = pairs.findIndex(
      (p) =>
        Math.hypot(p.centre[0] - dyad.centre[0], p.centre[1] - dyad.centre[1]) <= options.mergeMm &&
        Math.hypot(
          p.circlePointLocal[0] - dyad.circlePointLocal[0],
          p.circlePointLocal[1] - dyad.circlePointLocal[1],
        ) <= options.mergeMm,
    );
    if (same < 0) pairs.push(dyad);
    else if (dyad.residualMm < pairs[same]!.residualMm) pairs[same] = dyad;
  };

  for (const triple of triples) {
    for (const base of triple.bases) {
      const scale = Math.max(scaleMm, Math.hypot(base[0] - reference[0], base[1] - reference[1]));
      for (const centre of sharedRootSeeds(poses, triple, base, options.directions)) consider(centre, scale);
    }
  }
  pairs.sort((p, q) => p.centre[0] - q.centre[0] || p.centre[1] - q.centre[1]);
  if (pairs.length > 4) {
    return {
      status: 'degenerate',
      reason: `${pairs.length} distinct pairs: more than Burmester's four, so the positions are special (every point of a curve may fit)`,
      pairs,
      poles,
    };
  }
  return { status: 'ok', reason: `${pairs.length} real pair(s) found`, pairs, poles };
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
