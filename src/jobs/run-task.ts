import type { MessagePort } from 'node:worker_threads';
import type { Finding, Schedule } from '../domain/index.js';
import type { UnreadableFigure } from '../http/readable-report.js';
import { type RenderedDownload, renderDownloads } from '../http/render-download.js';
import { type CheckAnswer, checkBody, type IntakeRefusal, type PlanIntake, planBody } from '../http/schedule-intake.js';
import { planSchedule } from '../pipeline/index.js';
import { type PlanRecord, type PlanResult, type StoredArtifact, unpackJson } from '../store/index.js';
import { planResult } from './plan-result.js';

/** A plan to compute in a worker: the schedule and what its report needs. Plain data (structured clone). */
export interface PlanTask {
  readonly kind: 'plan';
  readonly id: string;
  readonly createdAt: string;
  readonly startedAt: string;
  /** The schedule as the store keeps it, packed by `packJson` (unpacked here, in the worker). */
  readonly schedulePacked: Uint8Array;
  readonly scheduleHash: string;
  readonly requestFindings: readonly Finding[];
  /** The chain search stops with what it has after this many seconds (PLAN_TIME_LIMIT_S). */
  readonly timeLimitS: number;
  /** Receives `{ stage, fraction }` as the plan goes. */
  readonly progress?: MessagePort;
}

/** A body posted to `POST /v1/checks`, as received (UTF-8 bytes), to read and check in a worker. */
export interface CheckTask {
  readonly kind: 'check';
  readonly body: Uint8Array;
}

/** A body posted to `POST /v1/plans`, as received, to read in a worker and make ready for the store's queue. */
export interface IntakeTask {
  readonly kind: 'intake';
  readonly body: Uint8Array;
}

/**
 * Downloads of a finished plan to render in a worker, from the plan as stored (its JSON, not parsed on the service
 * thread): the named ones, or every download the plan offers at its default query when `names` is absent.
 */
export interface RenderTask {
  readonly kind: 'render';
  readonly id: string;
  readonly createdAt: string;
  /** The plan's schedule, packed by `packJson`. */
  readonly schedulePacked: Uint8Array;
  /** The plan, packed by `packJson`. */
  readonly planPacked: Uint8Array;
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
  task: PlanTask | CheckTask | IntakeTask | RenderTask,
): PlanTaskResult | IntakeRefusal | CheckAnswer | PlanIntake | RenderedDownload[] {
  if (task.kind === 'check') return checkBody(utf8.decode(task.body));
  if (task.kind === 'intake') return planBody(utf8.decode(task.body));
  if (task.kind === 'render') return renderDownloads(storedRecord(task), task.planHash, task.names);
  const started = performance.now();
  try {
    const schedule = unpackJson<Schedule>(task.schedulePacked);
    const computed = planSchedule(schedule, {
      stop: () => performance.now() - started > task.timeLimitS * 1000,
      progress: (stage, fraction) => task.progress?.postMessage({ stage, fraction }),
    });
    const plan = { ...computed, findings: [...task.requestFindings, ...computed.findings] };
    const record = { id: task.id, createdAt: task.createdAt, schedule, plan };
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
          schedulePacked: task.schedulePacked,
          planPacked: written.result.planPacked,
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

/**
 * Request bodies as the framework's own parser decodes them: invalid sequences become U+FFFD (and then fail as JSON
 * or as a name), a byte order mark is dropped.
 */
const utf8 = new TextDecoder('utf-8');

/** A plan renders its downloads with it only when it finished within this many times PLAN_TIME_LIMIT_S. */
const RENDER_WITHIN_TIME_LIMITS = 2;

/** The plan record a render task names, decoded as the store decodes it. */
function storedRecord(task: Omit<RenderTask, 'kind' | 'names'>): PlanRecord {
  return {
    id: task.id,
    createdAt: task.createdAt,
    schedule: unpackJson(task.schedulePacked),
    plan: unpackJson(task.planPacked),
  };
}
