import { parse } from 'csv-parse/sync';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { fixture, useTestApp, waitForPlan } from '../support/test-app.js';
import { stripSchedule } from '../support/strip-schedule.js';

/**
 * Plans as background jobs over HTTP, end to end on the demo (fixtures/demo-edging-strip.json): 202 with Location
 * before any planning, poll, download, read back; ETag and 304 (RFC 9110 §13.1.2); listing, deletion, Idempotency-Key.
 */
const testApp = useTestApp({ settlePlans: false });
const server = () => testApp().server;

const post = (body: unknown, headers: Record<string, string> = {}) =>
  request(server())
    .post('/v1/plans')
    .set({ 'content-type': 'application/json', ...headers })
    .send(typeof body === 'string' ? body : JSON.stringify(body));

const tiny = (h: number, name = 'tiny-strip') => stripSchedule(h, name);

describe('POST /v1/plans queues; GET shows the job, then the plan', () => {
  it('answers 202 with Location, schedule hash and cautions before planning; polls to done; downloads the CSV and reads it back', async () => {
    const created = await post(fixture('demo-edging-strip'));
    expect(created.status).toBe(202);
    expect(created.body.status).toMatch(/^(queued|running)$/);
    expect(created.headers.location).toBe(`/v1/plans/${created.body.id}`);
    expect(created.body.location).toBe(created.headers.location);
    expect(created.body.schedule_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(created.body.cautions.length).toBeGreaterThan(3);
    expect(created.headers['retry-after']).toBe('1');

    const early = await request(server()).get(created.headers.location as string);
    expect(early.status).toBe(200);
    if (early.body.status !== 'done') {
      expect(early.body).toMatchObject({ stations: [], mechanism: null, plan_hash: null });
      expect(early.body.cautions.length).toBeGreaterThan(3);
      const download = await request(server()).get(`${created.headers.location}/setpoints.csv`);
      expect(download.status).toBe(409);
      expect(download.body.error).toBe('not_ready');
      expect(download.headers['retry-after']).toBe('1');
    }

    let plan = early.body;
    for (let i = 0; i < 600 && (plan.status === 'queued' || plan.status === 'running'); i++) {
      await new Promise((r) => setTimeout(r, 50));
      plan = (await request(server()).get(created.headers.location as string)).body;
    }
    expect(plan.status).toBe('done');
    expect(plan.schedule_hash).toBe(created.body.schedule_hash);
    expect(plan.plan_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(plan.stations).toHaveLength(4);
    expect(plan.finished_at >= plan.started_at).toBe(true);

    const csv = await request(server()).get(`${created.headers.location}/setpoints.csv`);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-disposition']).toBe('attachment; filename="edging-strip-demo-setpoints.csv"');
    expect(csv.headers['x-cautions']).toMatch(/HOT_MELT/);
    expect(csv.headers.link).toBe(`<${created.headers.location}>; rel="describedby"`);
    // sent again from memory: the same bytes and headers
    const again = await request(server()).get(`${created.headers.location}/setpoints.csv`);
    expect(again.text).toBe(csv.text);
    for (const h of ['content-type', 'content-disposition', 'etag', 'x-cautions'])
      expect(again.headers[h]).toBe(csv.headers[h]);
    const rows = parse(csv.text) as string[][];
    expect(rows[0]!.slice(0, 3)).toEqual(['position_m', 'time_s', 'actuator_1_deg']);
    expect(rows.length).toBeGreaterThan(10);

    // a JSON download the route names no file for gets one from the schedule's name
    const json = await request(server()).get(`${created.headers.location}/setpoints.json`);
    expect(json.headers['content-disposition']).toBe('attachment; filename="edging-strip-demo-setpoints.json"');
  }, 60_000);

  it('gives a finished plan and its downloads an ETag: If-None-Match answers 304 with no body, another tag 200', async () => {
    const { id } = (await post(tiny(10))).body;
    await waitForPlan(testApp(), id);
    const first = await request(server()).get(`/v1/plans/${id}`);
    const etag = first.headers.etag as string;
    expect(etag).toMatch(/^"[0-9a-f]{32}-[0-9a-f]{12}"$/);
    const again = await request(server()).get(`/v1/plans/${id}`).set('if-none-match', etag);
    expect(again.status).toBe(304);
    expect(again.text ?? '').toBe('');
    expect((await request(server()).get(`/v1/plans/${id}`).set('if-none-match', '"other"')).status).toBe(200);

    const cam = await request(server()).get(`/v1/plans/${id}/cam-table.csv?points=11`);
    const camTag = cam.headers.etag as string;
    expect(camTag).not.toBe(etag);
    expect(
      (await request(server()).get(`/v1/plans/${id}/cam-table.csv?points=11`).set('if-none-match', camTag)).status,
    ).toBe(304);
    // another query is another resource, another tag
    const other = await request(server()).get(`/v1/plans/${id}/cam-table.csv?points=12`).set('if-none-match', camTag);
    expect(other.status).toBe(200);
  }, 60_000);

  it('lists plans newest first with filters and paging; a bad filter is a 400 naming the field', async () => {
    const ids: string[] = [];
    for (const h of [9, 11, 12]) ids.push((await post(tiny(h, 'listed-strip'))).body.id);
    for (const id of ids) await waitForPlan(testApp(), id);
    const page1 = await request(server()).get('/v1/plans?name=listed-strip&limit=2');
    expect(page1.status).toBe(200);
    expect(page1.body.items.map((p: { id: string }) => p.id)).toEqual([ids[2], ids[1]]);
    expect(page1.body.items[0].location).toBe(`/v1/plans/${ids[2]}`);
    const page2 = await request(server()).get(`/v1/plans?name=listed-strip&limit=2&cursor=${page1.body.next_cursor}`);
    expect(page2.body.items.map((p: { id: string }) => p.id)).toEqual([ids[0]]);
    expect(page2.body.next_cursor).toBeNull();
    const done = await request(server()).get('/v1/plans?status=done&created_since=2000-01-01T00:00:00Z&limit=200');
    expect(done.body.items.every((p: { status: string }) => p.status === 'done')).toBe(true);
    const future = await request(server()).get('/v1/plans?created_since=2999-01-01T00:00:00Z');
    expect(future.body.items).toEqual([]);

    const bad = await request(server()).get('/v1/plans?status=finished&limit=0');
    expect(bad.status).toBe(400);
    expect(bad.body.error).toBe('malformed_request');
    expect(bad.body.details.map((d: { path: string }) => d.path).sort()).toEqual(['limit', 'status']);
    const badCursor = await request(server()).get('/v1/plans?cursor=nonsense');
    expect(badCursor.status).toBe(400);
    expect(badCursor.body.details[0].path).toBe('cursor');
  }, 60_000);

  it('deletes a plan (204), after which it and its downloads are 404', async () => {
    const { id } = (await post(tiny(13))).body;
    await waitForPlan(testApp(), id);
    expect((await request(server()).delete(`/v1/plans/${id}`)).status).toBe(204);
    expect((await request(server()).get(`/v1/plans/${id}`)).status).toBe(404);
    expect((await request(server()).get(`/v1/plans/${id}/setpoints.csv`)).status).toBe(404);
    expect((await request(server()).delete(`/v1/plans/${id}`)).status).toBe(404);
  }, 60_000);

  it('deletes a running plan: it stops and is gone', async () => {
    const { id } = (await post(fixture('crowned-edging-strip'))).body;
    const started = Date.now();
    while (testApp().plans.store.entry(id)?.status !== 'running' && Date.now() - started < 30_000) {
      await new Promise((r) => setTimeout(r, 10));
    }
    expect((await request(server()).delete(`/v1/plans/${id}`)).status).toBe(204);
    expect(testApp().plans.jobs.active).toBe(0);
    expect((await request(server()).get(`/v1/plans/${id}`)).status).toBe(404);
  }, 60_000);
});

describe('Idempotency-Key', () => {
  it('the same key with the same schedule (any formatting) returns the first plan; another schedule is 422', async () => {
    const key = `key-${Date.now()}`;
    const first = await post(tiny(14), { 'idempotency-key': key });
    expect(first.status).toBe(202);
    const spaced = JSON.stringify(tiny(14), null, 2);
    const again = await post(spaced, { 'idempotency-key': key });
    expect(again.status).toBe(202);
    expect(again.body.id).toBe(first.body.id);
    expect(again.headers.location).toBe(first.headers.location);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body.schedule_hash).toBe(first.body.schedule_hash);

    const conflict = await post(tiny(15), { 'idempotency-key': key });
    expect(conflict.status).toBe(422);
    expect(conflict.body.error).toBe('idempotency_conflict');
    expect(conflict.body.message).toContain(first.body.id);

    const bad = await post(tiny(14), { 'idempotency-key': 'x'.repeat(200) });
    expect(bad.status).toBe(400);
    expect(bad.body.details[0].path).toBe('idempotency-key');
    await waitForPlan(testApp(), first.body.id);
  }, 60_000);
});

describe('bad input to the plan routes', () => {
  const cases: [string, () => request.Test, number, string, string | null][] = [
    ['malformed JSON', () => post('{"stations": [', {}), 400, 'malformed_json', null],
    ['a wrong type', () => post({ stations: 'many' }), 400, 'invalid_schedule', 'stations'],
    [
      'too many vertices in a ring',
      () =>
        post({
          stations: [0, 1].map((p) => ({
            position_m: p,
            orifice: {
              outer: Array.from({ length: 5001 }, (_, i) => [Math.cos(i / 800) * 20, Math.sin(i / 800) * 20]),
            },
          })),
        }),
      400,
      'invalid_schedule',
      'stations[0].orifice.outer',
    ],
    [
      'an unknown id',
      () => request(server()).get('/v1/plans/00000000-0000-0000-0000-000000000000'),
      404,
      'not_found',
      null,
    ],
    ['an unknown id to download', () => request(server()).get('/v1/plans/nope/cam-table.csv'), 404, 'not_found', null],
  ];
  for (const [what, send, status, code, path] of cases) {
    it(`${what} → ${status} ${code}${path ? ` at ${path}` : ''}`, async () => {
      const res = await send();
      expect(res.status).toBe(status);
      expect(res.body.error).toBe(code);
      expect(res.body.message.length).toBeGreaterThan(10);
      expect(res.body.request_id).toBeTruthy();
      if (path) expect(res.body.details.map((d: { path: string }) => d.path)).toContain(path);
      expect(JSON.stringify(res.body)).not.toMatch(/at .*\.(ts|js):\d+/);
    });
  }
});

describe('load', () => {
  it('50 plans posted at once are all accepted and all finish', async () => {
    const posts = await Promise.all(Array.from({ length: 50 }, (_, i) => post(tiny(8.5 + i * 0.1, 'fifty'))));
    expect(posts.map((r) => r.status)).toEqual(Array(50).fill(202));
    for (const r of posts) await waitForPlan(testApp(), r.body.id, 120_000);
    const statuses = await Promise.all(posts.map((r) => request(server()).get(r.headers.location as string)));
    for (const s of statuses) expect(['done', 'incomplete', 'failed']).toContain(s.body.status);
    expect(new Set(posts.map((r) => r.body.id)).size).toBe(50);
  }, 180_000);

  it('/healthz stays fast while a long plan runs: median under 50 ms, none over 1 s (a plan on the request thread holds it for seconds)', async () => {
    const { id } = (await post(fixture('crowned-edging-strip'))).body;
    const t0 = Date.now();
    while (testApp().plans.store.entry(id)?.status !== 'running' && Date.now() - t0 < 30_000) {
      await new Promise((r) => setTimeout(r, 10));
    }
    const address = await testApp().listen({ host: '127.0.0.1', port: 0 });
    const times: number[] = [];
    for (let i = 0; i < 200; i++) {
      const t = performance.now();
      const res = await fetch(`${address}/healthz`);
      await res.text();
      times.push(performance.now() - t);
      expect(res.status).toBe(200);
    }
    // the plan was computing in its worker all along
    expect(testApp().plans.store.entry(id)?.status).toBe('running');
    times.sort((a, b) => a - b);
    console.log(
      `/healthz while a plan runs: p50 ${times[99]!.toFixed(1)} ms, p99 ${times[197]!.toFixed(1)} ms, max ${times[199]!.toFixed(1)} ms`,
    );
    // the bench (npm run bench:http) states the p99; here the machine's other load must not fail the test
    expect(times[99]).toBeLessThan(50);
    expect(times[199]).toBeLessThan(1000);
    await request(server()).delete(`/v1/plans/${id}`);
  }, 60_000);
});
