import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { fixture, useTestApp } from '../support/test-app.js';

const testApp = useTestApp();

describe('GET /v1/plans/{id} of a finished plan, sent as kept', () => {
  it('answers the stored report byte for byte with its ETag, 304 on If-None-Match, and 404 once deleted', async () => {
    const app = testApp();
    const created = await request(app.server).post('/v1/plans').send(fixture('demo-edging-strip'));
    const id = created.body.id as string;
    const first = await request(app.server).get(`/v1/plans/${id}`);
    const second = await request(app.server).get(`/v1/plans/${id}`);
    expect(first.status).toBe(200);
    expect(first.text).toBe(app.plans.store.report(id));
    expect(second.text).toBe(first.text);
    expect(first.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(first.headers.etag).toMatch(/^"[0-9a-f]{32}-[0-9a-f]{12}"$/);
    expect(second.headers.etag).toBe(first.headers.etag);
    expect(first.body.cautions.length).toBeGreaterThan(0);
    const again = await request(app.server).get(`/v1/plans/${id}`).set('if-none-match', String(first.headers.etag));
    expect(again.status).toBe(304);
    expect((await request(app.server).delete(`/v1/plans/${id}`)).status).toBe(204);
    const gone = await request(app.server).get(`/v1/plans/${id}`);
    expect(gone.status).toBe(404);
    expect(gone.body.error).toBe('not_found');
  }, 60_000);
});
