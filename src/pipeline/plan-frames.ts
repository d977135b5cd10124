import type { Point } from '../geometry/index.js';
import { linkJointIds, type MechanisationResult } from '../mechanise/index.js';
import { type ActuatorKind, sampleTrajectory } from '../motion/index.js';
import { type ChainFit, pivotFans, plateOutline } from '../synthesis/index.js';
import type { PlanMotion } from './plan-motion.js';
import type { PlanSimulation } from './plan-simulation.js';

/** Most frames a review page gets: the simulation's steps thinned evenly to this many. */
export const MAX_FRAMES = 2000;

/** The simulated motion as frames for drawing: internal units (mm, m, s; actuator values rad or mm). */
export interface PlanFrames {
  /** Simulation step of each frame. */
  readonly steps: readonly number[];
  readonly positionsM: readonly number[];
  readonly timesS: readonly number[];
  readonly actuators: readonly {
    readonly id: string;
    readonly kind: ActuatorKind;
    /** Value per frame, rad (rotary) or mm (linear). */
    readonly values: readonly number[];
  }[];
  /** Every joint's point per frame, die-body frame, mm. */
  readonly joints: readonly { readonly id: string; readonly positionsMm: readonly Point[] }[];
  /**
   * Every plate with the joints at its two pivots and its outline in its own frame: origin at the first pivot, x axis
   * toward the second, as the plate sits at the first station (mm).
   */
  readonly plates: readonly {
    readonly id: string;
    readonly pivots: readonly [string, string];
    readonly outlineLocalMm: readonly Point[];
  }[];
  /** Binary links with the joints at their two pins. */
  readonly links: readonly { readonly id: string; readonly pins: readonly [string, string] }[];
  readonly areaMm2: readonly number[];
  readonly drawDownRatio: readonly number[];
  /** m/s. */
  readonly pullerSpeedMPerS: readonly number[];
  readonly diePressureRatio: readonly number[];
}

/** What the frames are drawn from. */
export interface PlanFrameParts {
  readonly fit: ChainFit;
  readonly mechanisation: MechanisationResult;
  readonly motion: PlanMotion;
  readonly simulation: PlanSimulation;
}

/**
 * The simulation's steps thinned evenly to at most `maxFrames` (first and last kept), with each actuator's commanded
 * value, every joint's point, the plates' outlines in their own frames (drawn as the plan draws them: melt edge at e,
 * shaped edges, pivot fans) and the process series at those steps.
 */
export function planFrames(parts: PlanFrameParts, maxFrames = MAX_FRAMES): PlanFrames {
  const { fit, mechanisation, motion, simulation } = parts;
  const n = simulation.positionsM.length;
  const count = Math.max(2, Math.min(n, maxFrames));
  const steps =
    n <= count
      ? simulation.positionsM.map((_, j) => j)
      : Array.from({ length: count }, (_, i) => Math.round((i * (n - 1)) / (count - 1)));
  const pick = <T>(series: readonly T[]) => steps.map((j) => series[j]!);
  const model = mechanisation.model;
  const positionsM = pick(simulation.positionsM);
  const actuators = (model?.drivers ?? []).map((d, k) => {
    const t = motion.trajectories[k]!;
    const values = positionsM.map((x) => sampleTrajectory(t, x).value);
    if (t.timeBase.periodic && steps[steps.length - 1] === n - 1) values[values.length - 1] = values[0]!;
    return { id: d.id, kind: t.kind, values };
  });
  const jointAt = new Map(simulation.joints.map((j) => [j.id, j.positionsMm[0]!] as const));
  const fans = pivotFans(fit.chain.pivots);
  const plates = fit.chain.lengthsMm.map((_, i) => {
    const k = i + 1;
    const ids: [string, string] = [`pivot_${k - 1}`, `pivot_${k}`];
    const a = jointAt.get(ids[0]) ?? fit.chain.pivots[0]![k - 1]!;
    const b = jointAt.get(ids[1]) ?? fit.chain.pivots[0]![k]!;
    const outline = plateOutline(a, b, fit.shape, fit.edgeProfiles?.[i] ?? null, { atA: fans[i]!, atB: fans[k]! });
    const phi = Math.atan2(b[1] - a[1], b[0] - a[0]);
    const c = Math.cos(phi);
    const s = Math.sin(phi);
    return {
      id: `plate_${k}`,
      pivots: ids,
      outlineLocalMm: outline.outer.map(
        (p): Point => [c * (p[0] - a[0]) + s * (p[1] - a[1]), -s * (p[0] - a[0]) + c * (p[1] - a[1])],
      ),
    };
  });
  return {
    steps,
    positionsM,
    timesS: pick(simulation.timesS),
    actuators,
    joints: simulation.joints.map((j) => ({ id: j.id, positionsMm: pick(j.positionsMm) })),
    plates,
    links: mechanisation.links.map((l) => {
      const ids = linkJointIds(l);
      return { id: l.id, pins: [ids.a, ids.b] as const };
    }),
    areaMm2: pick(simulation.areaMm2),
    drawDownRatio: pick(simulation.drawDownRatio),
    pullerSpeedMPerS: pick(simulation.pullerSpeedMPerS),
    diePressureRatio: pick(simulation.diePressureRatio),
  };
}
