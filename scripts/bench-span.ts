/**
 * Moving-span benchmark (not a test): wall-clock time of `findMovingSpans` on dense schedules whose neighbouring
 * stations differ by 5 µm, so every station crosses every other: a see-saw strip (40 × 8 mm, top tilted about its
 * middle by 5 µm more at each station) and a crown that grows by 5 µm per station while its shoulders drop, each at
 * 100, 500 and 1000 stations (a 0.5 mm polyline top, 85 vertices per ring). Median of 5 runs after a warm-up; the
 * time per station shows the growth is linear. Run with `npm run bench:span`.
 */
import type { Point, Region } from '../src/geometry/index.js';
import { findMovingSpans } from '../src/span/index.js';
import { timeMedian as timeMedianOf } from './time-median.js';

const RUNS = 5;
const STEP_MM = 0.005;

function strip(top: (x: number) => number): Region {
  const points: Point[] = [];
  for (let k = 80; k >= 0; k--) points.push([k / 2, top(k / 2)]);
  return { outer: [[0, 0], [40, 0], ...points], holes: [] };
}

const families: Record<string, (k: number) => Region> = {
  'see-saw': (k) => strip((x) => 8 + (k * STEP_MM * (x - 20)) / 20),
  crown: (k) => strip((x) => 8 + k * STEP_MM * Math.cos((Math.PI * (x - 20)) / 20)),
};

function timeMedian(run: () => unknown): number {
  return timeMedianOf(run, RUNS).ms;
}

for (const [name, station] of Object.entries(families)) {
  for (const n of [100, 500, 1000]) {
    const orifices = Array.from({ length: n }, (_, k) => station(k));
    const options = { matchToleranceMm: 0.02, ends: null };
    const result = findMovingSpans(orifices, options);
    const ms = timeMedian(() => findMovingSpans(orifices, options));
    const outcome =
      result.status === 'found'
        ? `span of station ${n - 1}: (${result.spans[n - 1]!.start.map((v) => v.toFixed(3)).join(', ')}) → (${result.spans[
            n - 1
          ]!.end.map((v) => v.toFixed(3)).join(', ')}) mm`
        : `${result.status}: ${'message' in result ? result.message : result.reason}`;
    console.log(
      `${name.padEnd(8)} ${String(n).padStart(4)} stations, ${STEP_MM * 1000} µm steps: ${ms.toFixed(1)} ms ` +
        `(${((ms * 1000) / n).toFixed(0)} µs per station); ${outcome}`,
    );
  }
}
