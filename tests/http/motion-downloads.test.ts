import { parse } from 'csv-parse/sync';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { E, freeStations, WIDTH } from '../mechanise/known-linkage.js';
import { channelOrifice } from '../support/known-chain.js';
import { fixture, useTestApp } from '../support/test-app.js';

const testApp = useTestApp();

async function planId(schedule: Record<string, unknown>): Promise<string> {
  const created = await request(testApp().server)
    .post('/v1/plans')
    .set('content-type', 'application/json')
    .send(JSON.stringify(schedule));
  expect(created.status).toBe(202);
  return created.body.id as string;
}

const get = (path: string) => request(testApp().server).get(path);
/** CSV read back by an independent parser (csv-parse 7.0.3), numbers as numbers. */
const readCsv = (text: string): { header: string[]; rows: number[][] } => {
  const records = parse(text) as string[][];
  return { header: records[0]!, rows: records.slice(1).map((r) => r.map(Number)) };
};

const demo = () => fixture('demo-edging-strip') as Record<string, Record<string, unknown>>;
/** The demo with the puller following the orifice area. */
const followingDemo = () => {
  const d = demo();
  return { ...d, process: { ...d.process, puller_follows_area: true } };
};

describe('puller-speed table and re-timed setpoints (process.puller_follows_area)', () => {
  let id = '';
  // a plan computed and its downloads rendered on a shared machine: more than the default 10 s hook limit
  beforeAll(async () => {
    id = await planId(followingDemo());
  }, 60_000);

  it('puller-speed.csv read back with csv-parse equals puller-speed.json: 101 strictly increasing positions, closing on itself', async () => {
    const res = await get(`/v1/plans/${id}/puller-speed.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe('attachment; filename="edging-strip-demo-puller-speed.csv"');
    const csv = readCsv(res.text);
    const json = (await get(`/v1/plans/${id}/puller-speed.json`)).body;
    expect(csv.header).toEqual([
      'position_m',
      'time_s',
      'puller_speed_m_per_min',
      'orifice_area_mm2',
      'product_area_mm2',
      'draw_down_ratio',
    ]);
    expect(json.columns).toEqual(csv.header);
    expect(json.rows).toEqual(csv.rows);
    expect(json.points).toBe(101);
    expect(json.puller_follows_area).toBe(true);
    expect(json.units.puller_speed_m_per_min).toBe('m/min');
    expect(json.cautions.length).toBeGreaterThan(0);
    expect(csv.rows).toHaveLength(101);
    for (let i = 1; i < csv.rows.length; i++) expect(csv.rows[i]![0]).toBeGreaterThan(csv.rows[i - 1]![0]!);
    expect(csv.rows[0]![0]).toBe(0);
    expect(csv.rows.at(-1)![0]).toBe(1.5);
    expect(csv.rows.at(-1)![2]).toBe(csv.rows[0]![2]);
  });

  it('every row of the puller table and of the setpoints holds the mass balance: ρ_solid · A_product · v equals the throughput', async () => {
    const table = (await get(`/v1/plans/${id}/puller-speed.json`)).body;
    // ṁ = ρ·A·v (docs/MODEL.md §3; §5: 1400 kg/m³ × 400 mm² × 3 m/min = 100.8 kg/h): ρ in kg/m³, A in m², v in m/h
    const rho = table.solid_density_g_per_cm3 * 1000;
    expect((1400 * 400e-6 * 3 * 60).toFixed(6)).toBe('100.800000');
    const throughput = table.throughput_kg_per_h;
    for (const r of table.rows as number[][]) {
      const [, , speedMPerMin, area, product, drawDown] = r as [number, number, number, number, number, number];
      expect((rho * product * 1e-6 * speedMPerMin * 60) / throughput).toBeCloseTo(1, 5);
      expect(area / product).toBeCloseTo(drawDown, 6);
      expect(drawDown).toBeCloseTo(table.target_draw_down_ratio, 6);
    }
    const setpoints = (await get(`/v1/plans/${id}/setpoints.json`)).body;
    expect(setpoints.puller_follows_area).toBe(true);
    const col = (name: string) => setpoints.columns.indexOf(name) as number;
    for (const r of setpoints.rows as number[][]) {
      const product = r[col('orifice_area_mm2')]! / r[col('draw_down_ratio')]!;
      expect((rho * product * 1e-6 * r[col('puller_speed_m_per_min')]! * 60) / throughput).toBeCloseTo(1, 5);
    }
  });

  it('setpoint rows are equal time steps of the re-timed base: each step advances the line by about the puller speed × 0.05 s', async () => {
    const { header, rows } = readCsv((await get(`/v1/plans/${id}/setpoints.csv`)).text);
    const speed = header.indexOf('puller_speed_m_per_min');
    for (let i = 1; i < rows.length; i++) {
      const dt = rows[i]![1]! - rows[i - 1]![1]!;
      const dx = rows[i]![0]! - rows[i - 1]![0]!;
      if (i < rows.length - 1) expect(dt).toBeCloseTo(0.05, 9);
      // dx/dt = v(x): over one short step the mean speed lies between the speeds at its ends (within rounding)
      const lo = Math.min(rows[i]![speed]!, rows[i - 1]![speed]!) / 60;
      const hi = Math.max(rows[i]![speed]!, rows[i - 1]![speed]!) / 60;
      expect(dx / dt).toBeGreaterThanOrEqual(lo * (1 - 1e-4));
      expect(dx / dt).toBeLessThanOrEqual(hi * (1 + 1e-4));
    }
    // the periodic table closes: one repeat on, the actuator is back where it started
    expect(rows.at(-1)![0]).toBeCloseTo(1.5, 9);
    expect(rows.at(-1)![2]).toBe(rows[0]![2]);
  });
});

describe('motion.json for the review page', () => {
  let id = '';
  let view: Record<string, unknown> & {
    position_m: number[];
    time_s: number[];
    actuators: { id: string; kind: string; unit: string; values: number[] }[];
    joints: { id: string; positions_mm: [number, number][] }[];
    plates: { id: string; pivots: [string, string]; outline_local_mm: [number, number][] }[];
    links: { id: string; pins: [string, string] }[];
    area_mm2: number[];
    findings: { code: string; position_m?: number; to_position_m?: number }[];
  };
  beforeAll(async () => {
    id = await planId(demo());
    const res = await get(`/v1/plans/${id}/motion.json`);
    expect(res.status).toBe(200);
    view = res.body;
  }, 60_000);

  it('carries the schedule’s draw-down range and the pressure-rise limit, so the page draws them unbroken', () => {
    // the demo schedule's limits.draw_down as posted (fixtures/demo-edging-strip.json), not a default
    const posted = demo() as unknown as { limits: { draw_down: { min: number; max: number } } };
    expect(view.limits).toEqual({
      draw_down_ratio: { min: posted.limits.draw_down.min, max: posted.limits.draw_down.max },
      die_pressure_ratio: { max: 1.5 },
    });
  });

  it('has exactly the agreed fields, one value per frame in every series, at most 2000 frames', () => {
    expect(Object.keys(view).sort()).toEqual(
      [
        'plan_id',
        'position_m',
        'time_s',
        'actuators',
        'joints',
        'plates',
        'links',
        'area_mm2',
        'draw_down_ratio',
        'puller_speed_m_per_min',
        'die_pressure_ratio',
        'limits',
        'findings',
        'cautions',
      ].sort(),
    );
    expect(view.plan_id).toBe(id);
    const frames = view.position_m.length;
    expect(frames).toBe(901);
    for (const key of ['time_s', 'area_mm2', 'draw_down_ratio', 'puller_speed_m_per_min', 'die_pressure_ratio']) {
      expect((view[key] as unknown[]).length).toBe(frames);
    }
    expect(view.actuators).toEqual([expect.objectContaining({ id: 'actuator_1', kind: 'rotary', unit: 'deg' })]);
    expect(view.actuators[0]!.values).toHaveLength(frames);
    for (const j of view.joints) expect(j.positions_mm).toHaveLength(frames);
    expect(view.links).toEqual([{ id: 'link_1', pins: ['link_1_ground', 'link_1_b'] }]);
  });

  it('every plate is rigid along the motion: its two pivot joints stay one plate length apart in every frame', async () => {
    const plan = (await get(`/v1/plans/${id}`)).body;
    const lengths: number[] = plan.chain.plate_lengths_mm;
    const jointIds = new Set(view.joints.map((j) => j.id));
    expect(view.plates).toHaveLength(lengths.length);
    view.plates.forEach((plate, k) => {
      expect(jointIds.has(plate.pivots[0])).toBe(true);
      expect(jointIds.has(plate.pivots[1])).toBe(true);
      const a = view.joints.find((j) => j.id === plate.pivots[0])!.positions_mm;
      const b = view.joints.find((j) => j.id === plate.pivots[1])!.positions_mm;
      for (let f = 0; f < a.length; f += 50) {
        expect(Math.hypot(b[f]![0] - a[f]![0], b[f]![1] - a[f]![1])).toBeCloseTo(lengths[k]!, 3);
      }
      // in its own frame (origin at the first pivot, x toward the second) the melt edge runs at y = −e, e = hole
      // radius + ligament = 2 + 3 mm (docs/MODEL.md §2), and the round end reaches e beyond the first pivot
      const ys = plate.outline_local_mm.map((p) => p[1]);
      expect(Math.min(...ys)).toBeCloseTo(-5, 2);
    });
  });

  it('the plan summarises its simulation: 901 steps, every one solved and sealed, walls measured', async () => {
    const plan = (await get(`/v1/plans/${id}`)).body;
    expect(plan.simulation).toMatchObject({
      steps: 901,
      time_step_s: 0.05,
      capped: false,
      puller_follows_area: true,
      unsolved_steps: 0,
      max_leak_area_mm2: 0,
    });
    // the demo's puller follows the area (fixtures/demo-edging-strip.json): the repeat takes ∫ dx / v (dt = dx/v),
    // between 1.5 m at the fastest and at the slowest puller speed; 2 m/min at the first station, where the
    // throughput is set, so 45 s at most
    const speed = plan.simulation.puller_speed_m_per_min as { min: number; max: number };
    expect(speed.max).toBeCloseTo(2, 3);
    expect(plan.simulation.duration_s).toBeGreaterThan((1.5 / speed.max) * 60);
    expect(plan.simulation.duration_s).toBeLessThan((1.5 / speed.min) * 60);
    // the demo's thinnest wall is above its 1.5 mm minimum at every station (docs/MODEL.md §6) and between them
    expect(plan.simulation.min_wall_mm).toBeGreaterThan(1.5);
    expect(plan.simulation.area_mm2.max).toBeGreaterThan(plan.simulation.area_mm2.min);
  });

  it('carries the plan’s findings with their position ranges, and the cautions', () => {
    const motion = view.findings.filter((f) => f.code.startsWith('MOTION_') && f.to_position_m !== undefined);
    expect(motion.length).toBeGreaterThan(0);
    for (const f of motion) expect(f.to_position_m!).toBeGreaterThanOrEqual(f.position_m!);
    expect((view.cautions as unknown[]).length).toBeGreaterThan(0);
  });
});

describe('the same schedule planned twice', () => {
  it('gives byte-identical setpoint, cam, puller and motion tables', async () => {
    const a = await planId(demo());
    const b = await planId(demo());
    for (const file of ['setpoints.csv', 'cam-table.csv?points=301', 'puller-speed.csv?points=51', 'motion.json']) {
      const x = (await get(`/v1/plans/${a}/${file}`)).text;
      const y = (await get(`/v1/plans/${b}/${file}`)).text;
      expect(x.length).toBeGreaterThan(100);
      expect(x.replaceAll(a, '')).toBe(y.replaceAll(b, ''));
    }
  });
});

describe('a setpoint table too large to send', () => {
  it('0.001 s steps over a 1.5 m repeat at 0.1 m/min (900 000 rows) is 409 table_too_large; the cam and puller tables still come', async () => {
    const d = demo();
    // 1.5 m at 0.1 m/min = 900 s; 900 s / 0.001 s = 900 000 rows, above the 200 000 the service sends
    const id = await planId({ ...d, process: { ...d.process, line_speed_m_per_min: 0.1 }, time_step_s: 0.001 });
    for (const file of ['setpoints.csv', 'setpoints.json']) {
      const res = await get(`/v1/plans/${id}/${file}`);
      expect(res.status).toBe(409);
      expect(res.body.error).toBe('table_too_large');
      expect(res.body.message).toMatch(/about \d+ rows, more than 200000/);
    }
    expect((await get(`/v1/plans/${id}/cam-table.csv`)).status).toBe(200);
    expect((await get(`/v1/plans/${id}/puller-speed.csv`)).status).toBe(200);
    // the simulation itself stays bounded: at most 2000 steps (plus the stations), and it says so
    const view = (await get(`/v1/plans/${id}/motion.json`)).body;
    expect(view.position_m.length).toBeLessThanOrEqual(2000);
    const note = view.findings.find((f: { code: string }) => f.code === 'MOTION_SIMULATED');
    expect(note.message).toMatch(/at most 2000 steps are simulated/);
  });
});

describe('motion_law on the wire', () => {
  it('polynomial_345 gives 3-4-5 tables: law polynomial-345, rest at every station', async () => {
    const id = await planId({ ...demo(), motion_law: 'polynomial_345' });
    const json = (await get(`/v1/plans/${id}/cam-table.json`)).body;
    expect(json.law).toBe('polynomial-345');
    // 3-4-5 rest-to-rest (VDI 2143 Blatt 1): zero slope at the stations
    expect(Math.abs(json.rows[0][2])).toBeLessThanOrEqual(1e-9);
    const plan = (await get(`/v1/plans/${id}`)).body;
    expect(plan.motion.law).toBe('polynomial-345');
    expect(plan.motion.rest_to_rest).toBe(true);
  });

  it('an unknown law is a 400 naming motion_law', async () => {
    const res = await request(testApp().server)
      .post('/v1/plans')
      .set('content-type', 'application/json')
      .send(JSON.stringify({ ...demo(), motion_law: 'sine' }));
    expect(res.status).toBe(400);
    expect(res.body.details.map((d: { path: string }) => d.path)).toContain('motion_law');
  });
});

describe('setpoints?motion=tracked (direct mode follows the morph between station shapes)', () => {
  it('a plan with a binary link has no tracked motion (409 no_motion); an unknown motion is 400', async () => {
    const id = await planId(demo());
    const res = await get(`/v1/plans/${id}/setpoints.csv?motion=tracked`);
    expect(res.status).toBe(409);
    expect(res.body.error).toBe('no_motion');
    const bad = await get(`/v1/plans/${id}/setpoints.json?motion=smooth`);
    expect(bad.status).toBe(400);
    expect(bad.body.error).toBe('malformed_request');
    expect(bad.body.details[0].path).toBe('motion');
  });

  it('a 4-plate chain driven directly by 2 actuators gives tracked setpoints that pass through the station values', async () => {
    // stations of a known 4-plate chain pinned at both ends (two free plate angles each): 4 − 2 = 2 degrees of
    // freedom (Grübler–Kutzbach), so 2 actuators drive it directly, without links
    const pivots = freeStations([
      [0.35, 0.0],
      [0.2, -0.1],
      [0.45, 0.1],
    ]);
    const id = await planId({
      name: 'direct-chain',
      stations: pivots.map((p, i) => ({ position_m: i * 0.2, orifice: channelOrifice(p, E, WIDTH, 0.25) })),
      limits: { fit_tolerance_mm: 0.1 },
      plates: { pivot_hole_diameter_mm: 4, ligament_mm: 3, depth_mm: 25 },
      actuators: { count: 2 },
      time_step_s: 0.1,
    });
    const plan = (await get(`/v1/plans/${id}`)).body;
    expect(plan.mechanisation.mode).toBe('direct');
    expect(plan.simulation.tracking.tracked_max_residual_mm).toBeLessThanOrEqual(
      plan.simulation.tracking.law_max_residual_mm,
    );
    const res = await get(`/v1/plans/${id}/setpoints.csv?motion=tracked`);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toBe('attachment; filename="direct-chain-tracked-setpoints.csv"');
    const tracked = readCsv(res.text);
    const law = readCsv((await get(`/v1/plans/${id}/setpoints.csv`)).text);
    expect(tracked.header).toEqual(law.header);
    expect(tracked.rows.map((r) => r[0])).toEqual(law.rows.map((r) => r[0]));
    const json = (await get(`/v1/plans/${id}/setpoints.json?motion=tracked`)).body;
    expect(json.motion).toBe('tracked');
    expect(json.rows).toEqual(tracked.rows);
    // at the stations (0, 0.2, 0.4 m) the chain sits in the station's shape, so both tables give the station values
    const stations: { station_values: number[] }[] = plan.mechanism.actuators;
    [0, 0.2, 0.4].forEach((x, i) => {
      const row = tracked.rows.find((r) => Math.abs(r[0]! - x) < 1e-9)!;
      stations.forEach((a, k) => {
        expect(row[2 + k]!).toBeCloseTo(a.station_values[i]!, 2);
      });
    });
    // between them the tracked values differ from the law's: they follow the morph, not the law's joint angles
    const gap = Math.max(...tracked.rows.map((r, i) => Math.abs(r[2]! - law.rows[i]![2]!)));
    expect(gap).toBeGreaterThan(1e-3);
  });
});
