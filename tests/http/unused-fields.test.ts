import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { fixture, useTestApp } from '../support/test-app.js';

const testApp = useTestApp();

const fieldsNamed = (findings: { code: string; message: string }[]) =>
  findings.filter((f) => f.code === 'UNUSED_FIELD').map((f) => f.message.split(' ')[2]);

describe('fields the format knows but a route does not use', () => {
  it('a check names the field no stage reads yet and those only a plan reads (motion fields included)', async () => {
    // the demo fixture sends every setting a line controller would (scripts/make-fixtures.ts); its
    // process.puller_follows_area is read by the check too (the station draw-down is taken at that puller speed), so it
    // is not named
    const res = await request(testApp().server)
      .post('/v1/checks')
      .set('content-type', 'application/json')
      .send(JSON.stringify(fixture('demo-edging-strip')));
    expect(res.status).toBe(200);
    expect(fieldsNamed(res.body.findings).sort()).toEqual(
      [
        'time_step_s',
        'actuators.max_speed_deg_per_s',
        'actuators.max_accel_deg_per_s2',
        'plates.thickness_mm',
        'limits.max_plates',
        'plates.pivot_hole_diameter_mm',
        'plates.ligament_mm',
        'plates.depth_mm',
        'actuators.count',
        'repeat_length_m',
      ].sort(),
    );
  });

  it('a plan names only the field no stage reads yet (plates.thickness_mm)', async () => {
    const created = await request(testApp().server)
      .post('/v1/plans')
      .set('content-type', 'application/json')
      .send(JSON.stringify(fixture('demo-edging-strip')));
    expect(created.status).toBe(202);
    const plan = (await request(testApp().server).get(created.headers.location as string)).body;
    // time_step_s and the actuator limits are read by the motion stage now: only the plate drawings' field is left
    expect(fieldsNamed(plan.findings)).toEqual(['plates.thickness_mm']);
  });
});
