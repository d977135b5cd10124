import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { PlanMotion, PlanSimulation } from '../../pipeline/index.js';
import type { PlanRecord, PlanStore } from '../../store/index.js';
import { writeCsv } from '../../export/index.js';
import {
  CamTableQuery,
  CamTableWire,
  MotionViewWire,
  PlanIdParams,
  PullerTableWire,
  SetpointsQuery,
  SetpointsWire,
} from '../download-schema.js';
import { type ErrorCode, errorBody } from '../error-catalogue.js';
import {
  MAX_SETPOINT_ROWS,
  type MotionTableText,
  camTableText,
  columnUnit,
  downloadName,
  motionView,
  pullerTableText,
  setpointRowCount,
  setpointTableText,
  stationSetpoints,
} from '../motion-tables.js';
import { ErrorWire } from '../report-schema.js';
import { toCautionWire } from '../to-check-report.js';
import { sig } from '../wire-format.js';

/** Default and range of the cam table's `?points=`. */
export const CAM_POINTS = Object.freeze({ default: 101, min: 2, max: 10_001 });

const CsvText = z.string().describe('CSV, text/csv; charset=utf-8: a header line, then one line per row');

/**
 * Downloads of a plan's motion: `setpoints.csv` / `.json` (one row per time step), `cam-table.csv` / `.json`
 * (master line position against actuator values and slopes), `puller-speed.csv` / `.json` (puller speed and areas
 * against line position) and `motion.json` (the simulated motion as frames for the review page). The same plan gives
 * byte-identical files.
 */
export function planDownloadRoutes(store: PlanStore): FastifyPluginAsyncZod {
  return async (app) => {
    type Found = { record: PlanRecord; motion: PlanMotion; simulation: PlanSimulation | null };
    type Refusal = { status: 404 | 409; body: ReturnType<typeof errorBody> & { request_id: string } };
    const refuse = (code: ErrorCode, status: 404 | 409, message: string, requestId: string): Refusal => ({
      status,
      body: { ...errorBody(code, message), request_id: requestId },
    });
    const find = (id: string, requestId: string): Found | Refusal => {
      const record = store.get(id);
      if (!record) return refuse('not_found', 404, `No plan with id ${id}.`, requestId);
      const motion = record.plan.motion;
      if (record.plan.status === 'failed' || motion === null) {
        const why =
          record.plan.status === 'failed'
            ? `it failed: ${record.plan.error ?? 'see its findings'}`
            : 'its mechanism has no actuators (see outcome.shortfalls and the findings)';
        return refuse('no_motion', 409, `Plan ${id} has no actuator motion to download: ${why}`, requestId);
      }
      return { record, motion, simulation: record.plan.simulation ?? null };
    };
    const setpoints = (found: Found, requestId: string, tracked = false): MotionTableText | Refusal => {
      if (tracked && !found.simulation?.tracking) {
        return refuse(
          'no_motion',
          409,
          `Plan ${found.record.id} has no tracked motion: only a mechanism driven directly (one actuator per degree of freedom of the chain, no links) can follow the morph between station shapes. Download the setpoints without ?motion=tracked.`,
          requestId,
        );
      }
      const count = setpointRowCount(found.motion, found.simulation);
      if (count > MAX_SETPOINT_ROWS) {
        return refuse(
          'table_too_large',
          409,
          `The setpoint table would have about ${count} rows, more than ${MAX_SETPOINT_ROWS}: plan again with a longer time_step_s, or download the cam table.`,
          requestId,
        );
      }
      return setpointTableText(found.motion, found.simulation, tracked);
    };
    const simulated = (found: Found, requestId: string): PlanSimulation | Refusal =>
      found.simulation ??
      refuse(
        'no_motion',
        409,
        `Plan ${found.record.id} has no simulated motion (it was stored before plans simulated their motion, or its mechanism has no kinematic model): plan the schedule again.`,
        requestId,
      );
    const meta = (found: Found, table: MotionTableText, interpolation: string) => ({
      schedule: found.record.schedule.name,
      law: found.motion.law,
      periodic: table.periodic,
      units: Object.fromEntries(table.columns.map((c) => [c, columnUnit(c)])),
      columns: [...table.columns],
      plan_hash: store.entry(found.record.id)?.planHash ?? null,
      interpolation,
      cautions: found.record.plan.cautions.map(toCautionWire),
    });
    const numbers = (table: MotionTableText) => table.rows.map((r) => r.map(Number));
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
    const csvHeaders = (found: Found, suffix: string) => ({
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="${downloadName(found.record.schedule.name, suffix)}"`,
    });

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
      async (request, reply) => {
        const tracked = trackedOf(request.query.motion);
        if (tracked === null) return reply.code(400).send(badMotion(request.query.motion ?? '', request.id));
        const found = find(request.params.id, request.id);
        if ('status' in found) return reply.code(found.status).send(found.body);
        const table = setpoints(found, request.id, tracked);
        if ('status' in table) return reply.code(table.status).send(table.body);
        const name = tracked ? 'tracked-setpoints.csv' : 'setpoints.csv';
        return reply.headers(csvHeaders(found, name)).send(writeCsv(table.columns, table.rows));
      },
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
      async (request, reply) => {
        const tracked = trackedOf(request.query.motion);
        if (tracked === null) return reply.code(400).send(badMotion(request.query.motion ?? '', request.id));
        const found = find(request.params.id, request.id);
        if ('status' in found) return reply.code(found.status).send(found.body);
        const table = setpoints(found, request.id, tracked);
        if ('status' in table) return reply.code(table.status).send(table.body);
        return {
          ...meta(found, table, SETPOINT_INTERPOLATION),
          time_step_s: found.motion.timeStepS,
          puller_follows_area: found.simulation?.pullerFollowsArea ?? false,
          motion: tracked ? ('tracked' as const) : ('law' as const),
          rows: numbers(table),
        };
      },
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
      async (request, reply) => {
        const n = points(request.query.points);
        if (n === null) return reply.code(400).send(badPoints(request.query.points ?? '', request.id));
        const found = find(request.params.id, request.id);
        if ('status' in found) return reply.code(found.status).send(found.body);
        const table = camTableText(found.motion, n);
        return reply.headers(csvHeaders(found, 'cam-table.csv')).send(writeCsv(table.columns, table.rows));
      },
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
      async (request, reply) => {
        const n = points(request.query.points);
        if (n === null) return reply.code(400).send(badPoints(request.query.points ?? '', request.id));
        const found = find(request.params.id, request.id);
        if ('status' in found) return reply.code(found.status).send(found.body);
        const table = camTableText(found.motion, n);
        return {
          ...meta(found, table, CAM_INTERPOLATION),
          points: n,
          stations: stationSetpoints(found.motion),
          rows: numbers(table),
        };
      },
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
      async (request, reply) => {
        const n = points(request.query.points);
        if (n === null) return reply.code(400).send(badPoints(request.query.points ?? '', request.id));
        const found = find(request.params.id, request.id);
        if ('status' in found) return reply.code(found.status).send(found.body);
        const simulation = simulated(found, request.id);
        if ('status' in simulation) return reply.code(simulation.status).send(simulation.body);
        const table = pullerTableText(simulation, n);
        return reply.headers(csvHeaders(found, 'puller-speed.csv')).send(writeCsv(table.columns, table.rows));
      },
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
      async (request, reply) => {
        const n = points(request.query.points);
        if (n === null) return reply.code(400).send(badPoints(request.query.points ?? '', request.id));
        const found = find(request.params.id, request.id);
        if ('status' in found) return reply.code(found.status).send(found.body);
        const simulation = simulated(found, request.id);
        if ('status' in simulation) return reply.code(simulation.status).send(simulation.body);
        const table = pullerTableText(simulation, n);
        return {
          ...meta(found, table, PULLER_INTERPOLATION),
          points: n,
          puller_follows_area: simulation.pullerFollowsArea,
          target_draw_down_ratio: sig(simulation.targetDrawDown),
          throughput_kg_per_h: sig(simulation.throughputKgPerS * 3600),
          solid_density_g_per_cm3: sig(simulation.solidDensityKgPerM3 / 1000),
          rows: numbers(table),
        };
      },
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
        const found = find(request.params.id, request.id);
        if ('status' in found) return reply.code(found.status).send(found.body);
        const simulation = simulated(found, request.id);
        if ('status' in simulation) return reply.code(simulation.status).send(simulation.body);
        const { plan } = found.record;
        if (!plan.fit || !plan.mechanisation) {
          const refusal = refuse('no_motion', 409, `Plan ${found.record.id} has no mechanism to draw.`, request.id);
          return reply.code(refusal.status).send(refusal.body);
        }
        return motionView(
          found.record.id,
          { fit: plan.fit, mechanisation: plan.mechanisation, motion: found.motion, simulation },
          plan.findings,
          plan.cautions,
          found.record.schedule.limits,
        );
      },
    );
  };
}

/** How the setpoint rows are computed, in words (the JSON's `interpolation`). */
const SETPOINT_INTERPOLATION =
  'actuator values by the motion law at each row; orifice area linear between the simulation steps (one per time_step_s and every station), puller speed, product area and draw-down from it by the mass balance; with puller_follows_area, rows are equal time steps of the time base re-keyed by the puller speed (dt = dx/v, trapezoid rule) and their positions linear on it';
/** How the cam rows are computed, in words. */
const CAM_INTERPOLATION =
  'actuator values and slopes by the motion law at each master position (exact, no interpolation)';
/** How the puller rows are computed, in words. */
const PULLER_INTERPOLATION =
  'orifice area and time linear between the simulation steps (one per time_step_s and every station); puller speed, product area and draw-down from the area by the mass balance ṁ = ρ·A·v at constant throughput';
