import { Writable } from 'node:stream';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createLogger } from '../../src/logger.js';
import { makeTestApp } from '../support/test-app.js';
import { stripSchedule } from '../support/strip-schedule.js';

/**
 * API tokens (API_TOKENS="name:scope:token"): Bearer authentication (RFC 6750) on every /v1 route, read and write
 * scopes, open health routes, and tokens never in the log.
 */
const READ = 'read-token-0123456789abcdef';
const WRITE = 'write-token-0123456789abcdef';
let logged = '';
const sink = new Writable({
  write(chunk, _encoding, done) {
    logged += chunk;
    done();
  },
});
let app: Awaited<ReturnType<typeof makeTestApp>>;
beforeAll(async () => {
  app = await makeTestApp({
    logger: createLogger('trace', sink),
    apiTokens: [
      { name: 'mes', scope: 'read', token: READ },
      { name: 'line-1', scope: 'write', token: WRITE },
    ],
  });
});
afterAll(async () => {
  await app.close();
});

const schedule = JSON.stringify(stripSchedule(10, 'unnamed-schedule'));
const postPlan = (token?: string) => {
  const r = request(app.server).post('/v1/plans').set('content-type', 'application/json');
  return (token ? r.set('authorization', `Bearer ${token}`) : r).send(schedule);
};

describe('API tokens', () => {
  it('a /v1 request without a token is 401 unauthorized with WWW-Authenticate: Bearer', async () => {
    const res = await request(app.server).get('/v1/plans');
    expect(res.status).toBe(401);
    expect(res.body.error).toBe('unauthorized');
    expect(res.body.message).toMatch(/carries no token/);
    expect(res.headers['www-authenticate']).toMatch(/^Bearer/);
  });

  it('a percent-encoded path to a /v1 route needs a token too', async () => {
    const res = await request(app.server).get('/%761/plans');
    expect(res.status).toBe(401);
  });

  it('an unknown token, or a malformed header, is 401', async () => {
    for (const header of [`Bearer ${READ}x`, `Basic ${READ}`, 'Bearer', `Bearer ${READ} extra`]) {
      const res = await request(app.server).get('/v1/plans').set('authorization', header);
      expect(res.status).toBe(401);
      expect(res.body.message).toMatch(/a token the service does not know/);
    }
  });

  it('a read token may list and check but not post or delete a plan (403 forbidden, naming the scope)', async () => {
    const list = await request(app.server).get('/v1/plans').set('authorization', `Bearer ${READ}`);
    expect(list.status).toBe(200);
    const check = await request(app.server)
      .post('/v1/checks')
      .set({ 'content-type': 'application/json', authorization: `Bearer ${READ}` })
      .send(schedule);
    expect(check.status).toBe(200);
    const res = await postPlan(READ);
    expect(res.status).toBe(403);
    expect(res.body.error).toBe('forbidden');
    expect(res.body.message).toMatch(/"mes" has the read scope; POST \/v1\/plans needs write/);
    const del = await request(app.server).delete('/v1/plans/x').set('authorization', `Bearer ${READ}`);
    expect(del.status).toBe(403);
  });

  it('a write token posts a plan; the read token reads it', async () => {
    const res = await postPlan(WRITE);
    expect(res.status).toBe(202);
    const back = await request(app.server)
      .get(res.headers.location as string)
      .set('authorization', `bearer ${READ}`);
    expect(back.status).toBe(200);
  }, 60_000);

  it('health, readiness, the API description and its page stay open', async () => {
    for (const path of ['/healthz', '/readyz', '/openapi.json']) {
      expect((await request(app.server).get(path)).status).toBe(200);
    }
    const docs = await request(app.server).get('/docs/');
    expect(docs.status).toBe(200);
    expect(docs.headers['content-type']).toMatch(/text\/html/);
  });

  it('never writes a token to the log', async () => {
    await request(app.server).get('/v1/plans').set('authorization', `Bearer ${WRITE}`);
    await request(app.server).get('/v1/plans').set('authorization', `Bearer ${READ}nope`);
    expect(logged.length).toBeGreaterThan(100);
    expect(logged).not.toContain(READ);
    expect(logged).not.toContain(WRITE);
    app.log.info(
      { token: WRITE, headers: { authorization: `Bearer ${WRITE}` } },
      'what a careless log line would carry',
    );
    expect(logged).not.toContain(WRITE);
  });
});
