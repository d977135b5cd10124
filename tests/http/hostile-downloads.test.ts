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
  });

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
