import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { PlanJobs, WorkerPool } from '../../jobs/index.js';
import type { PlanStore } from '../../store/index.js';
import { SERVICE_VERSION } from '../../version.js';
import { HealthWire } from '../report-schema.js';

export const ReadyWire = z
  .object({
    status: z.enum(['ready', 'not_ready']),
    version: z.string(),
    store: z.enum(['ok', 'unavailable']).describe('the plan store answers a query'),
    workers: z.number().int().describe('worker threads alive now'),
    accepting_plans: z.boolean().describe('the plan queue takes plans (false while shutting down)'),
    plans_queued: z.number().int(),
    plans_running: z.number().int(),
  })
  .describe('readiness: the store answers, the worker pool is up and the queue takes plans');

export interface HealthDeps {
  readonly store: PlanStore;
  readonly jobs: PlanJobs;
  readonly pool: WorkerPool;
  /** Route config (the app turns the rate limit off for these). */
  readonly config: Record<string, unknown>;
}

/**
 * `GET /healthz`: the process is up and its event loop answers (it touches nothing else, so it stays fast while plans
 * compute in workers). `GET /readyz`: the store answers and the worker pool is up (503 otherwise).
 */
export function healthRoutes({ store, jobs, pool, config }: HealthDeps): FastifyPluginAsyncZod {
  return async (app) => {
    app.get(
      '/healthz',
      { config, schema: { summary: 'Liveness check', tags: ['service'], response: { 200: HealthWire } } },
      async () => ({ status: 'ok' as const, version: SERVICE_VERSION }),
    );
    app.get(
      '/readyz',
      {
        config,
        schema: {
          summary: 'Readiness check: store and worker pool',
          tags: ['service'],
          response: { 200: ReadyWire, 503: ReadyWire },
        },
      },
      async (_request, reply) => {
        let storeOk = true;
        let counts = { queued: 0, running: 0 };
        try {
          store.ping();
          counts = store.counts();
        } catch {
          storeOk = false;
        }
        const workers = pool.threads;
        const ready = storeOk && pool.open && jobs.accepts;
        return reply.code(ready ? 200 : 503).send({
          status: ready ? ('ready' as const) : ('not_ready' as const),
          version: SERVICE_VERSION,
          store: storeOk ? ('ok' as const) : ('unavailable' as const),
          workers,
          accepting_plans: jobs.accepts,
          plans_queued: counts.queued,
          plans_running: counts.running,
        });
      },
    );
  };
}
