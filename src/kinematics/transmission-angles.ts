import type { Point } from '../geometry/index.js';
import { safeAcos } from '../numeric/index.js';
import { constraintSystemOf } from './constraint-system.js';
import type { Mechanism } from './mechanism.js';
import { jointPoint, type Pose, pointOnBody } from './pose.js';

/** Transmission angle of one binary link at one configuration. */
export interface TransmissionAngle {
  /** The binary link. */
  readonly linkId: string;
  /** The joint where it is measured (the link's driven end). */
  readonly jointId: string;
  /** The body met at that joint. */
  readonly bodyId: string;
  /** μ ∈ [0, π], radians: angle at the joint between the link and the met body's reference line. */
  readonly mu: number;
  /** |π/2 − μ| ∈ [0, π/2], radians: 0 is ideal; the usual rule keeps μ within 40°–140° (deviation ≤ 50°). */
  readonly deviation: number;
}

/**
 * Transmission angles of every binary link (a body of kind `'link'` with exactly two revolute joints and no driver
 * on either), generalising the textbook μ of the four-bar (angle between coupler and rocker, cos μ = (b² + c² − a² −
 * d² + 2ad·cos θ2)/(2bc); Norton, *Design of Machinery*) and of the slider-crank (rod against the normal to
 * the slide):
 * - the link's driven end is its end on the body farther from the actuators (joint-graph distance from the bodies of
 *   driven joints, not through the die body); a link with one end on the die body is measured at its other end;
 * - the met body's reference line at that joint runs to its joint nearest the actuators (a revolute joint: to its
 *   centre; a prismatic joint: along the slide's normal);
 * - μ is the angle at the joint between the line to the link's other end and that reference line.
 * So a four-bar's coupler and rocker both report the classic μ. Links whose met body has no other joint are skipped.
 */
export function transmissionAngles(pose: Pose): TransmissionAngle[] {
  const m = pose.mechanism;
  const topo = topologyOf(m);
  const out: TransmissionAngle[] = [];
  for (const link of topo.binaryLinks) {
    const [j1, j2] = topo.jointsOf.get(link)!;
    const end = chooseDrivenEnd(m, topo, link, j1!, j2!);
    if (!end) continue;
    const { joint, other, met } = end;
    const ref = referenceJoint(m, topo, met, joint);
    if (ref === null) continue;
    const q = jointPoint(pose, m.joints[joint]!.id);
    const p = jointPoint(pose, m.joints[other]!.id);
    const refJoint = m.joints[ref]!;
    let dir: Point;
    if (refJoint.kind === 'revolute') {
      const r = jointPoint(pose, refJoint.id);
      dir = [r[0] - q[0], r[1] - q[1]];
    } else {
      const origin = pointOnBody(pose, refJoint.bodyI, [0, 0]);
      const tip = pointOnBody(pose, refJoint.bodyI, refJoint.axisI);
      dir = [-(tip[1] - origin[1]), tip[0] - origin[0]];
    }
    const lx = p[0] - q[0];
    const ly = p[1] - q[1];
    const mu = safeAcos((lx * dir[0] + ly * dir[1]) / (Math.hypot(lx, ly) * Math.hypot(dir[0], dir[1])));
    out.push({ linkId: link, jointId: m.joints[joint]!.id, bodyId: met, mu, deviation: Math.abs(Math.PI / 2 - mu) });
  }
  return out;
}

interface Topology {
  readonly ground: string;
  readonly jointsOf: Map<string, number[]>;
  readonly distance: Map<string, number>;
  readonly binaryLinks: string[];
}

const topologies = new WeakMap<Mechanism, Topology>();

function topologyOf(m: Mechanism): Topology {
  const cached = topologies.get(m);
  if (cached) return cached;
  const sys = constraintSystemOf(m);
  const ground = m.bodies[sys.ground]!.id;
  const jointsOf = new Map<string, number[]>(m.bodies.map((b) => [b.id, []]));
  m.joints.forEach((j, k) => {
    jointsOf.get(j.bodyI)!.push(k);
    jointsOf.get(j.bodyJ)!.push(k);
  });
  const driven = new Set(m.drivers.map((d) => d.joint));
  const distance = new Map<string, number>();
  const queue: string[] = [];
  for (const d of m.drivers) {
    const j = m.joints[sys.jointIndex.get(d.joint)!]!;
    for (const b of [j.bodyI, j.bodyJ]) {
      if (b !== ground && !distance.has(b)) {
        distance.set(b, 0);
        queue.push(b);
      }
    }
  }
  for (let head = 0; head < queue.length; head++) {
    const b = queue[head]!;
    for (const k of jointsOf.get(b)!) {
      const j = m.joints[k]!;
      const nb = j.bodyI === b ? j.bodyJ : j.bodyI;
      if (nb !== ground && !distance.has(nb)) {
        distance.set(nb, distance.get(b)! + 1);
        queue.push(nb);
      }
    }
  }
  const binaryLinks = m.bodies
    .filter((b) => {
      const js = jointsOf.get(b.id)!;
      return (
        b.kind === 'link' &&
        js.length === 2 &&
        js.every((k) => m.joints[k]!.kind === 'revolute' && !driven.has(m.joints[k]!.id))
      );
    })
    .map((b) => b.id);
  const topo = { ground, jointsOf, distance, binaryLinks };
  topologies.set(m, topo);
  return topo;
}

function otherBody(m: Mechanism, joint: number, body: string): string {
  const j = m.joints[joint]!;
  return j.bodyI === body ? j.bodyJ : j.bodyI;
}

function dist(topo: Topology, body: string): number {
  return body === topo.ground ? Number.POSITIVE_INFINITY : (topo.distance.get(body) ?? Number.POSITIVE_INFINITY);
}

function chooseDrivenEnd(
  m: Mechanism,
  topo: Topology,
  link: string,
  j1: number,
  j2: number,
): { joint: number; other: number; met: string } | null {
  const b1 = otherBody(m, j1, link);
  const b2 = otherBody(m, j2, link);
  if (b1 === topo.ground && b2 === topo.ground) return null;
  if (b1 === topo.ground) return { joint: j2, other: j1, met: b2 };
  if (b2 === topo.ground) return { joint: j1, other: j2, met: b1 };
  return dist(topo, b1) > dist(topo, b2) ? { joint: j1, other: j2, met: b1 } : { joint: j2, other: j1, met: b2 };
}

function referenceJoint(m: Mechanism, topo: Topology, body: string, exclude: number): number | null {
  let best: number | null = null;
  let bestDist = Number.POSITIVE_INFINITY;
  for (const k of topo.jointsOf.get(body)!) {
    if (k === exclude) continue;
    const d = dist(topo, otherBody(m, k, body));
    if (best === null || d < bestDist) {
      best = k;
      bestDist = d;
    }
  }
  return best;
}
