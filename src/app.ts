import { randomUUID } from 'node:crypto';
import fastifySwagger from '@fastify/swagger';
import Fastify, { type FastifyBaseLogger, type FastifyError } from 'fastify';
import {
  hasZodFastifySchemaValidationErrors,
  jsonSchemaTransform,
  serializerCompiler,
  validatorCompiler,
  type ZodTypeProvider,
} from 'fastify-type-provider-zod';
import type { Logger } from 'pino';
import { ERROR_CATALOGUE, type ErrorCode, type ErrorDetail, errorBody } from './http/error-catalogue.js';
import { openapiInfo } from './http/build-openapi.js';
import { RateLimiter } from './http/rate-limiter.js';
import { checkRoutes } from './http/routes/checks.js';
import { planRoutes } from './http/routes/plans.js';
import { MemoryPlanStore, type PlanStore } from './store/index.js';
import { healthRoutes } from './http/routes/health.js';
import { WIRE_LIMITS } from './http/wire-limits.js';
import { SERVICE_VERSION } from './version.js';

export interface AppOptions {
  /** A pino logger; tests pass a silent one. */
  readonly logger: Logger;
  /** Requests per minute from one client address; 0 or absent: no limit. */
  readonly rateLimitPerMinute?: number;
  /** Clock for the rate limiter, ms. @default Date.now */
  readonly now?: () => number;
  /** Where plans are kept. @default a MemoryPlanStore */
  readonly store?: PlanStore;
}

/**
 * Builds the HTTP application without listening (server.ts listens), so tests drive it through `app.server` with
 * supertest. Every error leaves through one handler that speaks the catalogue in api-spec/errors.md.
 */
export async function buildApp(options: AppOptions) {
  const app = Fastify({
    loggerInstance: options.logger as FastifyBaseLogger,
    bodyLimit: WIRE_LIMITS.bodyBytes,
    genReqId: (req) => {
      const given = req.headers['x-request-id'];
      return typeof given === 'string' && /^[\w.-]{1,64}$/.test(given) ? given : randomUUID();
    },
  }).withTypeProvider<ZodTypeProvider>();
  // only JSON bodies: anything else is 415 rather than a confusing schema error
  app.removeContentTypeParser('text/plain');
  app.setValidatorCompiler(validatorCompiler);
  app.setSerializerCompiler(serializerCompiler);
  app.addHook('onSend', async (request, reply) => {
    reply.header('x-request-id', request.id);
  });
  const perMinute = options.rateLimitPerMinute ?? 0;
  if (perMinute > 0) {
    const limiter = new RateLimiter(perMinute, 60_000, options.now ?? Date.now);
    app.addHook('onRequest', async (request, reply) => {
      const wait = limiter.take(request.ip);
      if (wait > 0) {
        reply.header('retry-after', String(wait));
        return send(
          reply,
          request.id,
          'rate_limited',
          `More than ${perMinute} requests a minute; try again in ${wait} s.`,
        );
      }
    });
  }

  app.setNotFoundHandler((request, reply) => {
    send(reply, request.id, 'not_found', `Nothing at ${request.method} ${request.url}.`);
  });
  app.setErrorHandler((error: FastifyError, request, reply) => {
    if (hasZodFastifySchemaValidationErrors(error)) {
      const details: ErrorDetail[] = error.validation.map((v) => ({
        path: formatInstancePath(v.instancePath),
        message: v.message ?? 'invalid value',
      }));
      return send(reply, request.id, 'invalid_schedule', 'The schedule does not match the expected format.', details);
    }
    switch (error.code) {
      case 'FST_ERR_CTP_INVALID_JSON_BODY':
      case 'FST_ERR_CTP_EMPTY_JSON_BODY':
        return send(reply, request.id, 'malformed_json', `The body is not valid JSON: ${error.message}`);
      case 'FST_ERR_CTP_BODY_TOO_LARGE':
        return send(reply, request.id, 'body_too_large', `The body is larger than ${WIRE_LIMITS.bodyBytes} bytes.`);
      case 'FST_ERR_CTP_INVALID_MEDIA_TYPE':
        return send(reply, request.id, 'unsupported_media_type', 'Send the schedule as application/json.');
    }
    if (error instanceof SyntaxError || error.statusCode === 400) {
      return send(reply, request.id, 'malformed_json', `The body could not be read: ${error.message}`);
    }
    request.log.error({ err: error }, 'unexpected failure');
    return send(reply, request.id, 'internal', 'The service failed unexpectedly; nothing was stored.');
  });

  // error and not-found handlers first: plugins registered after them inherit them
  await app.register(fastifySwagger, { openapi: openapiInfo(SERVICE_VERSION), transform: jsonSchemaTransform });
  await app.register(healthRoutes);
  await app.register(checkRoutes);
  await app.register(planRoutes(options.store ?? new MemoryPlanStore(), () => new Date(options.now?.() ?? Date.now())));
  app.get('/openapi.json', { schema: { hide: true } }, async () => app.swagger());
  return app;
}

function send(
  reply: { code(status: number): { send(body: unknown): unknown } },
  requestId: string,
  code: ErrorCode,
  message: string,
  details: readonly ErrorDetail[] = [],
) {
  return reply.code(ERROR_CATALOGUE[code].status).send({ ...errorBody(code, message, details), request_id: requestId });
}

/** `/stations/0/orifice/outer/2` → `stations[0].orifice.outer[2]`. */
function formatInstancePath(instancePath: string): string {
  const parts = instancePath.split('/').filter((p) => p !== '');
  let out = '';
  for (const part of parts) out += /^\d+$/.test(part) ? `[${part}]` : out === '' ? part : `.${part}`;
  return out === '' ? '(body)' : out;
}
