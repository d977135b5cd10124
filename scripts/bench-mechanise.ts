/**
 * Mechanisation benchmark (not a test): wall-clock time of `mechaniseChain` on the demo schedule through the real path
 * (wire schema → toSchedule → checkSchedule → fitChain, as src/pipeline/plan-schedule.ts runs it) with the actuator
 * count the schedule asks for, and, when that finds nothing, with the smallest count it reports; then on the
 * four-plate known chains of tests/mechanise at 3, 4, 5 and 7 distinct stations. Median of 5 runs after a warm-up.
 * Run with `npm run bench:mechanise`.
 */
import { readFileSync } from 'node:fs';
import { ScheduleWire } from '../src/http/schedule-schema.js';
import { toSchedule } from '../src/http/to-schedule.js';
import { type MechanisationResult, type MechaniseRequest, mechaniseChain } from '../src/mechanise/index.js';
import { checkSchedule } from '../src/pipeline/index.js';
import { fitChain, resolveChainFitOptions } from '../src/synthesis/index.js';
import { fourPlateFit, linkedStations } from '../tests/mechanise/known-linkage.js';
import { timeMedian as timeMedianOf } from './time-median.js';

const RUNS = 5;

function timeMedian<T>(run: () => T): { value: T; ms: number } {
  return timeMedianOf(run, RUNS);
}

function describe(r: MechanisationResult): string {
  if (r.status !== 'mechanised') {
    return `no mechanism (smallest count that works: ${r.smallestActuatorCount ?? 'none found'})`;
  }
  const actuators = r.mechanism!.actuators.map((a) => `${a.kind} at ${a.joint}`).join(', ');
  const angles =
    r.transmission.minDeg === null
      ? 'no binary links'
      : `transmission ${r.transmission.minDeg.toFixed(1)}°–${r.transmission.maxDeg!.toFixed(1)}°`;
  const residual = Math.max(...r.stations.map((s) => s.residualMm));
  const deviation = Math.max(...r.stations.map((s) => s.deviationMm));
  return (
    `${r.mode}, ${r.links.length} link(s), ${actuators}; ${angles}; mobility ${r.mobility!.grubler}/${r.mobility!.numerical}; ` +
    `residual ${residual.toExponential(1)} mm; orifice deviation ${deviation.toFixed(3)} mm`
  );
}

const json: unknown = JSON.parse(readFileSync(new URL('../fixtures/demo-edging-strip.json', import.meta.url), 'utf8'));
const mapping = toSchedule(ScheduleWire.parse(json));
if (!mapping.ok) throw new Error(`demo schedule rejected: ${JSON.stringify(mapping.problems)}`);
const schedule = mapping.schedule;
const check = checkSchedule(schedule);
const spans = check.stations.map((s) => s.movingSpan);
if (spans.some((s) => s === null)) throw new Error('demo: no moving span');
const fitStart = performance.now();
const fit = fitChain(
  schedule.stations.map((s) => s.orifice),
  spans.map((s) => s!),
  resolveChainFitOptions({
    toleranceMm: schedule.limits.fitToleranceMm,
    maxPlates: schedule.limits.maxPlates,
    pivotHoleDiameterMm: schedule.plates.pivotHoleDiameterMm,
    ligamentMm: schedule.plates.ligamentMm,
    depthMm: schedule.plates.depthMm,
  }),
);
const fitMs = performance.now() - fitStart;
const base: Omit<MechaniseRequest, 'actuatorCount'> = {
  periodic: schedule.repeatLengthM !== null,
  fitToleranceMm: schedule.limits.fitToleranceMm,
};

console.log(`mechanisation benchmark (Node ${process.version}; wall clock, median of ${RUNS} runs after a warm-up)`);
console.log(
  `demo: ${fit.plateCount} plates (${fit.chain.start.kind}/${fit.chain.end.kind} ends), ${schedule.stations.length} stations; fitChain ${fitMs.toFixed(0)} ms (once, not part of the timing)`,
);
const requested = timeMedian(() => mechaniseChain(fit, { ...base, actuatorCount: schedule.actuators.count }));
console.log(
  `demo, ${schedule.actuators.count} actuator(s) asked for: ${requested.ms.toFixed(0)} ms — ${describe(requested.value)}`,
);
for (const f of requested.value.findings) console.log(`  ${f.code}: ${f.message}`);
const smallest = requested.value.status === 'mechanised' ? null : requested.value.smallestActuatorCount;
if (smallest !== null) {
  const again = timeMedian(() => mechaniseChain(fit, { ...base, actuatorCount: smallest }));
  console.log(`demo, ${smallest} actuators: ${again.ms.toFixed(0)} ms — ${describe(again.value)}`);
}

const known: [string, number[]][] = [
  ['4 plates × 3 st', [0.2, 0.35, 0.5]],
  ['4 plates × 4 st', [0.2, 0.35, 0.5, 0.28]],
  ['4 plates × 5 st', [0.2, 0.35, 0.5, 0.28, 0.42]],
  ['4 plates × 7 st', [0.2, 0.35, 0.5, 0.28, 0.42, 0.3, 0.45]],
];
for (const [name, theta1] of known) {
  const stations = fourPlateFit(linkedStations(theta1));
  const r = timeMedian(() => mechaniseChain(stations, { actuatorCount: 1 }));
  console.log(`${name}: ${r.ms.toFixed(0)} ms — ${describe(r.value)}`);
}
