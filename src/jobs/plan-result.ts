import type { Finding, Schedule } from '../domain/index.js';
import type { UnreadableFigure } from '../http/readable-report.js';
import { readablePlan } from '../http/readable-plan-report.js';
import type { Plan } from '../pipeline/index.js';
import { processCautions } from '../safety/index.js';
import { encodeJson, type PlanRecord, type PlanResult, packText, textHash } from '../store/index.js';

/** What the job adds to a finished plan's report besides the plan itself. */
export interface JobFacts {
  readonly scheduleHash: string;
  readonly startedAt: string | null;
  readonly finishedAt: string;
}

/**
 * A finished plan written out for the store: the plan (checked readable first: a plan with a figure that is not
 * finite is stored as `failed` with the place, see `readablePlan`), its `GET /v1/plans/{id}` report as JSON, and the
 * plan's hash. Computed where the plan was (a worker), so the service thread only writes.
 */
export function planResult(
  record: PlanRecord,
  facts: JobFacts,
): { readonly result: PlanResult; readonly unreadable: UnreadableFigure | null } {
  const readable = readablePlan(record);
  const plan = readable.record.plan;
  const planJson = encodeJson(plan);
  const planHash = textHash(planJson);
  const report = {
    ...readable.report,
    schedule_hash: facts.scheduleHash,
    plan_hash: planHash,
    started_at: facts.startedAt,
    finished_at: facts.finishedAt,
    progress: null,
  };
  return {
    result: {
      status: plan.status,
      error: plan.error,
      planPacked: packText(planJson),
      reportJson: JSON.stringify(report),
      planHash,
    },
    unreadable: readable.unreadable,
  };
}

/**
 * A plan that failed outside the pipeline (its worker stopped, or it ran past the job's hard time limit): the reason,
 * the request's findings and the material's safety cautions, nothing measured.
 */
export function failedPlan(schedule: Schedule, requestFindings: readonly Finding[], error: string): Plan {
  const cautions = processCautions(schedule.material, schedule.process.dieTemperatureC);
  // fields a failed plan leaves empty that not every version of Plan has
  const empty = { simulation: null };
  return {
    ...empty,
    status: 'failed',
    error,
    outcome: { meetsRequest: false, shortfalls: [error] },
    check: {
      throughputKgPerS: Number.NaN,
      throughputFromFirstStation: false,
      targetDrawDown: Number.NaN,
      stations: [],
      findings: [],
      cautions,
    },
    fit: null,
    mechanisation: null,
    mechanism: null,
    motion: null,
    chainsTried: [],
    findings: [...requestFindings],
    cautions,
  };
}
