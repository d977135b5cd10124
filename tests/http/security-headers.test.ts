import fastifyHelmet from '@fastify/helmet';
import Fastify from 'fastify';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { HELMET_OPTIONS } from '../../src/app.js';
import { securityHeaders } from '../../src/http/security-headers.js';
import { useTestApp } from '../support/test-app.js';

const testApp = useTestApp();

/** The headers @fastify/helmet sets per request with the service's options (the reference). */
async function pluginHeaders(): Promise<Record<string, string>> {
  const app = Fastify();
  await app.register(fastifyHelmet, { global: true, ...HELMET_OPTIONS });
  app.get('/', async () => 'ok');
  const res = await app.inject({ method: 'GET', url: '/' });
  await app.close();
  const plain = Fastify();
  plain.get('/', async () => 'ok');
  const bare = await plain.inject({ method: 'GET', url: '/' });
  await plain.close();
  return Object.fromEntries(
    Object.entries(res.headers)
      .filter(([name]) => !(name in bare.headers))
      .map(([name, value]) => [name, String(value)]),
  );
}

describe('security headers worked out once', () => {
  it('securityHeaders(HELMET_OPTIONS) gives exactly the headers @fastify/helmet sets on every request', async () => {
    const reference = await pluginHeaders();
    const once = Object.fromEntries(securityHeaders(HELMET_OPTIONS).map(([n, v]) => [n.toLowerCase(), v]));
    expect(Object.keys(reference).length).toBeGreaterThan(8);
    expect(once).toEqual(reference);
  });

  it('the service sends them on an API read, a 404 and the review page', async () => {
    const reference = await pluginHeaders();
    for (const path of ['/healthz', '/v1/plans/unknown', '/']) {
      const res = await request(testApp().server).get(path);
      for (const [name, value] of Object.entries(reference)) expect(res.headers[name], `${path} ${name}`).toBe(value);
    }
  });
});
