import { z } from 'zod';
import { CamTableWire, SetpointsWire } from './download-schema.js';
import { PlanCreatedWire, PlanJobWire, PlanListWire, PlanProgressWire, PlanSummaryWire } from './plan-job-schema.js';
import { ChainWire, MechanisationWire, MechanismWire, PlanStationWire } from './plan-schema.js';
import { CautionWire, CheckReportWire, ErrorWire, FindingWire, HealthWire, StationCheckWire } from './report-schema.js';
import { ScheduleWire } from './schedule-schema.js';
import { WIRE_LIMITS } from './wire-limits.js';

/** The OpenAPI document's fixed parts; paths and schemas come from the routes' zod schemas. */
export function openapiInfo(version: string) {
  return {
    openapi: '3.1.0',
    info: {
      title: 'Die motion planner',
      version,
      description:
        'Plans the plate motion of variable-cross-section extrusion dies. Geometry in millimetres (y up, outer rings ' +
        'counter-clockwise, holes clockwise), line positions in metres; every field name carries its unit. ' +
        `Limits: body ${WIRE_LIMITS.bodyBytes} bytes, ${WIRE_LIMITS.stations} stations, ${WIRE_LIMITS.ringVertices} ` +
        `vertices per ring, ${WIRE_LIMITS.holes} holes per orifice, ${WIRE_LIMITS.totalVertices} vertices per schedule, ` +
        `coordinates within ±${WIRE_LIMITS.coordinateMm} mm. Errors: see api-spec/errors.md. ` +
        'Plans are computed in the background: POST /v1/plans answers 202 with a Location to poll. ' +
        'Authentication: when the service has API tokens, every /v1 route needs `Authorization: Bearer <token>` ' +
        '(scope read: GET and POST /v1/checks; write: also POST and DELETE /v1/plans). ' +
        'Cautions: every check, plan and download carries process-safety cautions (JSON bodies in `cautions`; CSV and ' +
        'drawing downloads name them in the `X-Cautions` header and link the plan, which holds them in full; the 202 of ' +
        'POST /v1/plans carries them; error bodies carry none). This service plans geometry and motion; the machine ' +
        'builder, local codes and plant practice decide.',
    },
    tags: [
      { name: 'checks', description: 'profile and process checks' },
      { name: 'plans', description: 'plans computed in the background: queue, status, result, list, delete' },
      { name: 'downloads', description: 'tables and drawings of a finished plan' },
      { name: 'service', description: 'health, readiness and description' },
    ],
    // stated whether or not this instance has tokens, so the document is the same everywhere
    components: {
      securitySchemes: {
        bearer: {
          type: 'http' as const,
          scheme: 'bearer',
          description: 'API token from API_TOKENS; needed on /v1 routes when the service has tokens',
        },
      },
    },
    security: [{ bearer: [] }],
  };
}

/** Named component schemas of the OpenAPI document (`#/components/schemas/<id>`), registered once. */
const COMPONENTS: readonly [z.ZodType, string][] = [
  [ScheduleWire, 'Schedule'],
  [CheckReportWire, 'CheckReport'],
  [StationCheckWire, 'StationCheck'],
  [FindingWire, 'Finding'],
  [CautionWire, 'Caution'],
  [ErrorWire, 'Error'],
  [HealthWire, 'Health'],
  [PlanJobWire, 'Plan'],
  [PlanCreatedWire, 'PlanAccepted'],
  [PlanProgressWire, 'PlanProgress'],
  [PlanSummaryWire, 'PlanSummary'],
  [PlanListWire, 'PlanList'],
  [PlanStationWire, 'PlanStation'],
  [ChainWire, 'Chain'],
  [MechanisationWire, 'Mechanisation'],
  [MechanismWire, 'Mechanism'],
  [SetpointsWire, 'Setpoints'],
  [CamTableWire, 'CamTable'],
];

export function registerComponentSchemas(): void {
  for (const [schema, id] of COMPONENTS) {
    // a described schema is in the registry already (zod keeps descriptions there): keep its description
    const meta = z.globalRegistry.get(schema);
    if (meta?.id === undefined) z.globalRegistry.add(schema, { ...meta, id });
  }
}

/** What each status means, for the OpenAPI response descriptions (codes from api-spec/errors.md). */
const STATUS_TEXT: Record<string, string> = {
  '200': 'OK',
  '202': 'Accepted: stored and queued; poll the Location header',
  '204': 'Deleted; no body',
  '304': 'Not modified: the ETag in If-None-Match is current; no body',
  '400': 'Bad request: invalid_schedule (details name every field), malformed_json or malformed_request',
  '401': 'unauthorized: the service has API tokens and the request carries none it knows (WWW-Authenticate: Bearer)',
  '403': 'forbidden: the token’s scope does not allow this (read tokens cannot post or delete plans)',
  '404': 'not_found: no such plan (or route)',
  '409': 'not_ready: the plan is queued or running (Retry-After); or no_motion / table_too_large for motion downloads',
  '413': 'body_too_large: more than 5 MiB',
  '415': 'unsupported_media_type: send application/json',
  '422': 'plan_too_large (station boundaries over 20 m) or idempotency_conflict (key used with another schedule)',
  '429': 'rate_limited: too many requests (Retry-After)',
  '500': 'internal: the service failed unexpectedly and stored nothing; report the request_id (no stack trace or path)',
  '503': 'service_busy (Retry-After), or not ready',
};

const ERROR_REF = { $ref: '#/components/schemas/Error' };

/** The smallest plan request (README), as the request example. */
const SCHEDULE_EXAMPLE = {
  name: 'two-step-strip',
  stations: [
    {
      position_m: 0.0,
      orifice: {
        outer: [
          [0, 0],
          [40, 0],
          [40, 8],
          [0, 8],
        ],
      },
    },
    {
      position_m: 0.5,
      orifice: {
        outer: [
          [0, 0],
          [40, 0],
          [40, 12],
          [0, 12],
        ],
      },
    },
  ],
};

type Operation = {
  responses?: Record<
    string,
    { description?: string; content?: Record<string, { schema?: unknown; example?: unknown }> }
  >;
  requestBody?: { content?: Record<string, { example?: unknown }> };
  security?: unknown[];
};

/**
 * Completes the generated document: every /v1 route lists the statuses the app's hooks add (401, 403, 429, 500; 304,
 * 409 not_ready and 503 service_busy on a plan's downloads), every response says what it means, the open routes need
 * no token, the schedule routes carry an example, and component schemas no route uses are dropped.
 */
export function completeOpenapi<T extends object>(document: T): T {
  const doc = document as unknown as {
    paths: Record<string, Record<string, Operation>>;
    components?: { schemas?: Record<string, unknown> };
  };
  for (const [path, item] of Object.entries(doc.paths ?? {})) {
    for (const [method, op] of Object.entries(item)) {
      op.responses ??= {};
      if (path.startsWith('/v1/')) {
        // every /v1 route can fail unexpectedly: the error handler then answers 500 internal in the catalogue's shape
        for (const status of ['401', '403', '429', '500']) op.responses[status] ??= errorResponse();
        if (path.startsWith('/v1/plans/{id}/') && method === 'get') {
          op.responses['304'] ??= { description: '' };
          op.responses['404'] ??= errorResponse();
          op.responses['409'] ??= errorResponse();
          // a download not stored with its plan is rendered by a worker, which can have too many waiting
          op.responses['503'] ??= errorResponse();
        }
      } else {
        op.security = [];
      }
      for (const [status, response] of Object.entries(op.responses)) {
        if (!response.description || response.description === 'Default Response') {
          response.description = STATUS_TEXT[status] ?? 'see api-spec/errors.md';
        }
        if (status === '304' || status === '204') delete response.content;
        // errors are JSON on every route, whatever a download's own type (the generator gives them the route's)
        if (path.startsWith('/v1/') && Number(status) >= 400) response.content = errorResponse().content;
      }
      const body = op.requestBody?.content?.['application/json'];
      if (body && (path === '/v1/plans' || path === '/v1/checks')) body.example = SCHEDULE_EXAMPLE;
      const accepted = op.responses['202']?.content?.['application/json'];
      if (accepted) {
        accepted.example = {
          id: '5b0c2f3e-8a1d-4c59-9d0e-2f6a7b1c3d4e',
          status: 'queued',
          schedule_hash: '9f2c…',
          location: '/v1/plans/5b0c2f3e-8a1d-4c59-9d0e-2f6a7b1c3d4e',
          cautions: [{ code: 'HOT_MELT', hazard: 'hot melt and die surfaces', message: '…' }],
        };
      }
      const bad = op.responses['400']?.content?.['application/json'];
      if (bad && path !== '/v1/plans' && path !== '/v1/checks') continue;
      if (bad) {
        bad.example = {
          error: 'invalid_schedule',
          message: 'The schedule describes an orifice or a station order the die cannot make.',
          details: [
            { path: 'stations[2].orifice.outer', message: 'the outer boundary crosses itself near (20.0, 5.0) mm' },
          ],
          request_id: '0d1e2f3a-…',
        };
      }
    }
  }
  // drop component schemas that nothing references (the input and output forms of one schema are both generated)
  const schemas = doc.components?.schemas;
  if (schemas) {
    for (;;) {
      const text = JSON.stringify({ paths: doc.paths, schemas });
      const unused = Object.keys(schemas).filter((name) => !text.includes(`"#/components/schemas/${name}"`));
      if (unused.length === 0) break;
      for (const name of unused) delete schemas[name];
    }
  }
  return document;
}

function errorResponse() {
  return { description: '', content: { 'application/json': { schema: ERROR_REF } } };
}
