import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { checkSchedule } from '../../pipeline/index.js';
import { CheckReportWire, ErrorWire } from '../report-schema.js';
import { ScheduleWire } from '../schedule-schema.js';
import { toCheckReport, toFindingWire } from '../to-check-report.js';
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
      const report = toCheckReport(schedule, check);
      return { ...report, findings: [...unknownScheduleFields(request).map(toFindingWire), ...report.findings] };
    },
  );
};
