import { randomUUID } from 'node:crypto';
import fastifyHelmet from '@fastify/helmet';
import fastifyRateLimit from '@fastify/rate-limit';
import fastifySwagger from '@fastify/swagger';
import fastifySwaggerUi from '@fastify/swagger-ui';
import Fastify, { type FastifyBaseLogger, type FastifyError, type FastifyReply } from 'fastify';
import {
  hasZodFastifySchemaValidationErrors,
  jsonSchemaTransform,
  jsonSchemaTransformObject,
  serializerCompiler,
  validatorCompiler,
  type ZodTypeProvider,
} from 'fastify-type-provider-zod';
import type { Logger } from 'pino';
import type { ApiToken } from './config.js';
import { ApiTokens, type Principal } from './http/api-tokens.js';
import { clientErrorAnswer } from './http/client-error-answer.js';
import { completeOpenapi, openapiInfo, registerComponentSchemas } from './http/build-openapi.js';
import { securityHeaders } from './http/security-headers.js';
import { ERROR_CATALOGUE, type ErrorCode, type ErrorDetail, errorBody } from './http/error-catalogue.js';
import { DownloadSource } from './http/download-source.js';
import { matchesEtag, planEtag } from './http/plan-gate.js';
import { checkRoutes } from './http/routes/checks.js';
import { pageRoutes } from './http/routes/pages.js';
import { healthRoutes } from './http/routes/health.js';
import { planDownloadRoutes } from './http/routes/plan-downloads.js';
import { planDrawingRoutes } from './http/routes/plan-drawings.js';
import { planRoutes } from './http/routes/plans.js';
import { formatInstancePath } from './http/field-path.js';
import { WIRE_LIMITS } from './http/wire-limits.js';
import { PlanJobs, WorkerPool } from './jobs/index.js';
import { type PlanStore, SqlitePlanStore } from './store/index.js';
import { SERVICE_VERSION } from './version.js';

export interface AppOptions {
  /** A pino logger; tests pass a silent one. */
  readonly logger: Logger;
  /** Requests per minute from one client (its token's name, or its address without tokens); 0 or absent: no limit. */
  readonly rateLimitPerMinute?: number;
  /** The rate limit's window, ms (tests shorten it). @default 60000 */
  readonly rateLimitWindowMs?: number;
  /** Where plans are kept; the app does not close a store it is given. @default an in-memory SQLite store */
  readonly store?: PlanStore;
  /** Plans computed at once, each in a worker thread. @default 1 */
  readonly planWorkers?: number;
  /** How long a slow or idle client may hold a connection (tests shorten them). @default SERVER_TIMEOUTS */
  readonly timeouts?: Partial<ServerTimeouts>;
  /** Seconds after which a plan's chain search stops with what it has. @default 20 */
  readonly planTimeLimitS?: number;
  /** Seconds after which a running plan is ended and stored as failed. @default max(60, 4 × planTimeLimitS) */
  readonly planHardLimitS?: number;
  /** On close, how long running plans may finish before they are queued again for the next start, ms. @default 0 */
  readonly shutdownGraceMs?: number;
  /** Start the worker threads with the app (the service) or when first needed (tests). @default true */
  readonly warmWorkers?: boolean;
  /** API tokens; none: every route is open (server.ts then listens on loopback only). @default [] */
  readonly apiTokens?: readonly ApiToken[];
}

/** How long a client may take, ms; a slow client cannot hold a connection longer. */
export interface ServerTimeouts {
  /** Whole request (headers and body) must arrive within this; Node answers 408 and closes otherwise. */
  readonly requestMs: number;
  /** A connection with no traffic either way for this long is closed. */
  readonly connectionMs: number;
  /** An idle keep-alive connection is closed after this. */
  readonly keepAliveMs: number;
}

/**
 * Timeouts of the HTTP server. 30 s brings a 5 MiB body over a slow 2 Mbit/s link; 120 s idle limit; 5 s keep-alive
 * as Node's default (common practice, no source).
 */
export const SERVER_TIMEOUTS: ServerTimeouts = Object.freeze({
  requestMs: 30_000,
  connectionMs: 120_000,
  keepAliveMs: 5_000,
});

/** Helmet's options: plain HTTP (TLS ends at a proxy), so no HSTS and no upgrade of a page's requests to https. */
export const HELMET_OPTIONS = Object.freeze({
  hsts: false,
  contentSecurityPolicy: { directives: { upgradeInsecureRequests: null } },
});

/** Longest path parameter, characters (a plan id is a 36-character UUID); longer ones answer 404 `not_found`. */
const MAX_PARAM_LENGTH = 100;

/** Seconds a client is told to wait before asking again for a plan that is not finished. */
const POLL_AFTER_S = 1;

declare module 'fastify' {
  interface FastifyRequest {
    /** Who sent the request (its API token's name and scope); null when the service has no tokens. */
    principal: Principal | null;
  }
}

/**
 * Builds the HTTP application without listening (server.ts listens), so tests drive it through `app.server` with
 * supertest. Every error leaves through one handler that speaks the catalogue in api-spec/errors.md. Plans run in
 * worker threads (`app.plans.jobs`); the queue starts when the app is ready and drains when it closes.
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
    // errors Node's HTTP parser meets before there is a request (a request not in within requestTimeout, headers too
    // large, bytes that are not HTTP) are answered in the catalogue's shape too, then the connection is closed
    clientErrorHandler: clientErrorAnswer(timeouts.requestMs, (fields, message) =>
      options.logger.debug(fields, message),
    ),
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
  // hooks that run on every request take a callback: no promise per request
  app.addHook('onSend', (request, reply, payload, done) => {
    reply.header('x-request-id', request.id);
    done(null, payload);
  });

  const ownStore = options.store === undefined;
  const store = options.store ?? new SqlitePlanStore(':memory:');
  const planWorkers = options.planWorkers ?? 1;
  const planTimeLimitS = options.planTimeLimitS ?? 20;
  const pool = new WorkerPool({ planThreads: planWorkers, warm: options.warmWorkers !== false });
  const jobs = new PlanJobs({
    store,
    pool,
    concurrency: planWorkers,
    timeLimitS: planTimeLimitS,
    ...(options.planHardLimitS === undefined ? {} : { hardLimitS: options.planHardLimitS }),
    log: (level, fields, message) => app.log[level](fields, message),
  });
  app.decorate('plans', { store, jobs, pool });
  app.addHook('onReady', async () => {
    jobs.start();
  });
  app.addHook('onClose', async () => {
    const drained = await jobs.drain(options.shutdownGraceMs ?? 0);
    if (drained.finished + drained.requeued > 0) app.log.info(drained, 'plan queue drained');
    await pool.close();
    if (ownStore) store.close();
  });

  // authentication: every /v1 route needs a token when tokens are configured; GET (and POST /v1/checks, which
  // stores nothing) need `read`, everything else `write`
  const tokens = new ApiTokens(options.apiTokens ?? []);
  app.decorateRequest('principal', null);
  if (tokens.required) {
    app.addHook('onRequest', async (request, reply) => {
      // the route matched, not the raw URL: a percent-encoded path reaches the same route and needs the same token
      const route = request.routeOptions.url;
      if (route === undefined || !route.startsWith('/v1/')) return;
      const principal = tokens.identify(request.headers.authorization);
      if (principal === null) {
        reply.header('www-authenticate', 'Bearer realm="die-motion-planner"');
        const sent =
          request.headers.authorization === undefined
            ? 'carries no token'
            : 'carries a token the service does not know';
        return send(reply, request.id, 'unauthorized', `The request ${sent}: send Authorization: Bearer <token>.`);
      }
      request.principal = principal;
      const reads = request.method === 'GET' || request.method === 'HEAD' || route === '/v1/checks';
      if (!reads && principal.scope !== 'write') {
        return send(
          reply,
          request.id,
          'forbidden',
          `The token "${principal.name}" has the read scope; ${request.method} ${shorten(request.url.split('?')[0] ?? '')} needs write.`,
        );
      }
    });
  }

  app.setNotFoundHandler((request, reply) => {
    send(reply, request.id, 'not_found', `Nothing at ${request.method} ${shorten(request.url)}.`);
  });
  app.setErrorHandler((error: FastifyError, request, reply) => {
    if (hasZodFastifySchemaValidationErrors(error)) {
      const details: ErrorDetail[] = error.validation.map((v) => ({
        path: formatInstancePath(v.instancePath),
        message: v.message ?? 'invalid value',
      }));
      if (error.validationContext !== undefined && error.validationContext !== 'body') {
        return send(
          reply,
          request.id,
          'malformed_request',
          `The request's ${error.validationContext === 'querystring' ? 'query' : error.validationContext} does not match what the route accepts.`,
          details,
        );
      }
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
      case 'RATE_LIMITED':
        return send(reply, request.id, 'rate_limited', error.message);
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

  const perMinute = options.rateLimitPerMinute ?? 0;
  if (perMinute > 0) {
    const windowMs = options.rateLimitWindowMs ?? 60_000;
    await app.register(fastifyRateLimit, {
      max: perMinute,
      timeWindow: windowMs,
      keyGenerator: (request) => (request.principal ? `token:${request.principal.name}` : `ip:${request.ip}`),
      errorResponseBuilder: (_request, context) => {
        const wait = Math.max(1, Math.ceil(context.ttl / 1000));
        return Object.assign(
          new Error(`More than ${perMinute} requests in ${windowMs / 1000} s; try again in ${wait} s.`),
          { statusCode: 429, code: 'RATE_LIMITED' },
        );
      },
    });
  }
  // security headers; no CORS: browsers on other origins cannot call the API. The service speaks plain HTTP (TLS,
  // where wanted, ends at a proxy), so no HSTS and no upgrade of a page's requests to https
  // (helmet's headers are worked out once and set on every response; the plugin stays for reply.helmet())
  await app.register(fastifyHelmet, { global: false, ...HELMET_OPTIONS });
  const security = securityHeaders(HELMET_OPTIONS);
  app.addHook('onRequest', (_request, reply, done) => {
    for (const [name, value] of security) reply.raw.setHeader(name, value);
    done();
  });

  registerComponentSchemas();
  // error and not-found handlers first: plugins registered after them inherit them
  await app.register(fastifySwagger, {
    openapi: openapiInfo(SERVICE_VERSION),
    transform: jsonSchemaTransform,
    transformObject: (document) => completeOpenapi(jsonSchemaTransformObject(document)),
  });
  // the API reference page; its own content security policy, with the inline styles swagger-ui sets
  await app.register(fastifySwaggerUi, {
    routePrefix: '/docs',
    staticCSP: true,
    transformStaticCSP: (header) =>
      header.replace("style-src 'self' https:", "style-src 'self' https: 'unsafe-inline'"),
    uiConfig: { deepLinking: true },
  });

  // downloads of a plan (/v1/plans/{id}/…): unknown → 404, queued or running → 409 not_ready; finished → ETag,
  // If-None-Match → 304, Link to the plan; the route then sends the file from memory, the store or a worker
  // (DownloadSource), never rendering on this thread
  const downloads = new DownloadSource(store, pool);
  // in their own scope, so no other route runs these hooks
  const downloadRoutes = async (scope: typeof app) => {
    scope.addHook('preHandler', async (request, reply) => {
      if (request.method !== 'GET' && request.method !== 'HEAD') return;
      const id = (request.params as { id?: string }).id ?? '';
      const entry = store.entry(id);
      if (!entry) return send(reply, request.id, 'not_found', `No plan with id ${id}.`);
      if (entry.status === 'queued' || entry.status === 'running') {
        reply.header('retry-after', String(POLL_AFTER_S));
        return send(
          reply,
          request.id,
          'not_ready',
          `Plan ${id} is ${entry.status}: its downloads exist once it is finished. GET /v1/plans/${id} shows its progress.`,
        );
      }
      // the resource as asked for (path and query), not the route's pattern: each part of plates/{part}.dxf is its own
      const asked = request.url.slice(request.url.indexOf('/', '/v1/plans/'.length) + 1);
      const etag = planEtag(entry, asked);
      reply.header('link', `</v1/plans/${id}>; rel="describedby"`);
      if (etag) {
        reply.header('etag', etag);
        reply.header('cache-control', 'private, no-cache');
        // a tag this service sent names a download it answered 200 (errors carry none, below); `*` matches only a
        // download that exists, so it is judged once the route has answered
        const ifNoneMatch = request.headers['if-none-match'];
        if (matchesEtag(ifNoneMatch, etag) && !namesAnyTag(ifNoneMatch)) return reply.code(304).send();
      }
    });
    scope.addHook('onSend', (request, reply, payload, done) => {
      if (reply.statusCode === 304) return done(null, payload);
      if (reply.statusCode !== 200) {
        // a refusal (no motion, no such part, a bad query) is not a representation to keep or revalidate
        reply.removeHeader('etag');
        reply.removeHeader('cache-control');
        return done(null, payload);
      }
      if (!namesAnyTag(request.headers['if-none-match'])) return done(null, payload);
      reply.code(304);
      done(null, '');
    });
    await scope.register(planDownloadRoutes(downloads));
    await scope.register(planDrawingRoutes(downloads));
  };
  const rateLimitOff = { rateLimit: false } as const;
  await app.register(healthRoutes({ store, jobs, pool, config: rateLimitOff }));
  await app.register(checkRoutes(pool));
  await app.register(
    planRoutes({ store, jobs, pool, pollAfterS: POLL_AFTER_S, onDeleted: (id) => downloads.forget(id) }),
  );
  await app.register(downloadRoutes);
  app.get('/openapi.json', { schema: { hide: true } }, async () => app.swagger());
  await app.register(pageRoutes);
  return app;
}

declare module 'fastify' {
  interface FastifyInstance {
    /** The plan store, queue and worker pool of this app. */
    plans: { store: PlanStore; jobs: PlanJobs; pool: WorkerPool };
  }
}

/** The part of a reply `send` uses. */
type ReplyLike = { code(status: number): { send(body: unknown): unknown } };

function send(
  reply: ReplyLike | FastifyReply,
  requestId: string,
  code: ErrorCode,
  message: string,
  details: readonly ErrorDetail[] = [],
) {
  return (reply as ReplyLike)
    .code(ERROR_CATALOGUE[code].status)
    .send({ ...errorBody(code, message, details), request_id: requestId });
}

/** True when an If-None-Match header lists `*` (any current representation). */
function namesAnyTag(ifNoneMatch: string | string[] | undefined): boolean {
  if (ifNoneMatch === undefined) return false;
  const text = Array.isArray(ifNoneMatch) ? ifNoneMatch.join(',') : ifNoneMatch;
  return text.split(',').some((t) => t.trim() === '*');
}

/** A URL as it may appear in a message: at most 80 characters. */
function shorten(url: string): string {
  return url.length > 80 ? `${url.slice(0, 77)}...` : url;
}
