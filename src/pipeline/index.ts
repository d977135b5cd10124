export { type StationCheck, type ScheduleCheck, checkSchedule } from './check-schedule.js';
export { type Plan, planSchedule } from './plan-schedule.js';
export { type PlanMechanism, chainMechanism } from './chain-mechanism.js';
export { type PlanMotion, PLAN_MOTION_LAW, planMotion } from './plan-motion.js';
