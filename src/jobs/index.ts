export { PlanJobs, type PlanJobsOptions } from './plan-jobs.js';
export { PoolBusyError, WorkerPool, type WorkerPoolOptions } from './worker-pool.js';
export { failedPlan, planResult } from './plan-result.js';
export type { CheckTask, IntakeTask, PlanTask, PlanTaskResult, RenderTask } from './run-task.js';
