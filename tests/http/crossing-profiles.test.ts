import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { useTestApp } from '../support/test-app.js';

const testApp = useTestApp();

const post = (route: string, body: unknown) =>
  request(testApp().server).post(route).set('content-type', 'application/json').send(JSON.stringify(body));

/** The see-saw of issue 14: a 40 × 8 mm strip whose top corners sit at 8 ∓ t and 8 ± t, three stations. */
function seeSaw(t: number, movingSpan?: unknown) {
  const station = (i: number, tilt: number) => {
    const top: number[][] = [];
    for (let k = 80; k >= 0; k--) top.push([k / 2, 8 + (tilt * (k / 2 - 20)) / 20]);
    return { position_m: i * 0.5, orifice: { outer: [[0, 0], [40, 0], ...top] } };
  };
  return {
    name: 'see-saw',
    ...(movingSpan ? { moving_span: movingSpan } : {}),
    stations: [station(0, t), station(1, 0), station(2, -t)],
  };
}

const spanFindings = (findings: { code: string }[]) =>
  findings.filter((f) => f.code === 'SPAN_NOT_RECONCILED' || f.code === 'SPAN_UNKNOWN');

describe('crossing station profiles over HTTP', () => {
  it('checks the see-saw strip with its span from corner to corner', async () => {
    const res = await post('/v1/checks', seeSaw(0.25));
    expect(res.status).toBe(200);
    expect(spanFindings(res.body.findings)).toEqual([]);
    // constructed analytically: station i's top runs from (0, 8 − t_i) to (40, 8 + t_i), t = 0.25, 0, −0.25
    [0.25, 0, -0.25].forEach((t, i) => {
      const span = res.body.stations[i].moving_span;
      expect(span.start_mm[0]).toBeCloseTo(0, 3);
      expect(span.start_mm[1]).toBeCloseTo(8 - t, 3);
      expect(span.end_mm[0]).toBeCloseTo(40, 3);
      expect(span.end_mm[1]).toBeCloseTo(8 + t, 3);
    });
  });

  it('plans the see-saw strip without a span error', async () => {
    const created = await post('/v1/plans', seeSaw(0.25));
    expect(created.status).toBe(202);
    const res = await request(testApp().server).get(created.headers.location as string);
    expect(res.status).toBe(200);
    expect(res.body.error ?? '').not.toMatch(/span/i);
    expect(spanFindings(res.body.findings)).toEqual([]);
  });

  it('plans the see-saw strip with the explicit span of the issue without a span error', async () => {
    const created = await post('/v1/plans', seeSaw(0.25, { start: [0, 8], end: [40, 8] }));
    expect(created.status).toBe(202);
    const res = await request(testApp().server).get(created.headers.location as string);
    expect(res.body.error ?? '').not.toMatch(/span/i);
    expect(spanFindings(res.body.findings)).toEqual([]);
    expect(res.body.findings.map((f: { code: string }) => f.code)).not.toContain('SPAN_DIFFERS_OUTSIDE');
  });

  it('refuses an explicit span end off a station boundary with 400 naming moving_span.end', async () => {
    // constructed: (40, 12) is 3.75 mm above the highest right-hand corner (8.25 mm)
    const res = await post('/v1/checks', seeSaw(0.25, { start: [0, 8], end: [40, 12] }));
    expect(res.status).toBe(400);
    expect(res.body.error).toBe('invalid_schedule');
    expect(res.body.details).toHaveLength(1);
    expect(res.body.details[0].path).toBe('moving_span.end');
    expect(res.body.details[0].message).toMatch(/lies 4.25 mm from the boundary of station 2.*within 1 mm/);
  });

  it('warns when stations differ outside an explicit span', async () => {
    const res = await post('/v1/checks', seeSaw(0.25, { start: [10, 8], end: [30, 8] }));
    expect(res.status).toBe(200);
    const f = res.body.findings.find((x: { code: string }) => x.code === 'SPAN_DIFFERS_OUTSIDE');
    expect(f.severity).toBe('warning');
    expect(f.message).toMatch(/moving_span\.start or end/);
  });
});
