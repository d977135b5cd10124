import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { fixture, useTestApp, waitForPlan } from '../support/test-app.js';

/**
 * The plan list, the Idempotency-Key and DELETE under unusual but valid use: answers stay those of the catalogue and
 * no plan is lost or left queued or running.
 */
const testApp = useTestApp({ settlePlans: false });
const server = () => testApp().server;
const demo = () => JSON.stringify(fixture('demo-edging-strip'));
const post = (body: string, key?: string) => {
  const req = request(server()).post('/v1/plans').set('content-type', 'application/json');
  return (key === undefined ? req : req.set('idempotency-key', key)).send(body);
};

describe('GET /v1/plans?created_since= with an offset that crosses the ends of the 4-digit years', () => {
  let id = '';
  beforeAll(async () => {
    id = (await post(demo())).body.id;
    await waitForPlan(testApp(), id);
  }, 60_000);

  it('9999-12-31T23:59:59-23:59 (year 10000 in UTC) lists no plan, not every plan', async () => {
    const res = await request(server()).get('/v1/plans').query({ created_since: '9999-12-31T23:59:59-23:59' });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ items: [], next_cursor: null });
  });

  it('0000-01-01T00:00:00+23:59 (year −1 in UTC) lists the plans as the year 0000 does', async () => {
    const res = await request(server()).get('/v1/plans').query({ created_since: '0000-01-01T00:00:00+23:59' });
    expect(res.status).toBe(200);
    expect(res.body.items.map((p: { id: string }) => p.id)).toContain(id);
  });
});

describe('GET /v1/plans with query parameters that are not one value of their kind', () => {
  it('each answers 400 malformed_request naming the parameter in a plain sentence', async () => {
    const limit = 'limit is a whole number of plans per page from 1 to 200, given once';
    for (const [query, path, message] of [
      ['limit=0', 'limit', limit],
      ['limit=1e9', 'limit', limit],
      ['limit=abc', 'limit', limit],
      ['limit=2.5', 'limit', limit],
      ['limit=', 'limit', limit],
      ['limit=1&limit=2', 'limit', limit],
      ['status=bogus', 'status', 'status is one of queued, running, done, incomplete or failed, given once'],
      [
        'status=done&status=failed',
        'status',
        'status is one of queued, running, done, incomplete or failed, given once',
      ],
      ['name=', 'name', 'name is empty: leave it out to list every name'],
      ['name=a&name=b', 'name', 'name is the schedule name as text, given once'],
      [
        'created_since=yesterday',
        'created_since',
        'created_since is an ISO 8601 time with its zone, e.g. 2026-12-02T10:00:00Z or 2026-12-02T11:00:00+01:00, given once',
      ],
      ['cursor=a&cursor=b', 'cursor', 'cursor is next_cursor of the previous page, given once'],
    ] as const) {
      const res = await request(server()).get(`/v1/plans?${query}`);
      expect(res.status, query).toBe(400);
      expect(res.body.error).toBe('malformed_request');
      expect(res.body.details, query).toEqual([{ path, message }]);
    }
  });
});

describe('Idempotency-Key and DELETE under concurrent use', () => {
  it('eight posts of one schedule with one key at once make one plan, answered 202 with its id every time', async () => {
    const answers = await Promise.all(Array.from({ length: 8 }, () => post(demo(), 'hostile-same-key')));
    expect(answers.map((a) => a.status)).toEqual(Array(8).fill(202));
    const ids = new Set(answers.map((a) => a.body.id));
    expect(ids.size).toBe(1);
    const [id] = [...ids] as string[];
    expect(answers.filter((a) => a.headers['idempotent-replayed'] === 'true')).toHaveLength(7);
    await waitForPlan(testApp(), id!);
  });

  it('DELETE of a running plan stops it (204); the next DELETE is 404, its downloads 404, and the queue goes on', async () => {
    const id = (await post(demo())).body.id as string;
    const next = (await post(demo())).body.id as string;
    for (let i = 0; i < 500 && testApp().plans.store.entry(id)?.status !== 'running'; i++) {
      await new Promise((resolve) => setTimeout(resolve, 10));
    }
    expect(testApp().plans.store.entry(id)?.status).toBe('running');
    expect((await request(server()).delete(`/v1/plans/${id}`)).status).toBe(204);
    const again = await request(server()).delete(`/v1/plans/${id}`);
    expect(again.status).toBe(404);
    expect(again.body.error).toBe('not_found');
    expect((await request(server()).get(`/v1/plans/${id}/setpoints.csv`)).status).toBe(404);
    await waitForPlan(testApp(), next);
    expect(['queued', 'running']).not.toContain(testApp().plans.store.entry(next)?.status);
    expect(testApp().plans.jobs.active).toBe(0);
  });
});
