import type { Point } from '../geometry/index.js';
import { createPositionSolver, initialPose, type Pose, pointOnBody } from '../kinematics/index.js';
import { restToRestLaw, sampleTrajectory } from '../motion/index.js';
import type { MotionSimulationInput } from './simulate-motion.js';
import { neighbours } from './simulate-motion.js';

/** Direct-mode tracking of the morph between station shapes, one value per step. */
export interface MorphTracking {
  /** `actuatorValues[k][j]`: actuator k at step j found by least squares, rad or mm. */
  readonly actuatorValues: readonly (readonly number[])[];
  /** Root-mean-square distance of the chain pivots from the morph's pivots with the tracked values, mm. */
  readonly residualMm: readonly number[];
  /** The same with the motion law's actuator values, mm: how far the commanded motion departs from the morph. */
  readonly lawResidualMm: readonly number[];
  /** Gauss–Newton iterations over all steps. */
  readonly iterations: number;
}

/**
 * In direct mode (one actuator per degree of freedom of the chain, no links) the actuators can shape every
 * intermediate orifice; this finds, at each step, the actuator values that bring the chain closest to the morph between
 * the neighbouring stations: each pivot blended linearly between its two station positions with the weight the motion
 * law gives at that point of the transition (s(u)/h of the rest-to-rest law; u itself for the monotone cubic), so the
 * morph starts and ends at rest at the stations like the commanded motion. Least squares on the actuator values over
 * the pivots' distances (Gauss–Newton with Levenberg damping; Jacobian by forward differences of warm-started position
 * solves, Nikravesh; Haug), started from the motion law's values at that step, and a step is kept only when it lowers
 * the residual: the tracked residual is never above the law's. `stationPivots[i][k]` is pivot k at station i (mm).
 * Pure and deterministic.
 */
export function trackMorph(
  input: MotionSimulationInput,
  stationPivots: readonly (readonly Point[])[],
  positionsM: readonly number[],
): MorphTracking {
  const { mechanism, trajectories, pivots } = input;
  const solver = createPositionSolver(mechanism);
  const d = trajectories.length;
  const law = restToRestLaw(trajectories[0]!.law);
  const values: number[][] = trajectories.map(() => []);
  const residualMm: number[] = [];
  const lawResidualMm: number[] = [];
  let iterations = 0;
  let pose: Pose = initialPose(mechanism);

  const solveAt = (a: readonly number[], from: Pose): Pose | null => {
    const r = solver.solve(a, from);
    return r.status === 'converged' ? r.pose : null;
  };
  const pivotsOf = (p: Pose): Point[] => pivots.map((q) => pointOnBody(p, q.body, q.local));
  const misfit = (p: Pose, target: readonly Point[]): number[] =>
    pivotsOf(p).flatMap((q, k) => [q[0] - target[k]![0], q[1] - target[k]![1]]);
  const rms = (r: readonly number[]) => Math.sqrt(r.reduce((s, v) => s + v * v, 0) / Math.max(1, r.length / 2));

  for (const x of positionsM) {
    const target = morphAt(input, stationPivots, x, law);
    let a = trajectories.map((t) => sampleTrajectory(t, x).value);
    let current = solveAt(a, pose);
    if (!current) {
      // the law's values cannot be assembled here: keep the last configuration and report its misfit
      for (let k = 0; k < d; k++) values[k]!.push(a[k]!);
      const r = misfit(pose, target);
      residualMm.push(rms(r));
      lawResidualMm.push(rms(r));
      continue;
    }
    let r = misfit(current, target);
    lawResidualMm.push(rms(r));
    let lambda = 1e-6;
    for (let it = 0; it < MAX_ITERATIONS; it++) {
      iterations++;
      // forward differences of the pivots against each actuator, from the current configuration
      const columns: number[][] = [];
      let singular = false;
      for (let m = 0; m < d; m++) {
        const h = STEP;
        const shifted = a.map((v, k) => (k === m ? v + h : v));
        const moved = solveAt(shifted, current);
        if (!moved) {
          singular = true;
          break;
        }
        const rm = misfit(moved, target);
        columns.push(rm.map((v, i) => (v - r[i]!) / h));
      }
      if (singular) break;
      const step = dampedStep(columns, r, lambda);
      const trial = a.map((v, k) => v + step[k]!);
      const moved = solveAt(trial, current);
      const rt = moved ? misfit(moved, target) : null;
      if (moved && rt && norm2(rt) < norm2(r)) {
        const gain = norm2(r) - norm2(rt);
        a = trial;
        current = moved;
        r = rt;
        lambda = Math.max(1e-9, lambda / 10);
        if (gain < 1e-12 * Math.max(1, norm2(r))) break;
      } else {
        lambda *= 100;
      }
    }
    for (let k = 0; k < d; k++) values[k]!.push(a[k]!);
    residualMm.push(rms(r));
    pose = current;
  }
  return { actuatorValues: values, residualMm, lawResidualMm, iterations };
}

/** Gauss–Newton iterations per step at most. */
const MAX_ITERATIONS = 6;
/** Forward-difference step of an actuator value (rad or mm). */
const STEP = 1e-6;

/** The morph's pivots at line position x: each pivot blended between its neighbouring stations by the law's weight. */
function morphAt(
  input: MotionSimulationInput,
  stationPivots: readonly (readonly Point[])[],
  x: number,
  law: ReturnType<typeof restToRestLaw>,
): Point[] {
  const { stations, repeatLengthM } = input;
  const [i, j] = neighbours(stations, repeatLengthM, x);
  const a = stationPivots[i]!;
  if (i === j) return [...a];
  const b = stationPivots[j]!;
  const first = stations[0]!.positionM;
  const wrapped =
    repeatLengthM === null ? x : first + ((((x - first) % repeatLengthM) + repeatLengthM) % repeatLengthM);
  const from = stations[i]!.positionM;
  const to = j === 0 ? first + repeatLengthM! : stations[j]!.positionM;
  const u = Math.min(1, Math.max(0, (wrapped - from) / (to - from)));
  const w = law ? law.evaluate(u, 1).value : u;
  return a.map((p, k): Point => [p[0] + w * (b[k]![0] - p[0]), p[1] + w * (b[k]![1] - p[1])]);
}

/** (JᵀJ + λ·diag(JᵀJ) + λ) δ = −Jᵀr for the columns of J, by Gaussian elimination (d is a handful). */
function dampedStep(columns: readonly (readonly number[])[], r: readonly number[], lambda: number): number[] {
  const d = columns.length;
  const A = columns.map((ci) => columns.map((cj) => ci.reduce((s, v, n) => s + v * cj[n]!, 0)));
  const g = columns.map((ci) => -ci.reduce((s, v, n) => s + v * r[n]!, 0));
  for (let k = 0; k < d; k++) A[k]![k] = A[k]![k]! * (1 + lambda) + lambda;
  // elimination with partial pivoting
  for (let c = 0; c < d; c++) {
    let p = c;
    for (let k = c + 1; k < d; k++) if (Math.abs(A[k]![c]!) > Math.abs(A[p]![c]!)) p = k;
    [A[c], A[p]] = [A[p]!, A[c]!];
    [g[c], g[p]] = [g[p]!, g[c]!];
    const pivot = A[c]![c]!;
    if (Math.abs(pivot) < 1e-300) return new Array(d).fill(0);
    for (let k = c + 1; k < d; k++) {
      const f = A[k]![c]! / pivot;
      for (let m = c; m < d; m++) A[k]![m] = A[k]![m]! - f * A[c]![m]!;
      g[k] = g[k]! - f * g[c]!;
    }
  }
  const out = new Array(d).fill(0);
  for (let c = d - 1; c >= 0; c--) {
    let s = g[c]!;
    for (let m = c + 1; m < d; m++) s -= A[c]![m]! * out[m]!;
    out[c] = s / A[c]![c]!;
  }
  return out;
}

function norm2(r: readonly number[]): number {
  return r.reduce((s, v) => s + v * v, 0);
}
