/**
 * Writes the schedules in fixtures/ from the invented scenarios of docs/MODEL.md §6. Run with `npx tsx
 * scripts/make-fixtures.ts`; the output is deterministic, so re-running it changes nothing unless this file changed.
 * Every number here is invented for demonstration.
 */
import { writeFileSync } from 'node:fs';
import { channelOrifice, closeChain } from '../tests/support/known-chain.js';

type P = [number, number];

const round = (x: number) => Math.round(x * 1e4) / 1e4;

/** A 40 mm wide solid strip on a flat base: top edge y(x) sampled every `step` mm, walls up to y(0) and y(40). */
function strip(top: (x: number) => number, step = 0.5): { outer: P[]; holes: P[][] } {
  const outer: P[] = [
    [0, 0],
    [40, 0],
  ];
  for (let x = 40; x >= -1e-9; x -= step) outer.push([round(x), round(top(Math.max(0, x)))]);
  return { outer, holes: [] };
}

const flat = () => 8;

/** Height of the upper arc of radius r through (x0, y0) and (x1, y1) at x (the arc bulges upward). */
function arcTop(x0: number, y0: number, x1: number, y1: number, r: number): (x: number) => number {
  const mx = (x0 + x1) / 2;
  const my = (y0 + y1) / 2;
  const half = Math.hypot(x1 - x0, y1 - y0) / 2;
  const d = Math.sqrt(r * r - half * half);
  // the centre lies below the chord, on its perpendicular bisector
  const nx = (y1 - y0) / (2 * half);
  const ny = -(x1 - x0) / (2 * half);
  const cx = mx + nx * d;
  const cy = my + ny * d;
  return (x) => cy + Math.sqrt(r * r - (x - cx) ** 2);
}

/** Single rounded crown: an arc of radius 30 mm from wall to wall, 15.6 mm high at the middle. */
const crown = arcTop(0, 8, 40, 8, 30);
/** Double crown: two arcs of radius 26 mm meeting in a valley at (20, 12); humps about 13.6 mm high. */
const leftHump = arcTop(0, 8, 20, 12, 26);
const rightHump = arcTop(20, 12, 40, 8, 26);
const doubleCrown = (x: number) => (x <= 20 ? leftHump(x) : rightHump(x));

/** Process, limits, plates and actuators of both edging-strip scenarios (one actuator, a 1.5 m repeat). */
const edgingStripSettings = {
  material: 'PVC-U',
  process: { line_speed_m_per_min: 2.0, die_temperature_c: 190 },
  limits: {
    draw_down: { min: 1.0, max: 1.3 },
    min_wall_mm: 1.5,
    max_wall_ratio: 2.5,
    fit_tolerance_mm: 0.2,
    max_plates: 24,
  },
  plates: { pivot_hole_diameter_mm: 4.0, ligament_mm: 3.0, thickness_mm: 6.0, depth_mm: 25.0 },
  actuators: { count: 1, max_speed_deg_per_s: 60, max_accel_deg_per_s2: 300 },
  time_step_s: 0.05,
  repeat_length_m: 1.5,
};

/**
 * The crowned edging strip: flat → single crown → double crown → flat. With links at least two pin holes and a
 * ligament long, no chain the planner tries is driven by one actuator, so its plan comes back `incomplete` with the
 * fewest actuators found; kept to show that answer.
 */
const crowns = {
  name: 'crowned-edging-strip',
  ...edgingStripSettings,
  moving_span: { start: [0, 8], end: [40, 8] },
  stations: [
    { position_m: 0.0, orifice: strip(flat) },
    { position_m: 0.375, orifice: strip(crown) },
    { position_m: 0.75, orifice: strip(doubleCrown) },
    { position_m: 1.125, orifice: strip(flat) },
  ],
};

/** A bow-tie: the outer ring crosses itself at (20, 5). */
const selfIntersecting = {
  name: 'self-intersecting-ring',
  stations: [
    {
      position_m: 0,
      orifice: {
        outer: [
          [0, 0],
          [40, 10],
          [40, 0],
          [0, 10],
        ],
      },
    },
  ],
};

/** A 40×6 strip with a 1.0 mm thick, 6 mm tall fin on top at x 19.5–20.5: below a 1.5 mm minimum wall. */
const thinWall = {
  name: 'thin-fin',
  material: 'PVC-U',
  limits: { min_wall_mm: 1.5 },
  stations: [
    {
      position_m: 0,
      orifice: {
        outer: [
          [0, 0],
          [40, 0],
          [40, 6],
          [20.5, 6],
          [20.5, 12],
          [19.5, 12],
          [19.5, 6],
          [0, 6],
        ],
      },
    },
  ],
};

/** A hollow cover: 40 wide with a 32×6 chamber held by a mandrel; the top wall changes from flat to crowned. */
function hollow(top: (x: number) => number): { outer: P[]; holes: P[][] } {
  const s = strip(top);
  return {
    outer: s.outer,
    holes: [
      [
        [4, 3],
        [4, 9],
        [36, 9],
        [36, 3],
      ],
    ],
  };
}
const hollowProfile = {
  name: 'hollow-cover',
  material: 'PVC-U',
  limits: { min_wall_mm: 2.0, max_wall_ratio: 3 },
  moving_span: { start: [0, 12], end: [40, 12] },
  stations: [
    { position_m: 0, orifice: hollow(() => 12) },
    { position_m: 0.5, orifice: hollow(arcTop(0, 12, 40, 12, 40)) },
  ],
};

/** Throughput fixed at 14 kg/h: the crowned station's orifice is far too large for the product at 2 m/min. */
const drawDownOut = {
  name: 'draw-down-out-of-range',
  material: 'PVC-U',
  process: { line_speed_m_per_min: 2.0, throughput_kg_per_h: 14 },
  limits: { draw_down: { min: 1.0, max: 1.2 } },
  stations: [
    { position_m: 0, orifice: strip(flat) },
    { position_m: 0.5, orifice: strip(crown) },
  ],
};

/** The second station's base is drawn 1 mm lower along x 10–30: the die body would have to move too. */
const fixedPartDisagrees = {
  name: 'fixed-part-disagrees',
  stations: [
    { position_m: 0, orifice: strip(flat) },
    {
      position_m: 0.5,
      orifice: {
        outer: [[0, 0], [10, 0], [10, -1], [30, -1], [30, 0], [40, 0], ...strip(crown).outer.slice(2)],
      },
    },
  ],
};

/**
 * The demo: an edging strip 40 mm wide on a flat base whose top edge carries a ridge and a groove that roll to the
 * right and back every 1.5 m. Its stations are made, for this demo, by a die of four plates, 14 mm between pivots,
 * pinned to the die body at (−6, 12) and (46, 12), whose second plate is held by one link from the die body, all
 * driven by one actuator on the first plate's ground pivot at 0.15, 0.30 and 0.45 rad: the melt edge is the plates'
 * pivot line swollen by e = 5 mm (docs/MODEL.md §2). The chain closes by the law of cosines. The puller follows the
 * orifice area, so every station and the motion between them run at the middle of the draw-down range.
 */
function rollingRidgeStations(): { outer: P[]; holes: P[][] }[] {
  const start: P = [-6, 12];
  const end: P = [46, 12];
  const lengths = [14, 14, 14, 14];
  const plate1End = (t: number): P => [start[0] + lengths[0]! * Math.cos(t), start[1] + lengths[0]! * Math.sin(t)];
  // the link: die-body pin at (−30, 40), plate pin at (7, 9) in plate 2's frame, drawn with plate 1 at 0.3 rad and
  // plate 2 level
  const ground: P = [-30, 40];
  const onPlate: P = [7, 9];
  const drawn = plate1End(0.3);
  const linkLength = Math.hypot(drawn[0] + onPlate[0] - ground[0], drawn[1] + onPlate[1] - ground[1]);
  const pinRadius = Math.hypot(onPlate[0], onPlate[1]);
  return [0.15, 0.3, 0.45, 0.3].map((t1) => {
    const j1 = plate1End(t1);
    // plate 2's pin: circle (j1, |onPlate|) meets circle (ground, link length), on the branch that keeps plate 2 level
    const dx = ground[0] - j1[0];
    const dy = ground[1] - j1[1];
    const d = Math.hypot(dx, dy);
    const along = (pinRadius ** 2 - linkLength ** 2 + d * d) / (2 * d);
    const h = Math.sqrt(pinRadius ** 2 - along ** 2);
    const pins: P[] = [-1, 1].map((side) => [
      j1[0] + (along * dx) / d - (side * h * dy) / d,
      j1[1] + (along * dy) / d + (side * h * dx) / d,
    ]);
    const tilt = (c: P) => Math.abs(Math.atan2(c[1] - j1[1], c[0] - j1[0]) - Math.atan2(onPlate[1], onPlate[0]));
    const pin = tilt(pins[0]!) < tilt(pins[1]!) ? pins[0]! : pins[1]!;
    const t2 = Math.atan2(pin[1] - j1[1], pin[0] - j1[0]) - Math.atan2(onPlate[1], onPlate[0]);
    return roundRegion(channelOrifice(closeChain(lengths, start, end, [t1, t2], false), 5, 40, 0.5));
  });
}

function roundRegion(r: { outer: P[]; holes: P[][] }): { outer: P[]; holes: P[][] } {
  return { outer: r.outer.map(([x, y]) => [round(x), round(y)]), holes: [] };
}

const demo = {
  name: 'edging-strip-demo',
  ...edgingStripSettings,
  // the orifice grows 27 % from the first station to the third: at a constant line speed the draw-down would leave
  // 1.0–1.3, so the puller follows the area and holds 1.15 at constant throughput (ṁ = ρ·A·v, docs/MODEL.md §3)
  process: { ...edgingStripSettings.process, puller_follows_area: true },
  stations: rollingRidgeStations().map((orifice, i) => ({ position_m: 0.375 * i, orifice })),
};

const files: Record<string, unknown> = {
  'demo-edging-strip.json': demo,
  'crowned-edging-strip.json': crowns,
  'self-intersecting.json': selfIntersecting,
  'thin-wall.json': thinWall,
  'hollow-profile.json': hollowProfile,
  'draw-down-out-of-range.json': drawDownOut,
  'fixed-part-disagrees.json': fixedPartDisagrees,
};
for (const [name, body] of Object.entries(files)) {
  writeFileSync(new URL(`../fixtures/${name}`, import.meta.url), `${JSON.stringify(body, null, 1)}\n`);
}
console.log(`wrote ${Object.keys(files).length} fixtures`);
