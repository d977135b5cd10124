export { type StationCheck, type ScheduleCheck, checkSchedule } from './check-schedule.js';
