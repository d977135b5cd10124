import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import {
  type DrawingDimensions,
  type DrawingModel,
  drawingModel,
  partIds,
  previewPlots,
  thermalScale,
  writeDieBodyDxf,
  writePartDxf,
  writePartsSheetDxf,
  writePreviewSvg,
  writeStationsDxf,
} from '../../export/index.js';
import type { PlanRecord, PlanStore } from '../../store/index.js';
import { DrawingPartParams, DrawingPlanParams, DrawingQuery, DxfText, SvgText } from '../drawing-schema.js';
import { type ErrorCode, errorBody } from '../error-catalogue.js';
import { downloadName } from '../motion-tables.js';
import { ErrorWire } from '../report-schema.js';

/** Drawing models kept for the plans drawn last (a model costs a few hundred ms: solves and a union). */
const MODEL_CACHE_SIZE = 16;

const DXF_TYPE = 'application/dxf';
const SVG_TYPE = 'image/svg+xml; charset=utf-8';

/**
 * Drawings of a plan: every part as a DXF (`plates/{part}.dxf`), all parts on one sheet with a parts list
 * (`plates.dxf`), the die body (`die-body.dxf`), the stations overlaid in place (`stations.dxf`) and an SVG preview
 * (`preview.svg`). `?dimensions=cold` (default) or `hot` on every DXF. 404 for an unknown plan or part, 409
 * `no_mechanism` for a plan that failed before it had a mechanism. The same plan gives byte-identical files.
 */
export function planDrawingRoutes(store: PlanStore): FastifyPluginAsyncZod {
  return async (app) => {
    const cache = new Map<string, DrawingModel>();
    type Found = { record: PlanRecord; model: DrawingModel };
    type Refusal = { status: 400 | 404 | 409; body: ReturnType<typeof errorBody> & { request_id: string } };
    const refuse = (code: ErrorCode, status: 400 | 404 | 409, message: string, requestId: string): Refusal => ({
      status,
      body: { ...errorBody(code, message), request_id: requestId },
    });
    const find = (id: string, requestId: string): Found | Refusal => {
      const record = store.get(id);
      if (!record) return refuse('not_found', 404, `No plan with id ${id}.`, requestId);
      const key = `${record.id}|${record.createdAt}`;
      const cached = cache.get(key);
      if (cached) return { record, model: cached };
      const made = drawingModel(record.plan, record.schedule);
      if (!made.ok) {
        return refuse('no_mechanism', 409, `Plan ${id} has no mechanism to draw: ${made.reason}`, requestId);
      }
      cache.set(key, made.model);
      while (cache.size > MODEL_CACHE_SIZE) cache.delete(cache.keys().next().value!);
      return { record, model: made.model };
    };
    const dimensionsOf = (raw: string | undefined, requestId: string): DrawingDimensions | Refusal => {
      if (raw === undefined || raw === 'cold') return 'cold';
      if (raw === 'hot') return 'hot';
      return {
        status: 400,
        body: {
          ...errorBody('malformed_request', `dimensions=${raw.slice(0, 20)} is neither cold nor hot.`, [
            { path: 'dimensions', message: 'cold (default: sizes to cut at 20 °C) or hot (the plan geometry)' },
          ]),
          request_id: requestId,
        },
      };
    };
    const headers = (record: PlanRecord, suffix: string, type: string, disposition = 'attachment') => ({
      'content-type': type,
      'content-disposition': `${disposition}; filename="${downloadName(record.schedule.name, suffix)}"`,
    });
    const dxfResponse = { 200: DxfText, 400: ErrorWire, 404: ErrorWire, 409: ErrorWire };
    const dxfRoute = (
      path: string,
      summary: string,
      description: string,
      suffix: string,
      write: (model: DrawingModel, dimensions: DrawingDimensions) => string,
    ) =>
      app.get(
        path,
        {
          schema: {
            summary,
            description,
            tags: ['drawings'],
            params: DrawingPlanParams,
            querystring: DrawingQuery,
            produces: [DXF_TYPE],
            response: dxfResponse,
          },
        },
        async (request, reply) => {
          const dimensions = dimensionsOf(request.query.dimensions, request.id);
          if (typeof dimensions !== 'string') return reply.code(dimensions.status).send(dimensions.body);
          const found = find(request.params.id, request.id);
          if ('status' in found) return reply.code(found.status).send(found.body);
          return reply.headers(headers(found.record, suffix, DXF_TYPE)).send(write(found.model, dimensions));
        },
      );
    const scaled = (model: DrawingModel, d: DrawingDimensions) => thermalScale(d, model.dieTemperatureC);

    dxfRoute(
      '/v1/plans/:id/plates.dxf',
      'Every part to cut on one DXF sheet, with a parts list',
      'Plates (and telescoping halves, slider blocks, binary links) as the first station places them, moved apart without overlap and not rotated; each with its closed cut outline, pin holes, centre marks and melt edge; a parts list (id, kind, stack layer, thickness, holes); notes and safety cautions. 409 `no_mechanism` when the plan failed.',
      'plates.dxf',
      (model, d) => writePartsSheetDxf(model, scaled(model, d)),
    );
    dxfRoute(
      '/v1/plans/:id/die-body.dxf',
      'The die body: fixed opening, die-body pin holes, slots, actuator mounts, swept area',
      'The die opening the plates close, die-body pin holes (chain ends and link ground pins) with centre marks, slot paths, actuator mounts with their ranges, and the area the moving parts sweep over the stations and 8 steps between each pair of them (union of every part outline); notes and safety cautions.',
      'die-body.dxf',
      (model, d) => writeDieBodyDxf(model, scaled(model, d)),
    );
    dxfRoute(
      '/v1/plans/:id/stations.dxf',
      'Every station in place: target and achieved orifice and the parts, one set of layers per station',
      'Layers `station-<n>-target`, `station-<n>-achieved` and `station-<n>-parts` for each station n (from 1), and `die-opening`; notes give each station line position and deviation; safety cautions.',
      'stations.dxf',
      (model, d) => writeStationsDxf(model, scaled(model, d)),
    );

    app.get(
      '/v1/plans/:id/plates/:part.dxf',
      {
        schema: {
          summary: 'One part to cut, as DXF',
          description:
            'The closed cut outline exactly as the plan clips the die opening with it (as the first station places the part, die-body frame), pin holes (schedule pivot hole diameter + 0.02 mm running clearance) on the pivot points, centre marks, the melt edge on layer `melt-edge`, notes (part, stack layer, thickness, units, cold or hot) and safety cautions. 404 for a part id the plan does not have.',
          tags: ['drawings'],
          params: DrawingPartParams,
          querystring: DrawingQuery,
          produces: [DXF_TYPE],
          response: dxfResponse,
        },
      },
      async (request, reply) => {
        const dimensions = dimensionsOf(request.query.dimensions, request.id);
        if (typeof dimensions !== 'string') return reply.code(dimensions.status).send(dimensions.body);
        const found = find(request.params.id, request.id);
        if ('status' in found) return reply.code(found.status).send(found.body);
        const { part } = request.params;
        const text = writePartDxf(found.model, part, scaled(found.model, dimensions));
        if (text === null) {
          const known = partIds(found.model).join(', ');
          const missing = refuse(
            'not_found',
            404,
            `Plan ${request.params.id} has no part ${part.slice(0, 40)}; its parts are ${known}.`,
            request.id,
          );
          return reply.code(missing.status).send(missing.body);
        }
        return reply.headers(headers(found.record, `${part}.dxf`, DXF_TYPE)).send(text);
      },
    );

    app.get(
      '/v1/plans/:id/preview.svg',
      {
        schema: {
          summary: 'The plan at a glance, as SVG',
          description:
            'A panel per station (target orifice, achieved orifice, every part in place), then plots against line position: actuator values (motion between stations and station values), target and achieved orifice area, draw-down ratio with its limits, puller speed that holds the target draw-down with the nominal line speed; findings with a line position marked; safety cautions. Geometry as planned (hot).',
          tags: ['drawings'],
          params: DrawingPlanParams,
          produces: ['image/svg+xml'],
          response: { 200: SvgText, 400: ErrorWire, 404: ErrorWire, 409: ErrorWire },
        },
      },
      async (request, reply) => {
        const found = find(request.params.id, request.id);
        if ('status' in found) return reply.code(found.status).send(found.body);
        const svg = writePreviewSvg(found.model, previewPlots(found.record.plan, found.record.schedule));
        return reply.headers(headers(found.record, 'preview.svg', SVG_TYPE, 'inline')).send(svg);
      },
    );
  };
}
