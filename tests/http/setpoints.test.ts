import { parse } from 'csv-parse/sync';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { fixture, useTestApp } from '../support/test-app.js';

const testApp = useTestApp();

/** Posts a schedule as a plan and returns its id. */
async function planId(schedule: Record<string, unknown>): Promise<string> {
  const created = await request(testApp().server)
    .post('/v1/plans')
    .set('content-type', 'application/json')
    .send(JSON.stringify(schedule));
  expect(created.status).toBe(202);
  return created.body.id as string;
}

const get = (path: string) => request(testApp().server).get(path);
/** Every motion download of a plan. */
const ALL_DOWNLOADS = [
  'setpoints.csv',
  'setpoints.json',
  'cam-table.csv',
  'cam-table.json',
  'puller-speed.csv',
  'puller-speed.json',
  'motion.json',
];
/** CSV text read back by an independent parser (csv-parse), numbers as numbers. */
const readCsv = (text: string): { header: string[]; rows: number[][] } => {
  const records = parse(text) as string[][];
  return { header: records[0]!, rows: records.slice(1).map((r) => r.map(Number)) };
};

describe('setpoint and cam-table downloads of the demo plan', () => {
  let id = '';
  beforeAll(async () => {
    // the demo with its puller at the 2 m/min line speed, so the rows are evenly timed by it (the demo's own puller
    // follows the area: those re-timed rows are tested in motion-downloads.test.ts)
    const demo = fixture('demo-edging-strip') as Record<string, Record<string, unknown>>;
    id = await planId({ ...demo, process: { ...demo.process, puller_follows_area: false } });
  });

  it('GET setpoints.csv is text/csv with the plan name as file name, header position_m,time_s,actuator_1_deg, then the puller speed, orifice area and draw-down', async () => {
    const res = await get(`/v1/plans/${id}/setpoints.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe('attachment; filename="edging-strip-demo-setpoints.csv"');
    expect(res.text.split('\n')[0]).toBe(
      'position_m,time_s,actuator_1_deg,puller_speed_m_per_min,orifice_area_mm2,draw_down_ratio',
    );
  });

  it('setpoints.csv read back with csv-parse equals the rows of setpoints.json, which carries units, law and cautions', async () => {
    const csv = readCsv((await get(`/v1/plans/${id}/setpoints.csv`)).text);
    const json = (await get(`/v1/plans/${id}/setpoints.json`)).body;
    expect(json.columns).toEqual(csv.header);
    expect(json.rows).toEqual(csv.rows);
    expect(json.units).toEqual({
      position_m: 'm',
      time_s: 's',
      actuator_1_deg: 'deg',
      puller_speed_m_per_min: 'm/min',
      orifice_area_mm2: 'mm²',
      draw_down_ratio: 'ratio',
    });
    expect(json.puller_follows_area).toBe(false);
    expect(json.plan_hash === null || /^[0-9a-f]{64}$/.test(json.plan_hash)).toBe(true);
    expect(json.law).toBe('cycloidal');
    expect(json.periodic).toBe(true);
    expect(json.schedule).toBe('edging-strip-demo');
    expect(json.time_step_s).toBe(0.05);
    expect(json.cautions.length).toBeGreaterThan(0);
  });

  it('setpoint rows: one per 0.05 s over one 1.5 m repeat at 2 m/min (45 s, 901 rows), positions strictly increasing, closing on itself', async () => {
    const { rows } = readCsv((await get(`/v1/plans/${id}/setpoints.csv`)).text);
    // 1.5 m / (2/60 m/s) = 45 s; 45 / 0.05 = 900 steps, so 901 rows with both ends
    expect(rows).toHaveLength(901);
    expect(rows[0]![0]).toBe(0);
    expect(rows.at(-1)![0]).toBeCloseTo(1.5, 9);
    expect(rows.at(-1)![1]).toBeCloseTo(45, 9);
    for (let i = 1; i < rows.length; i++) expect(rows[i]![0]).toBeGreaterThan(rows[i - 1]![0]!);
    expect(Math.abs(rows.at(-1)![2]! - rows[0]![2]!)).toBeLessThanOrEqual(1e-9);
  });

  it('the same plan gives a byte-identical CSV', async () => {
    const a = (await get(`/v1/plans/${id}/setpoints.csv`)).text;
    const b = (await get(`/v1/plans/${id}/setpoints.csv`)).text;
    expect(a).toBe(b);
    expect(a).not.toMatch(/NaN|e[+-]|Infinity/);
  });

  it('cam-table.csv: 101 strictly increasing master positions over one repeat, value and slope columns, closing on itself', async () => {
    const res = await get(`/v1/plans/${id}/cam-table.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe('attachment; filename="edging-strip-demo-cam-table.csv"');
    const { header, rows } = readCsv(res.text);
    expect(header).toEqual(['position_m', 'actuator_1_deg', 'actuator_1_deg_per_m']);
    expect(rows).toHaveLength(101);
    expect(rows[0]![0]).toBe(0);
    expect(rows.at(-1)![0]).toBe(1.5);
    for (let i = 1; i < rows.length; i++) expect(rows[i]![0]).toBeGreaterThan(rows[i - 1]![0]!);
    expect(Math.abs(rows.at(-1)![1]! - rows[0]![1]!)).toBeLessThanOrEqual(1e-9);
    // cycloidal, rest-to-rest: the cam is at rest (slope 0) at every station
    expect(Math.abs(rows[0]![2]!)).toBeLessThanOrEqual(1e-9);
  });

  it('the cam table sampled at the station positions reproduces the station values within 1e-6 °', async () => {
    // 101 points over 1.5 m are 0.015 m apart, so the stations at 0, 0.375, 0.75, 1.125 m fall on rows 0, 25, 50, 75
    const json = (await get(`/v1/plans/${id}/cam-table.json`)).body;
    const plan = (await get(`/v1/plans/${id}`)).body;
    const wireValues: number[] = plan.mechanism.actuators[0].station_values;
    expect(json.stations.map((s: { position_m: number }) => s.position_m)).toEqual([0, 0.375, 0.75, 1.125]);
    json.stations.forEach((s: { position_m: number; values: number[] }, i: number) => {
      const row = json.rows.find((r: number[]) => Math.abs(r[0]! - s.position_m) < 1e-12);
      expect(row).toBeDefined();
      expect(Math.abs(row[1] - s.values[0]!)).toBeLessThanOrEqual(1e-6);
      // the plan report rounds station values to 6 significant digits
      expect(s.values[0]).toBeCloseTo(wireValues[i]!, 3);
    });
    expect(json.periodic).toBe(true);
    expect(json.law).toBe('cycloidal');
    expect(json.units.actuator_1_deg_per_m).toBe('deg/m');
    expect(json.cautions.length).toBeGreaterThan(0);
  });

  it('cam-table.json equals cam-table.csv read back; ?points=2 gives the two ends; ?points=1 and ?points=x are 400', async () => {
    const csv = readCsv((await get(`/v1/plans/${id}/cam-table.csv?points=201`)).text);
    const json = (await get(`/v1/plans/${id}/cam-table.json?points=201`)).body;
    expect(json.points).toBe(201);
    expect(json.rows).toEqual(csv.rows);
    expect(readCsv((await get(`/v1/plans/${id}/cam-table.csv?points=2`)).text).rows.map((r) => r[0])).toEqual([0, 1.5]);
    for (const bad of ['1', '10002', 'x', '2.5']) {
      const res = await get(`/v1/plans/${id}/cam-table.csv?points=${bad}`);
      expect(res.status).toBe(400);
      expect(res.body.error).toBe('malformed_request');
    }
  });

  it('the plan states its motion: cycloidal, rest to rest, periodic, time step 0.05 s', async () => {
    const plan = (await get(`/v1/plans/${id}`)).body;
    expect(plan.motion).toEqual({ law: 'cycloidal', rest_to_rest: true, time_step_s: 0.05, periodic: true });
  });
});

describe('downloads that cannot be given', () => {
  it('an unknown id is 404 not_found from the catalogue, for every download', async () => {
    for (const file of ALL_DOWNLOADS) {
      const res = await get(`/v1/plans/00000000-0000-0000-0000-000000000000/${file}`);
      expect(res.status).toBe(404);
      expect(res.body.error).toBe('not_found');
    }
  });

  it('a failed plan without a mechanism (fixtures/fixed-part-disagrees.json) is 409 no_motion, for every download', async () => {
    const id = await planId(fixture('fixed-part-disagrees'));
    const plan = (await get(`/v1/plans/${id}`)).body;
    expect(plan.status).toBe('failed');
    expect(plan.motion).toBeNull();
    for (const file of ALL_DOWNLOADS) {
      const res = await get(`/v1/plans/${id}/${file}`);
      expect(res.status).toBe(409);
      expect(res.body.error).toBe('no_motion');
      expect(res.body.message).toContain('failed');
    }
  });
});
