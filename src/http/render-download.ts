import { serializerCompiler } from 'fastify-type-provider-zod';
import type { z } from 'zod';
import {
  type DrawingDimensions,
  drawingModel,
  partIds,
  previewPlots,
  thermalScale,
  writeCsv,
  writeDieBodyDxf,
  writePartDxf,
  writePartsSheetDxf,
  writePreviewSvg,
  writeStationsDxf,
} from '../export/index.js';
import type { PlanRecord } from '../store/index.js';
import { CamTableWire, MotionViewWire, PullerTableWire, SetpointsWire } from './download-schema.js';
import type { ErrorCode } from './error-catalogue.js';
import {
  camTableText,
  columnUnit,
  downloadName,
  MAX_SETPOINT_ROWS,
  type MotionTableText,
  motionView,
  pullerTableText,
  setpointRowCount,
  setpointTableText,
  stationSetpoints,
} from './motion-tables.js';
import { toCautionWire } from './to-check-report.js';
import { sig } from './wire-format.js';

/** Default and range of the tables' `?points=`. */
export const CAM_POINTS = Object.freeze({ default: 101, min: 2, max: 10_001 });

/**
 * One download of a finished plan as rendered: the file with the headers that describe it, or the reason the plan
 * has no such file (an error code of the catalogue and its message; the route adds the request id). `cautions` are
 * the plan's caution codes (the `X-Cautions` header), on both.
 */
export type RenderedDownload =
  | {
      readonly name: string;
      readonly refusal: null;
      readonly contentType: string;
      readonly disposition: string;
      readonly cautions: string;
      readonly body: Uint8Array;
    }
  | {
      readonly name: string;
      readonly refusal: ErrorCode;
      readonly contentType: string;
      readonly disposition: string;
      readonly cautions: string;
      /** The refusal's message, UTF-8. */
      readonly body: Uint8Array;
    };

const CSV_TYPE = 'text/csv; charset=utf-8';
const JSON_TYPE = 'application/json; charset=utf-8';
const DXF_TYPE = 'application/dxf';
const SVG_TYPE = 'image/svg+xml; charset=utf-8';

/** The drawings (without parts) every plan offers, by route. */
const SHEETS = ['plates.dxf', 'die-body.dxf', 'stations.dxf'] as const;
/** The tables every plan offers at their default query. */
const TABLES = [
  'setpoints.csv',
  'setpoints.json',
  'cam-table.csv',
  'cam-table.json',
  'puller-speed.csv',
  'puller-speed.json',
  'motion.json',
] as const;

/**
 * Canonical name of a download: its path below `/v1/plans/{id}/` and, only when it differs from the default, its one
 * query parameter (`cam-table.csv?points=201`, `setpoints.csv?motion=tracked`, `die-body.dxf?dimensions=hot`).
 */
export function downloadKey(
  path: string,
  query: { points?: number; tracked?: boolean; dimensions?: DrawingDimensions },
) {
  if (query.points !== undefined && query.points !== CAM_POINTS.default) return `${path}?points=${query.points}`;
  if (query.tracked === true) return `${path}?motion=tracked`;
  if (query.dimensions === 'hot') return `${path}?dimensions=hot`;
  return path;
}

/** True when `name` is one of the downloads a plan's job renders and stores (every route at its default query). */
export function isDefaultDownload(name: string): boolean {
  if ((TABLES as readonly string[]).includes(name) || name === 'preview.svg') return true;
  const path = name.endsWith('?dimensions=hot') ? name.slice(0, -'?dimensions=hot'.length) : name;
  return (SHEETS as readonly string[]).includes(path) || /^plates\/[^/?]+\.dxf$/.test(path);
}

/**
 * Renders downloads of a finished plan: every table at its default query, every drawing cold and hot (each part's
 * DXF included), the preview and motion.json when `names` is absent, or the named ones. Pure; the same plan gives
 * byte-identical files. `planHash` is the stored plan's hash (the JSON tables name it).
 */
export function renderDownloads(
  record: PlanRecord,
  planHash: string | null,
  names?: readonly string[],
): RenderedDownload[] {
  let drawing: ReturnType<typeof drawingModel> | undefined;
  const model = () => {
    drawing ??= drawingModel(record.plan, record.schedule);
    return drawing;
  };
  let wanted = names;
  if (wanted === undefined) {
    const made = model();
    const parts = made.ok ? partIds(made.model).map((p) => `plates/${encodeURIComponent(p)}.dxf`) : [];
    const drawings = [...SHEETS, ...parts];
    wanted = [...TABLES, ...drawings, ...drawings.map((d) => `${d}?dimensions=hot`), 'preview.svg'];
  }
  return wanted.map((name) => renderOne(record, planHash, name, model));
}

function renderOne(
  record: PlanRecord,
  planHash: string | null,
  name: string,
  model: () => ReturnType<typeof drawingModel>,
): RenderedDownload {
  const { plan, schedule, id } = record;
  const cautions = plan.cautions.map((c) => c.code).join(', ');
  const mark = name.indexOf('?');
  const path = mark < 0 ? name : name.slice(0, mark);
  const query = mark < 0 ? '' : name.slice(mark + 1);
  const [param, value] = query.split('=');
  const encoder = new TextEncoder();
  const refuse = (refusal: ErrorCode, message: string): RenderedDownload => ({
    name,
    refusal,
    contentType: JSON_TYPE,
    disposition: '',
    cautions,
    body: encoder.encode(message),
  });
  const file = (text: string, contentType: string, suffix: string, disposition = 'attachment'): RenderedDownload => ({
    name,
    refusal: null,
    contentType,
    disposition: `${disposition}; filename="${downloadName(schedule.name, suffix)}"`,
    cautions,
    body: encoder.encode(text),
  });
  const json = (schema: z.ZodType, data: unknown, suffix: string) =>
    file(serializerCompiler({ schema, method: 'GET', url: path })(data), JSON_TYPE, suffix);

  const dot = path.lastIndexOf('.');
  const extension = path.slice(dot);
  if (extension === '.dxf' || path === 'preview.svg') {
    const made = model();
    if (!made.ok) return refuse('no_mechanism', `Plan ${id} has no mechanism to draw: ${made.reason}`);
    const drawn = made.model;
    if (path === 'preview.svg') {
      return file(writePreviewSvg(drawn, previewPlots(plan, schedule)), SVG_TYPE, 'preview.svg', 'inline');
    }
    const dimensions: DrawingDimensions = param === 'dimensions' && value === 'hot' ? 'hot' : 'cold';
    const scale = thermalScale(dimensions, drawn.dieTemperatureC);
    if (path === 'plates.dxf') return file(writePartsSheetDxf(drawn, scale), DXF_TYPE, path);
    if (path === 'die-body.dxf') return file(writeDieBodyDxf(drawn, scale), DXF_TYPE, path);
    if (path === 'stations.dxf') return file(writeStationsDxf(drawn, scale), DXF_TYPE, path);
    const part = path.startsWith('plates/') ? decodeURIComponent(path.slice('plates/'.length, -'.dxf'.length)) : '';
    const text = part === '' ? null : writePartDxf(drawn, part, scale);
    if (text === null) {
      return refuse(
        'not_found',
        `Plan ${id} has no part ${part.slice(0, 40)}; its parts are ${partIds(drawn).join(', ')}.`,
      );
    }
    return file(text, DXF_TYPE, `${part}.dxf`);
  }

  const motion = plan.motion;
  if (plan.status === 'failed' || motion === null) {
    const why =
      plan.status === 'failed'
        ? `it failed: ${plan.error ?? 'see its findings'}`
        : 'its mechanism has no actuators (see outcome.shortfalls and the findings)';
    return refuse('no_motion', `Plan ${id} has no actuator motion to download: ${why}`);
  }
  const simulation = plan.simulation ?? null;
  const meta = (table: MotionTableText, interpolation: string) => ({
    schedule: schedule.name,
    law: motion.law,
    periodic: table.periodic,
    units: Object.fromEntries(table.columns.map((c) => [c, columnUnit(c)])),
    columns: [...table.columns],
    plan_hash: planHash,
    interpolation,
    cautions: plan.cautions.map(toCautionWire),
  });
  const numbers = (table: MotionTableText) => table.rows.map((r) => r.map(Number));
  const points = param === 'points' ? Number(value) : CAM_POINTS.default;
  const noSimulation = () =>
    refuse(
      'no_motion',
      `Plan ${id} has no simulated motion (it was stored before plans simulated their motion, or its mechanism has no kinematic model): plan the schedule again.`,
    );

  if (path === 'setpoints.csv' || path === 'setpoints.json') {
    const tracked = param === 'motion' && value === 'tracked';
    if (tracked && !simulation?.tracking) {
      return refuse(
        'no_motion',
        `Plan ${id} has no tracked motion: only a mechanism driven directly (one actuator per degree of freedom of the chain, no links) can follow the morph between station shapes. Download the setpoints without ?motion=tracked.`,
      );
    }
    const count = setpointRowCount(motion, simulation);
    if (count > MAX_SETPOINT_ROWS) {
      return refuse(
        'table_too_large',
        `The setpoint table would have about ${count} rows, more than ${MAX_SETPOINT_ROWS}: plan again with a longer time_step_s, or download the cam table.`,
      );
    }
    const table = setpointTableText(motion, simulation, tracked);
    if (path === 'setpoints.csv') {
      return file(writeCsv(table.columns, table.rows), CSV_TYPE, tracked ? 'tracked-setpoints.csv' : 'setpoints.csv');
    }
    return json(
      SetpointsWire,
      {
        ...meta(table, SETPOINT_INTERPOLATION),
        time_step_s: motion.timeStepS,
        puller_follows_area: simulation?.pullerFollowsArea ?? false,
        motion: tracked ? ('tracked' as const) : ('law' as const),
        rows: numbers(table),
      },
      path,
    );
  }
  if (path === 'cam-table.csv' || path === 'cam-table.json') {
    const table = camTableText(motion, points);
    if (path === 'cam-table.csv') return file(writeCsv(table.columns, table.rows), CSV_TYPE, path);
    return json(
      CamTableWire,
      {
        ...meta(table, CAM_INTERPOLATION),
        points,
        stations: stationSetpoints(motion),
        rows: numbers(table),
      },
      path,
    );
  }
  if (path === 'puller-speed.csv' || path === 'puller-speed.json') {
    if (!simulation) return noSimulation();
    const table = pullerTableText(simulation, points);
    if (path === 'puller-speed.csv') return file(writeCsv(table.columns, table.rows), CSV_TYPE, path);
    return json(
      PullerTableWire,
      {
        ...meta(table, PULLER_INTERPOLATION),
        points,
        puller_follows_area: simulation.pullerFollowsArea,
        target_draw_down_ratio: sig(simulation.targetDrawDown),
        throughput_kg_per_h: sig(simulation.throughputKgPerS * 3600),
        solid_density_g_per_cm3: sig(simulation.solidDensityKgPerM3 / 1000),
        rows: numbers(table),
      },
      path,
    );
  }
  if (path === 'motion.json') {
    if (!simulation) return noSimulation();
    if (!plan.fit || !plan.mechanisation) return refuse('no_motion', `Plan ${id} has no mechanism to draw.`);
    return json(
      MotionViewWire,
      motionView(
        id,
        { fit: plan.fit, mechanisation: plan.mechanisation, motion, simulation },
        plan.findings,
        plan.cautions,
        schedule.limits,
      ),
      path,
    );
  }
  return refuse('not_found', `Plan ${id} has no download ${path.slice(0, 60)}.`);
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
