import type { Point } from '../geometry/index.js';
import { safeAcos } from '../numeric/index.js';
import type { Mechanism } from './mechanism.js';
import { jointPoint, type Pose, pointOnBody } from './pose.js';

/** Transmission angle at the middle joint of one dyad of two plates. */
export interface DyadTransmissionAngle {
  /** The revolute joint between the dyad's two bodies, where μ is measured. */
  readonly jointId: string;
  readonly bodyIds: readonly [string, string];
  /** μ ∈ [0, π], radians: the angle at the joint between the two bodies' lines to their joints with the known part. */
  readonly mu: number;
  /** |π/2 − μ|, radians. */
  readonly deviation: number;
}

interface DyadPlan {
  readonly middle: number;
  readonly bodies: readonly [string, string];
  /** Per body, its joint to the part already placed. */
  readonly outer: readonly [number, number];
}

const plans = new WeakMap<Mechanism, readonly DyadPlan[]>();

/**
 * Transmission angles at the middle joints of the dyads (Assur groups of class II, RRR) that a mechanism of plates
 * solves as, where neither body is a binary link (`transmissionAngles` measures those): a plate chain closed onto the
 * die body is, between its driven part and its far ground pivot, a sequence of such dyads, and μ at the joint between
 * the dyad's two plates is the angle between the lines from that joint to each plate's joint with the part already
 * placed: the four-bar's coupler–rocker angle (cos μ = (b² + c² − a² − d² + 2ad·cos θ2)/(2bc); Norton, *Design of
 * Machinery*) when the chain is three plates driven at one ground pivot. A prismatic outer joint (a slider block in a
 * slot) gives the slide's normal as the line, as for the slider-crank.
 *
 * The dyads are found by Assur decomposition: starting from the die body and the bodies it drives directly (a driver
 * on a joint fixes the joint's second body relative to its first), two unplaced bodies joined by a revolute joint, each
 * with a joint to the placed part, form a dyad and are placed; a body with two joints to the placed part is placed
 * alone. Bodies left over (a class-III group, or plates joined by a driver between two of them) get no angle.
 */
export function dyadTransmissionAngles(pose: Pose): DyadTransmissionAngle[] {
  const m = pose.mechanism;
  const out: DyadTransmissionAngle[] = [];
  for (const plan of dyadPlans(m)) {
    const joint = m.joints[plan.middle]!;
    const q = jointPoint(pose, joint.id);
    const dirs = plan.outer.map((k) => lineTo(pose, m, k, q));
    const [u, v] = dirs as [Point, Point];
    const mu = safeAcos((u[0] * v[0] + u[1] * v[1]) / (Math.hypot(u[0], u[1]) * Math.hypot(v[0], v[1])));
    out.push({ jointId: joint.id, bodyIds: plan.bodies, mu, deviation: Math.abs(Math.PI / 2 - mu) });
  }
  return out;
}

/** From the middle joint's point q to body's outer joint k: to its centre (revolute) or along the slide's normal. */
function lineTo(pose: Pose, m: Mechanism, k: number, q: Point): Point {
  const j = m.joints[k]!;
  if (j.kind === 'revolute') {
    const r = jointPoint(pose, j.id);
    return [r[0] - q[0], r[1] - q[1]];
  }
  const origin = pointOnBody(pose, j.bodyI, [0, 0]);
  const tip = pointOnBody(pose, j.bodyI, j.axisI);
  return [-(tip[1] - origin[1]), tip[0] - origin[0]];
}

function dyadPlans(m: Mechanism): readonly DyadPlan[] {
  const cached = plans.get(m);
  if (cached) return cached;
  const ground = m.bodies.find((b) => b.kind === 'die_body')!.id;
  const placed = new Set<string>([ground]);
  const driven = new Set(m.drivers.map((d) => d.joint));
  const jointsOf = new Map<string, number[]>(m.bodies.map((b) => [b.id, []]));
  m.joints.forEach((j, k) => {
    jointsOf.get(j.bodyI)!.push(k);
    jointsOf.get(j.bodyJ)!.push(k);
  });
  const other = (k: number, b: string) => (m.joints[k]!.bodyI === b ? m.joints[k]!.bodyJ : m.joints[k]!.bodyI);
  const toPlaced = (b: string, except: number) =>
    jointsOf.get(b)!.filter((k) => k !== except && placed.has(other(k, b)));
  const isLink = new Set(
    m.bodies.filter((b) => b.kind === 'link' && jointsOf.get(b.id)!.length === 2).map((b) => b.id),
  );
  const out: DyadPlan[] = [];
  for (let progress = true; progress; ) {
    progress = false;
    for (const b of m.bodies) {
      if (placed.has(b.id)) continue;
      // a driven joint to the placed part, or two joints to it, place a body alone
      const known = toPlaced(b.id, -1);
      if (known.some((k) => driven.has(m.joints[k]!.id)) || known.length >= 2) {
        placed.add(b.id);
        progress = true;
      }
    }
    for (let k = 0; k < m.joints.length && !progress; k++) {
      const j = m.joints[k]!;
      if (j.kind !== 'revolute' || driven.has(j.id) || placed.has(j.bodyI) || placed.has(j.bodyJ)) continue;
      const a = toPlaced(j.bodyI, k);
      const b = toPlaced(j.bodyJ, k);
      if (a.length === 0 || b.length === 0) continue;
      placed.add(j.bodyI);
      placed.add(j.bodyJ);
      progress = true;
      if (!isLink.has(j.bodyI) && !isLink.has(j.bodyJ)) {
        out.push({ middle: k, bodies: [j.bodyI, j.bodyJ], outer: [a[0]!, b[0]!] });
      }
    }
  }
  plans.set(m, out);
  return out;
}
