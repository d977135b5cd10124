import type { Point } from '../geometry/index.js';
import {
  type BodyPose,
  type BodySpec,
  defineMechanism,
  type Joint,
  jointValue,
  type Mechanism,
  type Pose,
} from '../kinematics/index.js';
import { wrapAngle } from '../numeric/index.js';
import type { ChainTopology } from './chain-topology.js';
import type { LinkDesign } from './link-design.js';

/** First layer given to binary links with the plates on layers 1 and 2 and slider blocks on 3. */
export const FIRST_LINK_LAYER = 4;

/** Joint ids of a placed link: its end on body A and its end on plate B. */
export function linkJointIds(link: Pick<LinkDesign, 'id' | 'bodyA'>): { readonly a: string; readonly b: string } {
  return { a: link.bodyA === 'die_body' ? `${link.id}_ground` : `${link.id}_a`, b: `${link.id}_b` };
}

/**
 * The kinematic model of (part of) the chain with binary links and actuators: the die body, the chain bodies listed
 * in `chainBodies` (all by default) with every chain joint between them, each link as a body of kind `link` (frame
 * at its pin on A, x axis toward its pin on B, its own layer from `topology.linkLayerBase` on, so links never meet each
 * other), and one driver per actuator joint (`actuator_1`, …; actuator value = joint value). `initial` is the pose of
 * every body at `initial` (chain body poses, die-body frame), so the model is drawn assembled.
 */
export function buildMechanism(
  topology: ChainTopology,
  links: readonly LinkDesign[],
  actuatorJoints: readonly string[],
  initial: readonly BodyPose[],
  chainBodies?: ReadonlySet<string>,
): Mechanism {
  const included = (id: string) => id === 'die_body' || !chainBodies || chainBodies.has(id);
  const bodies: BodySpec[] = [{ id: 'die_body', kind: 'die_body', layer: 0 }];
  const poseOf = new Map<string, BodyPose>();
  topology.bodies.forEach((b, m) => {
    if (!included(b.id)) return;
    const pose = initial[m]!;
    poseOf.set(b.id, pose);
    bodies.push({ id: b.id, kind: b.kind, layer: b.layer, initial: pose });
  });
  const joints: Joint[] = topology.joints.filter((j) => included(j.bodyI) && included(j.bodyJ));
  links.forEach((link, m) => {
    const a = worldPoint(poseOf, link.bodyA, link.pinA);
    const b = worldPoint(poseOf, link.bodyB, link.pinB);
    const ids = linkJointIds(link);
    bodies.push({
      id: link.id,
      kind: 'link',
      layer: topology.linkLayerBase + m,
      points: { a: [0, 0], b: [link.lengthMm, 0] },
      initial: { x: a[0], y: a[1], phi: Math.atan2(b[1] - a[1], b[0] - a[0]) },
    });
    joints.push({ kind: 'revolute', id: ids.a, bodyI: link.bodyA, pointI: link.pinA, bodyJ: link.id, pointJ: [0, 0] });
    joints.push({
      kind: 'revolute',
      id: ids.b,
      bodyI: link.id,
      pointI: [link.lengthMm, 0],
      bodyJ: link.bodyB,
      pointJ: link.pinB,
    });
  });
  const drivers = actuatorJoints.map((joint, k) => ({ id: `actuator_${k + 1}`, joint }));
  return defineMechanism({ bodies, joints, drivers });
}

/**
 * The configurations of `mechanism` (built by `buildMechanism`) at a run of stations: chain bodies where `chainPoses`
 * put them, each link from its pin on A toward its pin on B, its angle unwrapped from station to station; actuator
 * values read off the driven joints (continuous along the run). The stations must be given in the order they are
 * driven through, so that angles stay continuous.
 */
export function posesAt(
  mechanism: Mechanism,
  topology: ChainTopology,
  chainPoses: readonly (readonly BodyPose[])[],
): Pose[] {
  const chainIndex = new Map(topology.bodies.map((b, m) => [b.id, m] as const));
  const out: Pose[] = [];
  let previous: Float64Array | null = null;
  for (const poses of chainPoses) {
    const coordinates = new Float64Array(3 * mechanism.bodies.length);
    const poseOf = new Map<string, BodyPose>();
    mechanism.bodies.forEach((b, i) => {
      const m = chainIndex.get(b.id);
      if (m === undefined) return;
      const p = poses[m]!;
      poseOf.set(b.id, p);
      coordinates.set([p.x, p.y, p.phi], 3 * i);
    });
    mechanism.bodies.forEach((b, i) => {
      if (b.kind !== 'link' || chainIndex.has(b.id)) return;
      const ends = mechanism.joints.filter((j) => j.bodyJ === b.id || j.bodyI === b.id);
      const toA = ends.find((j) => j.bodyJ === b.id)!;
      const toB = ends.find((j) => j.bodyI === b.id)!;
      const a = worldPoint(poseOf, toA.bodyI, toA.pointI);
      const c = worldPoint(poseOf, toB.bodyJ, toB.pointJ);
      let phi = Math.atan2(c[1] - a[1], c[0] - a[0]);
      if (previous) phi = previous[3 * i + 2]! + wrapAngle(phi - previous[3 * i + 2]!);
      coordinates.set([a[0], a[1], phi], 3 * i);
    });
    const drawn: Pose = { mechanism, coordinates, actuators: [] };
    const actuators = mechanism.drivers.map((d) => jointValue(drawn, d.joint) - d.offset);
    out.push({ mechanism, coordinates, actuators });
    previous = coordinates;
  }
  return out;
}

function worldPoint(poseOf: ReadonlyMap<string, BodyPose>, body: string, local: Point): Point {
  if (body === 'die_body') return local;
  const p = poseOf.get(body);
  if (!p) throw new Error(`buildMechanism: body '${body}' is not part of this mechanism`);
  const c = Math.cos(p.phi);
  const s = Math.sin(p.phi);
  return [p.x + c * local[0] - s * local[1], p.y + s * local[0] + c * local[1]];
}
