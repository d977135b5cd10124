import type { MessagePort } from 'node:worker_threads';
import type { Finding, Schedule } from '../domain/index.js';
import type { UnreadableFigure } from '../http/readable-report.js';
import { type RenderedDownload, renderDownloads } from '../http/render-download.js';
import type { CheckReport } from '../http/report-schema.js';
import { toCheckReport } from '../http/to-check-report.js';
import { checkSchedule, planSchedule } from '../pipeline/index.js';
import { decodeJson, encodeJson, type PlanRecord, type PlanResult, type StoredArtifact } from '../store/index.js';
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

/**
 * Downloads of a finished plan to render in a worker, from the plan as stored (its JSON, not parsed on the service
 * thread): the named ones, or every download the plan offers at its default query when `names` is absent.
 */
export interface RenderTask {
  readonly kind: 'render';
  readonly id: string;
  readonly createdAt: string;
  readonly scheduleJson: string;
  readonly planJson: string;
  readonly planHash: string;
  readonly names?: readonly string[];
}

export interface PlanTaskResult {
  readonly result: PlanResult;
  readonly unreadable: UnreadableFigure | null;
  /** Why the plan's downloads could not be rendered with it (they are then rendered when first asked for). */
  readonly renderError: string | null;
  readonly ms: number;
  readonly plates: number | null;
}

/**
 * What a worker thread runs (loaded through worker-entry.mjs): a plan, written out for the store, or a check, as its
 * wire report. The worker reads the clock for the plan's time limit; the pipeline stays pure.
 */
export default function runTask(
  task: PlanTask | CheckTask | RenderTask,
): PlanTaskResult | CheckReport | RenderedDownload[] {
  if (task.kind === 'check') return toCheckReport(task.schedule, checkSchedule(task.schedule));
  if (task.kind === 'render') return renderDownloads(storedRecord(task), task.planHash, task.names);
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
    // every download the plan offers, rendered here from the plan as the store gives it back, so the files are the
    // bytes a later render from the store makes, and stored with the result in one transaction
    let artifacts: StoredArtifact[] | undefined;
    let renderError: string | null = null;
    // a plan that took long already (a large one near the job's hard limit) is stored at once: its downloads are
    // then rendered by a worker when first asked for, rather than risk the hard limit failing a finished plan
    const late = performance.now() - started > RENDER_WITHIN_TIME_LIMITS * task.timeLimitS * 1000;
    if (!late) {
      task.progress?.postMessage({ stage: 'drawings', fraction: 0.97 });
      try {
        const stored = {
          id: task.id,
          createdAt: task.createdAt,
          scheduleJson: encodeJson(task.schedule),
          planJson: written.result.planJson,
          planHash: written.result.planHash,
        };
        artifacts = renderDownloads(storedRecord(stored), stored.planHash);
      } catch (err) {
        renderError = err instanceof Error ? err.message : String(err);
      }
    }
    return {
      ...written,
      result: artifacts ? { ...written.result, artifacts } : written.result,
      renderError,
      ms: Math.round(performance.now() - started),
      plates: plan.fit?.plateCount ?? null,
    };
  } finally {
    task.progress?.close();
  }
}

/** A plan renders its downloads with it only when it finished within this many times PLAN_TIME_LIMIT_S. */
const RENDER_WITHIN_TIME_LIMITS = 2;

/** The plan record a render task names, decoded as the store decodes it. */
function storedRecord(task: Omit<RenderTask, 'kind' | 'names'>): PlanRecord {
  return {
    id: task.id,
    createdAt: task.createdAt,
    schedule: decodeJson(task.scheduleJson),
    plan: decodeJson(task.planJson),
  };
}
