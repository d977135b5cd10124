import type { Finding, Schedule } from '../domain/index.js';
import type { Point } from '../geometry/index.js';
import { metresPerMinute } from '../motion/index.js';
import { FLOW_IMBALANCE_LIMIT, messageNumber as fmt, pullerSpeedRangeMPerMin, ratioText } from '../process/index.js';
import type { PlanSimulation } from './plan-simulation.js';

/** A pressure rise over the first station worth a warning: the same 1.5× as `PRESSURE_SWING` (common practice). */
export const MOTION_PRESSURE_RISE_RATIO = 1.5;
/** Transmission angles outside this band are flagged along the motion, degrees (the usual 40°–140° rule; Norton). */
export const MOTION_TRANSMISSION_BAND_DEG = [40, 140] as const;
/** Uncovered opening apart from the orifice above this is a leak, mm² (as at the stations, `plateOpening`). */
export const MOTION_LEAK_AREA_MM2 = 1e-3;
/** At most this many ranges are listed per code; the rest are counted in the last one's message. */
const MAX_RANGES = 5;

/** A run of consecutive measured steps where a limit is broken: first and last step, and the worst step. */
interface BrokenRun {
  readonly from: number;
  readonly to: number;
  readonly worst: number;
}

/**
 * Runs of steps where `broken(value)` holds, over the measured steps only (null: not measured at that step, which
 * neither breaks nor ends a run); `worse(a, b)` is true when a is worse than b.
 */
export function brokenRuns(
  values: readonly (number | null)[],
  broken: (v: number) => boolean,
  worse: (a: number, b: number) => boolean,
): BrokenRun[] {
  const runs: BrokenRun[] = [];
  let current: { from: number; to: number; worst: number } | null = null;
  values.forEach((v, j) => {
    if (v === null) return;
    if (broken(v)) {
      if (!current) current = { from: j, to: j, worst: j };
      else {
        current.to = j;
        if (worse(v, values[current.worst]!)) current.worst = j;
      }
    } else if (current) {
      runs.push(current);
      current = null;
    }
  });
  if (current) runs.push(current);
  return runs;
}

/**
 * Findings of the per-step simulation, each with the line-position range where a limit is broken (`positionM` …
 * `toPositionM`) and the worst value in it: `MOTION_NOT_SOLVED`, `MOTION_LEAK`, `MOTION_OPENING_BEYOND_STATIONS`,
 * `MOTION_THIN_WALL` (with `at`, where the thinnest wall is), `MOTION_WALL_RATIO`, `MOTION_FLOW_IMBALANCE`,
 * `MOTION_DRAW_DOWN_HIGH` / `_LOW` (puller at the nominal speed) or `MOTION_PULLER_SPEED_OUT_OF_RANGE` (puller following
 * the area, outside `limits.pullerSpeedMPerS`, by default 0.01–200 m/min), `MOTION_PRESSURE_RISE`,
 * `MOTION_TRANSMISSION_ANGLE`, `MOTION_CLEARANCE`; and one `MOTION_SIMULATED` note saying what was simulated (steps,
 * time step, wall stride, the fastest plate tip, the puller's range when it follows the area).
 */
export function simulationFindings(
  sim: PlanSimulation,
  schedule: Schedule,
  kinds: readonly ('rotary' | 'linear')[] = [],
): Finding[] {
  const x = sim.positionsM;
  const { limits } = schedule;
  const stepM = sim.timeStepS * schedule.process.lineSpeedMPerS;
  const strideNote = `measured every ${sim.wallStride} step(s) (about ${fmt(stepM * sim.wallStride)} m) and at every station`;
  const findings: Finding[] = [];
  /** The stations inside a run: their own check already reports the same limit there. */
  const alsoAtStations = (run: BrokenRun): string => {
    const inside = sim.stationSteps.flatMap((j, i) => (j >= run.from && j <= run.to ? [i] : []));
    if (inside.length === 0) return ' Every station meets this limit: only the motion between them breaks it.';
    return ` Station(s) ${inside.join(', ')} inside this range break it too (see their own findings).`;
  };
  const add = (
    code: string,
    severity: Finding['severity'],
    runs: readonly BrokenRun[],
    value: (j: number) => number,
    limit: number | undefined,
    text: (run: BrokenRun, range: string) => string,
    at?: (j: number) => Point | null,
  ) => {
    runs.slice(0, MAX_RANGES).forEach((run, k) => {
      const more =
        k === MAX_RANGES - 1 && runs.length > MAX_RANGES ? ` (${runs.length - MAX_RANGES} more range(s) like it.)` : '';
      findings.push({
        code,
        severity,
        positionM: x[run.from]!,
        toPositionM: x[run.to]!,
        value: value(run.worst),
        ...(limit !== undefined ? { limit } : {}),
        ...(at?.(run.worst) ? { at: at(run.worst)! } : {}),
        message: text(run, rangeText(x[run.from]!, x[run.to]!, schedule)) + alsoAtStations(run) + more,
      });
    });
  };
  const solvedAsNumber = sim.solved.map((ok) => (ok ? 0 : 1));
  add(
    'MOTION_NOT_SOLVED',
    'error',
    brokenRuns(
      solvedAsNumber,
      (v) => v > 0,
      () => false,
    ),
    () => 1,
    undefined,
    (_, range) =>
      `The mechanism cannot be assembled at the commanded actuator values ${range}: the position solve does not converge there (a dead point or out of reach), so the motion cannot pass. Check the mechanism's defects and the motion law.`,
  );
  add(
    'MOTION_LEAK',
    'error',
    brokenRuns(
      sim.leakAreaMm2,
      (v) => v > MOTION_LEAK_AREA_MM2,
      (a, b) => a > b,
    ),
    (j) => sim.leakAreaMm2[j]!,
    MOTION_LEAK_AREA_MM2,
    (run, range) =>
      `The plates leave ${fmt(sim.leakAreaMm2[run.worst]!)} mm² of the die opening uncovered apart from the orifice ${range} (worst at ${fmt(x[run.worst]!, 4)} m): melt would leak there while the plates move, though every station is sealed. Deeper plates, wider pivot fans or another motion law.`,
    (j) => sim.leakAt?.[j] ?? null,
  );
  add(
    'MOTION_OPENING_BEYOND_STATIONS',
    'warning',
    brokenRuns(
      sim.beyondStationsMm,
      (v) => v > limits.fitToleranceMm,
      (a, b) => a > b,
    ),
    (j) => sim.beyondStationsMm[j]!,
    limits.fitToleranceMm,
    (run, range) =>
      `The orifice reaches ${fmt(sim.beyondStationsMm[run.worst]!)} mm outside both neighbouring stations' orifices ${range} (worst at ${fmt(x[run.worst]!, 4)} m), more than the ${fmt(limits.fitToleranceMm)} mm fit tolerance: the product is larger there than either station asks for. Add a station there, or choose another motion law.`,
  );
  add(
    'MOTION_THIN_WALL',
    'error',
    brokenRuns(
      sim.minWallMm,
      (v) => v < limits.minWallMm,
      (a, b) => a < b,
    ),
    (j) => sim.minWallMm[j]!,
    limits.minWallMm,
    (run, range) =>
      `A wall of the orifice is ${fmt(sim.minWallMm[run.worst]!)} mm thin ${range}, below the ${fmt(limits.minWallMm)} mm minimum (walls ${strideNote}). Add a station there or change the neighbouring stations.`,
    (j) => sim.minWallAt[j] ?? null,
  );
  const wallRatio = sim.minWallMm.map((min, j) => {
    const max = sim.maxWallMm[j];
    return min !== null && max !== null && max !== undefined && min > 0 ? max / min : null;
  });
  add(
    'MOTION_WALL_RATIO',
    'warning',
    brokenRuns(
      wallRatio,
      (v) => v > limits.maxWallRatio,
      (a, b) => a > b,
    ),
    (j) => wallRatio[j]!,
    limits.maxWallRatio,
    (run, range) =>
      `The thickest wall (${fmt(sim.maxWallMm[run.worst]!)} mm) is ${fmt(wallRatio[run.worst]!)}× the thinnest (${fmt(sim.minWallMm[run.worst]!)} mm) ${range}, above limits.max_wall_ratio ${fmt(limits.maxWallRatio)} (walls ${strideNote}). Even out the walls of the neighbouring stations, or add a station there.`,
  );
  const n = schedule.process.powerLawN;
  // the same rule as the stations' FLOW_IMBALANCE: (H_max/H_min)^(2+1/n) at equal pressure (power-law slit)
  const imbalance = wallRatio.map((r) => (r === null ? null : r ** (2 + 1 / n)));
  add(
    'MOTION_FLOW_IMBALANCE',
    'warning',
    brokenRuns(
      imbalance,
      (v) => v > FLOW_IMBALANCE_LIMIT,
      (a, b) => a > b,
    ),
    (j) => imbalance[j]!,
    FLOW_IMBALANCE_LIMIT,
    (run, range) =>
      `At equal pressure the thickest wall flows ${ratioText(imbalance[run.worst]!)} faster per width than the thinnest ${range} (power-law slit, n ${fmt(n)}; limit ${FLOW_IMBALANCE_LIMIT}×, common practice, no source; walls ${strideNote}). Even out the walls or add flow restrictors.`,
  );
  if (sim.pullerFollowsArea) {
    // the draw-down is held at the target; the puller speed is what can leave its range (as at the stations)
    const pullerMPerMin = sim.pullerSpeedMPerS.map((v) => metresPerMinute(v));
    const { min: slowest, max: fastest } = pullerSpeedRangeMPerMin(schedule);
    const rangeText = schedule.limits.pullerSpeedMPerS
      ? 'the puller runs at (limits.puller_speed_m_per_min)'
      : 'a profile puller plausibly runs at (the default of limits.puller_speed_m_per_min; common practice, no source)';
    const pullerText = (run: BrokenRun, range: string, side: 'above' | 'below', limit: number) =>
      `To hold draw-down ${fmt(sim.targetDrawDown)} the puller would run at ${fmt(pullerMPerMin[run.worst]!)} m/min ${range}, ${side} the ${fmt(limit)} m/min ${rangeText}. Change the throughput or the orifice area, or let the puller run at the line speed.`;
    add(
      'MOTION_PULLER_SPEED_OUT_OF_RANGE',
      'warning',
      brokenRuns(
        pullerMPerMin,
        (v) => v > fastest,
        (a, b) => a > b,
      ),
      (j) => pullerMPerMin[j]!,
      fastest,
      (run, range) => pullerText(run, range, 'above', fastest),
    );
    add(
      'MOTION_PULLER_SPEED_OUT_OF_RANGE',
      'warning',
      brokenRuns(
        pullerMPerMin,
        (v) => v < slowest,
        (a, b) => a < b,
      ),
      (j) => pullerMPerMin[j]!,
      slowest,
      (run, range) => pullerText(run, range, 'below', slowest),
    );
  } else {
    add(
      'MOTION_DRAW_DOWN_HIGH',
      'warning',
      brokenRuns(
        sim.drawDownRatio,
        (v) => v > limits.drawDownMax,
        (a, b) => a > b,
      ),
      (j) => sim.drawDownRatio[j]!,
      limits.drawDownMax,
      (run, range) =>
        `Draw-down ${fmt(sim.drawDownRatio[run.worst]!)} above ${fmt(limits.drawDownMax)} ${range} at the nominal line speed. Let the puller follow the area (process.puller_follows_area) or change the orifice area or throughput.`,
    );
    add(
      'MOTION_DRAW_DOWN_LOW',
      'warning',
      brokenRuns(
        sim.drawDownRatio,
        (v) => v < limits.drawDownMin,
        (a, b) => a < b,
      ),
      (j) => sim.drawDownRatio[j]!,
      limits.drawDownMin,
      (run, range) =>
        `Draw-down ${fmt(sim.drawDownRatio[run.worst]!)} below ${fmt(limits.drawDownMin)} ${range} at the nominal line speed. Let the puller follow the area (process.puller_follows_area) or change the orifice area or throughput.`,
    );
  }
  add(
    'MOTION_PRESSURE_RISE',
    'warning',
    brokenRuns(
      sim.diePressureRatio,
      (v) => v > MOTION_PRESSURE_RISE_RATIO,
      (a, b) => a > b,
    ),
    (j) => sim.diePressureRatio[j]!,
    MOTION_PRESSURE_RISE_RATIO,
    (run, range) =>
      `The die-land pressure rises to ${fmt(sim.diePressureRatio[run.worst]!)}× the first station's ${range} at constant throughput (power-law slit at the equivalent gap; limit ${MOTION_PRESSURE_RISE_RATIO}×, common practice). Make sure the pressure interlocks and rupture disc cover it, and ramp the motion slowly enough for the melt-pressure control.`,
  );
  const [low, high] = MOTION_TRANSMISSION_BAND_DEG;
  add(
    'MOTION_TRANSMISSION_ANGLE',
    'warning',
    brokenRuns(
      sim.transmissionDeg,
      (v) => v < low || v > high,
      (a, b) => Math.abs(90 - a) > Math.abs(90 - b),
    ),
    (j) => sim.transmissionDeg[j]!,
    undefined,
    (run, range) =>
      `The transmission angle at ${sim.transmissionAt[run.worst]} reaches ${fmt(sim.transmissionDeg[run.worst]!)}° ${range}, outside ${low}°–${high}° (angles ${strideNote}): expect high pin and actuator force there.`,
  );
  add(
    'MOTION_CLEARANCE',
    'warning',
    brokenRuns(
      sim.clearanceMm,
      (v) => v < 0,
      (a, b) => a < b,
    ),
    (j) => sim.clearanceMm[j]!,
    0,
    (run, range) =>
      `Parts overlap by ${fmt(-sim.clearanceMm[run.worst]!)} mm ${range}: ${sim.clearanceParts[run.worst]} (room ${strideNote}). Give one part another layer or move the link.`,
  );
  findings.push(summary(sim, schedule, strideNote));
  if (sim.tracking) findings.push(trackingNote(sim, kinds, schedule));
  return findings;
}

/** `MOTION_TRACKED`: how far the law's motion and the tracked motion stray from the morph between stations. */
function trackingNote(sim: PlanSimulation, kinds: readonly ('rotary' | 'linear')[], schedule: Schedule): Finding {
  const t = sim.tracking!;
  const law = Math.max(0, ...t.lawResidualMm);
  const tracked = Math.max(0, ...t.residualMm);
  // the tracked values' speeds by differences over the steps, against the actuators' limits
  const over: string[] = [];
  t.actuatorValues.forEach((series, k) => {
    let peak = 0;
    for (let j = 1; j < series.length; j++) {
      const dt = sim.timesS[j]! - sim.timesS[j - 1]!;
      if (dt > 0) peak = Math.max(peak, Math.abs(series[j]! - series[j - 1]!) / dt);
    }
    const rotary = kinds[k] !== 'linear';
    const limit = rotary ? schedule.actuators.maxSpeedRadPerS : schedule.actuators.maxSpeedMmPerS;
    if (peak > limit) {
      const scale = rotary ? 180 / Math.PI : 1;
      over.push(
        `actuator ${k + 1} peaks at ${fmt(peak * scale)} ${rotary ? '°/s' : 'mm/s'} (limit ${fmt(limit * scale)})`,
      );
    }
  });
  const limits =
    over.length > 0
      ? ` Tracked, ${over.join('; ')}: lengthen the transitions or slow the line before using the tracked table.`
      : ' The tracked values stay within the actuators’ speed limits.';
  return {
    code: 'MOTION_TRACKED',
    severity: over.length > 0 ? 'warning' : 'info',
    value: tracked,
    message: `Direct mode: every actuator drives a chain joint, so the intermediate shapes can follow the morph between the station shapes (each pivot blended between its stations by the motion law's weight). With the motion law's values the pivots stray up to ${fmt(law)} mm (RMS over the pivots) from it; with actuator values found by least squares at every step, up to ${fmt(tracked)} mm (setpoints.csv?motion=tracked).${limits}`,
  };
}

function summary(sim: PlanSimulation, schedule: Schedule, strideNote: string): Finding {
  const x = sim.positionsM;
  let fastest = 0;
  sim.tipSpeedMmPerS.forEach((v, j) => {
    if (v > sim.tipSpeedMmPerS[fastest]!) fastest = j;
  });
  const areas = sim.areaMm2;
  const puller = sim.pullerFollowsArea
    ? ` The puller follows the area to hold draw-down ${fmt(sim.targetDrawDown)}: ${fmt(metresPerMinute(Math.min(...sim.pullerSpeedMPerS)))}–${fmt(metresPerMinute(Math.max(...sim.pullerSpeedMPerS)))} m/min, so the repeat takes ${fmt(sim.timesS[sim.timesS.length - 1]!)} s.`
    : '';
  const capped = sim.capped
    ? ` (coarser than time_step_s ${fmt(schedule.timeStepS)} s: at most 2000 steps are simulated)`
    : '';
  return {
    code: 'MOTION_SIMULATED',
    severity: 'info',
    value: x.length,
    message:
      `The commanded motion was simulated at ${x.length} steps every ${fmt(sim.timeStepS)} s${capped}, the mechanism assembled and the orifice clipped at each; walls, transmission angles and room ${strideNote}. ` +
      `Orifice area ${fmt(Math.min(...areas))}–${fmt(Math.max(...areas))} mm²; the fastest plate tip moves at ${fmt(sim.tipSpeedMmPerS[fastest]!)} mm/s at ${fmt(x[fastest]!, 4)} m.${puller}`,
  };
}

/** "from 0.62 m to 0.71 m of line (between stations 1 and 2)", or "at 0.62 m" for a single step. */
function rangeText(fromM: number, toM: number, schedule: Schedule): string {
  const where = between(fromM, toM, schedule);
  if (Math.abs(toM - fromM) < 1e-9) return `at ${fmt(fromM, 4)} m of line${where}`;
  return `from ${fmt(fromM, 4)} m to ${fmt(toM, 4)} m of line${where}`;
}

/** Which stations a range lies between, in words (empty when it spans more than one transition). */
function between(fromM: number, toM: number, schedule: Schedule): string {
  // the simulation's positions run from the first station over one repeat (or to the last station), unwrapped
  const s = schedule.stations;
  const first = s[0]!.positionM;
  const repeat = schedule.repeatLengthM;
  const a = fromM;
  const b = toM;
  for (let i = 0; i < s.length; i++) {
    const lo = s[i]!.positionM;
    const last = i === s.length - 1;
    if (last && repeat === null) break;
    const hi = last ? first + repeat! : s[i + 1]!.positionM;
    if (a >= lo && b <= hi) {
      const next = last ? 0 : i + 1;
      return ` (between stations ${i} and ${next})`;
    }
  }
  return '';
}
