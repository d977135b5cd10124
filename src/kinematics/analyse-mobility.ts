import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { assembleJacobian, constraintSystemOf, updateTrig } from './constraint-system.js';
import { grublerMobility } from './grubler-mobility.js';
import type { Pose } from './pose.js';

/** Mobility of a mechanism at one configuration, by count and by rank. */
export interface MobilityAnalysis {
  /** Grübler–Kutzbach count 3(n − 1) − 2·j1. */
  readonly grubler: number;
  /** Unknowns minus the numerical rank of the constraint Jacobian at the pose: the instantaneous mobility. */
  readonly numerical: number;
  /** Numerical rank of the constraint Jacobian Φq (drivers excluded). */
  readonly rank: number;
  /** Unknowns: 3 per moving body. */
  readonly coordinates: number;
  /** Constraint equations: 2 per joint. */
  readonly constraints: number;
  /** Constraint equations that are numerically dependent on others (constraints − rank). */
  readonly redundantConstraints: number;
  /** Number of drivers; the driven system is square and solvable when it equals `numerical`. */
  readonly drivers: number;
  /** Singular values of the scaled constraint Jacobian, largest first (dimensionless). */
  readonly singularValues: readonly number[];
}

/**
 * Numerical mobility from the rank of the constraint Jacobian Φq at `pose` (Haug; Nikravesh), next to the
 * Grübler–Kutzbach count. The rank counts singular values above `relativeThreshold × σmax` of the Jacobian with
 * every column dimensionless (x, y and Lc·φ); they differ from the count at special geometry (a parallelogram with a
 * redundant parallel link has Grübler 0 but moves). Uses an SVD (ml-matrix): set-up cost, not for a hot loop.
 */
export function analyseMobility(pose: Pose, relativeThreshold = 1e-9): MobilityAnalysis {
  const sys = constraintSystemOf(pose.mechanism);
  const grubler = grublerMobility(pose.mechanism);
  const nq = sys.nq;
  const nc = sys.nConstraints;
  let singularValues: number[] = [];
  let rank = 0;
  if (nq > 0 && nc > 0) {
    const cs = new Float64Array(sys.nBodies);
    const sn = new Float64Array(sys.nBodies);
    updateTrig(sys, pose.coordinates, cs, sn);
    const a = new Float64Array(nc * nq);
    assembleJacobian(sys, pose.coordinates, cs, sn, false, sys.rowConstraint, a, nq);
    const jac = new Matrix(Array.from({ length: nc }, (_, e) => Array.from(a.subarray(e * nq, (e + 1) * nq))));
    singularValues = new SingularValueDecomposition(jac, { autoTranspose: true }).diagonal
      .slice()
      .sort((x, y) => y - x);
    const limit = relativeThreshold * (singularValues[0] ?? 0);
    rank = singularValues.filter((s) => s > limit).length;
  }
  return {
    grubler,
    numerical: nq - rank,
    rank,
    coordinates: nq,
    constraints: nc,
    redundantConstraints: nc - rank,
    drivers: sys.nDrivers,
    singularValues,
  };
}
