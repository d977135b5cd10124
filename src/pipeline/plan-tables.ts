import { type ActuatorTrajectory, sampleTrajectory, setpointTable, timeStepsOver } from '../motion/index.js';
import { productAreaMm2, pullerSpeedForDrawDown } from '../process/index.js';
import { interpolateLinear } from '../numeric/index.js';
import type { PlanMotion } from './plan-motion.js';
import type { PlanSimulation } from './plan-simulation.js';

/** The setpoint table in internal units, with the process columns from the simulation when there is one. */
export interface PlanSetpoints {
  /** Line positions, m, strictly increasing (not wrapped). */
  readonly positionsM: readonly number[];
  /** Times from the first row, s, one time step apart (the last step may be shorter). */
  readonly timesS: readonly number[];
  /** `values[k][i]`: actuator k at row i, rad (rotary) or mm (linear). */
  readonly values: readonly (readonly number[])[];
  /** The process columns; null when the plan has no simulation. */
  readonly process: ProcessColumns | null;
  readonly periodic: boolean;
}

/** Puller speed, orifice and product area and draw-down at each row. */
export interface ProcessColumns {
  /** Puller speed, m/s. */
  readonly pullerSpeedMPerS: readonly number[];
  /** Orifice area, mm² (linear between simulation steps). */
  readonly areaMm2: readonly number[];
  /** Product cross-section, mm² (ṁ / (ρ_solid · v)). */
  readonly productAreaMm2: readonly number[];
  /** Area draw-down ratio, orifice over product. */
  readonly drawDownRatio: readonly number[];
}

/** Which actuator values a setpoint table carries. */
export interface SetpointSettings {
  /**
   * True: the direct-mode values that track the morph between station shapes (`trackMorph`), linear between the
   * simulation's steps; throws when the plan has none. @default false: the motion law's values
   */
  readonly tracked?: boolean;
}

/** Rows the setpoint table of a plan would have (to refuse a huge table before building it). */
export function setpointRowCount(motion: PlanMotion, simulation: PlanSimulation | null): number {
  const base = motion.trajectories[0]!.timeBase;
  const durationS = simulation?.pullerFollowsArea
    ? simulation.timesS[simulation.timesS.length - 1]!
    : base.spanM / base.lineSpeedMPerS;
  return Math.floor(durationS / motion.timeStepS + 1e-9) + 2;
}

/**
 * The setpoint table: one row per `time_step_s` over one repeat (periodic) or from the first to the last station.
 * At the nominal line speed the rows are the trajectories' step grid; when the puller follows the area the rows are
 * equal time steps of the re-keyed time base (the simulation's t(x), dt = dx/v), each row's position found on it by
 * linear interpolation, so position, time and puller speed agree. The process columns come from the simulation: the
 * orifice area linear between its steps, and from it the puller speed (nominal, or holding the target draw-down),
 * the product area and the draw-down, so that ρ_solid · A_product · v = ṁ on every row (mass balance). A periodic
 * table's last row repeats the first row's values exactly. With `settings.tracked` the actuator columns are the
 * direct-mode tracked values instead of the law's.
 */
export function planSetpoints(
  motion: PlanMotion,
  simulation: PlanSimulation | null,
  settings: SetpointSettings = {},
): PlanSetpoints {
  if (!simulation) {
    const table = setpointTable(motion.trajectories, motion.timeStepS);
    return { ...table, process: null };
  }
  const base = motion.trajectories[0]!.timeBase;
  let positionsM: number[];
  let timesS: number[];
  if (simulation.pullerFollowsArea) {
    timesS = timeStepsOver(simulation.timesS[simulation.timesS.length - 1]!, motion.timeStepS);
    positionsM = timesS.map((t) => interpolate(simulation.timesS, simulation.positionsM, t));
  } else {
    const table = setpointTable(motion.trajectories, motion.timeStepS);
    positionsM = [...table.positionsM];
    timesS = [...table.timesS];
  }
  const tracking = settings.tracked ? simulation.tracking : null;
  if (settings.tracked && !tracking)
    throw new Error('planSetpoints: the plan has no tracked motion (direct mode only)');
  const values = tracking
    ? tracking.actuatorValues.map((series) => {
        const out = positionsM.map((x) => interpolate(simulation.positionsM, series, x));
        if (base.periodic) out[out.length - 1] = out[0]!;
        return out;
      })
    : motion.trajectories.map((t) => column(t, positionsM, base.periodic));
  return {
    positionsM,
    timesS,
    values,
    process: processColumns(simulation, positionsM),
    periodic: base.periodic,
  };
}

/** A puller-speed table keyed by line position: master positions and the process columns there, and the time. */
export interface PullerTable extends ProcessColumns {
  /** Master positions, m, evenly spaced and strictly increasing over one repeat (or the stations' span). */
  readonly positionsM: readonly number[];
  /** Time at each position, s (re-keyed by the puller speed when it follows the area). */
  readonly timesS: readonly number[];
  readonly periodic: boolean;
  /** True when the puller follows the area; false: it runs at the nominal line speed throughout. */
  readonly follows: boolean;
}

/**
 * The puller-speed table: `points` (≥ 2) evenly spaced master positions over the simulation's span, the puller speed
 * and the process columns there (as `planSetpoints`), and the time at each (linear between simulation steps). A
 * periodic table's last row repeats the first row's process values, its time is the repeat's duration.
 */
export function pullerTable(simulation: PlanSimulation, points: number): PullerTable {
  if (!Number.isInteger(points) || points < 2) throw new Error(`pullerTable: needs at least 2 points, got ${points}`);
  const xs = simulation.positionsM;
  const first = xs[0]!;
  const last = xs[xs.length - 1]!;
  const positionsM = Array.from({ length: points }, (_, i) =>
    i === points - 1 ? last : first + ((last - first) * i) / (points - 1),
  );
  const timesS = positionsM.map((x) => interpolate(xs, simulation.timesS, x));
  return {
    positionsM,
    timesS,
    ...processColumns(simulation, positionsM),
    periodic: simulation.periodic,
    follows: simulation.pullerFollowsArea,
  };
}

/** The orifice area at the rows (linear between steps), and the puller speed, product area and draw-down from it. */
function processColumns(simulation: PlanSimulation, positionsM: readonly number[]): ProcessColumns {
  const periodic = simulation.periodic;
  const areaMm2 = positionsM.map((x) => interpolate(simulation.positionsM, simulation.areaMm2, x));
  if (periodic) areaMm2[areaMm2.length - 1] = areaMm2[0]!;
  const { throughputKgPerS: m, solidDensityKgPerM3: rho, targetDrawDown } = simulation;
  const nominal = simulation.nominalLineSpeedMPerS;
  const pullerSpeedMPerS = areaMm2.map((a) =>
    simulation.pullerFollowsArea && a > 0 ? pullerSpeedForDrawDown(m, rho, a, targetDrawDown) : nominal,
  );
  const product = pullerSpeedMPerS.map((v) => productAreaMm2(m, rho, v));
  return {
    pullerSpeedMPerS,
    areaMm2,
    productAreaMm2: product,
    drawDownRatio: areaMm2.map((a, i) => a / product[i]!),
  };
}

/** One trajectory sampled at the positions; a periodic column's last value repeats its first exactly. */
function column(t: ActuatorTrajectory, positionsM: readonly number[], periodic: boolean): number[] {
  const out = positionsM.map((x) => sampleTrajectory(t, x).value);
  if (periodic) out[out.length - 1] = out[0]!;
  return out;
}

/** Linear interpolation of ys over increasing xs at x (clamped to the ends), by bisection. */
export const interpolate = interpolateLinear;
