import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import type { Point } from '../geometry/index.js';
import { assembleJacobian, constraintSystemOf, driverRate, updateTrig } from './constraint-system.js';
import { NewtonWorkspace } from './newton-workspace.js';
import type { Pose } from './pose.js';
import { resolveSolveOptions, type SolveOptions } from './solve-options.js';

/** Velocity influence coefficients of a pose: how every body moves per unit speed of each actuator. */
export interface VelocityAnalysis {
  readonly pose: Pose;
  /** `'singular'` when the driven Jacobian is singular at the pose (the rates are then all NaN). */
  readonly status: 'ok' | 'singular';
  /**
   * `rates[k]`: ẋ, ẏ (mm) and φ̇ (rad) of every body, 3 per body in `mechanism.bodies` order, per unit rate of actuator
   * k (per radian for a revolute driver, per mm for a prismatic one), the other actuators held still.
   */
  readonly rates: readonly Float64Array[];
  /** Estimated 1-norm condition number of the scaled driven Jacobian; σmax/σmin for a non-square system. */
  readonly conditionEstimate: number;
}

/**
 * Solves the velocity equations Φq·q̇ = −Φt once per actuator at a solved `pose` (Nikravesh; Haug): the
 * driver equations give Φt = −e_k for a unit rate of actuator k. Square systems use the band LU of the position
 * solver; non-square ones the minimum-norm least-squares solution by SVD.
 */
export function solveVelocities(pose: Pose, options?: Partial<SolveOptions>): VelocityAnalysis {
  const sys = constraintSystemOf(pose.mechanism);
  const nBodies = sys.nBodies;
  if (sys.square) {
    const ws = new NewtonWorkspace(sys, resolveSolveOptions(options));
    ws.q.set(pose.coordinates);
    const ok = sys.nq === 0 || ws.factorAtCurrent();
    const rates = sys.mechanism.drivers.map((_, k) => {
      const out = new Float64Array(3 * nBodies);
      if (!ok) return out.fill(Number.NaN);
      const unit = sys.mechanism.drivers.map((__, d) => (d === k ? 1 : 0));
      ws.tangent(unit, out);
      return out;
    });
    return {
      pose,
      status: ok ? 'ok' : 'singular',
      rates,
      conditionEstimate: ok && sys.nq > 0 ? ws.lu.conditionEstimate() : ok ? 1 : Number.POSITIVE_INFINITY,
    };
  }
  const nEq = sys.nEquations;
  const nq = sys.nq;
  const row = Int32Array.from({ length: nEq }, (_, e) => e);
  const cs = new Float64Array(nBodies);
  const sn = new Float64Array(nBodies);
  updateTrig(sys, pose.coordinates, cs, sn);
  const a = new Float64Array(nEq * nq);
  assembleJacobian(sys, pose.coordinates, cs, sn, true, row, a, nq);
  const svd = new SingularValueDecomposition(
    new Matrix(Array.from({ length: nEq }, (_, e) => Array.from(a.subarray(e * nq, (e + 1) * nq)))),
    { autoTranspose: true },
  );
  const rates = sys.mechanism.drivers.map((_, k) => {
    const rhs = new Array<number>(nEq).fill(0);
    rhs[sys.nConstraints + k] = driverRate(sys, k);
    const x = svd.solve(Matrix.columnVector(rhs));
    const out = new Float64Array(3 * nBodies);
    for (let b = 0; b < nBodies; b++) {
      const c = sys.col[b]!;
      if (c < 0) continue;
      out[3 * b] = x.get(c, 0);
      out[3 * b + 1] = x.get(c + 1, 0);
      out[3 * b + 2] = x.get(c + 2, 0) / sys.scale;
    }
    return out;
  });
  const sigma = svd.diagonal;
  const smallest = sigma[Math.min(nEq, nq) - 1] ?? 0;
  return {
    pose,
    status: 'ok',
    rates,
    conditionEstimate: smallest > 0 ? (sigma[0] ?? 0) / smallest : Number.POSITIVE_INFINITY,
  };
}

/**
 * Velocity of a point fixed in body `bodyId` (given in its own frame, mm), in the die-body frame, per unit rate of
 * actuator `actuator`: ṙ + φ̇·B(φ)·s, mm per radian or mm per mm. Throws for an unknown body or actuator.
 */
export function pointVelocity(analysis: VelocityAnalysis, bodyId: string, local: Point, actuator = 0): Point {
  const sys = constraintSystemOf(analysis.pose.mechanism);
  const b = sys.bodyIndex.get(bodyId);
  if (b === undefined) throw new Error(`pointVelocity: unknown body '${bodyId}'`);
  const rate = analysis.rates[actuator];
  if (!rate) throw new Error(`pointVelocity: no actuator ${actuator}`);
  const phi = analysis.pose.coordinates[3 * b + 2]!;
  const c = Math.cos(phi);
  const s = Math.sin(phi);
  const w = rate[3 * b + 2]!;
  return [rate[3 * b]! - w * (s * local[0] + c * local[1]), rate[3 * b + 1]! + w * (c * local[0] - s * local[1])];
}
