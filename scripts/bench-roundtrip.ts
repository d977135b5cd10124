/**
 * Round-trip benchmark (not a test): random exact 1-DOF mechanisms (tests/support/random-mechanism.ts: 3–5 plates,
 * 0–2 binary links, 3–8 stations, one actuator by construction) are turned into schedules, planned through the real
 * path (wire schema → toSchedule → planSchedule), and compared with the truth. Per seed it prints the true and found
 * plate counts, links, stations, whether the one requested actuator was met, the worst station deviation and the wall
 * time of the plan; then the recovery rates (true plate count, actuator count, tolerance, all three) and the median
 * and largest time per plan; then the generator's own cost (time, draws per accepted mechanism by plate count, draws
 * turned down by the planner's clearance rules). Figures only, no assertions.
 *
 * Run with `npm run bench:roundtrip -- --seeds 40` (`--from S` to start at another seed, `--span walls` to post an
 * explicit moving span on the channel walls instead of letting the service find it).
 */
import { ScheduleWire } from '../src/http/schedule-schema.js';
import { toSchedule } from '../src/http/to-schedule.js';
import { planSchedule } from '../src/pipeline/index.js';
import { CLEARANCE_REJECTIONS, randomMechanism } from '../tests/support/random-mechanism.js';

function argument(name: string, fallback: string): string {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 && at + 1 < process.argv.length ? process.argv[at + 1]! : fallback;
}

const seeds = Number(argument('seeds', '40'));
const from = Number(argument('from', '1'));
const span = argument('span', 'auto');
if (!(Number.isInteger(seeds) && seeds > 0 && Number.isInteger(from))) throw new Error('--seeds N and --from S');
if (span !== 'auto' && span !== 'walls') throw new Error('--span auto | walls');

interface Row {
  readonly seed: number;
  readonly plates: number;
  readonly found: number | null;
  readonly links: number;
  readonly stations: number;
  readonly countMet: boolean;
  readonly actuatorsMet: boolean;
  readonly toleranceMet: boolean;
  readonly worstMm: number | null;
  readonly ms: number;
  readonly note: string;
}

console.log(
  `round-trip benchmark (Node ${process.version}; seeds ${from}–${from + seeds - 1}, moving span ${span}; wall clock of ` +
    'toSchedule + planSchedule, one run each)',
);
console.log('seed  plates true/found  links  stations  actuators met  worst dev mm     ms  note');
const rows: Row[] = [];
const generation = { ms: 0, draws: new Map<number, number[]>(), clearanceRedraws: 0 };
for (let seed = from; seed < from + seeds; seed++) {
  const g0 = performance.now();
  const m = randomMechanism(seed, { movingSpan: span });
  generation.ms += performance.now() - g0;
  const drawsOf = generation.draws.get(m.lengths.length) ?? [];
  drawsOf.push(m.draws);
  generation.draws.set(m.lengths.length, drawsOf);
  for (const why of CLEARANCE_REJECTIONS) generation.clearanceRedraws += m.rejections[why] ?? 0;
  const tolerance = m.schedule.limits!.fit_tolerance_mm!;
  const t0 = performance.now();
  const mapping = toSchedule(ScheduleWire.parse(m.schedule));
  if (!mapping.ok) throw new Error(`seed ${seed}: schedule rejected: ${JSON.stringify(mapping.problems)}`);
  const plan = planSchedule(mapping.schedule);
  const ms = performance.now() - t0;
  const fit = plan.fit;
  const mech = plan.mechanisation;
  const worst = fit ? Math.max(...fit.stations.map((s) => s.maxDeviationMm)) : null;
  const actuators = mech?.mechanism?.actuators.length ?? null;
  const form = fit
    ? [
        fit.chain.start.kind === 'slot' ? 'slot at start' : '',
        fit.chain.end.kind === 'slot' ? 'slot at end' : '',
        fit.chain.telescoping.length > 0 ? 'telescoping' : '',
      ].filter((s) => s !== '')
    : [];
  const note =
    plan.error ??
    [
      ...form,
      mech && mech.status !== 'mechanised'
        ? `no mechanism (smallest count that works: ${mech.smallestActuatorCount ?? 'none found'})`
        : '',
      mech?.status === 'mechanised' && actuators !== 1 ? `${actuators} actuators` : '',
    ]
      .filter((s) => s !== '')
      .join('; ');
  const row: Row = {
    seed,
    plates: m.lengths.length,
    found: fit?.plateCount ?? null,
    links: m.links.length,
    stations: m.stations.length,
    countMet: fit !== null && fit.plateCount <= m.lengths.length,
    actuatorsMet: mech?.status === 'mechanised' && actuators === 1,
    toleranceMet: worst !== null && worst <= tolerance,
    worstMm: worst,
    ms,
    note,
  };
  rows.push(row);
  console.log(
    `${String(seed).padStart(4)}  ${`${row.plates}/${row.found ?? '–'}`.padStart(17)}  ${String(row.links).padStart(5)}  ` +
      `${String(row.stations).padStart(8)}  ${(row.actuatorsMet ? 'yes' : 'no').padStart(13)}  ` +
      `${(worst === null ? '–' : worst.toFixed(3)).padStart(12)}  ${ms.toFixed(0).padStart(5)}  ${note}`,
  );
}

const rate = (pass: (r: Row) => boolean) => {
  const k = rows.filter(pass).length;
  return `${k}/${rows.length} (${((100 * k) / rows.length).toFixed(0)} %)`;
};
const times = rows.map((r) => r.ms).sort((a, b) => a - b);
const median =
  times.length % 2 === 1
    ? times[(times.length - 1) / 2]!
    : (times[times.length / 2 - 1]! + times[times.length / 2]!) / 2;
console.log('recovery');
console.log(
  `  plate count ≤ true count: ${rate((r) => r.countMet)} (exactly the true count: ${rate((r) => r.found === r.plates)})`,
);
console.log(`  1 actuator, as asked:     ${rate((r) => r.actuatorsMet)}`);
console.log(`  within the fit tolerance: ${rate((r) => r.toleranceMet)}`);
console.log(`  all three:                ${rate((r) => r.countMet && r.actuatorsMet && r.toleranceMet)}`);
console.log(
  `time per plan: median ${median.toFixed(0)} ms, max ${times.at(-1)!.toFixed(0)} ms (seed ${rows.find((r) => r.ms === times.at(-1))!.seed})`,
);
for (const n of [3, 4, 5]) {
  const of = rows.filter((r) => r.plates === n);
  if (of.length === 0) continue;
  const all = of.filter((r) => r.countMet && r.actuatorsMet && r.toleranceMet).length;
  console.log(`  ${n} plates: all three met on ${all}/${of.length}`);
}
console.log(
  `generation: ${generation.ms.toFixed(0)} ms for ${rows.length} seeds; ${generation.clearanceRedraws} draws turned ` +
    "down by the planner's clearance rules",
);
for (const [n, draws] of [...generation.draws].sort((p, q) => p[0] - q[0])) {
  const mean = draws.reduce((t, d) => t + d, 0) / draws.length;
  console.log(
    `  ${n} plates: ${mean.toFixed(0)} draws per accepted mechanism on average, at most ${Math.max(...draws)}`,
  );
}
