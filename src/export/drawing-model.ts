import type { Caution, Finding, Schedule } from '../domain/index.js';
import {
  type Point,
  pointToRingDistance,
  type Region,
  type Ring,
  regionArea,
  unionRegions,
} from '../geometry/index.js';
import { initialPose, jointPoint, type Pose, solvePosition } from '../kinematics/index.js';
import { toRadians } from '../numeric/index.js';
import type { Plan } from '../pipeline/index.js';
import { pivotFans, plateOutline } from '../synthesis/index.js';

/**
 * Added to the schedule's pivot hole diameter on every drawn pin hole, mm: a running fit for a pin of the schedule's
 * diameter. For 3–6 mm a H7 hole on a g6 pin leaves 0.004–0.024 mm (ISO 286-2 tables, from memory); 0.02 mm sits in
 * that band and is stated on every drawing so the tool maker can ream to their own fit instead.
 */
export const PIN_HOLE_FIT_CLEARANCE_MM = 0.02;

/**
 * Added to the slider block's width and length on every drawn slot, mm: a sliding fit for the block. For 6–18 mm a
 * H7 slot on a g6 block leaves 0.005–0.029 mm (ISO 286-2 tables, from memory); 0.02 mm sits in that band and is stated
 * on the die-body drawing so the tool maker can fit to their own practice instead.
 */
export const SLOT_FIT_CLEARANCE_MM = 0.02;

/**
 * Configurations solved between neighbouring stations for the swept envelope (each transition cut into this many
 * equal steps of the actuator values). Every actuator moves by the same rest-to-rest law over a transition, so all of
 * them are at the same fraction of their move at any instant: the configurations the die passes through are exactly
 * those at linearly interpolated actuator values, whatever the law.
 */
export const STEPS_PER_TRANSITION = 8;

/** What a drawn part is, in plain words. */
export type PartKind = 'plate' | 'telescoping half' | 'slider block' | 'link';

/** A round hole of a part, die-body frame, mm. */
export interface DrawnHole {
  readonly centre: Point;
  /** Drawn (cut) diameter: the schedule's pivot hole diameter plus `PIN_HOLE_FIT_CLEARANCE_MM`, mm. */
  readonly diameterMm: number;
  /** The joint whose pin goes through it. */
  readonly joint: string;
}

/** One part as placed in one configuration, die-body frame, mm. */
export interface DrawnPart {
  /** The mechanism body id (`plate_2`, `plate_3_slide`, `slider_start`, `link_1`). */
  readonly id: string;
  readonly kind: PartKind;
  /** Layer in the plate stack (1 nearest the die body), as the plan's mechanism gives it. */
  readonly stackLayer: number;
  /** Closed cut outline, counter-clockwise, first point not repeated. */
  readonly outline: Ring;
  /**
   * True when `outline` is the plate outline the plan's clipping uses, built the same way (`plateOutline` on the
   * plan's reported pivots, with the pivot fans over all stations and the plate's shaped edge); false when a boss round
   * a link pin widens the plate (then the union with the boss, on clipper's 0.1 µm grid) and for parts the clipping
   * does not use (links, slider blocks, telescoping halves).
   */
  readonly exactOutline: boolean;
  readonly holes: readonly DrawnHole[];
  /** The edge that forms the orifice, from one round end to the other; null for parts away from the melt. */
  readonly meltEdge: readonly Point[] | null;
}

/** One station as the drawings show it. */
export interface DrawnStation {
  readonly index: number;
  readonly positionM: number;
  readonly target: Region;
  /** Die opening minus the plates where the driven mechanism puts them (the plan's achieved orifice). */
  readonly achieved: Region;
  /** Symmetric Hausdorff distance between target and achieved boundaries, mm. */
  readonly deviationMm: number;
  readonly parts: readonly DrawnPart[];
}

/** An actuator and where it sits at the first station. */
export interface DrawnActuator {
  readonly id: string;
  readonly joint: string;
  readonly kind: 'rotary' | 'linear';
  /** The joint's point at the first station, mm. */
  readonly at: Point;
  /** True when one side of the actuator's joint is the die body (it mounts on the die body). */
  readonly onDieBody: boolean;
  /** The other body of the joint. */
  readonly drives: string;
  /** Values at the stations, degrees (rotary) or mm (linear). */
  readonly stationValues: readonly number[];
}

/**
 * Length of each half of a telescoping pair whose pivots are `stationLengths` apart over the stations: half the
 * longest distance plus e/2, so that the two straight melt edges overlap by e at the longest station, mm.
 */
export function telescopingHalfLength(stationLengths: readonly number[], e: number): number {
  return (Math.max(...stationLengths) + e) / 2;
}

/**
 * A straight slot in the die body for a chain end, mm: a pocket the slider block runs in, long enough for the block at
 * both ends of the pin's travel.
 */
export interface DrawnSlot {
  readonly joint: string;
  /** Pin centre at the two ends of its travel over the stations. */
  readonly from: Point;
  readonly to: Point;
  /** Unit vector along the slot (from `from` towards `to` when they differ). */
  readonly direction: Point;
  /** Width of the pocket: the slider block's width plus `SLOT_FIT_CLEARANCE_MM`, mm. */
  readonly widthMm: number;
  /** Length of the pocket: the pin's travel plus the block's length plus `SLOT_FIT_CLEARANCE_MM`, mm. */
  readonly lengthMm: number;
}

/**
 * A telescoping pair as drawn: two halves of one length, each from its own pivot towards the other, so that their melt
 * edges overlap by e at the pair's longest station (no gap for the melt) and slide over each other as it shortens.
 */
export interface DrawnTelescoping {
  /** The plate that telescopes (`plate_3`; its halves are `plate_3` and `plate_3_slide`). */
  readonly plate: string;
  /** Distance between the pair's pivots over the stations, mm. */
  readonly pivotsApartMm: { readonly min: number; readonly max: number };
  /** Length of each half from its pivot to its far end's centre (the round end adds e), mm. */
  readonly halfLengthMm: number;
  /** How far the halves' straight melt edges overlap at the longest station, mm (e by construction). */
  readonly overlapAtLongestMm: number;
  /**
   * At the shortest station, how far each half's far end reaches past the edge of the other half's pin hole, mm;
   * negative: it stops that far short.
   */
  readonly reachPastPinMm: number;
  /**
   * Halves whose layer lies between the layers the other half's pin joins (so the pin passes through that layer) while
   * the half reaches it: they would hit the pin. Empty when the stack lets them pass.
   */
  readonly clashes: readonly string[];
}

/** Everything the drawings of one plan show, in the plan's own numbers (die-body frame, working temperature). */
export interface DrawingModel {
  readonly scheduleName: string;
  /** The polymer the die runs (the schedule's material). */
  readonly polymer: string;
  readonly plateThicknessMm: number;
  readonly pinDiameterMm: number;
  readonly holeDiameterMm: number;
  readonly dieTemperatureC: number;
  /** Highest layer in the stack. */
  readonly stackLayers: number;
  /** The die opening the clipping used (envelope of every station's outer boundary). */
  readonly opening: Region;
  readonly stations: readonly DrawnStation[];
  /** Die-body pin holes: chain ends pinned to the die body and links' ground pins, at their fixed place. */
  readonly groundHoles: readonly DrawnHole[];
  readonly slots: readonly DrawnSlot[];
  readonly telescoping: readonly DrawnTelescoping[];
  readonly actuators: readonly DrawnActuator[];
  /** Union of every moving part over every configuration drawn (stations and intermediate steps), mm. */
  readonly sweptEnvelope: readonly Region[];
  /** How many configurations the envelope covers and how they were found, in words. */
  readonly sweepNote: string;
  readonly findings: readonly Finding[];
  readonly cautions: readonly Caution[];
}

/** Why a plan cannot be drawn. */
export type DrawingRefusal = { readonly ok: false; readonly reason: string };

/**
 * The parts, stations and die-body features of a plan, ready for the writers. Plates are drawn exactly as the plan's
 * clipping draws them (`plateOutline` between the pivots where the mechanism puts them, the same pivot fans and shaped
 * edges; docs/MODEL.md §2); a link pin closer than e to a plate's side edge sits in a boss of radius e, as the
 * clearance model draws it, and the plate's cut outline is widened by it. Links are capsules of half width e round
 * their pin line (the clearance model's steel width). Telescoping halves: two straight plates, each from its own pivot, long
 * enough that their melt edges overlap by e at the pair's longest station (the clipping treats the pair as one plate
 * whose length changes, so the edge must stay whole); whether each half then meets the other half's pin at the
 * shortest station, in a layer that pin passes through, is recorded (`telescoping`). Slider blocks:
 * 4e long along the slot, 2e wide, round their pin. A plan that failed (no fitted chain, no mechanism) is refused
 * with its reason.
 */
export function drawingModel(
  plan: Plan,
  schedule: Schedule,
): { readonly ok: true; readonly model: DrawingModel } | DrawingRefusal {
  const { fit, mechanism } = plan;
  if (plan.status === 'failed' || !fit || !mechanism) {
    return { ok: false, reason: plan.error ?? 'the plan has no mechanism' };
  }
  const shape = fit.shape;
  const e = shape.edgeOffsetMm;
  const holeDiameterMm = schedule.plates.pivotHoleDiameterMm + PIN_HOLE_FIT_CLEARANCE_MM;
  const n = fit.plateCount;
  const stationCount = schedule.stations.length;
  const layerOf = new Map(mechanism.bodies.map((b) => [b.id, b.layer] as const));
  const jointById = new Map(mechanism.joints.map((j) => [j.id, j] as const));
  const telescoping = new Map(fit.chain.telescoping.map((t) => [t.plate + 1, t.stationLengthsMm] as const));
  const links = plan.mechanisation?.status === 'mechanised' ? plan.mechanisation.links : [];
  const pivotIds = Array.from({ length: n + 1 }, (_, k) => `pivot_${k}`);
  const stationJoints: Map<string, Point>[] = Array.from(
    { length: stationCount },
    (_, i) => new Map(mechanism.joints.map((j) => [j.id, j.stationPositions[i]!] as const)),
  );
  // the pivot fans over all stations, as the clipping computes them
  const fans = pivotFans(stationJoints.map((joints) => pivotIds.map((id) => joints.get(id)!)));

  const hole = (centre: Point, joint: string): DrawnHole => ({ centre, diameterMm: holeDiameterMm, joint });
  const partsAt = (joints: ReadonlyMap<string, Point>): DrawnPart[] => {
    const parts: DrawnPart[] = [];
    const pivot = (k: number) => joints.get(`pivot_${k}`)!;
    for (let k = 1; k <= n; k++) {
      const a = pivot(k - 1);
      const b = pivot(k);
      const id = `plate_${k}`;
      const stationLengths = telescoping.get(k);
      if (stationLengths) {
        const length = telescopingHalfLength(stationLengths, e);
        const u = unit(a, b);
        for (const [half, from, dir, joint] of [
          [id, a, u, `pivot_${k - 1}`],
          [`${id}_slide`, b, [-u[0], -u[1]] as Point, `pivot_${k}`],
        ] as const) {
          const far: Point = [from[0] + dir[0] * length, from[1] + dir[1] * length];
          // the slide runs from its pivot backwards: draw it from the far end so its melt edge stays on the melt side
          const outline = half === id ? plateOutline(from, far, shape) : plateOutline(far, from, shape);
          parts.push({
            id: half,
            kind: 'telescoping half',
            stackLayer: layerOf.get(half) ?? 1,
            outline: outline.outer,
            exactOutline: false,
            holes: [hole(from, joint)],
            meltEdge: meltEdgeOf(outline.outer, 0),
          });
        }
        continue;
      }
      const edge = fit.edgeProfiles[k - 1] ?? null;
      const outline = plateOutline(a, b, shape, edge, { atA: fans[k - 1]!, atB: fans[k]! });
      const holes = [hole(a, `pivot_${k - 1}`), hole(b, `pivot_${k}`)];
      let cut: Ring = outline.outer;
      let exact = true;
      for (const link of links) {
        if (link.bodyB !== id && link.bodyA !== id) continue;
        const joint = link.bodyB === id ? `${link.id}_b` : `${link.id}_a`;
        const pin = joints.get(joint)!;
        holes.push(hole(pin, joint));
        // the clearance model's boss: a pin nearer than e to the plate's edge sits in a disc of radius e
        if (pointToRingDistance(pin, outline.outer) < e) {
          const merged = unionRegions([
            { outer: outline.outer, holes: [] },
            { outer: disc(pin, e, 24), holes: [] },
          ]);
          const biggest = merged.reduce((x, y) => (regionArea(y) > regionArea(x) ? y : x));
          cut = biggest.outer;
          exact = false;
        }
      }
      parts.push({
        id,
        kind: 'plate',
        stackLayer: layerOf.get(id) ?? 1,
        outline: cut,
        exactOutline: exact,
        holes,
        meltEdge: meltEdgeOf(outline.outer, edge?.length ?? 0),
      });
    }
    for (const which of ['start', 'end'] as const) {
      const end = which === 'start' ? fit.chain.start : fit.chain.end;
      if (end.kind !== 'slot') continue;
      const joint = which === 'start' ? 'pivot_0' : `pivot_${n}`;
      const c = joints.get(joint)!;
      parts.push({
        id: `slider_${which}`,
        kind: 'slider block',
        stackLayer: layerOf.get(`slider_${which}`) ?? 3,
        outline: block(c, end.direction, 2 * e, e),
        exactOutline: false,
        holes: [hole(c, joint)],
        meltEdge: null,
      });
    }
    for (const link of links) {
      const ends = [
        joints.get(link.bodyA === 'die_body' ? `${link.id}_ground` : `${link.id}_a`)!,
        joints.get(`${link.id}_b`)!,
      ] as const;
      parts.push({
        id: link.id,
        kind: 'link',
        stackLayer: layerOf.get(link.id) ?? 1,
        outline: capsule(ends[0], ends[1], e),
        exactOutline: false,
        holes: [
          hole(ends[0], link.bodyA === 'die_body' ? `${link.id}_ground` : `${link.id}_a`),
          hole(ends[1], `${link.id}_b`),
        ],
        meltEdge: null,
      });
    }
    return parts;
  };

  const achievedOf = (i: number): { region: Region; deviation: number } => {
    const driven = plan.mechanisation?.status === 'mechanised' ? plan.mechanisation.stations[i] : undefined;
    const fitted = fit.stations[i]!;
    return driven
      ? { region: driven.achievedOrifice, deviation: driven.deviationMm }
      : { region: fitted.achievedOrifice, deviation: fitted.maxDeviationMm };
  };
  const stations: DrawnStation[] = schedule.stations.map((s, i) => {
    const achieved = achievedOf(i);
    return {
      index: i,
      positionM: s.positionM,
      target: s.orifice,
      achieved: achieved.region,
      deviationMm: achieved.deviation,
      parts: partsAt(stationJoints[i]!),
    };
  });

  const steps =
    simulatedConfigurations(plan, stationJoints.length) ?? intermediateConfigurations(plan, schedule, stationJoints);
  const configurations = [...stationJoints, ...steps.joints];
  const sweptEnvelope = unionInHalves(
    configurations.flatMap((j) => partsAt(j).map((p) => ({ outer: p.outline, holes: [] }))),
  );

  const groundHoles: DrawnHole[] = [];
  for (const j of mechanism.joints) {
    if (j.type !== 'revolute' || !j.bodies.includes('die_body')) continue;
    groundHoles.push(hole(j.stationPositions[0]!, j.id));
  }
  const slots: DrawnSlot[] = [];
  for (const which of ['start', 'end'] as const) {
    const end = which === 'start' ? fit.chain.start : fit.chain.end;
    if (end.kind !== 'slot') continue;
    const lo = Math.min(...end.travelMm);
    const hi = Math.max(...end.travelMm);
    const at = (t: number): Point => [end.origin[0] + t * end.direction[0], end.origin[1] + t * end.direction[1]];
    // the slider block is 4e long and 2e wide round its pin (see `block`)
    slots.push({
      joint: `slot_${which}`,
      from: at(lo),
      to: at(hi),
      direction: end.direction,
      widthMm: 2 * e + SLOT_FIT_CLEARANCE_MM,
      lengthMm: hi - lo + 4 * e + SLOT_FIT_CLEARANCE_MM,
    });
  }
  const telescopingPairs: DrawnTelescoping[] = [...telescoping].map(([k, stationLengths]) => {
    const min = Math.min(...stationLengths);
    const max = Math.max(...stationLengths);
    const halfLengthMm = telescopingHalfLength(stationLengths, e);
    const reachPastPinMm = halfLengthMm + e - (min - holeDiameterMm / 2);
    const pinLayers = (joint: string): [number, number] => {
      const layers = (jointById.get(joint)?.bodies ?? []).map((b) => (b === 'die_body' ? 0 : (layerOf.get(b) ?? 0)));
      return [Math.min(...layers), Math.max(...layers)];
    };
    const clashes: string[] = [];
    for (const [half, otherPin] of [
      [`plate_${k}`, `pivot_${k}`],
      [`plate_${k}_slide`, `pivot_${k - 1}`],
    ] as const) {
      const [lo, hi] = pinLayers(otherPin);
      const layer = layerOf.get(half) ?? 1;
      if (reachPastPinMm > 0 && layer >= lo && layer <= hi) clashes.push(half);
    }
    return {
      plate: `plate_${k}`,
      pivotsApartMm: { min, max },
      halfLengthMm,
      overlapAtLongestMm: 2 * halfLengthMm - max,
      reachPastPinMm,
      clashes,
    };
  });
  const actuators: DrawnActuator[] = mechanism.actuators.map((a) => {
    const joint = jointById.get(a.joint);
    const bodies = joint?.bodies ?? ['die_body', 'die_body'];
    const onDieBody = bodies.includes('die_body');
    return {
      id: a.id,
      joint: a.joint,
      kind: a.kind,
      at: joint?.stationPositions[0] ?? [0, 0],
      onDieBody,
      drives: bodies[0] === 'die_body' ? bodies[1] : bodies[0],
      stationValues: a.stationValues,
    };
  });
  return {
    ok: true,
    model: {
      scheduleName: schedule.name,
      polymer: schedule.material,
      plateThicknessMm: schedule.plates.thicknessMm,
      pinDiameterMm: schedule.plates.pivotHoleDiameterMm,
      holeDiameterMm,
      dieTemperatureC: schedule.process.dieTemperatureC,
      stackLayers: Math.max(...mechanism.bodies.map((b) => b.layer)),
      opening: fit.opening,
      stations,
      groundHoles,
      slots,
      telescoping: telescopingPairs,
      actuators,
      sweptEnvelope,
      sweepNote: steps.note,
      findings: plan.findings,
      cautions: plan.cautions,
    },
  };
}

/** Most configurations taken from the plan's simulated motion for the swept envelope (evenly strided steps). */
export const SWEEP_CONFIGURATIONS = 64;

/**
 * Joint positions between the stations from the plan's own simulation of the commanded motion (every joint at every
 * step), at most `SWEEP_CONFIGURATIONS` evenly strided steps; null when the plan has no simulation or a step did not
 * solve (then the drawings solve their own steps).
 */
function simulatedConfigurations(
  plan: Plan,
  stationCount: number,
): { readonly joints: Map<string, Point>[]; readonly note: string } | null {
  const simulation = plan.simulation;
  if (!simulation || simulation.positionsM.length < 2 || !simulation.solved.every(Boolean)) return null;
  const steps = simulation.positionsM.length;
  const stride = Math.max(1, Math.ceil(steps / SWEEP_CONFIGURATIONS));
  const joints: Map<string, Point>[] = [];
  for (let k = 0; k < steps; k += stride) {
    joints.push(new Map(simulation.joints.map((j) => [j.id, j.positionsMm[k]!] as const)));
  }
  return {
    joints,
    note: `swept envelope over the ${stationCount} stations and ${joints.length} of the ${steps} steps of the plan's simulated motion (every ${stride}${stride === 1 ? 'st' : 'th'} step)`,
  };
}

/** Union of many regions, halves first: clipper's cost grows faster than the number of overlapping outlines. */
function unionInHalves(regions: readonly Region[]): Region[] {
  if (regions.length <= 8) return unionRegions(regions);
  const mid = regions.length >> 1;
  return unionRegions([...unionInHalves(regions.slice(0, mid)), ...unionInHalves(regions.slice(mid))]);
}

/**
 * Joint positions between the stations: the plan's mechanism solved at actuator values interpolated in
 * `STEPS_PER_TRANSITION` steps along every transition (and back to the first station when the schedule repeats), each
 * solve started from the one before. Empty, with the reason, when the plan has no driven model or a solve fails or
 * lands away from the next station (the envelope then covers the stations only).
 */
function intermediateConfigurations(
  plan: Plan,
  schedule: Schedule,
  stationJoints: readonly ReadonlyMap<string, Point>[],
): { readonly joints: Map<string, Point>[]; readonly note: string } {
  const stationsOnly = (why: string) => ({
    joints: [],
    note: `swept envelope over the ${stationJoints.length} stations only (${why})`,
  });
  const model = plan.mechanisation?.status === 'mechanised' ? plan.mechanisation.model : null;
  const actuators = plan.mechanism?.actuators ?? [];
  if (!model || actuators.length === 0) return stationsOnly('the plan has no driven mechanism');
  const jointIds = plan.mechanism!.joints.map((j) => j.id);
  const valuesAt = (i: number) =>
    actuators.map((a) => (a.kind === 'rotary' ? toRadians(a.stationValues[i]!) : a.stationValues[i]!));
  const read = (pose: Pose) => new Map(jointIds.map((id) => [id, jointPoint(pose, id)] as const));
  const far = (pose: Pose, joints: ReadonlyMap<string, Point>) =>
    jointIds.some((id) => {
      const p = jointPoint(pose, id);
      const q = joints.get(id)!;
      return Math.hypot(p[0] - q[0], p[1] - q[1]) > ARRIVAL_TOLERANCE_MM;
    });
  const first = solvePosition(model, valuesAt(0), { start: initialPose(model) });
  if (first.status !== 'converged' || far(first.pose, stationJoints[0]!)) {
    return stationsOnly('the mechanism could not be put back at the first station');
  }
  const count = stationJoints.length;
  const legs = schedule.repeatLengthM !== null ? count : count - 1;
  const out: Map<string, Point>[] = [];
  let pose = first.pose;
  for (let leg = 0; leg < legs; leg++) {
    const from = valuesAt(leg);
    const toIndex = (leg + 1) % count;
    const to = valuesAt(toIndex);
    for (let s = 1; s <= STEPS_PER_TRANSITION; s++) {
      const t = s / STEPS_PER_TRANSITION;
      const solved = solvePosition(
        model,
        from.map((v, k) => v + (to[k]! - v) * t),
        { start: pose },
      );
      if (solved.status !== 'converged')
        return stationsOnly(`a solve between stations ${leg + 1} and ${toIndex + 1} did not converge`);
      pose = solved.pose;
      if (s < STEPS_PER_TRANSITION) out.push(read(pose));
    }
    if (far(pose, stationJoints[toIndex]!)) {
      return stationsOnly(`the motion from station ${leg + 1} does not arrive at station ${toIndex + 1}`);
    }
  }
  return {
    joints: out,
    note: `swept envelope over the ${count} stations and ${out.length} configurations between them (${STEPS_PER_TRANSITION} steps per transition)`,
  };
}

/** A solve between stations must arrive this close to the plan's next station to count as the same motion, mm. */
const ARRIVAL_TOLERANCE_MM = 1e-3;

/**
 * The melt edge of a `plateOutline` ring: from the last point of the round end at a (where the edge starts), through
 * the shaped edge points if any, to the first point of the round end at b (the ring's first point).
 */
function meltEdgeOf(outer: Ring, edgePoints: number): Point[] {
  return [...outer.slice(outer.length - 1 - edgePoints), outer[0]!];
}

function unit(a: Point, b: Point): Point {
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
  return len > 0 ? [(b[0] - a[0]) / len, (b[1] - a[1]) / len] : [1, 0];
}

/** A regular polygon of `sides` vertices on a circle of radius r round c, counter-clockwise. */
function disc(c: Point, r: number, sides: number): Point[] {
  return Array.from({ length: sides }, (_, k): Point => {
    const t = (2 * Math.PI * k) / sides;
    return [c[0] + r * Math.cos(t), c[1] + r * Math.sin(t)];
  });
}

/** A capsule (stadium) of half width r round the segment a–b, counter-clockwise, chord error under 0.01 mm. */
function capsule(a: Point, b: Point, r: number): Point[] {
  const u = unit(a, b);
  const base = Math.atan2(u[1], u[0]);
  const steps = Math.max(4, Math.ceil(Math.PI / (2 * Math.acos(1 - Math.min(0.01 / r, 1)))));
  const out: Point[] = [];
  for (const [c, from] of [
    [b, base - Math.PI / 2],
    [a, base + Math.PI / 2],
  ] as const) {
    for (let k = 0; k <= steps; k++) {
      const t = from + (Math.PI * k) / steps;
      out.push([c[0] + r * Math.cos(t), c[1] + r * Math.sin(t)]);
    }
  }
  return out;
}

/** A rectangle 2·`halfLength` long along `direction` and 2·`halfWidth` wide, centred on c, counter-clockwise. */
function block(c: Point, direction: Point, halfLength: number, halfWidth: number): Point[] {
  const u = unit([0, 0], direction);
  const v: Point = [-u[1], u[0]];
  const h = halfLength;
  return [
    [c[0] - u[0] * h - v[0] * halfWidth, c[1] - u[1] * h - v[1] * halfWidth],
    [c[0] + u[0] * h - v[0] * halfWidth, c[1] + u[1] * h - v[1] * halfWidth],
    [c[0] + u[0] * h + v[0] * halfWidth, c[1] + u[1] * h + v[1] * halfWidth],
    [c[0] - u[0] * h + v[0] * halfWidth, c[1] - u[1] * h + v[1] * halfWidth],
  ];
}
