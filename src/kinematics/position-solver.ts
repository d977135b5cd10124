import { constraintSystemOf } from './constraint-system.js';
import type { Mechanism } from './mechanism.js';
import { NewtonWorkspace } from './newton-workspace.js';
import { initialPose, type Pose } from './pose.js';
import { resolveSolveOptions, type SolveOptions, type SolveStatus } from './solve-options.js';
import { solveLeastSquares } from './solve-least-squares.js';

/** Result of a position solve; returned on failure too, so callers can explain it. */
export interface PositionResult {
  readonly status: SolveStatus;
  /** Newton iterations taken. */
  readonly iterations: number;
  /** Max-norm of the constraint residual at `pose`, mm (angle equations as Lc·angle). */
  readonly residual: number;
  /**
   * Estimated 1-norm condition number of the scaled driven Jacobian [Φq; Φq of drivers] at (or one Newton step
   * before) `pose`: dimensionless, a cheap lower bound usually within a factor 10 (`BandLu.conditionEstimate('quick')`;
   * `measureSingularity` gives the exact 2-norm value); Infinity when singular. Non-square systems: σmax/σmin (SVD).
   */
  readonly conditionEstimate: number;
  /**
   * Sign of the determinant of the driven Jacobian (±1; 0 when singular or not square), equations in natural order
   * and unknowns in body order. It equals, up to a sign fixed for the mechanism, the sign of the dependent-coordinate
   * Jacobian when each driver acts on a grounded joint (Haug): a change between two poses means a singular
   * configuration lies between them (a branch defect).
   */
  readonly jacobianSign: -1 | 0 | 1;
  /** The last iterate: the solution when `status` is `'converged'`. */
  readonly pose: Pose;
}

/** A reusable position solver for one mechanism: its workspace is allocated once. Not safe for concurrent reuse. */
export interface PositionSolver {
  readonly mechanism: Mechanism;
  readonly options: SolveOptions;
  /**
   * Solves the driven constraint equations for actuator values `actuators` (radians for revolute drivers, mm for
   * prismatic ones, `mechanism.drivers` order), starting from `start` (warm start) or from the bodies' `initial` pose.
   */
  solve(actuators: readonly number[], start?: Pose): PositionResult;
}

/**
 * Creates a position solver (Nikravesh; Haug): Newton–Raphson in absolute coordinates with the analytic
 * Jacobian and step halving. A square system (drivers = degrees of freedom) is solved by band LU with partial
 * pivoting in preallocated flat arrays; a pivot below `relativePivot` or a condition estimate above `conditionLimit`
 * gives `'singular'`. A solve that starts from the solver's previous solution takes its first step with the previous
 * factors, which makes that step the first-order predictor along the velocity equations. Any other system falls
 * back to minimum-norm Gauss–Newton steps by SVD.
 */
export function createPositionSolver(mechanism: Mechanism, options?: Partial<SolveOptions>): PositionSolver {
  const resolved = resolveSolveOptions(options);
  const sys = constraintSystemOf(mechanism);
  const ws = sys.square ? new NewtonWorkspace(sys, resolved) : null;
  return {
    mechanism,
    options: resolved,
    solve(actuators, start) {
      if (actuators.length !== sys.nDrivers) {
        throw new Error(`solvePosition: ${sys.nDrivers} actuator values expected, got ${actuators.length}`);
      }
      if (start && start.mechanism !== mechanism) throw new Error('solvePosition: start pose is of another mechanism');
      const from = (start ?? initialPose(mechanism)).coordinates;
      const acts = [...actuators];
      if (!ws) {
        const q = Float64Array.from(from);
        const out = solveLeastSquares(sys, resolved, q, acts);
        return { ...out, jacobianSign: 0, pose: { mechanism, coordinates: q, actuators: acts } };
      }
      // Starting from this solver's previous solution, its factors are that point's Jacobian: reuse them.
      const continuing = ws.status === 'converged' && ws.factored && sameCoordinates(ws.q, from);
      ws.q.set(from);
      let status = ws.run(acts, resolved.maxIterations, continuing);
      const condition = ws.factored ? ws.lu.conditionEstimate('quick') : Number.POSITIVE_INFINITY;
      if (status === 'converged' && !(condition <= resolved.conditionLimit)) status = 'singular';
      return {
        status,
        iterations: ws.iterations,
        residual: ws.residual,
        conditionEstimate: condition,
        jacobianSign: ws.jacobianSign(),
        pose: { mechanism, coordinates: Float64Array.from(ws.q), actuators: acts },
      };
    },
  };
}

/**
 * One position solve: `createPositionSolver(mechanism, options).solve(actuators, options.start)`. Use a solver
 * object instead when solving the same mechanism many times.
 */
export function solvePosition(
  mechanism: Mechanism,
  actuators: readonly number[],
  options?: Partial<SolveOptions> & { readonly start?: Pose },
): PositionResult {
  return createPositionSolver(mechanism, options).solve(actuators, options?.start);
}

function sameCoordinates(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}
