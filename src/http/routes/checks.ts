import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { PoolBusyError, type WorkerPool } from '../../jobs/index.js';
import { keepJsonBodyBytes, validateAllButBody } from '../body-bytes.js';
import { CheckReportWire, ErrorWire } from '../report-schema.js';
import { ScheduleWire } from '../schedule-schema.js';
import { sendBusy, sendRefusal } from '../worker-replies.js';

/**
 * `POST /v1/checks`: measure every station and report process findings, with safety cautions. The whole check, from
 * the body's bytes (UTF-8, JSON, the wire format, the mapping to domain units) to the report's JSON, runs in a worker thread
 * (a schedule at the vertex limit takes seconds), so the service keeps answering meanwhile.
 */
export function checkRoutes(pool: WorkerPool): FastifyPluginAsyncZod {
  return async (app) => {
    keepJsonBodyBytes(app);
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
        validatorCompiler: validateAllButBody,
      },
      async (request, reply) => {
        let answer: Awaited<ReturnType<WorkerPool['check']>>;
        try {
          answer = await pool.check(request.body as unknown as Buffer);
        } catch (err) {
          if (!(err instanceof PoolBusyError)) throw err;
          return sendBusy(reply, request.id, 'checks');
        }
        if (!answer.ok) return sendRefusal(reply, request.id, answer);
        request.log.info({ stations: answer.stations, findings: answer.findings }, 'schedule checked');
        // written in the worker by the route's response schema
        return reply.header('content-type', 'application/json; charset=utf-8').send(answer.reportJson as never);
      },
    );
  };
}
