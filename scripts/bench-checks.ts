/**
 * Wall-check benchmark (not a test): wall-clock time of the wall measurement (`measureWalls`), the thin-wall search at
 * the default 1 mm limit (`findThinWalls`) and the whole check of a one-station schedule (`checkSchedule`), against
 * the vertex count, for two orifices: a ring (a circle of radius 20 mm with a 12 mm hole, n vertices on each ring, so
 * 2n in all) and a wavy strip (40 mm long, 3 mm thick on average, both faces sine waves, n vertices in all). Median of
 * 5 runs after a warm-up, and the growth exponent fitted to log(time) against log(vertices) by least squares. Then
 * two schedules at the service's total vertex limit (200 000): 20 stations of the ring at 5000 vertices a ring, and 500 stations
 * of 400-vertex wavy strips. Run with `npm run bench:checks`.
 */
import { findThinWalls, measureWalls, type Point, type Region } from '../src/geometry/index.js';
import { toSchedule } from '../src/http/to-schedule.js';
import { DEFAULT_TOLERANCES } from '../src/numeric/index.js';
import { checkSchedule } from '../src/pipeline/index.js';
import { timeMedian as timeMedianOf } from './time-median.js';

const RUNS = 5;
const COUNTS = [100, 200, 500, 1000, 2000, 5000];
const tol = DEFAULT_TOLERANCES;

function circle(n: number, r: number, clockwise: boolean): Point[] {
  const ring = Array.from({ length: n }, (_, i) => {
    const a = (2 * Math.PI * i) / n;
    return [r * Math.cos(a), r * Math.sin(a)] as Point;
  });
  return clockwise ? ring.reverse() : ring;
}

function ring(n: number): Region {
  return { outer: circle(n, 20, false), holes: [circle(n, 12, true)] };
}

function wavyStrip(n: number, phase = 0): Region {
  const m = Math.floor(n / 2);
  const bottom = Array.from({ length: m }, (_, i): Point => {
    const x = (40 * i) / (m - 1);
    return [x, 0.6 * Math.sin(3 * x + phase)];
  });
  const top = Array.from({ length: n - m }, (_, i): Point => {
    const x = 40 - (40 * i) / (n - m - 1);
    return [x, 3 + 0.8 * Math.sin(2 * x)];
  });
  return { outer: [...bottom, ...top], holes: [] };
}

function timeMedian(run: () => unknown): number {
  return timeMedianOf(run, RUNS).ms;
}

/** Least-squares slope of log(y) against log(x). */
function growthExponent(xs: readonly number[], ys: readonly number[]): number {
  const lx = xs.map(Math.log);
  const ly = ys.map((y) => Math.log(Math.max(y, 1e-3)));
  const mx = lx.reduce((s, v) => s + v, 0) / lx.length;
  const my = ly.reduce((s, v) => s + v, 0) / ly.length;
  let num = 0;
  let den = 0;
  for (let i = 0; i < lx.length; i++) {
    num += (lx[i]! - mx) * (ly[i]! - my);
    den += (lx[i]! - mx) ** 2;
  }
  return num / den;
}

function schedule(orifices: readonly Region[]) {
  const mapping = toSchedule({
    name: 'bench-checks',
    material: 'PVC-U',
    process: { line_speed_m_per_min: 2, die_temperature_c: 190 },
    stations: orifices.map((o, i) => ({ position_m: i * 0.01, orifice: { outer: o.outer, holes: o.holes } })),
  } as never);
  if (!mapping.ok) throw new Error(JSON.stringify(mapping.problems.slice(0, 3)));
  return mapping.schedule;
}

const shapes: Record<string, { make: (n: number) => Region; vertices: (n: number) => number }> = {
  ring: { make: ring, vertices: (n) => 2 * n },
  'wavy strip': { make: (n) => wavyStrip(n), vertices: (n) => n },
};

for (const [name, shape] of Object.entries(shapes)) {
  console.log(`\n${name}`);
  console.log('vertices   measureWalls ms   findThinWalls ms   checkSchedule ms   min wall mm   max wall mm');
  const vs: number[] = [];
  const walls: number[] = [];
  const thin: number[] = [];
  const checks: number[] = [];
  for (const n of COUNTS) {
    const region = shape.make(n);
    const one = schedule([region]);
    const w = measureWalls(region, tol);
    const tw = timeMedian(() => measureWalls(region, tol));
    const tt = timeMedian(() => findThinWalls(region, 1, tol));
    const tc = timeMedian(() => checkSchedule(one));
    vs.push(shape.vertices(n));
    walls.push(tw);
    thin.push(tt);
    checks.push(tc);
    console.log(
      `${String(shape.vertices(n)).padStart(8)}   ${tw.toFixed(1).padStart(12)}   ${tt.toFixed(1).padStart(16)}   ` +
        `${tc.toFixed(1).padStart(16)}   ${w.minWallMm.toFixed(5).padStart(11)}   ${w.maxWallMm.toFixed(5).padStart(11)}`,
    );
  }
  const top = (xs: readonly number[]): number[] => xs.slice(-3);
  console.log(
    `growth exponent (log-log slope), all counts: measureWalls ${growthExponent(vs, walls).toFixed(2)}, ` +
      `findThinWalls ${growthExponent(vs, thin).toFixed(2)}, checkSchedule ${growthExponent(vs, checks).toFixed(2)}; ` +
      `largest three counts (fixed costs matter less): measureWalls ${growthExponent(top(vs), top(walls)).toFixed(2)}, ` +
      `findThinWalls ${growthExponent(top(vs), top(thin)).toFixed(2)}, checkSchedule ` +
      `${growthExponent(top(vs), top(checks)).toFixed(2)}`,
  );
}

console.log('\nschedules at the 200 000-vertex limit');
for (const [label, orifices] of [
  ['20 stations × 10 000-vertex ring (5000 per ring)', Array.from({ length: 20 }, () => ring(5000))],
  ['500 stations × 400-vertex wavy strip', Array.from({ length: 500 }, (_, k) => wavyStrip(400, k * 0.01))],
] as const) {
  const s = schedule(orifices);
  const t0 = performance.now();
  checkSchedule(s);
  const first = performance.now() - t0;
  const tw = timeMedian(() => {
    for (const o of orifices) measureWalls(o, tol);
  });
  console.log(
    `${label}: checkSchedule ${(first / 1000).toFixed(2)} s, measureWalls over all stations ${(tw / 1000).toFixed(2)} s`,
  );
}
