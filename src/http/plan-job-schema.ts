import { z } from 'zod';
import { PlanAcceptedWire, PlanWire } from './plan-schema.js';
import { CautionWire } from './report-schema.js';

const PlanStatusWire = PlanWire.shape.status;

export const PlanProgressWire = z
  .object({
    stage: z.string().describe('the pipeline stage the plan is in: queued, check, fit, mechanise, other chains'),
    fraction: z.number().min(0).max(1).describe('coarse overall progress, 0–1, stage by stage'),
  })
  .describe('how far a running plan has come; null unless running');

const JobFields = {
  schedule_hash: z
    .string()
    .describe(
      'SHA-256 (hex) of the normalised schedule: the same schedule gives the same hash whatever its formatting',
    ),
  plan_hash: z
    .string()
    .nullable()
    .describe('SHA-256 (hex) of the stored plan; downloads derive their ETag from it; null until finished'),
  started_at: z.string().nullable().describe('when a worker last started the plan (ISO 8601)'),
  finished_at: z.string().nullable().describe('when the plan finished (ISO 8601)'),
  progress: PlanProgressWire.nullable(),
};

/** `GET /v1/plans/{id}`: the plan as PlanWire describes it, with where its job stands. */
export const PlanJobWire = PlanWire.extend(JobFields).describe(
  'A plan. queued/running: no result yet (stations empty, chain, mechanisation, mechanism and motion null; findings are those about the request, cautions those of the material); done/incomplete/failed: the result.',
);

export const PlanCreatedWire = PlanAcceptedWire.extend({
  schedule_hash: JobFields.schedule_hash,
  location: z.string().describe('where to read the plan: the same as the Location header'),
  cautions: z.array(CautionWire).describe('the material’s process-safety cautions; the plan carries them too'),
}).describe('A plan accepted: stored and queued (or, for a repeated Idempotency-Key, the plan made the first time)');

export const PlanSummaryWire = z
  .object({
    id: z.string(),
    name: z.string(),
    status: PlanStatusWire,
    created_at: z.string(),
    started_at: z.string().nullable(),
    finished_at: z.string().nullable(),
    schedule_hash: z.string(),
    plan_hash: z.string().nullable(),
    progress: PlanProgressWire.nullable(),
    location: z.string().describe('/v1/plans/{id}'),
  })
  .describe('one plan in a list, without its result');

export const PlanListWire = z
  .object({
    items: z.array(PlanSummaryWire).describe('newest first'),
    next_cursor: z.string().nullable().describe('pass as `cursor` for the next page; null on the last page'),
  })
  .describe('a page of plans');

/** A query parameter's message when it is not one value of its kind (also when it is given twice). */
const once = (what: string) => ({ error: `${what}, given once` });
const LIMIT_ERROR = once('limit is a whole number of plans per page from 1 to 200');

export const PlanListQueryWire = z.object({
  status: z
    .enum(PlanStatusWire.options, once('status is one of queued, running, done, incomplete or failed'))
    .optional()
    .describe('only plans with this status'),
  name: z
    .string(once('name is the schedule name as text'))
    .min(1, { error: 'name is empty: leave it out to list every name' })
    .max(200, { error: 'name is at most 200 characters, as a schedule name is' })
    .optional()
    .describe('only plans of schedules with exactly this name'),
  created_since: z.iso
    .datetime({
      offset: true,
      ...once(
        'created_since is an ISO 8601 time with its zone, e.g. 2026-12-02T10:00:00Z or 2026-12-02T11:00:00+01:00',
      ),
    })
    .optional()
    .describe('only plans created at or after this time (ISO 8601, e.g. 2026-12-02T10:00:00Z)'),
  limit: z.coerce
    .number(LIMIT_ERROR)
    .int(LIMIT_ERROR)
    .min(1, LIMIT_ERROR)
    .max(200, LIMIT_ERROR)
    .default(50)
    .describe('plans per page, 1–200 (default 50)'),
  cursor: z
    .string(once('cursor is next_cursor of the previous page'))
    .max(400, { error: 'cursor is next_cursor of the previous page, as given (at most 400 characters)' })
    .optional()
    .describe('next_cursor of the previous page'),
});

export const PlanIdParamsWire = z.object({ id: z.string().describe('plan id from POST /v1/plans') });

export const IdempotencyHeadersWire = z.looseObject({
  'idempotency-key': z
    .string()
    .regex(/^[\x21-\x7e]{1,128}$/, 'at most 128 visible ASCII characters')
    .optional()
    .describe(
      'repeat a POST safely: the same key with the same schedule returns the first plan (202, the same id); with another schedule 422 idempotency_conflict. Keys are kept per token (per service without tokens) as long as the plan is.',
    ),
});
