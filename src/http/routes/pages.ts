import { createRequire } from 'node:module';
import { dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import fastifyStatic from '@fastify/static';
import type { FastifyPluginAsync } from 'fastify';

/** The review page's files: HTML, style sheet and browser modules (plain ES modules, no build step). */
export const WEB_ROOT = fileURLToPath(new URL('../../web/', import.meta.url));

/** uPlot's browser files as installed (served from node_modules: the page loads nothing from the network). */
const UPLOT_ROOT = dirname(createRequire(import.meta.url).resolve('uplot/dist/uPlot.esm.js'));

/**
 * The review page: `GET /` (the plan list, and posting a schedule) and `GET /plans/{id}` (one plan), and their static
 * files under `/web/` (uPlot under `/web/vendor/uplot/`). The pages are the same HTML for every plan and fetch what they
 * show from `/v1/…` in the browser, so a token travels as a Bearer header, never in a page. Scripts and styles are
 * same-origin files (no inline script), so a strict Content-Security-Policy holds. None of these routes is part of the
 * API description.
 */
export const pageRoutes: FastifyPluginAsync = async (app) => {
  await app.register(fastifyStatic, {
    root: WEB_ROOT,
    prefix: '/web/',
    schemaHide: true,
    index: false,
    // a file is read again when it changes; browsers check with ETag / Last-Modified
    cacheControl: true,
    maxAge: 0,
  });
  await app.register(fastifyStatic, {
    root: UPLOT_ROOT,
    prefix: '/web/vendor/uplot/',
    schemaHide: true,
    index: false,
    decorateReply: false,
    allowedPath: (path) => path === '/uPlot.esm.js' || path === '/uPlot.min.css',
  });
  app.get('/', { schema: { hide: true } }, (_request, reply) => reply.type('text/html').sendFile('plans.html'));
  app.get<{ Params: { id: string } }>('/plans/:id', { schema: { hide: true } }, (_request, reply) =>
    reply.type('text/html').sendFile('plan.html'),
  );
};
