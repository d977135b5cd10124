export { type PlanRecord, type PlanStore, MemoryPlanStore } from './plan-store.js';
