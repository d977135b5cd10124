export { type StationCheck, type ScheduleCheck, checkSchedule } from './check-schedule.js';
export { type Plan, planSchedule } from './plan-schedule.js';
export { type PlanMechanism, chainMechanism } from './chain-mechanism.js';
export { type MotionCheckSettings, type PlanMotion, PLAN_MOTION_LAW, planMotion } from './plan-motion.js';
export {
  MAX_SIMULATION_STEPS,
  type PlanSimulation,
  type PlanSimulationParts,
  setpointTimes,
  simulatePlan,
  simulationInput,
  timesAlongSpeeds,
  WALL_MEASUREMENTS,
} from './plan-simulation.js';
export {
  type MotionSimulation,
  type MotionSimulationInput,
  type MotionSimulationSettings,
  neighbours,
  simulateMotion,
} from './simulate-motion.js';
export { brokenRuns, MOTION_PRESSURE_RISE_RATIO, simulationFindings } from './motion-findings.js';
export {
  interpolate,
  type PlanSetpoints,
  type ProcessColumns,
  type PullerTable,
  planSetpoints,
  pullerTable,
  type SetpointSettings,
  setpointRowCount,
} from './plan-tables.js';
export { MAX_FRAMES, type PlanFrameParts, type PlanFrames, planFrames } from './plan-frames.js';
export { type MorphTracking, trackMorph } from './track-morph.js';
