import type { Finding, Schedule } from '../domain/index.js';
import {
  type ActuatorTrajectory,
  actuatorTrajectory,
  checkMotionLimits,
  type MotionLawName,
  metresPerMinute,
} from '../motion/index.js';
import { DEFAULT_TOLERANCES, toRadians } from '../numeric/index.js';
import type { PlanMechanism } from './chain-mechanism.js';
import { motionLimitFinding } from './motion-limit-finding.js';

/**
 * The plan's motion as plain data: the law between stations, the setpoint table's time step and one trajectory per
 * actuator, in the order of `mechanism.actuators` (values in radians for rotary, millimetres for linear actuators).
 */
export interface PlanMotion {
  readonly law: MotionLawName;
  /** Time step of the setpoint table, s. */
  readonly timeStepS: number;
  readonly trajectories: readonly ActuatorTrajectory[];
}

/** The law a plan uses between stations unless the schedule asks for another: cycloidal (VDI 2143 Blatt 1). */
export const PLAN_MOTION_LAW: MotionLawName = 'cycloidal';

/** How the limits are checked. */
export interface MotionCheckSettings {
  /**
   * Check the limits as if the line ran at this speed, m/s (the fastest puller speed when the puller follows the
   * area: the actuators then move faster than at the nominal speed wherever the line is faster). @default the nominal
   * line speed
   */
  readonly limitLineSpeedMPerS?: number;
}

/**
 * One trajectory per actuator of `mechanism` by the schedule's motion law (cycloidal by default), keyed to the
 * stations' line positions and timed by the nominal line speed (periodic over `schedule.repeatLengthM` when set), and
 * the findings of the limit check at `settings.limitLineSpeedMPerS`: an `ACTUATOR_LIMIT` warning per broken limit (`schedule.actuators` limits: rad/s and rad/s² for rotary, mm/s and mm/s² for linear actuators).
 * Motion is null when
 * the mechanism has no actuators or its station values do not match the stations.
 */
export function planMotion(
  schedule: Schedule,
  mechanism: PlanMechanism | null,
  settings: MotionCheckSettings = {},
): { readonly motion: PlanMotion | null; readonly findings: readonly Finding[] } {
  const law = schedule.motionLaw ?? PLAN_MOTION_LAW;
  const nominal = schedule.process.lineSpeedMPerS;
  const checkSpeed = settings.limitLineSpeedMPerS ?? nominal;
  const stationsM = schedule.stations.map((s) => s.positionM);
  const actuators = mechanism?.actuators ?? [];
  if (actuators.length === 0 || actuators.some((a) => a.stationValues.length !== stationsM.length)) {
    return { motion: null, findings: [] };
  }
  const findings: Finding[] = [];
  const trajectories = actuators.map((a, k) => {
    const build = (lineSpeedMPerS: number) =>
      actuatorTrajectory(
        {
          kind: a.kind,
          stationsM,
          values: a.kind === 'rotary' ? a.stationValues.map(toRadians) : a.stationValues,
          law,
          lineSpeedMPerS,
          repeatLengthM: schedule.repeatLengthM,
        },
        DEFAULT_TOLERANCES,
      );
    const trajectory = build(nominal);
    const rotary = a.kind === 'rotary';
    const check = checkMotionLimits(checkSpeed === nominal ? trajectory : build(checkSpeed), {
      maxSpeedPerS: rotary ? schedule.actuators.maxSpeedRadPerS : schedule.actuators.maxSpeedMmPerS,
      maxAccelerationPerS2: rotary ? schedule.actuators.maxAccelRadPerS2 : schedule.actuators.maxAccelMmPerS2,
    });
    for (const problem of check.problems) {
      const f = motionLimitFinding(k, a.id, a.kind, problem);
      findings.push(
        checkSpeed === nominal
          ? f
          : {
              ...f,
              message: `${f.message} (Checked at the fastest puller speed, ${metresPerMinute(checkSpeed).toPrecision(3)} m/min, since the puller follows the orifice area: the line speed given is for the fastest stretch.)`,
            },
      );
    }
    return trajectory;
  });
  return { motion: { law, timeStepS: schedule.timeStepS, trajectories }, findings };
}
