import pc from 'polygon-clipping';
import { describe, expect, it } from 'vitest';
import type { Point, Region } from '../../src/geometry/index.js';
import { toSchedule } from '../../src/http/to-schedule.js';
import { defineMechanism } from '../../src/kinematics/index.js';
import { actuatorTrajectory, sampleTrajectory } from '../../src/motion/index.js';
import { DEFAULT_TOLERANCES } from '../../src/numeric/index.js';
import {
  brokenRuns,
  type PlanSimulation,
  planSchedule,
  simulateMotion,
  simulationFindings,
  timesAlongSpeeds,
} from '../../src/pipeline/index.js';
import { plateOutline } from '../../src/synthesis/index.js';
import { scheduleForTest } from '../process/schedule-for-test.js';
import { fixture } from '../support/test-app.js';

const square = (half: number): Region => ({
  outer: [
    [-half, -half],
    [half, -half],
    [half, half],
    [-half, half],
  ],
  holes: [],
});

/**
 * A wiper: one plate 60 mm between pivots, pinned to the die body at (−25, 0), half-width 2 mm (e = 2, depth 4), over
 * a 40 × 40 mm opening centred on the origin. At +90° and −90° it lies outside the opening (x from −27 to −23 mm), so
 * both stations leave the whole opening as one orifice; between them it sweeps through 0°, where it crosses the opening
 * from side to side and cuts it in two: a piece of opening the plates leave apart from the orifice (a leak).
 */
function wiper() {
  const mechanism = defineMechanism({
    bodies: [
      { id: 'die_body', kind: 'die_body' },
      { id: 'plate_1', kind: 'plate', layer: 1, initial: { x: -25, y: 0, phi: Math.PI / 2 } },
    ],
    joints: [
      { kind: 'revolute', id: 'pivot_0', bodyI: 'die_body', pointI: [-25, 0], bodyJ: 'plate_1', pointJ: [0, 0] },
    ],
    drivers: [{ id: 'actuator_1', joint: 'pivot_0' }],
  });
  const trajectory = actuatorTrajectory(
    {
      kind: 'rotary',
      stationsM: [0, 1],
      values: [Math.PI / 2, -Math.PI / 2],
      law: 'cycloidal',
      lineSpeedMPerS: 1 / 60,
      repeatLengthM: null,
    },
    DEFAULT_TOLERANCES,
  );
  const shape = { edgeOffsetMm: 2, depthMm: 4, holeRadiusMm: 1, arcToleranceMm: 0.01 };
  const opening = square(20);
  return {
    trajectory,
    shape,
    input: {
      mechanism,
      trajectories: [trajectory],
      pivots: [
        { body: 'plate_1', local: [0, 0] as Point },
        { body: 'plate_1', local: [60, 0] as Point },
      ],
      shape,
      edges: [null],
      fans: [0, 0],
      opening,
      stations: [
        { positionM: 0, target: opening },
        { positionM: 1, target: opening },
      ],
      repeatLengthM: null,
      toleranceMm: 0.01,
      clearance: null,
    },
  };
}

/** A plan-level simulation around a bare motion simulation, at a constant puller speed (process series neutral). */
function asPlanSimulation(sim: ReturnType<typeof simulateMotion>, stride: number): PlanSimulation {
  const n = sim.positionsM.length;
  return {
    ...sim,
    timeStepS: sim.timesS[1]! - sim.timesS[0]!,
    capped: false,
    wallStride: stride,
    stationSteps: [0, n - 1],
    periodic: false,
    nominalLineSpeedMPerS: 1 / 60,
    pullerFollowsArea: false,
    targetDrawDown: 1,
    throughputKgPerS: 1,
    solidDensityKgPerM3: 1000,
    pullerSpeedMPerS: sim.areaMm2.map(() => 1 / 60),
    productAreaMm2: sim.areaMm2.map(() => 1600),
    drawDownRatio: sim.areaMm2.map(() => 1),
    diePressureRatio: sim.areaMm2.map(() => 1),
    tracking: null,
  };
}

describe('simulateMotion: leaks between valid stations', () => {
  it('a wiper that cuts the opening in two between two sealed stations gives MOTION_LEAK over the range where polygon-clipping also finds two pieces', () => {
    const { input, trajectory, shape } = wiper();
    const positionsM = Array.from({ length: 201 }, (_, i) => i / 200);
    const timesS = positionsM.map((x) => x * 60);
    const sim = simulateMotion(input, { positionsM, timesS, clip: true, wallStride: 1000 });
    expect(sim.solved.every((ok) => ok)).toBe(true);
    // the stations themselves are sealed: the whole 40 × 40 opening is the orifice
    expect(sim.leakAreaMm2[0]).toBe(0);
    expect(sim.leakAreaMm2[200]).toBe(0);
    expect(sim.areaMm2[0]).toBeCloseTo(1600, 6);

    // reference: an independent boolean library (polygon-clipping 0.15.7) on the same plate outline, at the angle the
    // cycloidal law gives (VDI 2143: s = h·(u − sin 2πu / 2π)), computed here by hand rather than by the solver
    const reference = positionsM.map((x) => {
      const u = x; // the transition runs from 0 to 1 m
      const angle = Math.PI / 2 - Math.PI * (u - Math.sin(2 * Math.PI * u) / (2 * Math.PI));
      const a: Point = [-25, 0];
      const b: Point = [-25 + 60 * Math.cos(angle), 60 * Math.sin(angle)];
      const plate = plateOutline(a, b, shape).outer.map((p) => [p[0], p[1]] as [number, number]);
      const pieces = pc.difference([square(20).outer.map((p) => [p[0], p[1]] as [number, number])], [plate]);
      const areas = pieces.map((poly) => Math.abs(shoelace(poly[0]!)));
      return areas.filter((area) => area > 1e-3).length > 1;
    });
    const first = reference.indexOf(true);
    const last = reference.lastIndexOf(true);
    expect(first).toBeGreaterThan(0);
    expect(last).toBeLessThan(200);
    // the commanded angle passes 0° at the middle (s(½) = h/2), where the wiper certainly cuts the opening in two
    expect(reference[100]).toBe(true);
    expect(sampleTrajectory(trajectory, 0.5).value).toBeCloseTo(0, 12);

    const leaks = simulationFindings(asPlanSimulation(sim, 1000), scheduleForTest({ stations: 2 })).filter(
      (f) => f.code === 'MOTION_LEAK',
    );
    expect(leaks).toHaveLength(1);
    const leak = leaks[0]!;
    expect(leak.severity).toBe('error');
    // the range agrees with the reference within one step (0.005 m) at either end
    expect(Math.abs(leak.positionM! - positionsM[first]!)).toBeLessThanOrEqual(0.005 + 1e-12);
    expect(Math.abs(leak.toPositionM! - positionsM[last]!)).toBeLessThanOrEqual(0.005 + 1e-12);
    expect(leak.positionM!).toBeGreaterThan(0);
    expect(leak.toPositionM!).toBeLessThan(1);
    expect(leak.message).toMatch(/from [\d.]+ m to [\d.]+ m of line \(between stations 0 and 1\)/);
    expect(leak.message).toMatch(/Every station meets this limit: only the motion between them breaks it\./);

    // where to look: the finding's point is the simulation's at its worst step, and at a step where the pieces differ
    // in size it lies inside the leaking piece polygon-clipping finds, not in the orifice (the piece of the simulated
    // orifice's area)
    const worst = sim.leakAreaMm2.indexOf(leak.value!);
    expect(leak.at).toEqual(sim.leakAt![worst]);
    const j = first + 5;
    const u = positionsM[j]!;
    const angle = Math.PI / 2 - Math.PI * (u - Math.sin(2 * Math.PI * u) / (2 * Math.PI));
    const plate = plateOutline([-25, 0], [-25 + 60 * Math.cos(angle), 60 * Math.sin(angle)], shape).outer.map(
      (p) => [p[0], p[1]] as [number, number],
    );
    const pieces = pc
      .difference([square(20).outer.map((p) => [p[0], p[1]] as [number, number])], [plate])
      .map((poly) => poly[0]!);
    expect(pieces).toHaveLength(2);
    const orifice = pieces.find((ring) => Math.abs(Math.abs(shoelace(ring)) - sim.areaMm2[j]!) < 1e-2)!;
    const leaking = pieces.find((ring) => ring !== orifice)!;
    expect(Math.abs(shoelace(leaking))).toBeCloseTo(sim.leakAreaMm2[j]!, 2);
    const inside = (ring: readonly [number, number][], [x, y]: readonly [number, number]) => {
      // even-odd ray casting (Shimrat 1962)
      let odd = false;
      for (let a = 0, b = ring.length - 1; a < ring.length; b = a++) {
        const [xa, ya] = ring[a]!;
        const [xb, yb] = ring[b]!;
        if (ya > y !== yb > y && x < ((xb - xa) * (y - ya)) / (yb - ya) + xa) odd = !odd;
      }
      return odd;
    };
    expect(inside(leaking, sim.leakAt![j]!)).toBe(true);
    expect(inside(orifice, sim.leakAt![j]!)).toBe(false);
    // no leak, no point
    expect(sim.leakAt![0]).toBeNull();
  });
});

describe('simulationFindings: walls along the motion', () => {
  it('walls measured every 10 steps give MOTION_WALL_RATIO and MOTION_FLOW_IMBALANCE over the ranges where they break the limits', () => {
    const { input } = wiper();
    const positionsM = Array.from({ length: 201 }, (_, i) => i / 200);
    const sim = simulateMotion(input, {
      positionsM,
      timesS: positionsM.map((x) => x * 60),
      clip: false,
      wallStride: 10,
    });
    const measured = (j: number) => j % 10 === 0;
    const maxAt = (j: number) => (j >= 50 && j <= 70 ? 6 : j >= 120 && j <= 130 ? 3.5 : 2.4);
    const planned = {
      ...asPlanSimulation(sim, 10),
      minWallMm: positionsM.map((_, j) => (measured(j) ? 2 : null)),
      maxWallMm: positionsM.map((_, j) => (measured(j) ? maxAt(j) : null)),
    };
    // scheduleForTest: max_wall_ratio 2.5, power-law n = 1, so the flow ratio is (H_max/H_min)^(2+1/n) = r³ (slit flow,
    // docs/MODEL.md §3), above the 5× limit from r = 5^(1/3) ≈ 1.71 on
    const findings = simulationFindings(planned, scheduleForTest({ stations: 2 }));
    const ratio = findings.filter((f) => f.code === 'MOTION_WALL_RATIO');
    expect(ratio).toHaveLength(1);
    expect(ratio[0]).toMatchObject({ positionM: 0.25, toPositionM: 0.35, value: 3, limit: 2.5 });
    const flow = findings.filter((f) => f.code === 'MOTION_FLOW_IMBALANCE');
    expect(flow.map((f) => [f.positionM, f.toPositionM])).toEqual([
      [0.25, 0.35],
      [0.6, 0.65],
    ]);
    expect(flow[0]!.value).toBeCloseTo(27, 12);
    expect(flow[1]!.value).toBeCloseTo(1.75 ** 3, 12);
  });
});

describe('simulationFindings: the puller speed when it follows the area', () => {
  const { input } = wiper();
  const positionsM = Array.from({ length: 201 }, (_, i) => i / 200);
  const sim = simulateMotion(input, {
    positionsM,
    timesS: positionsM.map((x) => x * 60),
    clip: true,
    wallStride: 1000,
  });
  const smallestMm2 = Math.min(...sim.areaMm2);
  // mass balance ṁ = ρ·A·v (docs/MODEL.md §3) with the product A/ADR, ADR 1 and ρ 1000 kg/m³: a throughput that needs
  // 300 m/min at the smallest orifice, so the puller leaves the 200 m/min ceiling where the orifice is below 1.5× it
  const throughputKgPerS = (1000 * smallestMm2 * 1e-6 * 300) / 60;
  const speeds = sim.areaMm2.map((a) => throughputKgPerS / (1000 * a * 1e-6));
  const planned = (follows: boolean) => ({
    ...asPlanSimulation(sim, 1000),
    pullerFollowsArea: follows,
    throughputKgPerS,
    pullerSpeedMPerS: follows ? speeds : speeds.map(() => 1 / 60),
  });

  it('gives MOTION_PULLER_SPEED_OUT_OF_RANGE exactly over the steps above 200 m/min, worst 300 m/min', () => {
    expect(Math.min(...speeds) * 60).toBeLessThan(200); // the stations' full opening is well inside the range
    const fast = simulationFindings(planned(true), scheduleForTest({ stations: 2 })).filter(
      (f) => f.code === 'MOTION_PULLER_SPEED_OUT_OF_RANGE',
    );
    expect(fast.length).toBeGreaterThan(0);
    for (const f of fast) {
      const from = positionsM.indexOf(f.positionM!);
      const to = positionsM.indexOf(f.toPositionM!);
      for (let j = from; j <= to; j++) expect(speeds[j]! * 60).toBeGreaterThan(200);
      if (from > 0) expect(speeds[from - 1]! * 60).toBeLessThanOrEqual(200);
      if (to < positionsM.length - 1) expect(speeds[to + 1]! * 60).toBeLessThanOrEqual(200);
      expect(f.limit).toBe(200);
    }
    expect(Math.max(...fast.map((f) => f.value!))).toBeCloseTo(300, 9);
    const broken = speeds.filter((v) => v * 60 > 200).length;
    const covered = fast.reduce(
      (n, f) => n + positionsM.indexOf(f.toPositionM!) - positionsM.indexOf(f.positionM!) + 1,
      0,
    );
    expect(covered).toBe(broken);
  });

  it('holds the speeds to limits.puller_speed_m_per_min when given: 0–250 m/min leaves only the steps above 250', () => {
    const range = { min: 0, max: 250 / 60 };
    const fast = simulationFindings(
      planned(true),
      scheduleForTest({ stations: 2, limits: { pullerSpeedMPerS: range } }),
    );
    const out = fast.filter((f) => f.code === 'MOTION_PULLER_SPEED_OUT_OF_RANGE');
    expect(out.length).toBeGreaterThan(0);
    for (const f of out) {
      expect(f.limit).toBeCloseTo(250, 9);
      expect(f.message).toContain('(limits.puller_speed_m_per_min)');
    }
    const covered = out.reduce(
      (n, f) => n + positionsM.indexOf(f.toPositionM!) - positionsM.indexOf(f.positionM!) + 1,
      0,
    );
    expect(covered).toBe(speeds.filter((v) => v * 60 > 250).length);
  });

  it('gives none with the puller at the line speed, where the draw-down is checked instead', () => {
    const codes = simulationFindings(planned(false), scheduleForTest({ stations: 2 })).map((f) => f.code);
    expect(codes).not.toContain('MOTION_PULLER_SPEED_OUT_OF_RANGE');
  });
});

describe('simulatePlan on the demo (fixtures/demo-edging-strip.json)', () => {
  const wire = fixture('demo-edging-strip') as Parameters<typeof toSchedule>[0];
  const mapping = toSchedule(wire);
  if (!mapping.ok) throw new Error(JSON.stringify(mapping.problems));
  const plan = planSchedule(mapping.schedule);
  const sim = plan.simulation!;

  it('simulates one step per 0.05 s over the 1.5 m repeat (901 steps, every station among them), every step solved', () => {
    // 1.5 m at 2 m/min = 45 s; 45 / 0.05 = 900 steps, 901 positions; stations at 0, 0.375, 0.75, 1.125 m fall on steps
    expect(sim.positionsM).toHaveLength(901);
    expect(sim.stationSteps).toEqual([0, 225, 450, 675]);
    expect(sim.solved.every((ok) => ok)).toBe(true);
    expect(sim.leakAreaMm2.every((a) => a === 0)).toBe(true);
  });

  it('at every station position the simulated mechanism reproduces the plan’s station: joints within 1 µm, area within the fit report', () => {
    const joints = plan.mechanism!.joints;
    sim.stationSteps.forEach((j, i) => {
      for (const joint of joints) {
        const track = sim.joints.find((t) => t.id === joint.id)!;
        const p = track.positionsMm[j]!;
        const q = joint.stationPositions[i]!;
        expect(Math.hypot(p[0] - q[0], p[1] - q[1])).toBeLessThanOrEqual(1e-3);
      }
      // two boundaries within a Hausdorff distance d enclose areas that differ by at most about d × perimeter (the
      // band of width d along the boundary): the fit report's deviation bounds the area the simulation measures
      const station = plan.check.stations[i]!;
      const deviation = plan.mechanisation!.stations[i]!.deviationMm;
      expect(Math.abs(sim.areaMm2[j]! - station.areaMm2)).toBeLessThanOrEqual(deviation * station.perimeterMm);
      expect(sim.minWallMm[j]).not.toBeNull();
    });
  });

  it('with the puller at the line speed, the draw-down above 1.3 is one MOTION_DRAW_DOWN_HIGH whose range is exactly where the steps exceed it', () => {
    // the demo runs with the puller following the area; at a constant line speed its orifice, growing 27 %, leaves
    // the 1.0–1.3 range (area draw-down A_orifice / A_product at constant ṁ = ρ·A·v, docs/MODEL.md §3)
    const constant = toSchedule({ ...wire, process: { ...wire.process, puller_follows_area: false } });
    if (!constant.ok) throw new Error('schedule');
    const atLineSpeed = planSchedule(constant.schedule);
    const sim = atLineSpeed.simulation!;
    expect(sim.pullerFollowsArea).toBe(false);
    const high = atLineSpeed.findings.filter((f) => f.code === 'MOTION_DRAW_DOWN_HIGH');
    expect(high.length).toBeGreaterThan(0);
    for (const f of high) {
      const from = sim.positionsM.indexOf(f.positionM!);
      const to = sim.positionsM.indexOf(f.toPositionM!);
      expect(from).toBeGreaterThanOrEqual(0);
      expect(to).toBeGreaterThan(from);
      for (let j = from; j <= to; j++) expect(sim.drawDownRatio[j]!).toBeGreaterThan(1.3);
      if (from > 0) expect(sim.drawDownRatio[from - 1]!).toBeLessThanOrEqual(1.3);
      if (to < sim.positionsM.length - 1) expect(sim.drawDownRatio[to + 1]!).toBeLessThanOrEqual(1.3);
      expect(f.value).toBeCloseTo(Math.max(...sim.drawDownRatio.slice(from, to + 1)), 12);
      expect(f.message).toMatch(/^Draw-down [\d.]+ above 1\.3 from [\d.]+ m to [\d.]+ m of line/);
      // the demo's stations 1–3 break it on their own (DRAW_DOWN_HIGH), and the message says so
      expect(f.message).toMatch(/Station\(s\) [\d, ]+ inside this range break it too/);
    }
    expect(atLineSpeed.findings.some((f) => f.code === 'MOTION_SIMULATED')).toBe(true);
    // the stations inside the range break it on their own too: the same check the plan's station findings come from
    const stationHigh = atLineSpeed.findings.filter((f) => f.code === 'DRAW_DOWN_HIGH').map((f) => f.station);
    expect(stationHigh).toEqual([1, 2, 3]);
  });

  it('with the puller following the area (the demo as written), ρ·A·v is the throughput at every step and the draw-down is the target', () => {
    const p = plan;
    const s = p.simulation!;
    expect(s.pullerFollowsArea).toBe(true);
    // mass balance ṁ = ρ·A·v (docs/MODEL.md §3) with the solid density and the product area A = A_orifice / ADR
    s.areaMm2.forEach((a, j) => {
      const massKgPerS = (s.solidDensityKgPerM3 * (a / s.drawDownRatio[j]!) * 1e-6 * s.pullerSpeedMPerS[j]!) / 1;
      expect(massKgPerS).toBeCloseTo(p.check.throughputKgPerS, 12);
      expect(s.drawDownRatio[j]).toBeCloseTo(1.15, 12); // the middle of PVC-U's 1.0–1.3 in the demo
    });
    // dt = dx/v: the re-keyed repeat takes ∫ dx / v, between the extremes of 1.5 m / v
    const duration = s.timesS.at(-1)!;
    expect(duration).toBeGreaterThan(1.5 / Math.max(...s.pullerSpeedMPerS));
    expect(duration).toBeLessThan(1.5 / Math.min(...s.pullerSpeedMPerS));
    expect(p.findings.some((f) => f.code === 'MOTION_DRAW_DOWN_HIGH')).toBe(false);
    expect(p.findings.some((f) => f.code.startsWith('DRAW_DOWN_') || f.code.startsWith('MOTION_DRAW_DOWN_'))).toBe(
      false,
    );
  });
});

describe('timesAlongSpeeds', () => {
  it('at a constant speed the time is x / v exactly', () => {
    const xs = [0, 0.1, 0.25, 1];
    expect(timesAlongSpeeds(xs, [0.5, 0.5, 0.5, 0.5])).toEqual([0, 0.2, 0.5, 2]);
  });

  it('for v = v₀(1 + kx) it approaches t = ln(1 + kx) / (v₀k) (∫ dx/v in closed form) as the steps shrink', () => {
    const v0 = 2 / 60;
    const k = 0.8;
    const xs = Array.from({ length: 1001 }, (_, i) => (1.5 * i) / 1000);
    const t = timesAlongSpeeds(
      xs,
      xs.map((x) => v0 * (1 + k * x)),
    );
    const exact = Math.log(1 + k * 1.5) / (v0 * k);
    // the trapezoid rule's error is O(h²): with h = 1.5 mm it is far below a millisecond here
    expect(Math.abs(t.at(-1)! - exact)).toBeLessThan(1e-3);
  });
});

describe('brokenRuns', () => {
  it('joins consecutive broken steps, skips unmeasured ones, and keeps the worst step of each run', () => {
    const runs = brokenRuns(
      [1, 3, null, 4, 1, 5, 2],
      (v) => v > 2,
      (a, b) => a > b,
    );
    expect(runs).toEqual([
      { from: 1, to: 3, worst: 3 },
      { from: 5, to: 5, worst: 5 },
    ]);
  });
});

function shoelace(ring: readonly (readonly number[])[]): number {
  let s = 0;
  for (let i = 0; i < ring.length; i++) {
    const p = ring[i]!;
    const q = ring[(i + 1) % ring.length]!;
    s += p[0]! * q[1]! - q[0]! * p[1]!;
  }
  return s / 2;
}
