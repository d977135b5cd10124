import { randomUUID } from 'node:crypto';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { type PlanJobs, PoolBusyError, type WorkerPool } from '../../jobs/index.js';
import { processCautions } from '../../safety/index.js';
import { isPlanCursor, type PlanEntry, type PlanStore } from '../../store/index.js';
import { keepJsonBodyBytes, validateAllButBody } from '../body-bytes.js';
import { errorBody } from '../error-catalogue.js';
import { matchesEtag, planEtag } from '../plan-gate.js';
import {
  IdempotencyHeadersWire,
  PlanCreatedWire,
  PlanIdParamsWire,
  PlanJobWire,
  PlanListQueryWire,
  PlanListWire,
} from '../plan-job-schema.js';
import { ErrorWire } from '../report-schema.js';
import { ScheduleWire } from '../schedule-schema.js';
import { toCautionWire, toFindingWire } from '../to-check-report.js';
import { sendBusy, sendRefusal } from '../worker-replies.js';

/** Finished plans' reports kept encoded for GET /v1/plans/{id}, and most bytes they may hold (64 MiB). */
const SENT_PLANS = 256;
const SENT_BYTES = 64 * 1024 * 1024;

export interface PlanRouteDeps {
  readonly store: PlanStore;
  readonly jobs: PlanJobs;
  /** Reads posted schedules off the service thread. */
  readonly pool: WorkerPool;
  /** Called once a plan is deleted (the downloads it had in memory are forgotten). */
  readonly onDeleted?: (id: string) => void;
  /** Seconds a client is told (Retry-After) to wait before polling a plan that is not finished. */
  readonly pollAfterS: number;
}

const errors = { 400: ErrorWire, 401: ErrorWire, 403: ErrorWire, 429: ErrorWire };

/**
 * `POST /v1/plans` stores the schedule and queues the plan (answering 202 before any planning), `GET /v1/plans/{id}`
 * shows where it stands or its result, `GET /v1/plans` lists plans, `DELETE /v1/plans/{id}` stops and removes one.
 */
export function planRoutes({ store, jobs, pool, pollAfterS, onDeleted }: PlanRouteDeps): FastifyPluginAsyncZod {
  return async (app) => {
    keepJsonBodyBytes(app);
    // finished plans never change: their reports are kept encoded with their tags, so a read writes bytes as they
    // are (no serialiser, no text encoding, no hashing per request); bounded by count and bytes, oldest dropped
    const sent = new Map<string, { readonly etag: string; readonly body: Buffer }>();
    let sentBytes = 0;
    const prepared = (entry: PlanEntry) => {
      const known = sent.get(entry.id);
      if (known) return known;
      const etag = planEtag(entry, 'plan');
      const report = store.report(entry.id);
      if (!etag || report === undefined) return undefined;
      const made = { etag, body: Buffer.from(report, 'utf8') };
      if (made.body.byteLength <= SENT_BYTES / 8) {
        sent.set(entry.id, made);
        sentBytes += made.body.byteLength;
        while (sent.size > SENT_PLANS || sentBytes > SENT_BYTES) {
          const oldest = sent.keys().next().value!;
          sentBytes -= sent.get(oldest)!.body.byteLength;
          sent.delete(oldest);
        }
      }
      return made;
    };
    const forget = (id: string) => {
      const known = sent.get(id);
      if (!known) return;
      sentBytes -= known.body.byteLength;
      sent.delete(id);
    };
    const notFound = (id: string, requestId: string) => ({
      ...errorBody('not_found', `No plan with id ${id}.`),
      request_id: requestId,
    });

    app.post(
      '/v1/plans',
      {
        schema: {
          summary: 'Plan a schedule: stored and queued at once, computed by a worker',
          description:
            'Validates the schedule, stores it and queues the plan, then answers 202 with `Location: /v1/plans/{id}` before any planning. Poll the Location until `status` is `done`, `incomplete` or `failed`. With an `Idempotency-Key` header, repeating the request returns the same plan. The 202 carries the material’s safety cautions; errors carry none (the plan, once read, does).',
          tags: ['plans'],
          body: ScheduleWire,
          headers: IdempotencyHeadersWire,
          response: {
            202: PlanCreatedWire,
            ...errors,
            413: ErrorWire,
            415: ErrorWire,
            422: ErrorWire,
            503: ErrorWire,
          },
        },
        validatorCompiler: validateAllButBody,
      },
      async (request, reply) => {
        let taken: Awaited<ReturnType<WorkerPool['takePlan']>>;
        try {
          taken = await pool.takePlan(request.body as unknown as Buffer);
        } catch (err) {
          if (!(err instanceof PoolBusyError)) throw err;
          return sendBusy(reply, request.id, 'posted schedules');
        }
        if (!taken.ok) return sendRefusal(reply, request.id, taken);
        const hash = taken.scheduleHash;
        const key = request.headers['idempotency-key'] ?? null;
        const { entry, created } = store.add({
          id: randomUUID(),
          createdAt: new Date().toISOString(),
          schedulePacked: taken.schedulePacked,
          head: taken.head,
          scheduleHash: hash,
          requestFindings: taken.requestFindings,
          client: request.principal?.name ?? null,
          idempotencyKey: typeof key === 'string' ? key : null,
        });
        if (!created && entry.scheduleHash !== hash) {
          return reply.code(422).send({
            ...errorBody(
              'idempotency_conflict',
              `The Idempotency-Key was used for plan ${entry.id} with another schedule (hash ${entry.scheduleHash.slice(0, 12)}…, this one ${hash.slice(0, 12)}…).`,
              [{ path: 'idempotency-key', message: 'use a new key for a new schedule' }],
            ),
            request_id: request.id,
          });
        }
        if (created) {
          jobs.kick();
          request.log.info({ plan: entry.id, schedule: hash.slice(0, 12) }, 'plan queued');
        } else {
          reply.header('idempotent-replayed', 'true');
        }
        const location = `/v1/plans/${entry.id}`;
        const now = store.entry(entry.id) ?? entry;
        return reply
          .code(202)
          .header('location', location)
          .header('retry-after', String(pollAfterS))
          .send({
            id: entry.id,
            status: now.status,
            schedule_hash: entry.scheduleHash,
            location,
            cautions: processCautions(taken.head.material, taken.head.dieTemperatureC).map(toCautionWire),
          });
      },
    );

    app.get(
      '/v1/plans',
      {
        schema: {
          summary: 'List plans, newest first, with filters and paging',
          tags: ['plans'],
          querystring: PlanListQueryWire,
          response: { 200: PlanListWire, ...errors },
        },
      },
      async (request, reply) => {
        const q = request.query;
        if (q.cursor !== undefined && !isPlanCursor(q.cursor)) {
          return reply.code(400).send({
            ...errorBody('malformed_request', 'The cursor is not one this service gave.', [
              { path: 'cursor', message: 'pass next_cursor of the previous page as given' },
            ]),
            request_id: request.id,
          });
        }
        const since = q.created_since === undefined ? undefined : createdSinceKey(q.created_since);
        if (since === null) return { items: [], next_cursor: null };
        const page = store.list({
          limit: q.limit,
          ...(q.status === undefined ? {} : { status: q.status }),
          ...(q.name === undefined ? {} : { name: q.name }),
          ...(since === undefined ? {} : { createdSince: since }),
          ...(q.cursor === undefined ? {} : { after: q.cursor }),
        });
        return { items: page.items.map(summary), next_cursor: page.next };
      },
    );

    app.get(
      '/v1/plans/:id',
      {
        schema: {
          summary: 'A plan: where it stands, or its stations, chain, mechanism, motion, findings and cautions',
          description:
            'While `queued` or `running` the plan has no result yet (and `Retry-After` says when to look again); `progress` shows the stage. `done`: the plan meets the request; `incomplete`: computed but short of it (`outcome.shortfalls`); `failed`: no chain (see `error`). A finished plan carries an ETag: send it back as If-None-Match for a 304.',
          tags: ['plans'],
          params: PlanIdParamsWire,
          response: {
            200: PlanJobWire,
            304: z.null().describe('not modified: the ETag sent in If-None-Match is current (no body)'),
            ...errors,
            404: ErrorWire,
          },
        },
      },
      async (request, reply) => {
        const { id } = request.params;
        const entry = store.entry(id);
        if (!entry) return reply.code(404).send(notFound(id, request.id));
        if (entry.status === 'queued' || entry.status === 'running') {
          return reply.header('retry-after', String(pollAfterS)).send(pending(entry));
        }
        const ready = prepared(entry);
        if (!ready) return reply.code(404).send(notFound(id, request.id));
        reply.headers({ etag: ready.etag, 'cache-control': 'private, no-cache' });
        if (matchesEtag(request.headers['if-none-match'], ready.etag)) return reply.code(304).send(null);
        // stored as sent: the report was written and checked when the plan finished
        return reply.header('content-type', 'application/json; charset=utf-8').send(ready.body as never);
      },
    );

    app.delete(
      '/v1/plans/:id',
      {
        schema: {
          summary: 'Delete a plan: a running plan is stopped; its result, schedule and Idempotency-Key are removed',
          tags: ['plans'],
          params: PlanIdParamsWire,
          response: { 204: z.null().describe('deleted (no body)'), ...errors, 404: ErrorWire },
        },
      },
      async (request, reply) => {
        const { id } = request.params;
        if (!store.entry(id)) return reply.code(404).send(notFound(id, request.id));
        await jobs.cancel(id);
        store.delete(id);
        forget(id);
        onDeleted?.(id);
        request.log.info({ plan: id }, 'plan deleted');
        return reply.code(204).send(null);
      },
    );

    /** The report of a plan that has no result yet. */
    const pending = (entry: PlanEntry) => {
      const head = store.scheduleHead(entry.id);
      return {
        id: entry.id,
        name: entry.name,
        status: entry.status,
        outcome: { meets_request: false, shortfalls: [] },
        chains_tried: [],
        created_at: entry.createdAt,
        findings: store.requestFindings(entry.id).map(toFindingWire),
        cautions: head ? processCautions(head.material, head.dieTemperatureC).map(toCautionWire) : [],
        stations: [],
        chain: null,
        mechanisation: null,
        mechanism: null,
        motion: null,
        simulation: null,
        schedule_hash: entry.scheduleHash,
        plan_hash: null,
        started_at: entry.startedAt,
        finished_at: null,
        progress: entry.progress,
      };
    };
  };
}

/**
 * `?created_since=` as the store compares it, text against ISO 8601 UTC times with a 4-digit year; null when no plan
 * can be created that late. An offset can carry 9999-12-31 into year 10000 ("+010000-…", which sorts before every
 * 4-digit year) or 0000-01-01 back into year −1 ("-000001-…").
 */
function createdSinceKey(text: string): string | null {
  const iso = new Date(text).toISOString();
  if (iso.startsWith('+')) return null;
  return iso.startsWith('-') ? '0000-01-01T00:00:00.000Z' : iso;
}

function summary(entry: PlanEntry) {
  return {
    id: entry.id,
    name: entry.name,
    status: entry.status,
    created_at: entry.createdAt,
    started_at: entry.startedAt,
    finished_at: entry.finishedAt,
    schedule_hash: entry.scheduleHash,
    plan_hash: entry.planHash,
    progress: entry.progress,
    location: `/v1/plans/${entry.id}`,
  };
}
