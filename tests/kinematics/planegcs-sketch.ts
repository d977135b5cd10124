/**
 * Test helper: assembles a pin-jointed mechanism with @salusoft89/planegcs (FreeCAD's geometric constraint solver,
 * WebAssembly), an implementation independent of ours. Each revolute joint becomes one sketch point; each moving
 * body keeps its pins rigid by distances (two pins: one distance; more: distances from its first two pins to every
 * other pin, a rigid triangulation for non-collinear pins); die-body pins are fixed; a driver on a grounded joint
 * becomes a `p2p_angle` from the driven pin to another pin of the driven body.
 */
import { Algorithm, type GcsWrapper, make_gcs_wrapper, type SketchPrimitive } from '@salusoft89/planegcs';
import type { Point } from '../../src/geometry/index.js';
import { jointPoint, type Mechanism, type Pose, pointOnBody } from '../../src/kinematics/index.js';

export async function createGcs(): Promise<GcsWrapper> {
  return make_gcs_wrapper();
}

export interface GcsAssembly {
  readonly status: number;
  /** Position of every revolute joint, die-body frame, mm. */
  readonly points: ReadonlyMap<string, Point>;
}

export function assembleWithPlanegcs(gcs: GcsWrapper, start: Pose, actuators: readonly number[]): GcsAssembly {
  const m: Mechanism = start.mechanism;
  const ground = m.bodies.find((b) => b.kind === 'die_body')!.id;
  const primitives: SketchPrimitive[] = [];
  const pinsOf = new Map<string, { joint: string; local: Point }[]>();
  for (const j of m.joints) {
    if (j.kind !== 'revolute') throw new Error('planegcs helper: revolute joints only');
    const p = jointPoint(start, j.id);
    const fixed = j.bodyI === ground || j.bodyJ === ground;
    primitives.push({ id: `p:${j.id}`, type: 'point', x: p[0], y: p[1], fixed });
    for (const [body, local] of [
      [j.bodyI, j.pointI],
      [j.bodyJ, j.pointJ],
    ] as const) {
      if (body === ground) continue;
      const list = pinsOf.get(body) ?? [];
      list.push({ joint: j.id, local });
      pinsOf.set(body, list);
    }
  }
  let n = 0;
  const distance = (a: { joint: string; local: Point }, b: { joint: string; local: Point }) => {
    primitives.push({
      id: `d${n++}`,
      type: 'p2p_distance',
      p1_id: `p:${a.joint}`,
      p2_id: `p:${b.joint}`,
      distance: Math.hypot(a.local[0] - b.local[0], a.local[1] - b.local[1]),
    });
  };
  for (const pins of pinsOf.values()) {
    const [first, second] = pins;
    if (!first || !second) continue;
    distance(first, second);
    for (const other of pins.slice(2)) {
      distance(first, other);
      distance(second, other);
    }
  }
  m.drivers.forEach((driver, k) => {
    const j = m.joints.find((x) => x.id === driver.joint)!;
    if (j.kind !== 'revolute' || j.bodyI !== ground) throw new Error('planegcs helper: grounded revolute drivers only');
    const pins = pinsOf.get(j.bodyJ)!;
    const from = pins.find((p) => p.joint === j.id)!;
    const to = pins.find((p) => p.joint !== j.id)!;
    const localAngle = Math.atan2(to.local[1] - from.local[1], to.local[0] - from.local[0]);
    primitives.push({
      id: `drive${k}`,
      type: 'p2p_angle',
      p1_id: `p:${from.joint}`,
      p2_id: `p:${to.joint}`,
      angle: actuators[k]! + driver.offset + localAngle,
    });
  });
  gcs.clear_data();
  gcs.push_primitives_and_params(primitives);
  gcs.set_convergence_threshold(1e-20);
  gcs.set_max_iterations(500);
  const status = gcs.solve(Algorithm.DogLeg);
  gcs.apply_solution();
  const points = new Map<string, Point>();
  for (const prim of gcs.sketch_index.get_primitives()) {
    if (prim.type === 'point') points.set(prim.id.slice(2), [prim.x, prim.y]);
  }
  return { status, points };
}

/** Largest distance between our joint points and the planegcs ones, mm. */
export function maxJointDeviation(pose: Pose, gcs: GcsAssembly): number {
  let worst = 0;
  for (const j of pose.mechanism.joints) {
    const ours = jointPoint(pose, j.id);
    const theirs = gcs.points.get(j.id)!;
    worst = Math.max(worst, Math.hypot(ours[0] - theirs[0], ours[1] - theirs[1]));
    // Both bodies' copies of the pin, to see the pin is really shared in our pose.
    const other = j.kind === 'revolute' ? pointOnBody(pose, j.bodyJ, j.pointJ) : ours;
    worst = Math.max(worst, Math.hypot(other[0] - theirs[0], other[1] - theirs[1]));
  }
  return worst;
}
