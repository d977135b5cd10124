import type { MessagePort } from 'node:worker_threads';
import type { Finding, Schedule } from '../domain/index.js';
import type { UnreadableFigure } from '../http/readable-report.js';
import type { CheckReport } from '../http/report-schema.js';
import { toCheckReport } from '../http/to-check-report.js';
import { checkSchedule, planSchedule } from '../pipeline/index.js';
import type { PlanResult } from '../store/index.js';
import { planResult } from './plan-result.js';

/** A plan to compute in a worker: the schedule and what its report needs. Plain data (structured clone). */
export interface PlanTask {
  readonly kind: 'plan';
  readonly id: string;
  readonly createdAt: string;
  readonly startedAt: string;
  readonly schedule: Schedule;
  readonly scheduleHash: string;
  readonly requestFindings: readonly Finding[];
  /** The chain search stops with what it has after this many seconds (PLAN_TIME_LIMIT_S). */
  readonly timeLimitS: number;
  /** Receives `{ stage, fraction }` as the plan goes. */
  readonly progress?: MessagePort;
}

/** A schedule to check in a worker. */
export interface CheckTask {
  readonly kind: 'check';
  readonly schedule: Schedule;
}

export interface PlanTaskResult {
  readonly result: PlanResult;
  readonly unreadable: UnreadableFigure | null;
  readonly ms: number;
  readonly plates: number | null;
}

/**
 * What a worker thread runs (loaded through worker-entry.mjs): a plan, written out for the store, or a check, as its
 * wire report. The worker reads the clock for the plan's time limit; the pipeline stays pure.
 */
export default function runTask(task: PlanTask | CheckTask): PlanTaskResult | CheckReport {
  if (task.kind === 'check') return toCheckReport(task.schedule, checkSchedule(task.schedule));
  const started = performance.now();
  try {
    const computed = planSchedule(task.schedule, {
      stop: () => performance.now() - started > task.timeLimitS * 1000,
      progress: (stage, fraction) => task.progress?.postMessage({ stage, fraction }),
    });
    const plan = { ...computed, findings: [...task.requestFindings, ...computed.findings] };
    const record = { id: task.id, createdAt: task.createdAt, schedule: task.schedule, plan };
    const written = planResult(record, {
      scheduleHash: task.scheduleHash,
      startedAt: task.startedAt,
      finishedAt: new Date().toISOString(),
    });
    return { ...written, ms: Math.round(performance.now() - started), plates: plan.fit?.plateCount ?? null };
  } finally {
    task.progress?.close();
  }
}
