import { Matrix } from 'ml-matrix';
import { assembleJacobian, constraintSystemOf, evaluateResidual, updateTrig } from './constraint-system.js';
import type { Pose } from './pose.js';

/** The constraint equations of a mechanism evaluated at one pose, in plain dense form. */
export interface ConstraintEvaluation {
  /**
   * Residuals, mm: 2 per joint in `mechanism.joints` order (revolute: x and y gap of the pin; prismatic: Lc × angle
   * error, then normal offset), then 1 per driver when actuator values were given (joint value − actuator − offset,
   * angles × Lc).
   */
  readonly residual: Float64Array;
  /**
   * Jacobian of `residual` with respect to the unknowns x, y (mm) and Lc·φ of every moving body in `mechanism.bodies`
   * order (die body skipped): dimensionless, one row per residual (ml-matrix).
   */
  readonly jacobian: Matrix;
  /** Characteristic length Lc, mm, that scales the angle unknowns and angle equations. */
  readonly scale: number;
}

/**
 * Evaluates Φ and Φq at `pose` (Nikravesh ch. 3–4; Haug ch. 3), with the driver equations for `actuators` when given.
 * Allocates fresh arrays: for analysis, cross-checks and baselines; the solvers use a preallocated workspace.
 */
export function evaluateConstraints(pose: Pose, actuators?: readonly number[]): ConstraintEvaluation {
  const sys = constraintSystemOf(pose.mechanism);
  const withDrivers = actuators !== undefined;
  if (withDrivers && actuators.length !== sys.nDrivers) {
    throw new Error(`evaluateConstraints: ${sys.nDrivers} actuator values expected, got ${actuators.length}`);
  }
  const nEq = withDrivers ? sys.nEquations : sys.nConstraints;
  const nq = sys.nq;
  const row = Int32Array.from({ length: nEq }, (_, e) => e);
  const cs = new Float64Array(sys.nBodies);
  const sn = new Float64Array(sys.nBodies);
  updateTrig(sys, pose.coordinates, cs, sn);
  const residual = new Float64Array(nEq);
  evaluateResidual(sys, pose.coordinates, cs, sn, withDrivers ? actuators : null, row, residual);
  const a = new Float64Array(nEq * nq);
  assembleJacobian(sys, pose.coordinates, cs, sn, withDrivers, row, a, nq, sys.colNatural);
  const jacobian = new Matrix(nEq, nq);
  for (let e = 0; e < nEq; e++) for (let c = 0; c < nq; c++) jacobian.set(e, c, a[e * nq + c]!);
  return { residual, jacobian, scale: sys.scale };
}
