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
import { pageRoutes } from './http/routes/pages.js';
import { planDownloadRoutes } from './http/routes/plan-downloads.js';
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
  /** How long a slow or idle client may hold a connection (tests shorten them). @default SERVER_TIMEOUTS */
  readonly timeouts?: Partial<ServerTimeouts>;
  /** Seconds after which a plan's chain search stops with what it has. @default 20 */
  readonly planTimeLimitS?: number;
}

/** How long a client may take, ms; a slow client cannot hold a connection longer. */
export interface ServerTimeouts {
  /** Whole request (headers and body) must arrive within this; Node answers 408 and closes otherwise. */
  readonly requestMs: number;
  /** A connection with no traffic either way for this long is closed (covers the longest synchronous plan). */
  readonly connectionMs: number;
  /** An idle keep-alive connection is closed after this. */
  readonly keepAliveMs: number;
}

/**
 * Timeouts of the HTTP server. 30 s brings a 5 MiB body over a slow 2 Mbit/s link; a plan of tens of plates may
 * compute for about a minute before answering, hence the 120 s idle limit; 5 s keep-alive as Node's default
 * (common practice, no source).
 */
export const SERVER_TIMEOUTS: ServerTimeouts = Object.freeze({
  requestMs: 30_000,
  connectionMs: 120_000,
  keepAliveMs: 5_000,
});

/** Longest path parameter, characters (a plan id is a 36-character UUID); longer ones answer 404 `not_found`. */
const MAX_PARAM_LENGTH = 100;

/**
 * Builds the HTTP application without listening (server.ts listens), so tests drive it through `app.server` with
 * supertest. Every error leaves through one handler that speaks the catalogue in api-spec/errors.md.
 */
export async function buildApp(options: AppOptions) {
  const timeouts = { ...SERVER_TIMEOUTS, ...options.timeouts };
  const app = Fastify({
    loggerInstance: options.logger as FastifyBaseLogger,
    bodyLimit: WIRE_LIMITS.bodyBytes,
    requestTimeout: timeouts.requestMs,
    // Node looks for overdue requests every connectionsCheckingInterval (30 s by default): check every second, or
    // sooner when the timeout is shorter, so a slow client is let go close to requestTimeout, not up to 30 s later
    http: {
      connectionsCheckingInterval: Math.min(1000, timeouts.requestMs),
      headersTimeout: Math.min(10_000, timeouts.requestMs),
    },
    connectionTimeout: timeouts.connectionMs,
    keepAliveTimeout: timeouts.keepAliveMs,
    routerOptions: { maxParamLength: MAX_PARAM_LENGTH },
    // secure-json-parse's defaults, stated: a body with a __proto__ or constructor.prototype key is refused (400)
    onProtoPoisoning: 'error',
    onConstructorPoisoning: 'error',
    // errors the router raises before any route (a broken percent-escape, an over-long id) speak the catalogue too
    frameworkErrors: (error, request, frameworkReply) => {
      frameworkReply.header('x-request-id', request.id);
      const reply = frameworkReply as unknown as ReplyLike;
      if (error.code === 'FST_ERR_MAX_PARAM_LENGTH') {
        return send(
          reply,
          request.id,
          'not_found',
          `Nothing at ${request.method} ${shorten(request.url)}: a path part is longer than ${MAX_PARAM_LENGTH} characters (a plan id has 36).`,
        );
      }
      return send(
        reply,
        request.id,
        'malformed_request',
        `The URL ${shorten(request.url)} cannot be read: it has a broken percent-escape or a character that is not allowed.`,
      );
    },
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
        return send(
          reply,
          request.id,
          'malformed_json',
          'The body is not valid JSON, or it carries a "__proto__" or "constructor": { "prototype": … } key, which is refused.',
        );
      case 'FST_ERR_CTP_EMPTY_JSON_BODY':
        return send(reply, request.id, 'malformed_json', `The body is not valid JSON: ${error.message}`);
      case 'FST_ERR_CTP_INVALID_CONTENT_LENGTH':
        return send(
          reply,
          request.id,
          'malformed_request',
          'The body is not as long as its Content-Length header says.',
        );
      case 'FST_ERR_CTP_BODY_TOO_LARGE':
        return send(reply, request.id, 'body_too_large', `The body is larger than ${WIRE_LIMITS.bodyBytes} bytes.`);
      case 'FST_ERR_CTP_INVALID_MEDIA_TYPE':
        return send(reply, request.id, 'unsupported_media_type', 'Send the schedule as application/json.');
    }
    if (error instanceof SyntaxError) {
      return send(reply, request.id, 'malformed_json', `The body could not be read: ${error.message}`);
    }
    // any other client error the framework raises (a bad header, an unreadable body) is the request's fault, not ours
    if (error.statusCode !== undefined && error.statusCode >= 400 && error.statusCode < 500) {
      return send(reply, request.id, 'malformed_request', `The request could not be read: ${error.message}`);
    }
    request.log.error({ err: error }, 'unexpected failure');
    return send(reply, request.id, 'internal', 'The service failed unexpectedly; nothing was stored.');
  });

  // error and not-found handlers first: plugins registered after them inherit them
  await app.register(fastifySwagger, { openapi: openapiInfo(SERVICE_VERSION), transform: jsonSchemaTransform });
  await app.register(healthRoutes);
  await app.register(checkRoutes);
  const store = options.store ?? new MemoryPlanStore();
  await app.register(planRoutes(store, () => new Date(options.now?.() ?? Date.now()), options.planTimeLimitS ?? 20));
  await app.register(planDownloadRoutes(store));
  app.get('/openapi.json', { schema: { hide: true } }, async () => app.swagger());
  await app.register(pageRoutes);
  return app;
}

/** The part of a reply `send` uses. */
type ReplyLike = { code(status: number): { send(body: unknown): unknown } };

function send(
  reply: ReplyLike,
  requestId: string,
  code: ErrorCode,
  message: string,
  details: readonly ErrorDetail[] = [],
) {
  return reply.code(ERROR_CATALOGUE[code].status).send({ ...errorBody(code, message, details), request_id: requestId });
}

/** A URL as it may appear in a message: at most 80 characters. */
function shorten(url: string): string {
  return url.length > 80 ? `${url.slice(0, 77)}...` : url;
}

/** `/stations/0/orifice/outer/2` → `stations[0].orifice.outer[2]`. */
function formatInstancePath(instancePath: string): string {
  const parts = instancePath.split('/').filter((p) => p !== '');
  let out = '';
  for (const part of parts) out += /^\d+$/.test(part) ? `[${part}]` : out === '' ? part : `.${part}`;
  return out === '' ? '(body)' : out;
}
