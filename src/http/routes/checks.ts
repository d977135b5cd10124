import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { checkSchedule } from '../../pipeline/index.js';
import { CheckReportWire, ErrorWire } from '../report-schema.js';
import { ScheduleWire } from '../schedule-schema.js';
import { toCheckReport, toFindingWire } from '../to-check-report.js';
import { errorBody } from '../error-catalogue.js';
import { unreadableFigure } from '../readable-report.js';
import { keepRawBody, scheduleOrReject, unknownScheduleFields } from '../reject-bad-schedule.js';

/** `POST /v1/checks`: measure every station and report process findings, with safety cautions. */
export const checkRoutes: FastifyPluginAsyncZod = async (app) => {
  app.post(
    '/v1/checks',
    {
      schema: {
        summary: 'Check a schedule of orifice profiles',
        description:
          'Measures every station (area, perimeter, thinnest and thickest wall), runs the process checks (mass balance, ' +
          'area draw-down, slit-flow balance, land pressure), finds the moving span, and returns findings and safety cautions.',
        tags: ['checks'],
        body: ScheduleWire,
        response: { 200: CheckReportWire, 400: ErrorWire },
      },
      preValidation: keepRawBody,
    },
    async (request, reply) => {
      const schedule = scheduleOrReject(request.body, request, reply);
      if (!schedule) return reply;
      const check = checkSchedule(schedule);
      request.log.info({ stations: check.stations.length, findings: check.findings.length }, 'schedule checked');
      const mapped = toCheckReport(schedule, check);
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
