import { bodyPose, type Mechanism, type Pose } from '../kinematics/index.js';
import { buildMechanism, linkJointIds, posesAt } from './build-mechanism.js';
import { driveThroughStations, type MotionCheck, type MotionPlace } from './drive-through-stations.js';
import {
  type ClearanceRecord,
  clearancePartsOf,
  collisionDefects,
  linkLayerOrder,
  makeClearanceInspector,
} from './motion-clearance.js';
import type { LinkDesign } from './link-design.js';
import type { MechaniseContext } from './mechanise-context.js';

/** A mechanism (whole or partial) with its expected station configurations and how driving it went. */
export interface EvaluatedDesign {
  readonly links: readonly LinkDesign[];
  readonly actuatorJoints: readonly string[];
  readonly mechanism: Mechanism;
  /** Expected configuration at each distinct position, actuator values included. */
  readonly expected: readonly Pose[];
  readonly motion: MotionCheck;
  /** Smallest room per pair of parts over the whole motion (complete mechanisms only), smallest first. */
  readonly clearances: readonly ClearanceRecord[];
}

/** Where an actuator acts: a chain joint by id, or the ground pivot of one of the design's links (a crank). */
export type ActuatorPlace = string | LinkDesign;

/**
 * Builds the mechanism of `links` and `actuators` on the chain (or on the chain bodies in `chainBodies` only),
 * places it at every distinct position and drives it through the legs of the schedule (`driveThroughStations`).
 * Links are renamed `link_1`, `link_2`, … in the order given, bottom layer first; when one's plate pin would pass
 * through the layer of a link whose line it crosses, the links are restacked once (`linkLayerOrder`) and driven again.
 */
export function evaluateDesign(
  context: MechaniseContext,
  links: readonly LinkDesign[],
  actuators: readonly ActuatorPlace[],
  chainBodies?: ReadonlySet<string>,
  reordered = false,
): EvaluatedDesign {
  const { topology, stations, options } = context;
  const named = links.map((l, k) => ({ ...l, id: `link_${k + 1}` }));
  const actuatorJoints = actuators.map((a) => {
    if (typeof a === 'string') return a;
    const k = links.indexOf(a);
    if (k < 0) throw new Error('evaluateDesign: an actuator names a link that is not in the design');
    return linkJointIds(named[k]!).a;
  });
  const distinctPoses = stations.representatives.map((r) => stations.poses[r]!);
  const mechanism = buildMechanism(topology, named, actuatorJoints, distinctPoses[0]!, chainBodies);
  const expected = posesAt(mechanism, topology, distinctPoses);
  // room between the parts is checked on complete mechanisms (partial ones lack the parts that collide)
  const clearance = chainBodies ? null : makeClearanceInspector(clearancePartsOf(context, mechanism, named));
  const driven = driveThroughStations(expected, context.legs, {
    trace: options.trace,
    arrivalToleranceMm: context.arrivalToleranceMm,
    transmissionLimitDeg: options.transmissionLimitDeg,
    ...(clearance
      ? { inspect: (pose: Pose, at: MotionPlace) => clearance.inspect((id) => bodyPose(pose, id), at) }
      : {}),
  });
  if (clearance && links.length > 1 && !reordered) {
    // a link's plate pin that crosses another link's line must stop below that link's layer: restack if needed
    const overlaps = clearance.linkOverlaps();
    const ids = named.map((l) => l.id);
    const order = overlaps.length > 0 ? linkLayerOrder(ids, overlaps) : null;
    if (order?.some((id, k) => id !== ids[k])) {
      const restacked = order.map((id) => links[ids.indexOf(id)]!);
      return evaluateDesign(context, restacked, actuators, chainBodies, true);
    }
  }
  const clearances = clearance?.records() ?? [];
  const clashes = collisionDefects(clearances);
  const motion: MotionCheck =
    clashes.length === 0 ? driven : { ...driven, ok: false, defects: [...driven.defects, ...clashes] };
  return { links: named, actuatorJoints, mechanism, expected, motion, clearances };
}
