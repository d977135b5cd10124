import type { PlanRecord } from '../store/index.js';
import type { PlanReport } from './plan-schema.js';
import { type UnreadableFigure, unreadableFigure } from './readable-report.js';
import { toPlanReport } from './to-plan-report.js';

/** A plan's wire report that can always be sent, and the record it was written from. */
export interface ReadablePlan {
  readonly record: PlanRecord;
  readonly report: PlanReport;
  /** What made the computed plan unreadable, when the record was turned into a failed plan; null otherwise. */
  readonly unreadable: UnreadableFigure | null;
}

/**
 * The plan's wire report, checked for numbers that are not finite. A plan with such a figure (or that cannot be
 * written out at all) becomes a `failed` plan whose `error` says where, keeping its findings and
 * cautions, so that a stored plan is always readable: `POST /v1/plans` stores the returned record and
 * `GET /v1/plans/{id}` answers with the returned report, never with a 500.
 */
export function readablePlan(record: PlanRecord): ReadablePlan {
  const unreadable = tryReport(record);
  if (!('path' in unreadable)) return { record, report: unreadable, unreadable: null };
  const error =
    `The plan could not be written out: ${unreadable.path} is not a finite number (${unreadable.problem}). ` +
    'The schedule is probably at the edge of a plausible range; bring its values nearer to common practice.';
  const failed: PlanRecord = {
    ...record,
    plan: {
      ...record.plan,
      status: 'failed',
      error,
      outcome: { meetsRequest: false, shortfalls: [error] },
      fit: null,
      mechanisation: null,
      mechanism: null,
      motion: null,
      simulation: null,
      chainsTried: [],
    },
  };
  const second = tryReport(failed);
  if (!('path' in second)) return { record: failed, report: second, unreadable };
  // last resort: nothing but the reason (findings and cautions could not be written either)
  const bare: PlanRecord = { ...failed, plan: { ...failed.plan, findings: [], cautions: [] } };
  return { record: bare, report: toPlanReport(bare), unreadable };
}

function tryReport(record: PlanRecord): PlanReport | UnreadableFigure {
  let report: PlanReport;
  try {
    report = toPlanReport(record);
  } catch (err) {
    return { path: '(plan)', problem: err instanceof Error ? err.message : String(err) };
  }
  return unreadableFigure(report) ?? report;
}
