import { randomUUID } from 'node:crypto';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { planSchedule } from '../../pipeline/index.js';
import type { PlanStore } from '../../store/index.js';
import { errorBody } from '../error-catalogue.js';
import { PlanAcceptedWire, PlanWire } from '../plan-schema.js';
import { ErrorWire } from '../report-schema.js';
import { ScheduleWire } from '../schedule-schema.js';
import { readablePlan } from '../readable-plan-report.js';
import { keepRawBody, scheduleOrReject, unknownScheduleFields } from '../reject-bad-schedule.js';
import { ringPerimeter } from '../../geometry/index.js';

/**
 * `POST /v1/plans` and `GET /v1/plans/{id}`. The plan is computed before the answer (the job queue comes with the
 * service work); the record is stored whole, so a failure leaves nothing half-written.
 */
/**
 * Largest total outer-boundary length of a schedule's stations a plan request may fit, mm: about 180 stations of the
 * demo strip (about 110 mm of boundary each). Measured on a 2-core machine: 100 such stations plan in about 6 s, 400 in
 * about 55 s (README), so a plan stays within about half a minute until plans move to background jobs.
 */
export const PLAN_BOUNDARY_LIMIT_MM = 20_000;

export function planRoutes(store: PlanStore, now: () => Date, timeLimitS: number): FastifyPluginAsyncZod {
  return async (app) => {
    app.post(
      '/v1/plans',
      {
        schema: {
          summary: 'Plan a schedule: check, fit the plate chain, build the mechanism',
          tags: ['plans'],
          body: ScheduleWire,
          response: { 202: PlanAcceptedWire, 400: ErrorWire, 422: ErrorWire },
        },
        preValidation: keepRawBody,
      },
      async (request, reply) => {
        const schedule = scheduleOrReject(request.body, request, reply);
        if (!schedule) return reply;
        if (schedule.stations.length < 2) {
          return reply.code(400).send({
            ...errorBody('invalid_schedule', 'A plan needs at least two stations.', [
              { path: 'stations', message: 'a plan needs at least 2 stations: with one there is nothing to move' },
            ]),
            request_id: request.id,
          });
        }
        // the chain fit's work grows with every station's boundary length: refuse what would hold the service
        const boundaryMm = schedule.stations.reduce((sum, s) => sum + ringPerimeter(s.orifice.outer), 0);
        if (boundaryMm > PLAN_BOUNDARY_LIMIT_MM) {
          return reply.code(422).send({
            ...errorBody(
              'plan_too_large',
              `The stations' boundaries add up to ${Math.round(boundaryMm / 1000)} m, more than the ${PLAN_BOUNDARY_LIMIT_MM / 1000} m one plan request may fit.`,
              [
                {
                  path: 'stations',
                  message: `${schedule.stations.length} stations with ${Math.round(boundaryMm / 1000)} m of boundary in all: send fewer stations or plan the schedule in parts (at most ${PLAN_BOUNDARY_LIMIT_MM / 1000} m)`,
                },
              ],
            ),
            request_id: request.id,
          });
        }
        const started = performance.now();
        // the chain search stops at the time limit with what it has (and says so), so no plan holds the server long
        const computed = planSchedule(schedule, { stop: () => performance.now() - started > timeLimitS * 1000 });
        const plan = { ...computed, findings: [...unknownScheduleFields(request, 'plans'), ...computed.findings] };
        const id = randomUUID();
        // checked before it is stored: a plan that could not be written out is stored as failed, with the reason
        const readable = readablePlan({ id, createdAt: now().toISOString(), schedule, plan });
        if (readable.unreadable) request.log.warn({ plan: id, unreadable: readable.unreadable }, 'plan not finite');
        store.put(readable.record);
        const status = readable.record.plan.status;
        request.log.info(
          { plan: id, status, plates: plan.fit?.plateCount, ms: Math.round(performance.now() - started) },
          'plan computed',
        );
        return reply.code(202).header('location', `/v1/plans/${id}`).send({ id, status });
      },
    );

    app.get(
      '/v1/plans/:id',
      {
        schema: {
          summary: 'A plan with its stations, chain, mechanism, findings and cautions',
          tags: ['plans'],
          params: z.object({ id: z.string().describe('plan id from POST /v1/plans') }),
          response: { 200: PlanWire, 404: ErrorWire },
        },
      },
      async (request, reply) => {
        const record = store.get(request.params.id);
        if (!record) {
          return reply
            .code(404)
            .send({ ...errorBody('not_found', `No plan with id ${request.params.id}.`), request_id: request.id });
        }
        const readable = readablePlan(record);
        if (readable.unreadable)
          request.log.warn({ plan: record.id, unreadable: readable.unreadable }, 'plan not finite');
        return readable.report;
      },
    );
  };
}
