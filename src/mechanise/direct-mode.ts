import type { Point } from '../geometry/index.js';
import type { Joint } from '../kinematics/index.js';
import { bodyPoseAt, type MechaniseContext, placeOn } from './mechanise-context.js';
import { type EvaluatedDesign, evaluateDesign } from './evaluate-design.js';
import type { MotionDefect } from './drive-through-stations.js';

/** Outcome of the direct mode: one actuator per degree of freedom, no links. */
export interface DirectModeOutcome {
  readonly design: EvaluatedDesign | null;
  /** Driver sets driven through the stations. */
  readonly tried: number;
  /** Defects of the best-scored driver set, when none passed. */
  readonly defects: readonly MotionDefect[];
}

/**
 * Direct mode (actuator count = degrees of freedom): an actuator on the chain's start ground joint (a rotary one on a
 * ground pivot, a linear one on a slot) and on all but three of the other joints. The chain is one loop, so the three
 * undriven joints close it like a rigid triangle; the closure is singular when their screws (a pin: rotation about its
 * centre; a slide: translation along it) are linearly dependent, e.g. three pins in a line (Hunt, *Kinematic Geometry
 * of Mechanisms*; the loop-closure Jacobian of Haug). Every triple is scored by |det| of its three unit screws at the
 * distinct positions (scale-free, 1 at best), linear actuators halving the score; the best sets are driven through
 * the stations until one passes.
 */
export function directMode(context: MechaniseContext): DirectModeOutcome {
  const { topology, options } = context;
  const joints = topology.joints;
  const distinct = context.stations.representatives.length;
  const scale = characteristicLength(context);
  const centre = chainCentre(context);
  const screws = Array.from({ length: distinct }, (_, s) => joints.map((j) => screwOf(context, s, j, centre, scale)));
  const triples: { undriven: number[]; score: number }[] = [];
  for (let a = 1; a < joints.length; a++) {
    for (let b = a + 1; b < joints.length; b++) {
      for (let c = b + 1; c < joints.length; c++) {
        let score = Number.POSITIVE_INFINITY;
        for (const row of screws) score = Math.min(score, Math.abs(det3(row[a]!, row[b]!, row[c]!)));
        const linear = joints.filter((j, k) => j.kind === 'prismatic' && k !== a && k !== b && k !== c).length;
        triples.push({ undriven: [a, b, c], score: score * 0.5 ** linear });
      }
    }
  }
  triples.sort((p, q) => q.score - p.score);
  let tried = 0;
  let defects: readonly MotionDefect[] = [];
  for (const t of triples) {
    if (tried >= options.maxAssemblies || !(t.score > 0)) break;
    const driven = joints.filter((_, k) => !t.undriven.includes(k)).map((j) => j.id);
    const design = evaluateDesign(context, [], driven);
    tried++;
    if (design.motion.ok) return { design, tried, defects: [] };
    if (tried === 1) defects = design.motion.defects;
  }
  return { design: null, tried, defects };
}

/** Unit screw of a joint at a distinct position: (1, y, −x)/‖·‖ for a pin at (x, y), (0, u) for a slide along u. */
function screwOf(
  context: MechaniseContext,
  s: number,
  j: Joint,
  centre: Point,
  scale: number,
): [number, number, number] {
  const pose = bodyPoseAt(context, s, j.bodyJ);
  if (j.kind === 'prismatic') {
    const posI = bodyPoseAt(context, s, j.bodyI);
    const u = placeOn({ x: 0, y: 0, phi: posI.phi }, j.axisI);
    const n = Math.hypot(u[0], u[1]);
    return [0, u[0] / n, u[1] / n];
  }
  const p = placeOn(pose, j.pointJ);
  const y = (p[1] - centre[1]) / scale;
  const x = (p[0] - centre[0]) / scale;
  const n = Math.hypot(1, x, y);
  return [1 / n, y / n, -x / n];
}

function det3(a: readonly number[], b: readonly number[], c: readonly number[]): number {
  return (
    a[0]! * (b[1]! * c[2]! - b[2]! * c[1]!) -
    a[1]! * (b[0]! * c[2]! - b[2]! * c[0]!) +
    a[2]! * (b[0]! * c[1]! - b[1]! * c[0]!)
  );
}

/** Half the largest pivot-to-pivot distance of the chain at its first station, at least 1 mm. */
function characteristicLength(context: MechaniseContext): number {
  const pts = context.topology.joints.map((j) => placeOn(bodyPoseAt(context, 0, j.bodyJ), j.pointJ));
  let best = 1;
  for (const p of pts) for (const q of pts) best = Math.max(best, 0.5 * Math.hypot(p[0] - q[0], p[1] - q[1]));
  return best;
}

function chainCentre(context: MechaniseContext): Point {
  const pts = context.topology.joints.map((j) => placeOn(bodyPoseAt(context, 0, j.bodyJ), j.pointJ));
  return [pts.reduce((s, p) => s + p[0], 0) / pts.length, pts.reduce((s, p) => s + p[1], 0) / pts.length];
}
