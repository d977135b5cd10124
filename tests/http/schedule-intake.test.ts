import { readFileSync } from 'node:fs';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { checkBody, planBody, readSchedule } from '../../src/http/schedule-intake.js';
import { ScheduleWire } from '../../src/http/schedule-schema.js';
import { toSchedule } from '../../src/http/to-schedule.js';
import { scheduleHash, unpackJson } from '../../src/store/index.js';
import { scheduleAtVertexLimit } from '../support/large-schedule.js';
import { useTestApp } from '../support/test-app.js';

/**
 * Reading a posted schedule, as a worker does it from the body's text (src/http/schedule-intake.ts). References:
 * JSON, RFC 8259 (§8.1: a parser may ignore a byte order mark); gzip, RFC 1952 §2.3.1 (every member starts with the
 * bytes 1f 8b and compression method 8, deflate); prototype poisoning through a "__proto__" key, the reason the
 * framework's JSON parser (secure-json-parse) refuses such keys.
 */
const demoText = readFileSync(new URL('../../fixtures/demo-edging-strip.json', import.meta.url), 'utf8');

describe('readSchedule', () => {
  it('reads the demo as the wire format and the domain mapping read it, noting the field no stage reads yet', () => {
    const read = readSchedule(demoText, 'plans');
    const mapped = toSchedule(ScheduleWire.parse(JSON.parse(demoText)));
    if (!read.ok || !mapped.ok) throw new Error('the demo must read');
    expect(read.schedule).toEqual(mapped.schedule);
    expect(read.requestFindings.map((f) => [f.code, f.severity])).toEqual([['UNUSED_FIELD', 'info']]);
    expect(read.requestFindings[0]?.message).toContain('plates.thickness_mm');
  });

  it('ignores a UTF-8 byte order mark (RFC 8259 §8.1)', () => {
    expect(readSchedule(`\uFEFF${demoText}`, 'checks').ok).toBe(true);
  });

  it('refuses text that is not JSON, and a "__proto__" key at any depth, as malformed_json', () => {
    for (const text of ['{"name": "a",}', '{"stations": [', 'NaN', '{"process": {"__proto__": {"x": 1}}}']) {
      const read = readSchedule(text, 'checks');
      expect(read).toMatchObject({ ok: false, code: 'malformed_json', details: [] });
    }
  });

  it('names every field the wire format refuses by its path, stations[i].orifice.outer[j] style', () => {
    const body = JSON.parse(demoText);
    body.stations[1].orifice.outer[2] = [1, 'x'];
    body.process.line_speed_m_per_min = -1;
    const read = readSchedule(JSON.stringify(body), 'checks');
    if (read.ok) throw new Error('must be refused');
    expect(read.code).toBe('invalid_schedule');
    expect(read.details.map((d) => d.path).sort()).toEqual([
      'process.line_speed_m_per_min',
      'stations[1].orifice.outer[2][1]',
    ]);
    expect(readSchedule('[]', 'checks')).toMatchObject({ ok: false, details: [{ path: '(body)' }] });
  });

  it('warns of unknown fields and notes plan-only fields on a check', () => {
    const body = { ...JSON.parse(demoText), limits: { ...JSON.parse(demoText).limits, min_wall: 2 } };
    const read = readSchedule(JSON.stringify(body), 'checks');
    if (!read.ok) throw new Error('must read');
    expect(read.requestFindings.map((f) => f.code)).toContain('UNKNOWN_FIELD');
    expect(read.requestFindings.find((f) => f.code === 'UNKNOWN_FIELD')?.message).toContain('limits.min_wall');
    expect(read.requestFindings.filter((f) => f.code === 'UNUSED_FIELD').length).toBeGreaterThan(0);
  });
});

describe('checkBody and planBody', () => {
  it('a check answers JSON text that parses to a report with cautions', () => {
    const answer = checkBody(demoText);
    if (!answer.ok) throw new Error('the demo must check');
    const report = JSON.parse(answer.reportJson);
    expect(report.stations).toHaveLength(answer.stations);
    expect(report.findings).toHaveLength(answer.findings);
    expect(report.cautions.length).toBeGreaterThan(0);
  });

  it('a plan gets its schedule packed as gzip (RFC 1952), unpacking to the schedule it hashed', () => {
    const taken = planBody(demoText);
    if (!taken.ok) throw new Error('the demo must be taken');
    expect([...taken.schedulePacked.subarray(0, 3)]).toEqual([0x1f, 0x8b, 8]);
    const schedule = unpackJson<Parameters<typeof scheduleHash>[0]>(taken.schedulePacked);
    expect(scheduleHash(schedule)).toBe(taken.scheduleHash);
    expect(taken.head).toEqual({ name: 'edging-strip-demo', material: 'PVC-U', dieTemperatureC: 190 });
  });

  it('a plan needs two stations and at most 20 m of boundary in all', () => {
    const one = { ...JSON.parse(demoText), stations: JSON.parse(demoText).stations.slice(0, 1) };
    expect(planBody(JSON.stringify(one))).toMatchObject({ ok: false, details: [{ path: 'stations' }] });
    const body = JSON.parse(demoText);
    // 300 stations of the demo strip, about 110 mm of boundary each: 33 m
    body.stations = Array.from({ length: 300 }, (_, i) => ({ ...body.stations[i % 4], position_m: i * 0.004 }));
    expect(planBody(JSON.stringify(body))).toMatchObject({ ok: false, code: 'plan_too_large' });
  });
});

describe('the service hands posted bodies to a worker', () => {
  const app = useTestApp({ settlePlans: false });

  it('checks and queues a schedule at the vertex limit (its bytes moved to the worker, not copied)', async () => {
    const text = scheduleAtVertexLimit();
    expect(text.length).toBeGreaterThan(2_500_000);
    const checked = await request(app().server).post('/v1/checks').set('content-type', 'application/json').send(text);
    expect(checked.status).toBe(200);
    expect(checked.body.stations).toHaveLength(40);
    // the ellipse x²/a² + y²/b² = 1 has area πab (to the polygon's 5,000-vertex chord error, under 1e-6 relative)
    expect(checked.body.stations[0].area_mm2).toBeCloseTo(Math.PI * 20 * 3, 1);
    const posted = await request(app().server).post('/v1/plans').set('content-type', 'application/json').send(text);
    expect(posted.status).toBe(202);
    expect(posted.body.cautions.length).toBeGreaterThan(0);
    const queued = await request(app().server).get(`/v1/plans/${posted.body.id}`);
    expect(queued.body.cautions).toEqual(posted.body.cautions);
    expect((await request(app().server).delete(`/v1/plans/${posted.body.id}`)).status).toBe(204);
  }, 120_000);

  it('small bodies (which share a pooled buffer) are copied, and an empty body is refused as empty', async () => {
    const tiny = await request(app().server).post('/v1/checks').set('content-type', 'application/json').send('{}');
    expect(tiny.status).toBe(400);
    expect(tiny.body.details.map((d: { path: string }) => d.path)).toContain('stations');
    const empty = await request(app().server).post('/v1/plans').set('content-type', 'application/json').send('');
    expect(empty.status).toBe(400);
    expect(empty.body.error).toBe('malformed_json');
  });
});
