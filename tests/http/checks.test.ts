import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { fixture, useTestApp } from '../support/test-app.js';

const testApp = useTestApp();

const post = (body: unknown) =>
  request(testApp().server).post('/v1/checks').set('content-type', 'application/json').send(JSON.stringify(body));

describe('POST /v1/checks', () => {
  it('measures every station of the demo schedule and carries the safety cautions', async () => {
    const res = await post(fixture('crowned-edging-strip'));
    expect(res.status).toBe(200);
    const stations = res.body.stations as Record<
      'area_mm2' | 'perimeter_mm' | 'min_wall_mm' | 'max_wall_mm' | 'draw_down_ratio',
      number
    >[];
    expect(stations).toHaveLength(4);
    // the flat station is a 40 × 8 rectangle: area and perimeter by hand (analytic)
    expect(stations[0]!.area_mm2).toBeCloseTo(320, 6);
    expect(stations[0]!.perimeter_mm).toBeCloseTo(96, 6);
    expect(stations[0]!.min_wall_mm).toBeCloseTo(8, 1);
    expect(stations[0]!.max_wall_mm).toBeCloseTo(8, 1);
    // the crown is an arc of radius 30 on the 40 mm chord: circular segment R²/2·(θ − sin θ), θ = 2·asin(20/30),
    // = 209.56 mm² over the 320 mm² base (analytic; the 0.5 mm polyline loses about 0.06 mm²)
    const theta = 2 * Math.asin(20 / 30);
    expect(stations[1]!.area_mm2).toBeCloseTo(320 + (900 / 2) * (theta - Math.sin(theta)), 0);
    for (const key of ['area_mm2', 'perimeter_mm', 'min_wall_mm', 'max_wall_mm', 'draw_down_ratio'] as const) {
      for (const s of stations) expect(Number.isFinite(s[key])).toBe(true);
    }
    // throughput from the first station at the middle of the draw-down range 1.0–1.3
    expect(res.body.throughput_source).toBe('first_station');
    expect(stations[0]!.draw_down_ratio).toBeCloseTo(1.15, 6);
    // mass balance: ADR scales with orifice area at constant throughput and line speed
    expect(stations[1]!.draw_down_ratio / stations[0]!.draw_down_ratio).toBeCloseTo(
      stations[1]!.area_mm2 / stations[0]!.area_mm2,
      4,
    );
    const codes = (res.body.cautions as { code: string; message: string }[]).map((c) => c.code);
    expect(codes).toEqual(expect.arrayContaining(['HOT_MELT', 'MELT_PRESSURE', 'PINCH_AND_SHEAR', 'STORED_ENERGY']));
    expect(codes).toContain('PVC_DECOMPOSITION');
    for (const c of res.body.cautions) expect(c.message).toMatch(/local codes and plant practice/);
    expect(res.headers['x-request-id']).toBeTruthy();
  });

  it('honours process.puller_follows_area on the demo: each station at the puller speed that holds 1.15', async () => {
    const res = await post(fixture('demo-edging-strip'));
    expect(res.status).toBe(200);
    expect(res.body.puller_follows_area).toBe(true);
    const stations = res.body.stations as Record<string, number>[];
    // area draw-down held at the middle of 1.0–1.3 by the puller, ṁ = ρ·A·v at constant throughput (docs/MODEL.md §3)
    for (const s of stations) {
      expect(s.draw_down_ratio).toBeCloseTo(1.15, 3);
      expect(s.puller_speed_m_per_min).toBe(s.puller_speed_for_target_m_per_min);
    }
    // the orifice grows from 280 to 356 mm², so the puller slows from 2 m/min by the same ratio
    expect(stations[0]!.puller_speed_m_per_min).toBeCloseTo(2, 3);
    expect(stations[2]!.puller_speed_m_per_min).toBeCloseTo((2 * stations[0]!.area_mm2!) / stations[2]!.area_mm2!, 2);
    const codes = (res.body.findings as { code: string; message: string }[]).map((f) => f.code);
    expect(codes.filter((c) => c.startsWith('DRAW_DOWN_'))).toEqual([]);
    // the check uses the field now, so it is not reported as one only a plan reads
    const unused = (res.body.findings as { code: string; message: string }[]).filter((f) => f.code === 'UNUSED_FIELD');
    expect(unused.some((f) => f.message.includes('puller_follows_area'))).toBe(false);
  });

  it('refuses a puller range whose min exceeds its max (400 naming limits.puller_speed_m_per_min)', async () => {
    const demo = fixture('demo-edging-strip') as Record<string, Record<string, unknown>>;
    const res = await post({ ...demo, limits: { ...demo.limits, puller_speed_m_per_min: { min: 5, max: 1 } } });
    expect(res.status).toBe(400);
    expect(res.body.details.map((d: { path: string }) => d.path)).toContain('limits.puller_speed_m_per_min');
  });

  it('flags the thin fin with its location', async () => {
    const res = await post(fixture('thin-wall'));
    expect(res.status).toBe(200);
    const thin = res.body.findings.find((f: { code: string }) => f.code === 'THIN_WALL');
    expect(thin).toBeDefined();
    expect(thin.severity).toBe('error');
    expect(thin.value).toBeCloseTo(1.0, 1);
    expect(thin.limit).toBe(1.5);
    // the fin stands at x 19.5–20.5, y 6–12
    expect(thin.at_mm[0]).toBeCloseTo(20, 0);
    expect(thin.at_mm[1]).toBeGreaterThan(6);
    expect(thin.at_mm[1]).toBeLessThan(12);
    expect(res.body.stations[0].thin_walls).toHaveLength(1);
  });

  it('measures a hollow profile with its hole', async () => {
    const res = await post(fixture('hollow-profile'));
    expect(res.status).toBe(200);
    // station 0: 40 × 12 less a 32 × 6 chamber = 480 − 192 = 288 mm²; perimeter 104 + 76 (analytic)
    expect(res.body.stations[0].area_mm2).toBeCloseTo(288, 6);
    expect(res.body.stations[0].perimeter_mm).toBeCloseTo(180, 6);
    // thinnest wall: the 3 mm floor and top (12 − 9) around the chamber
    expect(res.body.stations[0].min_wall_mm).toBeCloseTo(3, 1);
    expect(res.body.stations[0].moving_span.length_mm).toBeCloseTo(40, 6);
    // walls 3 mm (floor, top) and 4 mm (sides): power-law slit ratios with PVC-U n = 0.26 (docs/MODEL.md §3):
    // flow (4/3)^(2+1/n), pressure (4/3)^(1+2n) [derived]
    const s0 = res.body.stations[0];
    const n = 0.26;
    expect(s0.flow_imbalance_ratio).toBeCloseTo((s0.max_wall_mm / s0.min_wall_mm) ** (2 + 1 / n), 3);
    expect(s0.wall_pressure_ratio).toBeCloseTo((s0.max_wall_mm / s0.min_wall_mm) ** (1 + 2 * n), 4);
  });

  it('flags draw-down out of range with the puller speed that would hold it', async () => {
    const res = await post(fixture('draw-down-out-of-range'));
    expect(res.status).toBe(200);
    expect(res.body.throughput_source).toBe('request');
    const high = res.body.findings.filter((f: { code: string }) => f.code === 'DRAW_DOWN_HIGH');
    expect(high).toHaveLength(2);
    // 14 kg/h at 2 m/min: product area = ṁ/(ρv) = (14/3600)/(1400·2/60) m² = 83.33 mm²; ADR = 320/83.33 = 3.84
    expect(res.body.stations[0].draw_down_ratio).toBeCloseTo(3.84, 4);
  });

  it('reports stations whose die-body part disagrees', async () => {
    const res = await post(fixture('fixed-part-disagrees'));
    expect(res.status).toBe(200);
    const f = res.body.findings.find((x: { code: string }) => x.code === 'SPAN_NOT_RECONCILED');
    expect(f.severity).toBe('error');
    expect(f.message).toMatch(/separate places/);
    expect(res.body.stations[0].moving_span).toBeNull();
  });

  it('rejects a self-intersecting ring with the path of the ring', async () => {
    const res = await post(fixture('self-intersecting'));
    expect(res.status).toBe(400);
    expect(res.body.error).toBe('invalid_schedule');
    expect(res.body.details[0].path).toBe('stations[0].orifice.outer');
    expect(res.body.details[0].message).toMatch(/crosses itself/);
  });

  it('rejects malformed JSON with 400 malformed_json', async () => {
    const res = await request(testApp().server)
      .post('/v1/checks')
      .set('content-type', 'application/json')
      .send('{"stations": [');
    expect(res.status).toBe(400);
    expect(res.body.error).toBe('malformed_json');
  });

  it('rejects a body without stations, naming the field', async () => {
    const res = await post({ name: 'no stations' });
    expect(res.status).toBe(400);
    expect(res.body.error).toBe('invalid_schedule');
    expect(res.body.details).toContainEqual({ path: 'stations', message: expect.stringMatching(/stations/) });
  });

  it('rejects a negative line speed and a NaN position with their paths', async () => {
    const body = fixture('crowned-edging-strip') as {
      process: Record<string, unknown>;
      stations: { position_m: unknown }[];
    };
    body.process.line_speed_m_per_min = -2;
    body.stations[1]!.position_m = 'NaN';
    const res = await post(body);
    expect(res.status).toBe(400);
    const paths = res.body.details.map((d: { path: string }) => d.path);
    expect(paths).toContain('process.line_speed_m_per_min');
    expect(paths).toContain('stations[1].position_m');
    const speed = res.body.details.find((d: { path: string }) => d.path === 'process.line_speed_m_per_min');
    // range from FIELD_RANGES (common practice, no source)
    expect(speed.message).toMatch(/line_speed_m_per_min must lie within 0.01–200 m\/min/);
  });

  it('rejects a point with a missing coordinate', async () => {
    const res = await post({ stations: [{ position_m: 0, orifice: { outer: [[0, 0], [40], [40, 8]] } }] });
    expect(res.status).toBe(400);
    expect(res.body.details.some((d: { path: string }) => d.path.startsWith('stations[0].orifice.outer[1]'))).toBe(
      true,
    );
  });

  it('rejects stations out of order', async () => {
    const body = fixture('crowned-edging-strip') as { stations: { position_m: number }[] };
    body.stations[2]!.position_m = 0.1;
    const res = await post(body);
    expect(res.status).toBe(400);
    expect(res.body.details[0].path).toBe('stations[2].position_m');
    expect(res.body.details[0].message).toMatch(/increasing line position/);
  });

  it('answers 413 to an oversized body', async () => {
    const huge = JSON.stringify({ stations: [], padding: 'x'.repeat(6 * 1024 * 1024) });
    const res = await request(testApp().server).post('/v1/checks').set('content-type', 'application/json').send(huge);
    expect(res.status).toBe(413);
    expect(res.body.error).toBe('body_too_large');
  });

  it('answers 415 to a body that is not JSON', async () => {
    const res = await request(testApp().server).post('/v1/checks').set('content-type', 'text/plain').send('hello');
    expect(res.status).toBe(415);
  });
});

describe('service routes', () => {
  it('GET /healthz answers ok', async () => {
    const res = await request(testApp().server).get('/healthz');
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('ok');
  });

  it('unknown routes answer 404 from the catalogue', async () => {
    const res = await request(testApp().server).get('/v1/nothing-here');
    expect(res.status).toBe(404);
    expect(res.body.error).toBe('not_found');
  });
});

describe('rate limit', () => {
  it('answers 429 rate_limited with Retry-After past the limit, lets the client in again after the window, and never limits /healthz', async () => {
    const { makeTestApp } = await import('../support/test-app.js');
    // the limit per window as @fastify/rate-limit counts it; the window shortened to 1 s for the test
    const limited = await makeTestApp({ rateLimitPerMinute: 2, rateLimitWindowMs: 1000 });
    const get = () => request(limited.server).get('/v1/plans/no-such-plan');
    expect((await get()).status).toBe(404);
    expect((await get()).status).toBe(404);
    const third = await get();
    expect(third.status).toBe(429);
    expect(third.body.error).toBe('rate_limited');
    expect(third.body.request_id).toBeTruthy();
    expect(Number(third.headers['retry-after'])).toBeGreaterThan(0);
    for (let i = 0; i < 5; i++) expect((await request(limited.server).get('/healthz')).status).toBe(200);
    await new Promise((resolve) => setTimeout(resolve, 1100));
    expect((await get()).status).toBe(404);
    await limited.close();
  });
});

describe('unknown fields', () => {
  it('warns, with the path, about a field the format does not know instead of dropping it silently', async () => {
    const body = fixture('crowned-edging-strip') as {
      limits: Record<string, unknown>;
      stations: Record<string, unknown>[];
    };
    body.limits.min_wall = 3; // a typo for min_wall_mm
    body.stations[1]!.note = 'crown';
    const res = await post(body);
    expect(res.status).toBe(200);
    const unknown = res.body.findings.filter((f: { code: string }) => f.code === 'UNKNOWN_FIELD');
    expect(unknown.map((f: { message: string }) => f.message.split(' ')[2])).toEqual([
      'limits.min_wall',
      'stations[1].note',
    ]);
  });
});
