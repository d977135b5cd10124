import type { Point } from '../geometry/index.js';
import { type BodyPose, type SolveStatus, solvePosition } from '../kinematics/index.js';
import { buildMechanism, posesAt } from './build-mechanism.js';
import type { ChainTopology } from './chain-topology.js';

/** The fitted stations made exactly assembled, and the distinct positions among them. */
export interface AssembledStations {
  /** Worst solver status over the stations: `converged` when every station closed. */
  readonly status: SolveStatus;
  /** Chain body poses per station (schedule order), die-body frame, closing every joint to round-off. */
  readonly poses: readonly (readonly BodyPose[])[];
  /** Largest pivot move from the fitted chain to the assembled one, per station, mm. */
  readonly closureAdjustmentMm: readonly number[];
  /** Distinct position of each station (index into `representatives`). */
  readonly distinctOf: readonly number[];
  /** For each distinct position, the first station (schedule order) that has it. */
  readonly representatives: readonly number[];
}

/**
 * Closes the fitted chain at every station: the fit ends its chain within a few micrometres of the end pin, so each
 * station's fitted pose is projected onto the chain's joint constraints by minimum-norm Gauss–Newton steps (the
 * position solver on the undriven chain), which moves every body as little as the constraints allow. Stations whose
 * assembled pivots all agree within `mergeToleranceMm` are one position for the synthesis (a periodic schedule that
 * repeats its first profile, a back-and-forth schedule).
 */
export function assembleStations(topology: ChainTopology, mergeToleranceMm: number): AssembledStations {
  const first = topology.fittedPoses[0]!;
  const chainOnly = buildMechanism(topology, [], [], first);
  const fitted = posesAt(chainOnly, topology, topology.fittedPoses);
  const order: SolveStatus[] = ['converged', 'max-iterations', 'singular', 'diverged'];
  let status: SolveStatus = 'converged';
  const poses: BodyPose[][] = [];
  const closureAdjustmentMm: number[] = [];
  fitted.forEach((start, i) => {
    const solved = solvePosition(chainOnly, [], { start, maxIterations: 50 });
    if (order.indexOf(solved.status) > order.indexOf(status)) status = solved.status;
    const q = solved.pose.coordinates;
    const bodies = topology.bodies.map(
      (_, m): BodyPose => ({ x: q[3 * (m + 1)]!, y: q[3 * (m + 1) + 1]!, phi: q[3 * (m + 1) + 2]! }),
    );
    poses.push(bodies);
    const before = pivotPoints(topology, topology.fittedPoses[i]!);
    const after = pivotPoints(topology, bodies);
    closureAdjustmentMm.push(Math.max(...before.map((p, k) => Math.hypot(p[0] - after[k]![0], p[1] - after[k]![1]))));
  });
  const representatives: number[] = [];
  const distinctOf: number[] = [];
  const pivots = poses.map((p) => pivotPoints(topology, p));
  pivots.forEach((p, i) => {
    const same = representatives.findIndex((r) =>
      pivots[r]!.every((q, k) => Math.hypot(q[0] - p[k]![0], q[1] - p[k]![1]) <= mergeToleranceMm),
    );
    if (same >= 0) distinctOf.push(same);
    else {
      distinctOf.push(representatives.length);
      representatives.push(i);
    }
  });
  return { status, poses, closureAdjustmentMm, distinctOf, representatives };
}

/** Pivot k (k = 0 … N) of the chain in the die-body frame for chain body poses `poses` (topology order), mm. */
export function pivotPoints(topology: ChainTopology, poses: readonly BodyPose[]): Point[] {
  const index = new Map(topology.bodies.map((b, m) => [b.id, m] as const));
  return topology.pivots.map(({ body, local }) => {
    const p = poses[index.get(body)!]!;
    const c = Math.cos(p.phi);
    const s = Math.sin(p.phi);
    return [p.x + c * local[0] - s * local[1], p.y + s * local[0] + c * local[1]];
  });
}
