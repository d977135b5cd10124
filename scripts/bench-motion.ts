/**
 * Benchmark of the per-step motion simulation on the demo (fixtures/demo-edging-strip.json): steps per second at
 * 10 ms steps, kinematics only (trajectories sampled, warm-started Newton, joint points) and with per-step clipping
 * (plates drawn, opening − plates, area, perimeter, leaks, reach beyond the stations). Kinematics run over 100 m of
 * product (300 000 steps at 2 m/min); clipping, about ten times slower, over `--clip-metres` (default 3 m, 9 000
 * steps) and is reported per step, so the benchmark stays short. Each 1.5 m repeat starts at the first station, where
 * the mechanism's model is assembled, and the steps inside it are warm-started from the previous one. Then the whole
 * plan and its own simulation (one step per time_step_s, walls at a stride) are timed.
 *
 *   npm run bench:motion [-- --metres 100 --clip-metres 3]
 *
 * Targets: ≥ 20 000 steps/s kinematics only, ≥ 2 000 steps/s with clipping. Figures vary with machine load.
 */
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { toSchedule } from '../src/http/to-schedule.js';
import { planSchedule, simulateMotion, simulatePlan, simulationInput } from '../src/pipeline/index.js';
import { timeMedian } from './time-median.js';

const { values: args } = parseArgs({
  options: { metres: { type: 'string', default: '100' }, 'clip-metres': { type: 'string', default: '3' } },
});
const metres = Number(args.metres);
const clipMetres = Number(args['clip-metres']);
const STEP_S = 0.01;

const wire = JSON.parse(readFileSync(new URL('../fixtures/demo-edging-strip.json', import.meta.url), 'utf8'));
const mapping = toSchedule(wire);
if (!mapping.ok) throw new Error('the demo schedule does not map');
const schedule = mapping.schedule;
const planned = timeMedian(() => planSchedule(schedule), 3);
const plan = planned.value;
if (!plan.fit || !plan.mechanisation || !plan.motion) throw new Error('the demo plan has no motion');
const parts = { schedule, check: plan.check, fit: plan.fit, mechanisation: plan.mechanisation, motion: plan.motion };
const input = simulationInput(parts);
if (!input) throw new Error('the demo plan has no kinematic model');
const bare = { ...input, clearance: null };
const speed = schedule.process.lineSpeedMPerS;
const repeat = schedule.repeatLengthM ?? 1.5;

/** Runs `length` m of product in repeats (each from the first station), every 10 ms; returns the steps run. */
function run(length: number, clip: boolean): { steps: number; maxIterations: number } {
  let steps = 0;
  let maxIterations = 0;
  for (let start = 0; start < length - 1e-9; start += repeat) {
    const span = Math.min(repeat, length - start);
    const count = Math.round(span / speed / STEP_S);
    const timesS = Array.from({ length: count }, (_, i) => i * STEP_S);
    const positionsM = timesS.map((t) => start + speed * t);
    const sim = simulateMotion(bare, { positionsM, timesS, clip, wallStride: Number.MAX_SAFE_INTEGER });
    if (!sim.solved.every((ok) => ok)) throw new Error('a step did not solve');
    steps += count;
    maxIterations = Math.max(maxIterations, sim.iterations.max);
  }
  return { steps, maxIterations };
}

const kinematics = timeMedian(() => run(metres, false), 1);
const clipping = timeMedian(() => run(clipMetres, true), 3);
const own = timeMedian(() => simulatePlan(parts), 3);
const perSecond = (steps: number, ms: number) => Math.round((steps / ms) * 1000);

console.log(`demo: ${schedule.name}, ${plan.fit.plateCount} plates, ${plan.mechanisation.model?.bodies.length} bodies`);
console.log(
  `kinematics only, 10 ms steps over ${metres} m: ${kinematics.value.steps} steps in ${(kinematics.ms / 1000).toFixed(2)} s = ${perSecond(kinematics.value.steps, kinematics.ms)} steps/s (target ≥ 20000), at most ${kinematics.value.maxIterations} Newton iteration(s) per step`,
);
console.log(
  `with per-step clipping, 10 ms steps over ${clipMetres} m: ${clipping.value.steps} steps in ${(clipping.ms / 1000).toFixed(2)} s = ${perSecond(clipping.value.steps, clipping.ms)} steps/s (target ≥ 2000); 100 m would take about ${((300_000 / perSecond(clipping.value.steps, clipping.ms)) * (metres / 100)).toFixed(0)} s`,
);
const sim = own.value;
console.log(
  `the plan's own simulation: ${sim?.positionsM.length} steps every ${sim?.timeStepS} s with walls every ${sim?.wallStride} steps and at the stations: ${own.ms.toFixed(0)} ms; the whole demo plan: ${planned.ms.toFixed(0)} ms`,
);
