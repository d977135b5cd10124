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
        'Every response carries safety cautions: this service plans geometry and motion; the machine builder, local ' +
        'codes and plant practice decide.',
    },
    tags: [
      { name: 'checks', description: 'profile and process checks' },
      { name: 'plans', description: 'plate chain, mechanism and (later) motion plans' },
      { name: 'service', description: 'health and description' },
    ],
  };
}
