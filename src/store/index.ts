export {
  type ClaimedPlan,
  FINISHED_STATUSES,
  type NewPlan,
  type PlanEntry,
  type PlanListQuery,
  type PlanPage,
  type PlanProgress,
  type PlanRecord,
  type PlanResult,
  type PlanStatus,
  type PlanStore,
  type ScheduleHead,
  scheduleParts,
  type StoredArtifact,
} from './plan-store.js';
export { isPlanCursor, SqlitePlanStore } from './sqlite-plan-store.js';
export { decodeJson, encodeJson, packJson, packText, unpackJson } from './json-codec.js';
export { scheduleHash, textHash } from './schedule-hash.js';
export { MIGRATIONS } from './migrations.js';
