import type { Schedule } from '../domain/index.js';
import type { Point, Ring } from '../geometry/index.js';
import type { BodyPose, Mechanism } from '../kinematics/index.js';
import { chainTopology, type ClearanceParts, type MechanisationResult } from '../mechanise/index.js';
import { stepGrid, timeStepsOver } from '../motion/index.js';
import { productAreaMm2, pullerSpeedForDrawDown, slitPressureDropPa } from '../process/index.js';
import { type ChainFit, pivotFans, plateOutline } from '../synthesis/index.js';
import type { ScheduleCheck } from './check-schedule.js';
import type { PlanMotion } from './plan-motion.js';
import { type MotionSimulation, type MotionSimulationInput, simulateMotion } from './simulate-motion.js';
import { type MorphTracking, trackMorph } from './track-morph.js';

/** Most steps a plan simulates; a finer setpoint grid is simulated on an even coarser grid (and the plan says so). */
export const MAX_SIMULATION_STEPS = 2000;
/** About this many wall measurements (and transmission and clearance checks) per plan, spread evenly over the steps. */
export const WALL_MEASUREMENTS = 40;

/**
 * The commanded motion simulated step by step (docs/MODEL.md §3), with the process figures per step. Plain data: one
 * value per step in every series (null where a quantity is measured only at the wall stride).
 */
export interface PlanSimulation extends MotionSimulation {
  /** Time step of the simulation at the nominal line speed, s: the setpoint table's, or coarser when capped. */
  readonly timeStepS: number;
  /** True when the setpoint grid had more than MAX_SIMULATION_STEPS steps and a coarser step was simulated. */
  readonly capped: boolean;
  /** Walls, transmission angles and clearances were measured every this many steps (and at every station). */
  readonly wallStride: number;
  /** Station positions are steps of the simulation: `stationSteps[i]` is station i's step. */
  readonly stationSteps: readonly number[];
  /** True when the simulation covers one repeat: its last step is its first one repeat on. */
  readonly periodic: boolean;
  /** The schedule's nominal line speed, m/s. */
  readonly nominalLineSpeedMPerS: number;
  /** True when the puller follows the orifice area (the schedule's `process.pullerFollowsArea`). */
  readonly pullerFollowsArea: boolean;
  /** Draw-down the puller holds when it follows the area (middle of the range), area ratio. */
  readonly targetDrawDown: number;
  /** Throughput held constant over the motion, kg/s. */
  readonly throughputKgPerS: number;
  /** Solid density at the puller, kg/m³ (for ṁ = ρ·A·v). */
  readonly solidDensityKgPerM3: number;
  /** Puller speed per step, m/s: the nominal line speed, or the speed that holds the target draw-down. */
  readonly pullerSpeedMPerS: readonly number[];
  /** Product cross-section per step, mm² (ṁ / (ρ_solid · v)). */
  readonly productAreaMm2: readonly number[];
  /** Area draw-down ratio per step, orifice over product. */
  readonly drawDownRatio: readonly number[];
  /** Die-land pressure per step over the first station's (power-law slit at the equivalent gap 2A/P). */
  readonly diePressureRatio: readonly number[];
  /**
   * Direct mode only (one actuator per degree of freedom, no links): the actuator values per step that follow the
   * morph between station shapes by least squares (`trackMorph`), and how far the law's and the tracked motion stray
   * from it; null otherwise.
   */
  readonly tracking: MorphTracking | null;
}

/** What the simulation is built from: the plan's parts. */
export interface PlanSimulationParts {
  readonly schedule: Schedule;
  readonly check: ScheduleCheck;
  readonly fit: ChainFit;
  readonly mechanisation: MechanisationResult;
  readonly motion: PlanMotion;
}

/**
 * The simulation input of a mechanised plan: its kinematic model and trajectories, the chain's pivots and plate shape
 * (shaped edges, pivot fans as the mechanisation drew them), the die opening, the stations, and the parts whose room
 * is checked (plates drawn with 0.2 mm chords in their own frames, binary links). Null when the plan has no model.
 */
export function simulationInput(parts: PlanSimulationParts): MotionSimulationInput | null {
  const { schedule, fit, mechanisation, motion } = parts;
  const model = mechanisation.model;
  if (!model || model.drivers.length !== motion.trajectories.length) return null;
  const topology = chainTopology(fit);
  return {
    mechanism: model,
    trajectories: motion.trajectories,
    pivots: topology.pivots,
    shape: fit.shape,
    edges: fit.edgeProfiles ?? [],
    fans: pivotFans(fit.chain.pivots),
    opening: fit.opening,
    stations: schedule.stations.map((s, i) => ({ positionM: s.positionM, target: fit.stations[i]!.targetOrifice })),
    repeatLengthM: schedule.repeatLengthM,
    toleranceMm: schedule.limits.fitToleranceMm,
    clearance: clearanceParts(fit, model, mechanisation),
  };
}

/**
 * The plan's motion simulated on the setpoint grid (`time_step_s` over one repeat, or first to last station) with
 * every station position added as a step; a grid of more than MAX_SIMULATION_STEPS steps is replaced by an even one of
 * that many. Walls (the slow measurement), transmission angles and clearances are measured at about WALL_MEASUREMENTS
 * evenly strided steps and at every station. Then the process per step at constant throughput: the puller speed (the
 * nominal line speed, or when `process.pullerFollowsArea` the speed holding the target draw-down, ṁ = ρ·A·v), the
 * product area, the draw-down and the die-land pressure over the first station's (power-law slit at the equivalent
 * gap 2A/P, docs/MODEL.md §3). When the puller follows the area, times are re-keyed by that speed (dt = dx/v,
 * trapezoid rule) and the tip speeds with them. Null when the plan has no kinematic model.
 */
export function simulatePlan(parts: PlanSimulationParts): PlanSimulation | null {
  const input = simulationInput(parts);
  if (!input) return null;
  const { schedule, check, motion } = parts;
  const base = motion.trajectories[0]!.timeBase;
  // a grid far finer than the cap is never built: a 1 ms step over a long repeat has more steps than stepGrid allows
  const durationS = base.spanM / base.lineSpeedMPerS;
  const fine = durationS / motion.timeStepS > MAX_SIMULATION_STEPS ? null : stepGrid(base, motion.timeStepS);
  const capped = fine === null || fine.timesS.length > MAX_SIMULATION_STEPS;
  const timeStepS = capped ? durationS / (MAX_SIMULATION_STEPS - 1) : motion.timeStepS;
  const grid = capped ? stepGrid(base, timeStepS) : fine!;
  // every station is a step, so the stations' shapes are measured exactly where the schedule asks for them
  const positions = [...grid.positionsM];
  for (const s of schedule.stations) positions.push(s.positionM);
  positions.sort((a, b) => a - b);
  const positionsM: number[] = [];
  for (const x of positions) {
    if (positionsM.length === 0 || x - positionsM[positionsM.length - 1]! > 1e-9) positionsM.push(x);
  }
  const nominalTimes = positionsM.map((x) => (x - base.originM) / base.lineSpeedMPerS);
  const stationSteps = schedule.stations.map((s) => nearestIndex(positionsM, s.positionM));
  const wallStride = Math.max(1, Math.ceil(positionsM.length / WALL_MEASUREMENTS));
  const run = simulateMotion(input, {
    positionsM,
    timesS: nominalTimes,
    clip: true,
    wallStride,
    alsoMeasure: stationSteps,
  });

  const p = schedule.process;
  const follows = p.pullerFollowsArea === true;
  const throughput = check.throughputKgPerS;
  const target = check.targetDrawDown;
  const nominalProduct = productAreaMm2(throughput, p.solidDensityKgPerM3, p.lineSpeedMPerS);
  const pullerSpeedMPerS = run.areaMm2.map((a) =>
    follows && a > 0 ? pullerSpeedForDrawDown(throughput, p.solidDensityKgPerM3, a, target) : p.lineSpeedMPerS,
  );
  const product = pullerSpeedMPerS.map((v, j) =>
    follows && run.areaMm2[j]! > 0 ? productAreaMm2(throughput, p.solidDensityKgPerM3, v) : nominalProduct,
  );
  const drawDownRatio = run.areaMm2.map((a, j) => a / product[j]!);
  const firstPressure = check.stations[0]!.process.landPressureBar * 1e5;
  const diePressureRatio = run.areaMm2.map((a, j) => {
    const perimeter = run.perimeterMm[j]!;
    if (!(a > 0) || !(perimeter > 0)) return Number.POSITIVE_INFINITY;
    const q = throughput / p.meltDensityKgPerM3 / (perimeter / 2 / 1000);
    const slit = { gapMm: (2 * a) / perimeter, landMm: p.dieLandLengthMm, n: p.powerLawN, mPaSn: p.powerLawMPaSn };
    return slitPressureDropPa(slit, q) / firstPressure;
  });
  const timesS = follows ? timesAlongSpeeds(positionsM, pullerSpeedMPerS) : nominalTimes;
  const direct = parts.mechanisation.mode === 'direct' && parts.mechanisation.links.length === 0;
  const tracking = direct ? trackMorph({ ...input, clearance: null }, parts.fit.chain.pivots, positionsM) : null;
  const tipSpeedMmPerS = follows
    ? run.tipSpeedMmPerS.map((s, j) => {
        const a = Math.max(0, j - 1);
        const b = Math.min(positionsM.length - 1, j + 1);
        const before = nominalTimes[b]! - nominalTimes[a]!;
        const after = timesS[b]! - timesS[a]!;
        return after > 0 ? (s * before) / after : s;
      })
    : run.tipSpeedMmPerS;
  return {
    ...run,
    timesS,
    tipSpeedMmPerS,
    timeStepS,
    capped,
    wallStride,
    stationSteps,
    periodic: base.periodic,
    nominalLineSpeedMPerS: p.lineSpeedMPerS,
    pullerFollowsArea: follows,
    targetDrawDown: target,
    throughputKgPerS: throughput,
    solidDensityKgPerM3: p.solidDensityKgPerM3,
    pullerSpeedMPerS,
    productAreaMm2: product,
    drawDownRatio,
    diePressureRatio,
    tracking,
  };
}

/**
 * Times at line positions when the line speed varies with position, s from the first: t_j = t_{j−1} +
 * (x_j − x_{j−1})·½(1/v_{j−1} + 1/v_j) (dt = dx/v by the trapezoid rule).
 */
export function timesAlongSpeeds(positionsM: readonly number[], speedsMPerS: readonly number[]): number[] {
  const out: number[] = [0];
  for (let j = 1; j < positionsM.length; j++) {
    const dx = positionsM[j]! - positionsM[j - 1]!;
    out.push(out[j - 1]! + dx * 0.5 * (1 / speedsMPerS[j - 1]! + 1 / speedsMPerS[j]!));
  }
  return out;
}

/** Time steps of `timeStepS` over the simulation's (possibly re-keyed) duration, s, the end included. */
export function setpointTimes(simulation: PlanSimulation, timeStepS: number): number[] {
  return timeStepsOver(simulation.timesS[simulation.timesS.length - 1]!, timeStepS);
}

/** Index of the value in an increasing list nearest to x. */
function nearestIndex(values: readonly number[], x: number): number {
  let best = 0;
  for (let i = 1; i < values.length; i++) if (Math.abs(values[i]! - x) < Math.abs(values[best]! - x)) best = i;
  return best;
}

/**
 * The parts whose room is checked along the motion: every rigid plate's outline (straight melt edge at e, the pivot
 * fans, 0.2 mm chords) in its own frame as it sits at the first station, its layer from the model; the binary links.
 * Telescoping halves and slider blocks carry no outline (as in the mechanisation's own check).
 */
function clearanceParts(fit: ChainFit, model: Mechanism, m: MechanisationResult): ClearanceParts {
  const topology = chainTopology(fit);
  const layerOf = new Map(model.bodies.map((b) => [b.id, b.layer] as const));
  const initialOf = new Map(model.bodies.map((b) => [b.id, b.initial] as const));
  const coarse = { ...fit.shape, arcToleranceMm: Math.max(fit.shape.arcToleranceMm, 0.2) };
  const fans = pivotFans(fit.chain.pivots);
  const pivots = fit.chain.pivots[0]!;
  const plates: { id: string; layer: number; outline: Ring }[] = [];
  for (const b of topology.bodies) {
    if (b.role !== 'plate' || b.pivotsLocal.length < 2) continue;
    const k = b.plate - 1;
    const pose = initialOf.get(b.id);
    if (!pose) continue;
    const outline = plateOutline(pivots[k]!, pivots[k + 1]!, coarse, null, { atA: fans[k]!, atB: fans[k + 1]! });
    plates.push({ id: b.id, layer: layerOf.get(b.id) ?? b.layer, outline: outline.outer.map((q) => toLocal(pose, q)) });
  }
  return {
    plates,
    links: m.links.map((l) => ({
      id: l.id,
      layer: layerOf.get(l.id) ?? 0,
      lengthMm: l.lengthMm,
      bodyA: l.bodyA,
      bodyB: l.bodyB,
    })),
    layerOf,
    opening: fit.opening.outer,
    pinRadiusMm: fit.shape.holeRadiusMm,
    steelMm: fit.shape.edgeOffsetMm,
  };
}

function toLocal(pose: BodyPose, p: Point): Point {
  const c = Math.cos(pose.phi);
  const s = Math.sin(pose.phi);
  const dx = p[0] - pose.x;
  const dy = p[1] - pose.y;
  return [c * dx + s * dy, -s * dx + c * dy];
}
