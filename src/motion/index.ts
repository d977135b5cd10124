export type { LawSample } from './law-sample.js';
export type { RestToRestLaw } from './rest-to-rest-law.js';
export { cycloidal } from './cycloidal.js';
export { polynomial345 } from './polynomial-345.js';
export {
  type CubicIntervalPeaks,
  type MonotoneCubic,
  type MonotoneCubicEnds,
  monotoneCubic,
  monotoneCubicIntervalPeaks,
  sampleMonotoneCubic,
} from './monotone-cubic.js';
export {
  type LineTimeBase,
  SECONDS_PER_MINUTE,
  lineTimeBase,
  metresPerMinute,
  metresPerSecond,
  positionAtTime,
  timeAtPosition,
  wrapPosition,
} from './line-time-base.js';
export { type StepGrid, stepGrid, timeStepsOver } from './step-grid.js';
export {
  type ActuatorKind,
  type ActuatorTrajectory,
  type ActuatorTrajectoryInput,
  type ActuatorTransition,
  type MotionLawName,
  actuatorTrajectory,
  restToRestLaw,
} from './actuator-trajectory.js';
export { type ActuatorSample, sampleTrajectory, sampleTrajectoryAtTime } from './sample-trajectory.js';
export type { MotionLimitProblem } from './motion-limit-problem.js';
export {
  type MotionLimitCheck,
  type MotionLimits,
  type TransitionPeaks,
  checkMotionLimits,
} from './check-motion-limits.js';
export { type SetpointTable, setpointTable, sharedTimeBase } from './setpoint-table.js';
export { type CamTable, camTable } from './cam-table.js';
