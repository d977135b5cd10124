import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { makeTestApp } from '../support/test-app.js';

describe('GET /healthz and GET /readyz', () => {
  it('readiness is 200 while store and pool answer and the queue takes plans, 503 once the queue stops (shutdown)', async () => {
    const app = await makeTestApp();
    const ready = await request(app.server).get('/readyz');
    expect(ready.status).toBe(200);
    expect(ready.body).toMatchObject({ status: 'ready', store: 'ok', accepting_plans: true, plans_queued: 0 });
    await app.plans.jobs.drain(0);
    const draining = await request(app.server).get('/readyz');
    expect(draining.status).toBe(503);
    expect(draining.body).toMatchObject({ status: 'not_ready', accepting_plans: false });
    // liveness stays: the process still answers
    expect((await request(app.server).get('/healthz')).body).toMatchObject({ status: 'ok' });
    await app.close();
  });
});
