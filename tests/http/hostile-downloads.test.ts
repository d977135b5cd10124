import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { fixture, useTestApp } from '../support/test-app.js';

/**
 * Downloads of unusual but valid plans: each download either answers 200 or refuses with a catalogued 409 that says
 * what to change, never a 5xx, and never a refusal the plan does not deserve.
 */
const testApp = useTestApp();
const get = (path: string) => request(testApp().server).get(path);

async function planId(schedule: Record<string, unknown>): Promise<string> {
  const created = await request(testApp().server)
    .post('/v1/plans')
    .set('content-type', 'application/json')
    .send(JSON.stringify(schedule));
  expect(created.status).toBe(202);
  return created.body.id as string;
}

describe('a 1 ms time step over a 10 km repeat (both ends of their ranges)', () => {
  let id = '';
  beforeAll(async () => {
    // 10 km at 2 m/min is 300 000 s: 300 million setpoint rows, far more than the simulation's 2000 steps
    id = await planId({
      ...fixture('demo-edging-strip'),
      process: { line_speed_m_per_min: 2, die_temperature_c: 190 },
      time_step_s: 0.001,
      repeat_length_m: 10_000,
    });
  }, 60_000);

  it('the plan is simulated on a coarser grid (capped), not left without its simulation', async () => {
    const plan = (await get(`/v1/plans/${id}`)).body;
    expect(plan.status).not.toBe('failed');
    expect(plan.simulation.capped).toBe(true);
    expect(plan.simulation.steps).toBeLessThanOrEqual(2000 + plan.stations.length);
    expect(plan.findings.map((f: { code: string }) => f.code)).not.toContain('MOTION_NOT_SIMULATED');
  });

  it('puller-speed.csv and motion.json answer 200; setpoints.csv refuses with table_too_large and says what to do', async () => {
    expect((await get(`/v1/plans/${id}/puller-speed.csv`)).status).toBe(200);
    expect((await get(`/v1/plans/${id}/motion.json`)).status).toBe(200);
    const setpoints = await get(`/v1/plans/${id}/setpoints.csv`);
    expect(setpoints.status).toBe(409);
    expect(setpoints.body.error).toBe('table_too_large');
    expect(setpoints.body.message).toMatch(/longer time_step_s, or download the cam table/);
    const cam = await get(`/v1/plans/${id}/cam-table.csv?points=10001`);
    expect(cam.status).toBe(200);
    expect(cam.text.trim().split('\n')).toHaveLength(10_002);
  });
});

describe('conditional requests for downloads that do not exist', () => {
  let failed = '';
  let done = '';
  beforeAll(async () => {
    const demo = fixture('demo-edging-strip') as { stations: Record<string, unknown>[] };
    // two stations of one shape: nothing moves, so no chain is fitted and the plan fails
    failed = await planId({ ...demo, stations: [demo.stations[0], { ...demo.stations[0], position_m: 1 }] });
    done = await planId(fixture('demo-edging-strip'));
  }, 60_000);

  it('a refusal carries no ETag, so no client keeps it to revalidate', async () => {
    for (const path of [
      `/v1/plans/${failed}/setpoints.csv`,
      `/v1/plans/${failed}/preview.svg`,
      `/v1/plans/${done}/plates/plate_99.dxf`,
      `/v1/plans/${done}/cam-table.csv?points=0`,
    ]) {
      const res = await get(path);
      expect(res.status).toBeGreaterThanOrEqual(400);
      expect(res.headers.etag).toBeUndefined();
    }
  });

  it('If-None-Match: * answers the refusal itself (409, 404, 400), not 304, for GET and HEAD alike', async () => {
    for (const [path, status] of [
      [`/v1/plans/${failed}/setpoints.csv`, 409],
      [`/v1/plans/${failed}/plates.dxf`, 409],
      [`/v1/plans/${done}/plates/plate_99.dxf`, 404],
      [`/v1/plans/${done}/cam-table.csv?points=0`, 400],
    ] as const) {
      const res = await get(path).set('if-none-match', '*');
      expect(res.status).toBe(status);
      expect(res.body.error).toBeDefined();
      const head = await request(testApp().server).head(path).set('if-none-match', '*');
      expect(head.status).toBe(status);
    }
  });

  it('If-None-Match: * or the ETag sent answers 304 for a download that exists, for GET and HEAD', async () => {
    const first = await get(`/v1/plans/${done}/setpoints.csv`);
    expect(first.status).toBe(200);
    for (const tag of ['*', first.headers.etag as string, `"elsewhere", ${first.headers.etag}`]) {
      const again = await get(`/v1/plans/${done}/setpoints.csv`).set('if-none-match', tag);
      expect(again.status).toBe(304);
      expect(again.text).toBe('');
      expect(again.headers.etag).toBe(first.headers.etag);
      const head = await request(testApp().server).head(`/v1/plans/${done}/setpoints.csv`).set('if-none-match', tag);
      expect(head.status).toBe(304);
    }
  });
});
