import type { Point } from '../geometry/index.js';
import { constraintSystemOf, jointTravel } from './constraint-system.js';
import type { BodyPose, Mechanism } from './mechanism.js';

/**
 * A configuration of a mechanism: where every body is, in the die-body frame.
 *
 * `coordinates` holds x (mm), y (mm) and φ (rad, counter-clockwise, not wrapped) for every body in `mechanism.bodies`
 * order, 3 per body, the die body included at 0, 0, 0 (Nikravesh's absolute coordinates). Treat it as read-only: the
 * solvers copy it and never keep a reference. `actuators` are the actuator values the pose was solved for (radians
 * for revolute drivers, mm for prismatic ones), in `mechanism.drivers` order.
 */
export interface Pose {
  readonly mechanism: Mechanism;
  readonly coordinates: Float64Array;
  readonly actuators: readonly number[];
}

/**
 * The pose built from each body's `initial` field (the builders put an assembled configuration there), tagged with
 * `actuators` (default: the actuator values that configuration shows, each driven joint's value minus the driver's
 * offset). It is a starting guess: it need not satisfy the constraints.
 */
export function initialPose(mechanism: Mechanism, actuators?: readonly number[]): Pose {
  const coordinates = new Float64Array(3 * mechanism.bodies.length);
  mechanism.bodies.forEach((b, i) => {
    if (b.kind === 'die_body') return;
    coordinates[3 * i] = b.initial.x;
    coordinates[3 * i + 1] = b.initial.y;
    coordinates[3 * i + 2] = b.initial.phi;
  });
  const drawn: Pose = { mechanism, coordinates, actuators: [] };
  return {
    mechanism,
    coordinates,
    actuators: actuators ?? mechanism.drivers.map((d) => jointValue(drawn, d.joint) - d.offset),
  };
}

/** Position of body `bodyId` in the die-body frame: origin in mm, φ in radians. Throws for an unknown body id. */
export function bodyPose(pose: Pose, bodyId: string): BodyPose {
  const b = bodyIndexOf(pose, bodyId);
  const q = pose.coordinates;
  return { x: q[3 * b]!, y: q[3 * b + 1]!, phi: q[3 * b + 2]! };
}

/** A point given in body `bodyId`'s frame (mm), expressed in the die-body frame (mm). */
export function pointOnBody(pose: Pose, bodyId: string, local: Point): Point {
  return transform(pose.coordinates, bodyIndexOf(pose, bodyId), local);
}

/**
 * The joint point in the die-body frame, mm: for a revolute joint the pin centre (as carried by body I; body J's
 * point coincides once solved), for a prismatic joint the slide point `pointJ` of body J. Throws for an unknown id.
 */
export function jointPoint(pose: Pose, jointId: string): Point {
  const sys = constraintSystemOf(pose.mechanism);
  const k = sys.jointIndex.get(jointId);
  if (k === undefined) throw new Error(`jointPoint: unknown joint '${jointId}'`);
  const joint = pose.mechanism.joints[k]!;
  return joint.kind === 'revolute'
    ? transform(pose.coordinates, sys.jI[k]!, joint.pointI)
    : transform(pose.coordinates, sys.jJ[k]!, joint.pointJ);
}

/**
 * The joint value a driver would act on: relative angle φJ − φI in radians for a revolute joint (not wrapped), travel
 * along body I's axis in mm for a prismatic joint. Throws for an unknown joint id.
 */
export function jointValue(pose: Pose, jointId: string): number {
  const sys = constraintSystemOf(pose.mechanism);
  const k = sys.jointIndex.get(jointId);
  if (k === undefined) throw new Error(`jointValue: unknown joint '${jointId}'`);
  const q = pose.coordinates;
  const i = sys.jI[k]!;
  const j = sys.jJ[k]!;
  if (sys.jKind[k] === 0) return q[3 * j + 2]! - q[3 * i + 2]!;
  const c = new Float64Array(sys.nBodies);
  const s = new Float64Array(sys.nBodies);
  for (const b of [i, j]) {
    c[b] = Math.cos(q[3 * b + 2]!);
    s[b] = Math.sin(q[3 * b + 2]!);
  }
  return jointTravel(sys, q, c, s, k);
}

function bodyIndexOf(pose: Pose, bodyId: string): number {
  const b = constraintSystemOf(pose.mechanism).bodyIndex.get(bodyId);
  if (b === undefined) throw new Error(`unknown body '${bodyId}'`);
  return b;
}

function transform(q: Float64Array, b: number, local: Point): Point {
  const c = Math.cos(q[3 * b + 2]!);
  const s = Math.sin(q[3 * b + 2]!);
  return [q[3 * b]! + c * local[0] - s * local[1], q[3 * b + 1]! + s * local[0] + c * local[1]];
}
