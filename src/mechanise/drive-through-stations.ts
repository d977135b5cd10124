import {
  checkCircuit,
  createPositionSolver,
  dyadTransmissionAngles,
  type PathStatus,
  type Pose,
  type TraceOptions,
  traceActuatorPath,
  transmissionAngles,
} from '../kinematics/index.js';
import { toDegrees, toRadians } from '../numeric/index.js';

/** A defect found while driving a mechanism through its stations (Chase & Mirth, J. Mech. Des. 115(2) 1993). */
export interface MotionDefect {
  /**
   * `SINGULAR_STATION`: a station cannot be solved, or is a dead point, at its actuator values.
   * `BRANCH_DEFECT`: the driven-Jacobian determinant has another sign at the next station: a dead point lies between.
   * `ORDER_DEFECT`: driving toward the next station stops at a dead point: the actuator would have to reverse inside
   * the leg. `CIRCUIT_DEFECT`: the leg completes but ends in another configuration than the station's.
   * `TRANSMISSION_ANGLE`: a binary link's transmission angle leaves the limit band somewhere along the motion.
   * `COLLISION`: two parts overlap somewhere along the motion (`makeClearanceInspector`).
   */
  readonly code:
    | 'SINGULAR_STATION'
    | 'BRANCH_DEFECT'
    | 'ORDER_DEFECT'
    | 'CIRCUIT_DEFECT'
    | 'TRANSMISSION_ANGLE'
    | 'COLLISION';
  /** The leg, as distinct positions [from, to], when the defect belongs to one. */
  readonly leg?: readonly [number, number];
  /** The distinct position concerned. */
  readonly position?: number;
  /** Link concerned (`TRANSMISSION_ANGLE`). */
  readonly linkId?: string;
  /** Measured value: deviation (mm), transmission angle (degrees) or the path fraction where a trace stopped. */
  readonly value?: number;
  readonly message: string;
}

/** Transmission-angle extremes of one binary link over the whole motion, degrees. */
export interface LinkTransmission {
  readonly linkId: string;
  readonly minDeg: number;
  readonly maxDeg: number;
}

/** Where along the motion something was measured: at a distinct position, or a fraction of the way along a leg. */
export interface MotionPlace {
  readonly position: number | null;
  readonly leg: readonly [number, number] | null;
  /** 0 … 1 along the leg (0 at a position). */
  readonly fraction: number;
}

/**
 * Transmission angle at a plate–plate joint closing a dyad (`dyadTransmissionAngles`) over the whole motion, degrees:
 * its extremes and the angle farthest from 90° with where it occurs. Reported as findings, not defects: a chain of
 * nearly aligned plates closing onto a ground pivot is near its stretched limit there, which holds position well but
 * drives poorly.
 */
export interface JointTransmission {
  readonly jointId: string;
  readonly minDeg: number;
  readonly maxDeg: number;
  readonly worstDeg: number;
  readonly worstAt: MotionPlace;
}

/** One leg driven from a distinct position to the next in schedule order. */
export interface LegTrace {
  readonly from: number;
  readonly to: number;
  readonly status: PathStatus | 'not-traced';
  readonly reason: string;
  readonly steps: number;
}

/** The outcome of driving a mechanism through its stations. */
export interface MotionCheck {
  /** No defect of any kind. */
  readonly ok: boolean;
  readonly defects: readonly MotionDefect[];
  /** The configuration reached at each distinct position by driving along the schedule (the first solve for the first). */
  readonly arrivals: readonly (Pose | null)[];
  readonly legs: readonly LegTrace[];
  readonly transmission: readonly LinkTransmission[];
  /** Plate–plate joints closing a dyad, over the whole motion. */
  readonly jointTransmission: readonly JointTransmission[];
  /** Smallest sin μ of any binary link anywhere along the motion; 1 without links. */
  readonly worstTransmissionSine: number;
  /** Largest condition estimate of the driven Jacobian met along the motion (dimensionless). */
  readonly maxCondition: number;
}

/** Settings of `driveThroughStations`. */
export interface DriveSettings {
  readonly trace: TraceOptions;
  /** Traced and expected configurations may differ by this, mm. */
  readonly arrivalToleranceMm: number;
  /** Transmission angles outside this band are defects, degrees. */
  readonly transmissionLimitDeg: readonly [number, number];
  /** Called with every configuration checked: each station solved and every accepted step of every leg. */
  readonly inspect?: (pose: Pose, at: MotionPlace) => void;
}

/**
 * Drives a mechanism (as many drivers as degrees of freedom) through its stations and reports every defect (Chase &
 * Mirth 1993; determinant test of Haug): each station is first solved at its own actuator values from its expected
 * configuration (`expected[p]`, one per distinct position, actuator values included); then each leg is traced by
 * continuation (`traceActuatorPath`) from the solved configuration toward the next station's actuator values. A leg
 * between stations of opposite determinant sign is a branch defect and is not traced; a trace that stops is an order
 * defect (a dead point lies inside the leg); a trace that completes away from the station is a circuit defect. The
 * transmission angle of every binary link (a defect outside the limit band), and of every plate–plate joint that closes
 * a dyad (`dyadTransmissionAngles`; reported, not a defect), is measured at every accepted step and at the stations. For a
 * back-and-forth schedule the actuators simply reverse between legs: only the legs themselves must be clean.
 */
export function driveThroughStations(
  expected: readonly Pose[],
  legs: readonly (readonly [number, number])[],
  settings: DriveSettings,
): MotionCheck {
  const mechanism = expected[0]!.mechanism;
  const solver = createPositionSolver(mechanism, settings.trace);
  const defects: MotionDefect[] = [];
  const solved: (Pose | null)[] = [];
  const signs: number[] = [];
  let maxCondition = 0;
  const extremes = new Map<string, { min: number; max: number }>();
  const note = (id: string, mu: number) => {
    const e = extremes.get(id);
    if (!e) extremes.set(id, { min: mu, max: mu });
    else {
      e.min = Math.min(e.min, mu);
      e.max = Math.max(e.max, mu);
    }
  };
  // plate–plate joints that close a dyad: extremes and where the angle is worst (farthest from 90°)
  const jointExtremes = new Map<string, { min: number; max: number; worst: number; at: MotionPlace }>();
  const measure = (pose: Pose, at: MotionPlace) => {
    settings.inspect?.(pose, at);
    for (const t of transmissionAngles(pose)) note(t.linkId, t.mu);
    for (const t of dyadTransmissionAngles(pose)) {
      const e = jointExtremes.get(t.jointId);
      if (!e) jointExtremes.set(t.jointId, { min: t.mu, max: t.mu, worst: t.mu, at });
      else {
        e.min = Math.min(e.min, t.mu);
        e.max = Math.max(e.max, t.mu);
        if (Math.abs(Math.PI / 2 - t.mu) > Math.abs(Math.PI / 2 - e.worst)) {
          e.worst = t.mu;
          e.at = at;
        }
      }
    }
  };
  expected.forEach((pose, p) => {
    const r = solver.solve(pose.actuators, pose);
    if (r.status !== 'converged') {
      defects.push({
        code: 'SINGULAR_STATION',
        position: p,
        message: `position ${p} cannot be solved at its actuator values (${r.status}): it is a dead point or out of reach`,
      });
      solved.push(null);
      signs.push(0);
      return;
    }
    maxCondition = Math.max(maxCondition, r.conditionEstimate);
    solved.push(r.pose);
    signs.push(r.jacobianSign);
    measure(r.pose, { position: p, leg: null, fraction: 0 });
  });
  const arrivals: (Pose | null)[] = expected.map(() => null);
  // the schedule starts at its first station's position, reached by solving there
  const first = legs[0]?.[0] ?? 0;
  arrivals[first] = solved[first] ?? null;
  const traces: LegTrace[] = [];
  for (const [from, to] of legs) {
    const start = solved[from];
    const target = solved[to];
    if (!start || !target) {
      traces.push({ from, to, status: 'not-traced', reason: 'a station could not be solved', steps: 0 });
      continue;
    }
    if (signs[from] !== signs[to]) {
      defects.push({
        code: 'BRANCH_DEFECT',
        leg: [from, to],
        message: `positions ${from} and ${to} lie on different branches (the driven Jacobian changes sign): the mechanism would have to pass a dead point between them`,
      });
      traces.push({ from, to, status: 'not-traced', reason: 'branch defect', steps: 0 });
      continue;
    }
    const trace = traceActuatorPath(start, expected[to]!.actuators, settings.trace);
    traces.push({ from, to, status: trace.status, reason: trace.reason, steps: trace.acceptedSteps });
    for (const sample of trace.samples) {
      maxCondition = Math.max(maxCondition, sample.conditionEstimate);
      measure(sample.pose, { position: null, leg: [from, to], fraction: sample.s });
    }
    if (trace.status !== 'completed') {
      defects.push({
        code: 'ORDER_DEFECT',
        leg: [from, to],
        value: trace.stoppedAt.s,
        message: `driving from position ${from} toward position ${to} stops at ${Math.round(trace.stoppedAt.s * 100)} % of the leg: ${trace.reason}`,
      });
      continue;
    }
    const last = trace.samples[trace.samples.length - 1]!.pose;
    const circuit = checkCircuit(last, target, settings.arrivalToleranceMm);
    if (circuit.defect) {
      defects.push({
        code: 'CIRCUIT_DEFECT',
        leg: [from, to],
        position: to,
        value: circuit.maxDeviationMm,
        message: `driving from position ${from} reaches position ${to}'s actuator values in another configuration (${circuit.worstBodyId} is ${circuit.maxDeviationMm.toPrecision(3)} mm away)`,
      });
      continue;
    }
    if (!arrivals[to]) arrivals[to] = last;
  }
  const [limMin, limMax] = settings.transmissionLimitDeg;
  const transmission: LinkTransmission[] = [...extremes].map(([linkId, e]) => ({
    linkId,
    minDeg: toDegrees(e.min),
    maxDeg: toDegrees(e.max),
  }));
  let worstTransmissionSine = 1;
  for (const t of transmission) {
    worstTransmissionSine = Math.min(worstTransmissionSine, Math.sin(toRadians(Math.min(t.minDeg, 180 - t.maxDeg))));
    const bad = t.minDeg < limMin ? t.minDeg : t.maxDeg > limMax ? t.maxDeg : null;
    if (bad !== null) {
      defects.push({
        code: 'TRANSMISSION_ANGLE',
        linkId: t.linkId,
        value: bad,
        message: `${t.linkId}'s transmission angle reaches ${bad.toFixed(1)}°, outside ${limMin}°–${limMax}°`,
      });
    }
  }
  const joints: JointTransmission[] = [...jointExtremes].map(([jointId, e]) => ({
    jointId,
    minDeg: toDegrees(e.min),
    maxDeg: toDegrees(e.max),
    worstDeg: toDegrees(e.worst),
    worstAt: e.at,
  }));
  return {
    ok: defects.length === 0,
    defects,
    arrivals,
    legs: traces,
    transmission,
    jointTransmission: joints,
    worstTransmissionSine,
    maxCondition,
  };
}
