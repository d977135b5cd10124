import { constraintSystemOf } from './constraint-system.js';
import { NewtonWorkspace } from './newton-workspace.js';
import type { Pose } from './pose.js';
import { resolveSolveOptions, type SolveOptions } from './solve-options.js';

/** How a traced path ends. */
export type PathStatus = 'completed' | 'singular' | 'stalled';

/** Settings of `traceActuatorPath`, on top of the position solver's; resolved by `resolveTraceOptions`. */
export interface TraceOptions extends SolveOptions {
  /** First step, as a fraction of the path (path parameter s runs 0 → 1). @default 0.02 */
  readonly initialStep: number;
  /** Largest step, fraction of the path. @default 0.05 */
  readonly maxStep: number;
  /** Below this step (fraction of the path) the trace stops and reports why. @default 1e-10 */
  readonly minStep: number;
  /** Largest predicted move of any body coordinate per step, as a fraction of the characteristic length. @default 0.05 */
  readonly maxDisplacement: number;
  /** Newton iterations allowed to the corrector before the step is halved. @default 8 */
  readonly correctorIterations: number;
  /** A corrector move larger than this multiple of the predictor move (plus 1e-6 Lc) counts as a jump. @default 1 */
  readonly jumpRatio: number;
  /** Accepted plus rejected steps before giving up with `'stalled'`. @default 100000 */
  readonly maxSteps: number;
}

/** Fills every missing trace setting with its documented default. */
export function resolveTraceOptions(partial: Partial<TraceOptions> = {}): TraceOptions {
  return {
    ...resolveSolveOptions(partial),
    initialStep: partial.initialStep ?? 0.02,
    maxStep: partial.maxStep ?? 0.05,
    minStep: partial.minStep ?? 1e-10,
    maxDisplacement: partial.maxDisplacement ?? 0.05,
    correctorIterations: partial.correctorIterations ?? 8,
    jumpRatio: partial.jumpRatio ?? 1,
    maxSteps: partial.maxSteps ?? 100_000,
  };
}

/** One accepted point of a traced path. */
export interface PathSample {
  /** Path parameter: actuators = from + s·(to − from). */
  readonly s: number;
  readonly actuators: readonly number[];
  readonly pose: Pose;
  /** Corrector iterations spent on this point. */
  readonly iterations: number;
  /** Residual at the point, mm. */
  readonly residual: number;
  /** Estimated 1-norm condition number of the scaled driven Jacobian. */
  readonly conditionEstimate: number;
  /** Sign of the driven-Jacobian determinant; constant along a traced path by construction. */
  readonly jacobianSign: -1 | 1;
  /** ln |det| of the scaled driven Jacobian (its approach to −∞ signals a singular configuration ahead). */
  readonly logAbsDeterminant: number;
}

/** A path traced through actuator space, with the reason it ended. */
export interface PathTrace {
  readonly status: PathStatus;
  readonly from: readonly number[];
  readonly to: readonly number[];
  /** Accepted points in path order, the start (s = 0) first; empty when the start could not be assembled. */
  readonly samples: readonly PathSample[];
  /** The last accepted point: s and actuator values where the trace stopped (s = 1 when completed). */
  readonly stoppedAt: { readonly s: number; readonly actuators: readonly number[] };
  /**
   * For `'singular'` traces: where the singular configuration is estimated to be, by extrapolating det² linearly in
   * s (exact to first order at a fold/dead point), clamped to at most one failed step past `stoppedAt`.
   */
  readonly singularityEstimate: { readonly s: number; readonly actuators: readonly number[] } | null;
  /** A sentence for people: why the trace ended. */
  readonly reason: string;
  readonly acceptedSteps: number;
  readonly rejectedSteps: number;
  /** Corrector iterations over all accepted and rejected steps. */
  readonly newtonIterations: number;
}

type Rejection = 'singular' | 'branch' | 'jump' | 'diverged' | 'max-iterations';

/**
 * Drives the actuators along the straight segment from `start.actuators` to `to` by predictor–corrector
 * continuation (Nikravesh; Haug): the predictor is the tangent from the velocity equations
 * Φq·q̇ = −Φt, the corrector Newton–Raphson; the step adapts to the corrector's effort and to a cap on the predicted
 * displacement, and is halved when the corrector fails, lands on a singular configuration, changes the sign of the
 * driven-Jacobian determinant (another branch) or moves much further than predicted (another circuit). It never
 * crosses a singular configuration: when the step falls below `minStep` it stops and reports `'singular'` (a dead
 * point, toggle or bifurcation ahead) or `'stalled'` (no singularity in sight), with the last accepted point.
 *
 * `start` need not be exact: it is first corrected at its own actuator values. Needs as many drivers as degrees of
 * freedom (throws otherwise).
 */
export function traceActuatorPath(start: Pose, to: readonly number[], options?: Partial<TraceOptions>): PathTrace {
  const opts = resolveTraceOptions(options);
  const sys = constraintSystemOf(start.mechanism);
  if (!sys.square) {
    throw new Error(
      `traceActuatorPath: ${sys.nDrivers} drivers for ${sys.nq} coordinates and ${sys.nConstraints} constraint equations; continuation needs a square driven system`,
    );
  }
  const from = [...start.actuators];
  if (from.length !== sys.nDrivers || to.length !== sys.nDrivers) {
    throw new Error(`traceActuatorPath: ${sys.nDrivers} actuator values expected at both ends`);
  }
  const nd = sys.nDrivers;
  const dir = to.map((v, k) => v - from[k]!);
  const at = (s: number): number[] => (s >= 1 ? [...to] : from.map((v, k) => v + s * dir[k]!));
  const ws = new NewtonWorkspace(sys, opts);
  const mechanism = start.mechanism;
  const samples: PathSample[] = [];
  let newtonIterations = 0;
  let accepted = 0;
  let rejected = 0;

  ws.q.set(start.coordinates);
  const first = ws.run(from);
  newtonIterations += ws.iterations;
  const firstCondition = ws.factored ? ws.lu.conditionEstimate('quick') : Number.POSITIVE_INFINITY;
  if (first !== 'converged' || !(firstCondition <= opts.conditionLimit)) {
    const singular = first === 'singular' || first === 'converged';
    return {
      status: singular ? 'singular' : 'stalled',
      from,
      to: [...to],
      samples,
      stoppedAt: { s: 0, actuators: from },
      singularityEstimate: singular ? { s: 0, actuators: from } : null,
      reason: singular
        ? 'the start configuration is singular'
        : `the start configuration could not be assembled (${first}, residual ${ws.residual.toExponential(2)} mm)`,
      acceptedSteps: 0,
      rejectedSteps: 0,
      newtonIterations,
    };
  }
  const record = (s: number, condition: number): PathSample => {
    const sample: PathSample = {
      s,
      actuators: at(s),
      pose: { mechanism, coordinates: Float64Array.from(ws.q), actuators: at(s) },
      iterations: ws.iterations,
      residual: ws.residual,
      conditionEstimate: condition,
      jacobianSign: ws.jacobianSign() < 0 ? -1 : 1,
      logAbsDeterminant: ws.lu.logAbsDeterminant,
    };
    samples.push(sample);
    return sample;
  };
  let last = record(0, firstCondition);

  const nCoord = ws.q.length;
  const qPrev = new Float64Array(nCoord);
  const qdot = new Float64Array(nCoord);
  const lc = sys.scale;
  const rateNorm = (): number => {
    let m = 0;
    for (let i = 0; i < nCoord; i++) {
      const v = Math.abs(qdot[i]!) * (i % 3 === 2 ? lc : 1);
      if (v > m) m = v;
    }
    return m;
  };
  ws.tangent(dir, qdot);
  let speed = rateNorm();
  let s = 0;
  let h = opts.initialStep;
  let lastRejection: Rejection | null = null;
  let lastFailedStep = 0;
  let status: PathStatus = 'completed';
  let reason = 'reached the end of the path';
  const moveFloor = 1e-6 * lc;

  while (s < 1) {
    if (accepted + rejected >= opts.maxSteps) {
      status = 'stalled';
      reason = `gave up after ${opts.maxSteps} steps`;
      break;
    }
    if (speed > 0) h = Math.min(h, (opts.maxDisplacement * lc) / speed);
    h = Math.min(h, opts.maxStep, 1 - s);
    if (h < opts.minStep && 1 - s > opts.minStep) {
      status =
        lastRejection === 'singular' || lastRejection === 'branch' || foldAhead(samples, lastFailedStep)
          ? 'singular'
          : 'stalled';
      reason =
        status === 'singular'
          ? `singular configuration at s = ${s.toPrecision(8)}: the mechanism cannot be driven further along this path without changing branch (last refusal: ${lastRejection})`
          : `step fell below ${opts.minStep} at s = ${s.toPrecision(8)} (last refusal: ${lastRejection})`;
      break;
    }
    if (1 - s - h < opts.minStep) h = 1 - s;
    qPrev.set(ws.q);
    for (let i = 0; i < nCoord; i++) ws.q[i] = qPrev[i]! + h * qdot[i]!;
    const sNext = Math.min(1, s + h);
    const result = ws.run(at(sNext), opts.correctorIterations);
    newtonIterations += ws.iterations;
    let refusal: Rejection | null = null;
    let condition = Number.POSITIVE_INFINITY;
    if (result !== 'converged') {
      refusal = result;
    } else if ((ws.jacobianSign() < 0 ? -1 : 1) !== last.jacobianSign) {
      refusal = 'branch';
    } else {
      let move = 0;
      for (let i = 0; i < nCoord; i++) {
        const v = Math.abs(ws.q[i]! - qPrev[i]! - h * qdot[i]!) * (i % 3 === 2 ? lc : 1);
        if (v > move) move = v;
      }
      if (move > opts.jumpRatio * h * speed + moveFloor) refusal = 'jump';
      else {
        condition = ws.lu.conditionEstimate('quick');
        if (!(condition <= opts.conditionLimit)) refusal = 'singular';
      }
    }
    if (refusal) {
      ws.q.set(qPrev);
      rejected++;
      lastRejection = refusal;
      lastFailedStep = h;
      h *= 0.5;
      continue;
    }
    accepted++;
    s = sNext;
    last = record(s, condition);
    ws.tangent(dir, qdot);
    speed = rateNorm();
    if (ws.iterations <= 2) h *= 1.6;
    else if (ws.iterations >= 5) h *= 0.6;
  }

  const stoppedAt = { s: last.s, actuators: last.actuators };
  let singularityEstimate: PathTrace['singularityEstimate'] = null;
  if (status === 'singular') {
    const sStar = Math.min(last.s + lastFailedStep, extrapolateFold(samples) ?? last.s);
    singularityEstimate = { s: Math.max(last.s, sStar), actuators: at(Math.max(last.s, sStar)) };
  }
  return {
    status,
    from,
    to: [...to],
    samples,
    stoppedAt,
    singularityEstimate,
    reason: nd === 0 ? 'no drivers: nothing to trace' : reason,
    acceptedSteps: accepted,
    rejectedSteps: rejected,
    newtonIterations,
  };
}

/** s where det² extrapolated linearly through the last two samples vanishes, if |det| is falling; else null. */
function extrapolateFold(samples: readonly PathSample[]): number | null {
  const b = samples[samples.length - 1];
  const a = samples[samples.length - 2];
  if (!a || !b || !(b.logAbsDeterminant < a.logAbsDeterminant) || !(b.s > a.s)) return null;
  const ratio = Math.exp(2 * (b.logAbsDeterminant - a.logAbsDeterminant));
  return b.s + (ratio * (b.s - a.s)) / (1 - ratio);
}

/** True when the extrapolated singularity lies within a few failed steps of the last accepted point. */
function foldAhead(samples: readonly PathSample[], failedStep: number): boolean {
  const last = samples[samples.length - 1];
  const sStar = extrapolateFold(samples);
  return last !== undefined && sStar !== null && sStar - last.s <= 4 * Math.max(failedStep, 1e-12);
}
