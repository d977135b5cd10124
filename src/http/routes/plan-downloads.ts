import type { FastifyReply } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import {
  CamTableQuery,
  CamTableWire,
  MotionViewWire,
  PlanIdParams,
  PullerTableWire,
  SetpointsQuery,
  SetpointsWire,
} from '../download-schema.js';
import { type DownloadSource, sendDownload } from '../download-source.js';
import { errorBody } from '../error-catalogue.js';
import { CAM_POINTS, downloadKey } from '../render-download.js';
import { ErrorWire } from '../report-schema.js';

const CsvText = z.string().describe('CSV, text/csv; charset=utf-8: a header line, then one line per row');

/**
 * Downloads of a plan's motion: `setpoints.csv` / `.json` (one row per time step), `cam-table.csv` / `.json`
 * (master line position against actuator values and slopes), `puller-speed.csv` / `.json` (puller speed and areas
 * against line position) and `motion.json` (the simulated motion as frames for the review page). The same plan gives
 * byte-identical files, rendered off the service thread (`DownloadSource`).
 */
export function planDownloadRoutes(source: DownloadSource): FastifyPluginAsyncZod {
  return async (app) => {
    const points = (raw: string | undefined): number | null => {
      if (raw === undefined) return CAM_POINTS.default;
      if (!/^\d{1,6}$/.test(raw)) return null;
      const n = Number(raw);
      return n >= CAM_POINTS.min && n <= CAM_POINTS.max ? n : null;
    };
    const badPoints = (raw: string, requestId: string) => ({
      ...errorBody('malformed_request', `points=${raw.slice(0, 20)} is not a whole number from 2 to 10001.`, [
        { path: 'points', message: 'a whole number of master positions from 2 to 10001 (default 101)' },
      ]),
      request_id: requestId,
    });
    /** `?motion=`: true for tracked, false for the law's values, null when the value is not one of them. */
    const trackedOf = (raw: string | undefined): boolean | null =>
      raw === undefined || raw === 'law' ? false : raw === 'tracked' ? true : null;
    const badMotion = (raw: string, requestId: string) => ({
      ...errorBody('malformed_request', `motion=${raw.slice(0, 20)} is neither law nor tracked.`, [
        { path: 'motion', message: 'law (the motion law, default) or tracked (direct mode only)' },
      ]),
      request_id: requestId,
    });

    type Ask = { params: { id: string }; id: string };
    /** A download with `?points=N` (cam and puller tables): 400 for a bad count, else the table with that many rows. */
    const sendWithPoints = (name: string, request: Ask & { query: { points?: string } }, reply: FastifyReply) => {
      const n = points(request.query.points);
      if (n === null) return reply.code(400).send(badPoints(request.query.points ?? '', request.id));
      return sendDownload(source, reply, request.id, request.params.id, downloadKey(name, { points: n }));
    };
    /** A setpoint download with `?motion=law|tracked`: 400 for another value. */
    const sendWithMotion = (name: string, request: Ask & { query: { motion?: string } }, reply: FastifyReply) => {
      const tracked = trackedOf(request.query.motion);
      if (tracked === null) return reply.code(400).send(badMotion(request.query.motion ?? '', request.id));
      return sendDownload(source, reply, request.id, request.params.id, downloadKey(name, { tracked }));
    };

    const csvResponse = { 200: CsvText, 400: ErrorWire, 404: ErrorWire, 409: ErrorWire };
    app.get(
      '/v1/plans/:id/setpoints.csv',
      {
        schema: {
          summary: 'Actuator setpoints per time step, as CSV',
          description:
            'Header `position_m,time_s,actuator_<n>_deg` (rotary) or `actuator_<n>_mm` (linear), one row per `time_step_s` over one repeat (periodic) or from the first to the last station; numbers with 9 decimals and a "." decimal point. 409 `no_motion` when the plan has no actuators.',
          tags: ['downloads'],
          params: PlanIdParams,
          querystring: SetpointsQuery,
          produces: ['text/csv'],
          response: csvResponse,
        },
      },
      async (request, reply) => sendWithMotion('setpoints.csv', request, reply),
    );
    app.get(
      '/v1/plans/:id/setpoints.json',
      {
        schema: {
          summary: 'Actuator setpoints per time step, as JSON with units, law and cautions',
          tags: ['downloads'],
          params: PlanIdParams,
          querystring: SetpointsQuery,
          response: { 200: SetpointsWire, 400: ErrorWire, 404: ErrorWire, 409: ErrorWire },
        },
      },
      async (request, reply) => sendWithMotion('setpoints.json', request, reply),
    );
    app.get(
      '/v1/plans/:id/cam-table.csv',
      {
        schema: {
          summary: 'Electronic cam table (master line position against actuator values and slopes), as CSV',
          description:
            'Header `position_m`, then per actuator `actuator_<n>_deg` and `actuator_<n>_deg_per_m` (or `_mm`, `_mm_per_m`); `points` rows with strictly increasing, evenly spaced master positions over one repeat (or the stations span). No comment line: the periodic flag, units and law are in cam-table.json.',
          tags: ['downloads'],
          params: PlanIdParams,
          querystring: CamTableQuery,
          produces: ['text/csv'],
          response: csvResponse,
        },
      },
      async (request, reply) => sendWithPoints('cam-table.csv', request, reply),
    );
    app.get(
      '/v1/plans/:id/cam-table.json',
      {
        schema: {
          summary: 'Electronic cam table with its metadata (periodic flag, units, law, station values, cautions)',
          tags: ['downloads'],
          params: PlanIdParams,
          querystring: CamTableQuery,
          response: { 200: CamTableWire, 400: ErrorWire, 404: ErrorWire, 409: ErrorWire },
        },
      },
      async (request, reply) => sendWithPoints('cam-table.json', request, reply),
    );
    app.get(
      '/v1/plans/:id/puller-speed.csv',
      {
        schema: {
          summary: 'Puller speed against line position at constant throughput, as CSV',
          description:
            'Header `position_m,time_s,puller_speed_m_per_min,orifice_area_mm2,product_area_mm2,draw_down_ratio`; `points` rows (default 101, 2–10001) with strictly increasing, evenly spaced master positions over one repeat (or the stations span). The orifice area comes from the simulated motion (mechanism assembled and plates clipped at every step); with `process.puller_follows_area` the puller speed holds the target draw-down (ṁ = ρ·A·v), else it is the nominal line speed. 409 `no_motion` when the plan has no simulated motion.',
          tags: ['downloads'],
          params: PlanIdParams,
          querystring: CamTableQuery,
          produces: ['text/csv'],
          response: csvResponse,
        },
      },
      async (request, reply) => sendWithPoints('puller-speed.csv', request, reply),
    );
    app.get(
      '/v1/plans/:id/puller-speed.json',
      {
        schema: {
          summary: 'Puller-speed table with its metadata (throughput, target draw-down, units, cautions)',
          tags: ['downloads'],
          params: PlanIdParams,
          querystring: CamTableQuery,
          response: { 200: PullerTableWire, 400: ErrorWire, 404: ErrorWire, 409: ErrorWire },
        },
      },
      async (request, reply) => sendWithPoints('puller-speed.json', request, reply),
    );
    app.get(
      '/v1/plans/:id/motion.json',
      {
        schema: {
          summary: 'The simulated motion as frames for the review page (joints, plates, links, areas, findings)',
          description:
            'The plan’s simulation steps (one per time_step_s, and every station), thinned evenly to at most 2000 frames: line position and time, each actuator’s value, every joint’s point, each plate’s outline in its own frame with the joints at its pivots, the links with the joints at their pins, orifice area, draw-down, puller speed and die-pressure ratio per frame, and the plan’s findings and cautions. 409 `no_motion` when the plan has no simulated motion.',
          tags: ['downloads'],
          params: PlanIdParams,
          response: { 200: MotionViewWire, 404: ErrorWire, 409: ErrorWire },
        },
      },
      async (request, reply) => {
        return sendDownload(source, reply, request.id, request.params.id, 'motion.json');
      },
    );
  };
}
