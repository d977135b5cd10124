import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import type { DrawingDimensions } from '../../export/index.js';
import { DrawingPartParams, DrawingPlanParams, DrawingQuery, DxfText, SvgText } from '../drawing-schema.js';
import { type DownloadSource, sendDownload } from '../download-source.js';
import { errorBody } from '../error-catalogue.js';
import { downloadKey } from '../render-download.js';
import { ErrorWire } from '../report-schema.js';

const DXF_TYPE = 'application/dxf';

/**
 * Drawings of a plan: every part as a DXF (`plates/{part}.dxf`), all parts on one sheet with a parts list
 * (`plates.dxf`), the die body (`die-body.dxf`), the stations overlaid in place (`stations.dxf`) and an SVG preview
 * (`preview.svg`). `?dimensions=cold` (default) or `hot` on every DXF. 404 for an unknown plan or part, 409
 * `no_mechanism` for a plan that failed before it had a mechanism. The same plan gives byte-identical files; they
 * are rendered off the service thread (`DownloadSource`).
 */
export function planDrawingRoutes(source: DownloadSource): FastifyPluginAsyncZod {
  return async (app) => {
    type Refusal = { status: 400; body: ReturnType<typeof errorBody> & { request_id: string } };
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
    const dxfResponse = { 200: DxfText, 400: ErrorWire, 404: ErrorWire, 409: ErrorWire };
    const dxfRoute = (path: string, summary: string, description: string, suffix: string) =>
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
          const name = downloadKey(suffix, { dimensions });
          return sendDownload(source, reply, request.id, request.params.id, name);
        },
      );

    dxfRoute(
      '/v1/plans/:id/plates.dxf',
      'Every part to cut on one DXF sheet, with a parts list',
      'Plates (and telescoping halves, slider blocks, binary links) as the first station places them, moved apart without overlap and not rotated; each with its closed cut outline, pin holes, centre marks and melt edge; a parts list (id, kind, stack layer, thickness, holes); notes and safety cautions. 409 `no_mechanism` when the plan failed.',
      'plates.dxf',
    );
    dxfRoute(
      '/v1/plans/:id/die-body.dxf',
      'The die body: fixed opening, die-body pin holes, slots, actuator mounts, swept area',
      'The die opening the plates close, die-body pin holes (chain ends and link ground pins) with centre marks, slot paths, actuator mounts with their ranges, and the area the moving parts sweep over the stations and 8 steps between each pair of them (union of every part outline); notes and safety cautions.',
      'die-body.dxf',
    );
    dxfRoute(
      '/v1/plans/:id/stations.dxf',
      'Every station in place: target and achieved orifice and the parts, one set of layers per station',
      'Layers `station-<n>-target`, `station-<n>-achieved` and `station-<n>-parts` for each station n (from 1), and `die-opening`; notes give each station line position and deviation; safety cautions.',
      'stations.dxf',
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
        const part = encodeURIComponent(request.params.part);
        const name = downloadKey(`plates/${part}.dxf`, { dimensions });
        return sendDownload(source, reply, request.id, request.params.id, name);
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
        return sendDownload(source, reply, request.id, request.params.id, 'preview.svg');
      },
    );
  };
}
