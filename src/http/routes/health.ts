import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { SERVICE_VERSION } from '../../version.js';
import { HealthWire } from '../report-schema.js';

/** `GET /healthz`: the process is up and answering. */
export const healthRoutes: FastifyPluginAsyncZod = async (app) => {
  app.get(
    '/healthz',
    { schema: { summary: 'Liveness check', tags: ['service'], response: { 200: HealthWire } } },
    async () => ({ status: 'ok' as const, version: SERVICE_VERSION }),
  );
};
