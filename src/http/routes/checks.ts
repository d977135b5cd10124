import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { PoolBusyError, type WorkerPool } from '../../jobs/index.js';
import { errorBody } from '../error-catalogue.js';
import { unreadableFigure } from '../readable-report.js';
import { keepRawBody, scheduleOrReject, unknownScheduleFields } from '../reject-bad-schedule.js';
import { CheckReportWire, ErrorWire } from '../report-schema.js';
import { ScheduleWire } from '../schedule-schema.js';
import { toFindingWire } from '../to-check-report.js';

/**
 * `POST /v1/checks`: measure every station and report process findings, with safety cautions. The check runs in a
 * worker thread (a 500-station schedule takes seconds), so the service keeps answering meanwhile.
 */
export function checkRoutes(pool: WorkerPool): FastifyPluginAsyncZod {
  return async (app) => {
    app.post(
      '/v1/checks',
      {
        schema: {
          summary: 'Check a schedule of orifice profiles',
          description:
            'Measures every station (area, perimeter, thinnest and thickest wall), runs the process checks (mass balance, ' +
            'area draw-down, slit-flow balance, land pressure), finds the moving span, and returns findings and safety cautions. ' +
            'Nothing is stored. Errors carry no cautions; a 200 always does.',
          tags: ['checks'],
          body: ScheduleWire,
          response: {
            200: CheckReportWire,
            400: ErrorWire,
            401: ErrorWire,
            403: ErrorWire,
            413: ErrorWire,
            415: ErrorWire,
            429: ErrorWire,
            503: ErrorWire,
          },
        },
        preValidation: keepRawBody,
      },
      async (request, reply) => {
        const schedule = scheduleOrReject(request.body, request, reply);
        if (!schedule) return reply;
        let mapped: Awaited<ReturnType<WorkerPool['check']>>;
        try {
          mapped = await pool.check(schedule);
        } catch (err) {
          if (!(err instanceof PoolBusyError)) throw err;
          return reply
            .code(503)
            .header('retry-after', '2')
            .send({
              ...errorBody('service_busy', 'Too many checks are waiting for a worker; try again in 2 s.'),
              request_id: request.id,
            });
        }
        request.log.info({ stations: mapped.stations.length, findings: mapped.findings.length }, 'schedule checked');
        const report = {
          ...mapped,
          findings: [...unknownScheduleFields(request, 'checks').map(toFindingWire), ...mapped.findings],
        };
        const unreadable = unreadableFigure(report);
        if (unreadable) {
          request.log.warn({ unreadable }, 'check figure not finite');
          return reply.code(400).send({
            ...errorBody('invalid_schedule', 'The schedule gives figures that cannot be computed as finite numbers.', [
              {
                path: 'process',
                message: `these process values and orifices give ${unreadable.path} that is not a finite number (${unreadable.problem}); bring the values nearer to common practice`,
              },
            ]),
            request_id: request.id,
          });
        }
        return report;
      },
    );
  };
}
