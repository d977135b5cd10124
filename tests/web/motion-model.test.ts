import { describe, expect, it } from 'vitest';
import { describePose } from '../../src/web/lib/describe.js';
import {
  intervalIndex,
  type MotionJson,
  modelFromMotion,
  modelFromStations,
  nearestStation,
  type PlanLike,
  poseAt,
  valueAt,
} from '../../src/web/lib/motion-model.js';

type Point = readonly [number, number];

/** A crank-and-plate: ground pivot at the origin, a 10 mm plate to a free pivot that turns 90° over 1 m of line. */
function crankMotion(steps: number): MotionJson {
  const position_m = Array.from({ length: steps + 1 }, (_, i) => i / steps);
  const angle = position_m.map((x) => (Math.PI / 2) * x);
  return {
    position_m,
    time_s: position_m.map((x) => x * 30),
    actuators: [{ id: 'actuator_1', kind: 'rotary', unit: 'deg', values: angle.map((a) => (a * 180) / Math.PI) }],
    joints: [
      { id: 'pivot_0', positions_mm: position_m.map(() => [0, 0] as [number, number]) },
      { id: 'pivot_1', positions_mm: angle.map((a) => [10 * Math.cos(a), 10 * Math.sin(a)] as [number, number]) },
    ],
    plates: [
      {
        id: 'plate_1',
        pivots: ['pivot_0', 'pivot_1'],
        outline_local_mm: [
          [0, 0],
          [10, 0],
          [10, 4],
          [0, 4],
        ],
      },
    ],
    links: [],
    area_mm2: position_m.map((x) => 300 + 20 * x),
    draw_down_ratio: position_m.map(() => 1.2),
    puller_speed_m_per_min: position_m.map(() => 2),
    die_pressure_ratio: position_m.map(() => 1),
  };
}

const crankPlan: PlanLike = {
  stations: [
    { position_m: 0, achieved_orifice: { outer: [] }, plates: [] },
    { position_m: 1, achieved_orifice: { outer: [] }, plates: [] },
  ],
  chain: { edge_offset_mm: 5 },
  mechanism: {
    bodies: [
      { id: 'die_body', kind: 'die_body', layer: 0 },
      { id: 'plate_1', kind: 'plate', layer: 1 },
    ],
    joints: [
      { id: 'pivot_0', bodies: ['die_body', 'plate_1'], station_positions: [] },
      { id: 'pivot_1', bodies: ['plate_1', 'die_body'], station_positions: [] },
    ],
    actuators: [{ id: 'actuator_1', joint: 'pivot_0', kind: 'rotary', station_values: [0, 90] }],
  },
};

describe('line position → pose', () => {
  it('intervalIndex finds the sample interval and clamps at both ends', () => {
    const xs = [0, 0.5, 1, 2];
    expect(intervalIndex(xs, -1)).toBe(0);
    expect(intervalIndex(xs, 0.75)).toBe(1);
    expect(intervalIndex(xs, 1)).toBe(2);
    expect(intervalIndex(xs, 5)).toBe(2);
  });

  it('poseAt on motion.json interpolates joints linearly between samples: halfway between two samples of the crank', () => {
    const model = modelFromMotion(crankMotion(10), crankPlan);
    const x = 0.35; // halfway between samples 0.3 and 0.4 (27° and 36°)
    const pose = poseAt(model, x);
    const a = (27 * Math.PI) / 180;
    const b = (36 * Math.PI) / 180;
    const expected: Point = [5 * (Math.cos(a) + Math.cos(b)), 5 * (Math.sin(a) + Math.sin(b))];
    expect(pose.joints.pivot_1![0]).toBeCloseTo(expected[0], 10);
    expect(pose.joints.pivot_1![1]).toBeCloseTo(expected[1], 10);
    expect(pose.actuators[0]!.value).toBeCloseTo(31.5, 10);
    // at a sample the pose is the sample itself: 90° at the end, beyond it clamped
    expect(poseAt(model, 1).joints.pivot_1![0]).toBeCloseTo(0, 10);
    expect(poseAt(model, 3).joints.pivot_1![1]).toBeCloseTo(10, 10);
    expect(poseAt(model, 3).position).toBe(1);
  });

  it('modelFromMotion keeps the limits motion.json states, so the charts draw them when nothing breaks them', () => {
    const limits = { draw_down_ratio: { min: 1, max: 1.3 }, die_pressure_ratio: { max: 1.5 } };
    expect(modelFromMotion({ ...crankMotion(10), limits }, crankPlan).limits).toEqual(limits);
    expect(modelFromMotion(crankMotion(10), crankPlan).limits).toEqual({});
  });

  it('poseAt places the plate outline on its pivots: at 90° of the crank the 10×4 plate stands upright, left of its pivot line', () => {
    const model = modelFromMotion(crankMotion(10), crankPlan);
    const plate = poseAt(model, 1).plates[0]!;
    const expected = [
      [0, 0],
      [0, 10],
      [-4, 10],
      [-4, 0],
    ];
    plate.outline.forEach((p, i) => {
      expect(p[0]).toBeCloseTo(expected[i]![0]!, 10);
      expect(p[1]).toBeCloseTo(expected[i]![1]!, 10);
    });
    expect(plate.layer).toBe(1);
    expect(model.joints.find((j) => j.id === 'pivot_0')!.ground).toBe(true);
    expect(model.actuators[0]!.joint).toBe('pivot_0');
    expect(model.clock && valueAt(model.clock, 0.5)).toBeCloseTo(15, 12);
  });

  it('modelFromStations moves the joints by the actuator’s share of its travel: a cycloidal leg a quarter along is u − sin(2πu)/2π ≈ 9.08 % of the way (VDI 2143 rest-to-rest)', () => {
    // two stations 1 m apart; the free pivot moves from (10, 0) to (0, 10); the setpoints follow the cycloidal law
    const n = 400;
    const rows = Array.from({ length: n + 1 }, (_, i) => {
      const u = i / n;
      return [u, u * 30, 90 * (u - Math.sin(2 * Math.PI * u) / (2 * Math.PI))];
    });
    const plan: PlanLike = {
      ...crankPlan,
      stations: [
        {
          position_m: 0,
          achieved_orifice: { outer: [] },
          plates: [
            {
              plate: 'plate_1',
              pivots_mm: [
                [0, 0],
                [10, 0],
              ],
            },
          ],
        },
        {
          position_m: 1,
          achieved_orifice: { outer: [] },
          plates: [
            {
              plate: 'plate_1',
              pivots_mm: [
                [0, 0],
                [0, 10],
              ],
            },
          ],
        },
      ],
      mechanism: {
        ...crankPlan.mechanism!,
        joints: [
          {
            id: 'pivot_0',
            bodies: ['die_body', 'plate_1'],
            station_positions: [
              [0, 0],
              [0, 0],
            ],
          },
          {
            id: 'pivot_1',
            bodies: ['plate_1', 'die_body'],
            station_positions: [
              [10, 0],
              [0, 10],
            ],
          },
        ],
      },
    };
    const model = modelFromStations(plan, { columns: ['position_m', 'time_s', 'actuator_1_deg'], rows });
    expect(model.source).toBe('stations');
    const share = 0.25 - Math.sin(Math.PI / 2) / (2 * Math.PI);
    const pose = poseAt(model, 0.25);
    expect(pose.joints.pivot_1![0]).toBeCloseTo(10 - 10 * share, 3);
    expect(pose.joints.pivot_1![1]).toBeCloseTo(10 * share, 3);
    // the plate is a bar round its pivot line, 5 mm (edge offset) each side and past each pivot
    expect(model.plates[0]!.outline).toEqual([
      [-5, -5],
      [15, -5],
      [15, 5],
      [-5, 5],
    ]);
    expect(model.plates[0]!.approximate).toBe(true);
    expect(model.clock && valueAt(model.clock, 0.5)).toBeCloseTo(15, 12);
  });

  it('modelFromStations closes a periodic motion: past the last station the joints return to the first station’s pose', () => {
    const plan: PlanLike = {
      stations: [0, 0.5].map((p, k) => ({
        position_m: p,
        achieved_orifice: { outer: [] },
        plates: [
          {
            plate: 'plate_1',
            pivots_mm: [
              [0, 0],
              [10, k * 4],
            ],
          },
        ],
      })),
      chain: { edge_offset_mm: 5 },
      mechanism: null,
    };
    const rows = [
      [0, 0, 0],
      [0.5, 15, 0],
      [1, 30, 0],
    ];
    const model = modelFromStations(plan, { columns: ['position_m', 'time_s', 'actuator_1_deg'], rows });
    expect(model.positions).toEqual([0, 0.5, 1]);
    expect(poseAt(model, 0.75).joints['plate_1.pivot_b']).toEqual([10, 2]);
    expect(poseAt(model, 1).joints['plate_1.pivot_b']).toEqual([10, 0]);
  });

  it('describePose says where each plate is, in mm and degrees', () => {
    const model = modelFromMotion(crankMotion(10), crankPlan);
    const text = describePose(poseAt(model, 1));
    expect(text).toContain('At 1.000 m of line.');
    expect(text).toContain('actuator_1 at 90.0 °.');
    expect(text).toContain('plate_1 from (0.0, 0.0) to (0.0, 10.0) mm, at 90.0°.');
  });
});

describe('nearest station', () => {
  it('nearestStation picks the station nearest by line position, and the first again one repeat on', () => {
    const model = modelFromMotion(crankMotion(4), {
      ...crankPlan,
      stations: [0, 0.25, 0.5].map((p) => ({ position_m: p, achieved_orifice: { outer: [] }, plates: [] })),
    });
    expect(nearestStation(model, 0.1)).toBe(0);
    expect(nearestStation(model, 0.2)).toBe(1);
    expect(nearestStation(model, 0.6)).toBe(2);
    // the motion runs to 1 m, past the last station at 0.5 m: near its end the mechanism is back at station 0
    expect(nearestStation(model, 0.9)).toBe(0);
  });
});
