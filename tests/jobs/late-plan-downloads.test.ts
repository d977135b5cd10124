import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { fixture, useTestApp } from '../support/test-app.js';

// a time limit so short that every plan finishes past twice of it: stored at once, downloads rendered when asked
const testApp = useTestApp({ planTimeLimitS: 0.001 });

describe('a plan that finishes late stores its result at once', () => {
  it('has no stored downloads; the first one asked for renders them all in a worker and stores them', async () => {
    const app = testApp();
    const created = await request(app.server).post('/v1/plans').send(fixture('demo-edging-strip'));
    const id = created.body.id as string;
    expect(['done', 'incomplete', 'failed']).toContain(app.plans.store.entry(id)?.status);
    expect(app.plans.store.artifactNames(id)).toEqual([]);
    const res = await request(app.server).get(`/v1/plans/${id}/cam-table.csv`);
    expect([200, 409]).toContain(res.status);
    expect(res.headers['x-cautions']).toContain('HOT_MELT');
    const names = app.plans.store.artifactNames(id);
    expect(names).toContain('cam-table.csv');
    expect(names).toContain('plates.dxf?dimensions=hot');
  }, 60_000);
});
