/**
 * Random exact mechanisms and their orifice schedules, built here independently of src/ for round-trip tests of the
 * planner (fit a chain, add binary links and actuators, and get the truth back).
 *
 * The die model is that of tests/support/known-chain.ts (docs/MODEL.md §2): a flat-floored channel 0 ≤ x ≤ W, floor
 * y = 0, closed above by a chain of N straight plates pinned to the die body just outside both walls; the melt edge is
 * the pivot polyline swollen by e = hole radius + ligament (a capsule of radius e round every plate), the orifice the
 * channel below it. What is generated is a one-degree-of-freedom mechanism built by sequential dyads, every position
 * in closed form:
 * - plate 1's angle is the input (one rotary actuator at the start pivot);
 * - for k = 2 … N − 2, plate k's angle follows from a binary link whose one pin sits in plate k's body and whose other
 *   pin is a ground pivot in the die body or a pin on an earlier plate (k − 2 or earlier): plate k's pin lies on the
 *   circle about its pivot k − 1 and on the circle of the link's length about the other pin; the two circles meet in
 *   two points (law of cosines) and the one on the side of the reference configuration is kept;
 * - the last two plates close onto the end pivot by two-link inverse kinematics (`closeChain`, law of cosines).
 * So N plates and N − 3 links give Grübler–Kutzbach mobility 3(n − 1) − 2j = 3(N + N − 3) − 2(N + 1 + 2(N − 3)) = 1.
 * The channel is W wide (the chain's span less 3–7 mm at each end, the pivots outside the walls) and H = 2h + 4 mm
 * high for a drawn profile height h of 8–13 mm, the start pivot at h + e; plates are 10–25 mm long, links 12–150 mm.
 * The schedule body (`schedule`) carries the stations' orifices (`channelOrifice`, melt edge sampled every `stepMm`),
 * `limits.fit_tolerance_mm`, the plates (hole 4 mm, ligament 3 mm, depth 25 mm) and `actuators.count` 1.
 *
 * Every link length is measured once, at a reference configuration; every station is then solved from its input
 * angle alone, so plate lengths and link lengths are constant by construction. A draw is rejected, and the next one
 * taken from the same seeded stream, unless over the whole input range (sampled finely, stations included) every
 * circle intersection exists with margin, no branch flips, each link's transmission angle stays within 45°–135°, the
 * closing pair of plates stays clear of its straight (dead-point) pose, the melt edge stays inside the channel
 * (3 mm ≤ y ≤ H − 3 mm), every link clears the melt by more than e, and every joint turns by at least
 * `minArticulationDeg` across the stations (else fewer plates or links could make the same orifices and the truth
 * would not be minimal). Last, a draw is rejected when its parts would collide anywhere along the motion by the
 * planner's published clearance rules (DEVELOPERS.md; src/mechanise/motion-clearance.ts): a ground pivot under a
 * plate, a link pin under a plate of a layer it passes (plate layers as the planner assigns them) or within a link's
 * width of another link, a link over the die opening less than e inside the plates (`clearanceViolation`).
 *
 * Why it is an independent reference: every position comes from closed-form triangle solutions, and the link
 * lengths, pins and pivots are known exactly, so a planner that returns N plates, N − 3 links and one actuator has
 * recovered them, not reproduced itself. The one piece of src/ run here is the planner's plate outline
 * (`plateOutline`, `pivotFans`), and only in the validity filter: it applies the planner's published physical rules
 * so that every truth is an admissible design (one the planner is right to accept), while the truth itself, and so
 * the answer the round trip expects, is still constructed and computed independently (the wire type is imported for
 * the compiler only).
 */
import type { ScheduleWireInput } from '../../src/http/schedule-schema.js';
import { pivotFans, plateOutline } from '../../src/synthesis/index.js';
import { channelOrifice, closeChain, meltEdgeY, type P } from './known-chain.js';

/** Pivot hole diameter, mm (the service's default plate). */
export const HOLE_DIAMETER_MM = 4;
/** Steel between a pivot hole and the melt edge, mm. */
export const LIGAMENT_MM = 3;
/** Plate depth from the melt edge, mm. */
export const PLATE_DEPTH_MM = 25;
/** Edge offset e = hole radius + ligament, mm: the pivot line lies e behind the melt edge. */
export const EDGE_OFFSET_MM = HOLE_DIAMETER_MM / 2 + LIGAMENT_MM;

/**
 * Seeded uniform generator on [0, 1): mulberry32 (Tommy Ettinger's 32-bit mixer, public domain); the same seed gives
 * the same sequence on every platform.
 */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** The far end of a binary link: a ground pivot in the die body, or a pin on an earlier plate. */
export type LinkEnd =
  | { readonly kind: 'ground'; readonly point: P }
  | {
      readonly kind: 'plate';
      /** 1-based plate number, at most the driven plate − 2. */
      readonly plate: number;
      /** Pin in that plate's frame, mm. */
      readonly pin: P;
    };

/** A binary link of the generated mechanism. */
export interface RandomLink {
  /** 1-based number of the plate it drives (2 … N − 2). */
  readonly plate: number;
  /**
   * Pin on that plate in the plate's own frame, mm: origin at its start pivot, x toward its next pivot, y away from the
   * melt (the left normal of a plate running left to right).
   */
  readonly pin: P;
  readonly other: LinkEnd;
  /** Pin centre to pin centre, measured at the reference configuration, mm. */
  readonly lengthMm: number;
  /** Which of the two circle intersections the plate's pin takes: +1 left of the line pivot → other pin, −1 right. */
  readonly branch: 1 | -1;
}

/** One station of the generated schedule. */
export interface RandomStation {
  readonly positionM: number;
  /** Plate 1's angle (the input), radians from +x, counter-clockwise. */
  readonly inputRad: number;
  /** Chain pivots start … end (N + 1 points), die-body frame, mm. */
  readonly pivots: P[];
  /** Angle of every plate, radians. */
  readonly angles: number[];
  /** Both pin centres of every link, [other end, pin on the driven plate], die-body frame, mm. */
  readonly linkEnds: [P, P][];
  /** The orifice under the swollen chain (`channelOrifice`), counter-clockwise, mm. */
  readonly orifice: { outer: P[]; holes: P[][] };
}

export interface RandomMechanism {
  readonly seed: number;
  /** Draws taken from the seed's stream; all but the last were rejected. */
  readonly draws: number;
  /** Why the rejected draws were rejected, with their counts. */
  readonly rejections: Readonly<Record<string, number>>;
  /** Plate lengths, pivot to pivot, mm (rounded to 0.1 mm when drawn). */
  readonly lengths: number[];
  readonly start: P;
  readonly end: P;
  /** Channel width W, mm: walls at x = 0 and x = W. */
  readonly widthMm: number;
  /** Channel height H, mm: the melt edge stays within 3 mm ≤ y ≤ H − 3 mm. */
  readonly heightMm: number;
  readonly edgeOffsetMm: number;
  readonly links: RandomLink[];
  /** Plate 1's angle at the reference configuration, where the link lengths were measured, radians. */
  readonly referenceInputRad: number;
  /** Branch of the closing pair of plates, as `closeChain` takes it. */
  readonly elbowUp: boolean;
  readonly stations: RandomStation[];
  /** The schedule as a line controller would post it to POST /v1/plans (plain JSON). */
  readonly schedule: ScheduleWireInput;
}

export interface RandomMechanismOptions {
  /** Plate count range, inclusive. @default [3, 5] */
  readonly plates?: readonly [min: number, max: number];
  /** Station count range, inclusive. @default [3, 8] */
  readonly stations?: readonly [min: number, max: number];
  /** `limits.fit_tolerance_mm` of the schedule, mm. @default 0.1 */
  readonly fitToleranceMm?: number;
  /** Sampling step of the orifices' melt edge, mm. @default 0.25 */
  readonly stepMm?: number;
  /** Smallest turn of every joint across the stations, degrees. @default 2 */
  readonly minArticulationDeg?: number;
  /**
   * `auto`: no `moving_span`, the service finds it; `walls`: an explicit `moving_span` from a point on the left wall to
   * one on the right wall, each 1 mm below the lowest melt edge at that wall over the stations (the part of the wall
   * common to every station, from where the plates' end slides along it). @default 'auto'
   */
  readonly movingSpan?: 'auto' | 'walls';
  /** Draws before giving up (programmer misuse: impossible options). @default 20000 */
  readonly maxDraws?: number;
}

/** Transmission-angle band kept at every link pin over the whole motion, radians (40°–140° usual rule, tightened). */
const TRANSMISSION_BAND: readonly [number, number] = [(45 * Math.PI) / 180, (135 * Math.PI) / 180];
/** The closing pair of plates keeps at least this bend from straight (a dead point at 0 and 180°), radians. */
const MIN_CLOSING_BEND = (8 * Math.PI) / 180;
/** Plates run left to right within this of level (the melt-edge model of known-chain.ts assumes it), radians. */
const MAX_PLATE_ANGLE = (60 * Math.PI) / 180;
/** The melt keeps this far from the channel floor and top, mm. */
const MELT_MARGIN_MM = 3;
/** A link's centre line keeps e plus this from every orifice, mm (the planner demands e). */
const LINK_CLEARANCE_MARGIN_MM = 0.5;
/** Largest swing of the melt edge between stations at any x, mm: the plates (depth 25 mm) must cover the opening. */
const MAX_SWING_MM = 12;
/** Ground pivots lie within this of the die opening's bounding box, mm (the planner allows 80 mm). */
const FRAME_MM = 70;
/** Input steps when the motion between the extreme stations is sampled, radians. */
const MOTION_STEP_RAD = 0.004;
/** Stations' inputs differ by at least this, radians (distinct positions). */
const MIN_INPUT_GAP_RAD = 0.02;

/**
 * A random exact 1-DOF mechanism (3–5 plates, 0–2 binary links, 3–8 stations) and its schedule, deterministic in
 * `seed`. See the file comment for the construction; throws only when `maxDraws` draws are all rejected.
 */
export function randomMechanism(seed: number, options: RandomMechanismOptions = {}): RandomMechanism {
  const o = {
    plates: options.plates ?? [3, 5],
    stations: options.stations ?? [3, 8],
    fitToleranceMm: options.fitToleranceMm ?? 0.1,
    stepMm: options.stepMm ?? 0.25,
    minArticulationRad: ((options.minArticulationDeg ?? 2) * Math.PI) / 180,
    movingSpan: options.movingSpan ?? 'auto',
    maxDraws: options.maxDraws ?? 20000,
  };
  if (!(o.plates[0] >= 3 && o.plates[1] >= o.plates[0] && o.stations[0] >= 2 && o.stations[1] >= o.stations[0])) {
    throw new Error('randomMechanism: plates must be a range from 3 up, stations a range from 2 up');
  }
  const rand = mulberry32(seed);
  // the structure is drawn once, so plate and station counts stay uniform however often the geometry is redrawn
  const integer = (a: number, b: number) => Math.min(b, a + Math.floor((b - a + 1) * rand()));
  const structure: Structure = {
    plates: integer(o.plates[0], o.plates[1]),
    stations: integer(o.stations[0], o.stations[1]),
  };
  const rejections: Record<string, number> = {};
  for (let draw = 1; draw <= o.maxDraws; draw++) {
    const m = drawMechanism(rand, structure, o);
    if (typeof m === 'string') {
      rejections[m] = (rejections[m] ?? 0) + 1;
      continue;
    }
    return { seed, draws: draw, rejections, ...m, schedule: scheduleOf(seed, m, o) };
  }
  throw new Error(`randomMechanism(${seed}): no acceptable mechanism in ${o.maxDraws} draws`);
}

interface Structure {
  readonly plates: number;
  readonly stations: number;
}

interface Resolved {
  readonly plates: readonly [number, number];
  readonly stations: readonly [number, number];
  readonly fitToleranceMm: number;
  readonly stepMm: number;
  readonly minArticulationRad: number;
  readonly movingSpan: 'auto' | 'walls';
  readonly maxDraws: number;
}

type Drawn = Omit<RandomMechanism, 'seed' | 'draws' | 'rejections' | 'schedule'>;

interface Frame {
  readonly lengths: number[];
  readonly start: P;
  readonly end: P;
  readonly links: RandomLink[];
  readonly elbowUp: boolean;
}

interface Configuration {
  readonly pivots: P[];
  readonly angles: number[];
  readonly linkEnds: [P, P][];
}

const E = EDGE_OFFSET_MM;

/** One draw: a mechanism, or why it was rejected. */
function drawMechanism(rand: () => number, structure: Structure, o: Resolved): Drawn | string {
  const uniform = (a: number, b: number) => a + (b - a) * rand();
  const integer = (a: number, b: number) => Math.min(b, a + Math.floor((b - a + 1) * rand()));
  const n = structure.plates;
  const lengths = Array.from({ length: n }, () => Math.round(uniform(10, 25) * 10) / 10);
  const profileHeight = uniform(8, 13);
  const height = 2 * profileHeight + 4;
  const start: P = [-uniform(3, 7), profileHeight + E];
  // reference configuration: every plate angle drawn, the end pivot where the chain then ends
  const reference = lengths.map(() => uniform(-0.3, 0.3));
  const refPivots: P[] = [start];
  for (let k = 0; k < n; k++) {
    const p = refPivots[k]!;
    refPivots.push([p[0] + lengths[k]! * Math.cos(reference[k]!), p[1] + lengths[k]! * Math.sin(reference[k]!)]);
  }
  const end = refPivots[n]!;
  const width = end[0] - uniform(3, 7);
  if (width < 20) return 'narrow channel';
  // the closing pair's branch: which side of the line pivot N−2 → end pivot N−1 lies on (cross product)
  const a = refPivots[n - 2]!;
  const b = refPivots[n - 1]!;
  const elbowUp = (end[0] - a[0]) * (b[1] - a[1]) - (end[1] - a[1]) * (b[0] - a[0]) > 0;

  const links: RandomLink[] = [];
  for (let k = 2; k <= n - 2; k++) {
    const pin = drawPin(uniform, lengths[k - 1]!);
    if (pin === null) return 'pin too close to a pivot';
    const pivot = refPivots[k - 1]!;
    const pinWorld = onPlate(pivot, reference[k - 1]!, pin);
    let other: LinkEnd;
    let otherWorld: P;
    if (k >= 3 && rand() < 0.5) {
      const j = integer(1, k - 2);
      const pinJ = drawPin(uniform, lengths[j - 1]!);
      if (pinJ === null) return 'pin too close to a pivot';
      other = { kind: 'plate', plate: j, pin: pinJ };
      otherWorld = onPlate(refPivots[j - 1]!, reference[j - 1]!, pinJ);
    } else {
      // a ground pivot roughly square to the pin's radius about pivot k − 1 (transmission angle near 90°), on the
      // higher of the two sides
      const radius = Math.atan2(pivot[1] - pinWorld[1], pivot[0] - pinWorld[0]);
      const turn = Math.PI / 2 + uniform(-0.6, 0.6);
      const len = uniform(15, 90);
      const candidates: P[] = [radius + turn, radius - turn].map((t) => [
        pinWorld[0] + len * Math.cos(t),
        pinWorld[1] + len * Math.sin(t),
      ]);
      otherWorld = candidates[0]![1] > candidates[1]![1] ? candidates[0]! : candidates[1]!;
      other = { kind: 'ground', point: otherWorld };
      // the die body: outside the channel (and so every orifice and the opening) by more than e; the frame is checked
      // once the stations are known
      if (distanceToBox(otherWorld, width, height) < E + 1) return 'ground pivot in the channel';
    }
    const lengthMm = Math.hypot(pinWorld[0] - otherWorld[0], pinWorld[1] - otherWorld[1]);
    if (lengthMm < 12 || lengthMm > 150) return 'link length';
    const cross =
      (otherWorld[0] - pivot[0]) * (pinWorld[1] - pivot[1]) - (otherWorld[1] - pivot[1]) * (pinWorld[0] - pivot[0]);
    links.push({ plate: k, pin, other, lengthMm, branch: cross > 0 ? 1 : -1 });
  }
  const frame: Frame = { lengths, start, end, links, elbowUp };

  // stations: inputs spread over ±δ about the reference (evenly spaced, jittered by up to a third of the spacing, the
  // extremes kept), visited in a shuffled order as a schedule may go back and forth
  const delta = uniform(0.1, 0.25);
  const count = structure.stations;
  const spacing = 2 / (count - 1);
  const t = Array.from({ length: count }, (_, i) =>
    i === 0 || i === count - 1 ? -1 + i * spacing : -1 + (i + uniform(-1 / 3, 1 / 3)) * spacing,
  );
  for (let i = t.length - 1; i > 0; i--) {
    const j = Math.floor(rand() * (i + 1));
    [t[i], t[j]] = [t[j]!, t[i]!];
  }
  const inputs = t.map((ti) => reference[0]! + delta * ti);
  const sorted = [...inputs].sort((x, y) => x - y);
  for (let i = 1; i < sorted.length; i++)
    if (sorted[i]! - sorted[i - 1]! < MIN_INPUT_GAP_RAD) return 'stations too close';

  // the whole motion, finely sampled (every leg between stations lies inside it: one input, one branch)
  const lo = sorted[0]!;
  const hi = sorted.at(-1)!;
  const steps = Math.ceil((hi - lo) / MOTION_STEP_RAD);
  const motion: Configuration[] = [];
  for (let s = 0; s <= steps; s++) {
    const c = solve(frame, lo + ((hi - lo) * s) / steps);
    if (typeof c === 'string') return c;
    const why = inadmissible(frame, c, width, height, 1);
    if (why) return why;
    motion.push(c);
  }

  const stations: RandomStation[] = [];
  let position = 0;
  for (const input of inputs) {
    const c = solve(frame, input) as Configuration;
    const orifice = channelOrifice(c.pivots, E, width, o.stepMm);
    const why = inadmissible(frame, c, width, height, o.stepMm);
    if (why) return why;
    stations.push({ positionM: position, inputRad: input, ...c, orifice });
    position = Math.round((position + uniform(0.05, 0.3)) * 1000) / 1000;
  }

  // every joint turns visibly across the stations: the start and end pivots (absolute angles of plates 1 and N) and
  // each pivot between plates (relative angle)
  const joints = [
    (c: RandomStation) => c.angles[0]!,
    ...lengths.slice(1).map((_, k) => (c: RandomStation) => wrap(c.angles[k + 1]! - c.angles[k]!)),
    (c: RandomStation) => c.angles[n - 1]!,
  ];
  for (const joint of joints) {
    const values = stations.map(joint);
    if (Math.max(...values) - Math.min(...values) < o.minArticulationRad) return 'a joint barely turns';
  }
  // the plates (25 mm deep) cover the die opening, the envelope of the stations, at every station
  let top = 0;
  for (let x = 0; x <= width; x += 0.5) {
    const ys = stations.map((s) => meltEdgeY(s.pivots, E, x));
    if (Math.max(...ys) - Math.min(...ys) > MAX_SWING_MM) return 'melt edge swings too far';
    top = Math.max(top, ...ys);
  }
  // ground pivots inside the planner's frame (the opening's bounding box, 0 … W by 0 … top, grown by 80 mm) with
  // 10 mm to spare
  for (const link of links) {
    if (link.other.kind !== 'ground') continue;
    const [x, y] = link.other.point;
    if (x < -FRAME_MM || x > width + FRAME_MM || y < -FRAME_MM || y > top + FRAME_MM) {
      return 'ground pivot outside the frame';
    }
  }
  // room between the parts along the whole motion, by the planner's rules (last: the dearest check)
  if (links.length > 0) {
    const room = clearanceViolation(
      frame,
      stations.map((s) => s.pivots),
      [...motion, ...stations],
      width,
    );
    if (room) return room;
  }
  return {
    lengths,
    start,
    end,
    widthMm: width,
    heightMm: height,
    edgeOffsetMm: E,
    links,
    referenceInputRad: reference[0]!,
    elbowUp,
    stations,
  };
}

/** A pin in a plate's body (plate frame), clear of both pivot holes, or null when the draw lands too near one. */
function drawPin(uniform: (a: number, b: number) => number, length: number): P | null {
  // the body behind the pivot line: e of steel from the pivot line and from the back edge, which lies
  // depth − e behind the pivot line; a hole diameter plus a ligament (e + hole radius) from each pivot, + 0.5 mm
  const pin: P = [uniform(0.15, 0.85) * length, uniform(E + 1, PLATE_DEPTH_MM - 2 * E - 1)];
  const clear = E + HOLE_DIAMETER_MM / 2 + 0.5;
  if (Math.hypot(pin[0], pin[1]) < clear || Math.hypot(pin[0] - length, pin[1]) < clear) return null;
  return pin;
}

/** A point given in a plate's frame (origin at `pivot`, x at angle `angle`, y its left normal), die-body frame. */
function onPlate(pivot: P, angle: number, local: P): P {
  const c = Math.cos(angle);
  const s = Math.sin(angle);
  return [pivot[0] + c * local[0] - s * local[1], pivot[1] + s * local[0] + c * local[1]];
}

/** The configuration at input angle `input`: sequential dyads, then the closing pair; or why it does not exist. */
function solve(frame: Frame, input: number): Configuration | string {
  const { lengths, start, end, links } = frame;
  const angles = [input];
  const pivots: P[] = [start, onPlate(start, input, [lengths[0]!, 0])];
  const linkEnds: [P, P][] = [];
  for (const link of links) {
    const k = link.plate;
    const pivot = pivots[k - 1]!;
    const other: P =
      link.other.kind === 'ground'
        ? link.other.point
        : onPlate(pivots[link.other.plate - 1]!, angles[link.other.plate - 1]!, link.other.pin);
    // circle (pivot, r) ∩ circle (other, ℓ): the foot along the centre line by the law of cosines, then the height
    const r = Math.hypot(link.pin[0], link.pin[1]);
    const dx = other[0] - pivot[0];
    const dy = other[1] - pivot[1];
    const d = Math.hypot(dx, dy);
    const along = (r * r - link.lengthMm ** 2 + d * d) / (2 * d);
    const h2 = r * r - along * along;
    if (!(h2 > (0.05 * r) ** 2)) return 'link cannot reach';
    const h = link.branch * Math.sqrt(h2);
    const pin: P = [pivot[0] + (along * dx - h * dy) / d, pivot[1] + (along * dy + h * dx) / d];
    angles.push(Math.atan2(pin[1] - pivot[1], pin[0] - pivot[0]) - Math.atan2(link.pin[1], link.pin[0]));
    pivots.push(onPlate(pivot, angles[k - 1]!, [lengths[k - 1]!, 0]));
    linkEnds.push([other, pin]);
  }
  let closed: P[];
  try {
    closed = closeChain(lengths, start, end, angles, frame.elbowUp);
  } catch {
    return 'chain cannot close';
  }
  const n = lengths.length;
  for (let k = n - 2; k < n; k++) {
    angles.push(Math.atan2(closed[k + 1]![1] - closed[k]![1], closed[k + 1]![0] - closed[k]![0]));
  }
  return { pivots: closed, angles, linkEnds };
}

/** Why a configuration is unusable, or null: the limits of the file comment, checked on one configuration. */
function inadmissible(frame: Frame, c: Configuration, width: number, height: number, step: number): string | null {
  const n = frame.lengths.length;
  if (c.angles.some((a) => Math.abs(wrap(a)) > MAX_PLATE_ANGLE)) return 'plate too steep';
  const bend = Math.abs(wrap(c.angles[n - 1]! - c.angles[n - 2]!));
  if (bend < MIN_CLOSING_BEND || bend > Math.PI - MIN_CLOSING_BEND) return 'closing pair near straight';
  for (let x = 0; x <= width; x += 0.5) {
    const y = meltEdgeY(c.pivots, E, x);
    if (!(y >= MELT_MARGIN_MM && y <= height - MELT_MARGIN_MM)) return 'melt edge leaves the channel';
  }
  const orifice = channelOrifice(c.pivots, E, width, step).outer;
  for (const [i, link] of frame.links.entries()) {
    const [other, pin] = c.linkEnds[i]!;
    // transmission angle at the driven pin, between the link and the plate's line to its pivot toward the input
    const pivot = c.pivots[link.plate - 1]!;
    const mu = angleBetween([other[0] - pin[0], other[1] - pin[1]], [pivot[0] - pin[0], pivot[1] - pin[1]]);
    if (mu < TRANSMISSION_BAND[0] || mu > TRANSMISSION_BAND[1]) return 'transmission angle';
    if (segmentToRingClearance(other, pin, orifice) < E + LINK_CLEARANCE_MARGIN_MM) return 'link crosses the melt';
  }
  return null;
}

/**
 * The planner's plate outline (src/synthesis `plateOutline`: straight melt edge at e, body to depth − e behind the
 * pivot line, fanned round each interior pivot by `pivotFans` of the stations) with round arcs drawn finely.
 */
const PLATE_SHAPE = {
  edgeOffsetMm: E,
  depthMm: PLATE_DEPTH_MM,
  holeRadiusMm: HOLE_DIAMETER_MM / 2,
  arcToleranceMm: 0.02,
} as const;
/**
 * Room kept beyond each clearance rule of the planner, mm: its outlines are drawn with 0.2 mm chords (the chords lie
 * inside the arcs) and its fitted chain may stray from the truth by the fit tolerance.
 */
const ROOM_MARGIN_MM = 0.3;
/** A link's pin line is sampled this often against the die opening, mm. */
const LINK_SAMPLE_MM = 0.5;

/** The rejection reasons of `clearanceViolation` (the planner's clearance rules), as `rejections` counts them. */
export const CLEARANCE_REJECTIONS = [
  'ground pivot under a plate',
  'plate layers undecided',
  'link pin under a plate of a layer above',
  'link pin through another link',
  'link over the melt',
] as const;

/**
 * Why the parts of a mechanism would collide somewhere along its motion, or null: the planner's clearance rules
 * (DEVELOPERS.md; src/mechanise/motion-clearance.ts `makeClearanceInspector`), each with `ROOM_MARGIN_MM` to spare,
 * checked on every configuration given:
 * 1. every ground pivot outside every plate outline by the pin radius (its pin reaches through every plate layer);
 * 2. every link pin on a plate outside every plate of a higher layer by the pin radius (layers as the planner gives
 *    them, `plateLayers`: 1, 2, 1, 2, … unless plates on one layer would overlap; links lie above every plate), and
 *    every link pin on a plate at least pin radius + e from the pin line of every other link (the planner numbers
 *    links in the order it finds them, so whichever link it puts lower, the other's pins pass through it);
 * 3. every point of a link's pin line over the die opening (the envelope of the stations' orifices) at least e inside
 *    some plate outline.
 * The outlines are the planner's own (`plateOutline`, `pivotFans` from src/synthesis), used here only to filter draws.
 */
function clearanceViolation(
  frame: Frame,
  stationPivots: readonly P[][],
  configurations: readonly Configuration[],
  width: number,
): (typeof CLEARANCE_REJECTIONS)[number] | null {
  const n = frame.lengths.length;
  const fans = pivotFans(stationPivots);
  const outlineAt = (pivots: readonly P[], k: number) =>
    plateOutline(pivots[k]!, pivots[k + 1]!, PLATE_SHAPE, null, { atA: fans[k]!, atB: fans[k + 1]! }).outer as P[];
  const layers = plateLayers(stationPivots.map((pv) => Array.from({ length: n }, (_, k) => outlineAt(pv, k))));
  if (layers === null) return 'plate layers undecided';
  const pinRoom = PLATE_SHAPE.holeRadiusMm + ROOM_MARGIN_MM;
  // the die opening {0 ≤ x ≤ W, 0 ≤ y ≤ highest melt edge over the stations}, its top tabulated every 0.25 mm and
  // taken at the higher neighbour (the opening grown a little, on the safe side)
  const cells = Math.ceil(width / 0.25);
  const top = Array.from({ length: cells + 1 }, (_, i) =>
    Math.max(...stationPivots.map((pv) => meltEdgeY(pv, E, Math.min(width, i * 0.25)))),
  );
  const opening = (p: P) => {
    if (!(p[0] >= 0 && p[0] <= width && p[1] >= 0)) return false;
    const i = Math.min(cells - 1, Math.floor(p[0] / 0.25));
    return p[1] <= Math.max(top[i]!, top[i + 1]!);
  };
  for (const c of configurations) {
    const outlines = Array.from({ length: n }, (_, k) => outlineAt(c.pivots, k));
    for (const [i, link] of frame.links.entries()) {
      const [other, pin] = c.linkEnds[i]!;
      if (link.other.kind === 'ground') {
        if (outlines.some((ring) => signedDistance(other, ring) < pinRoom)) return 'ground pivot under a plate';
      }
      const platePins: [P, number][] = [[pin, link.plate]];
      if (link.other.kind === 'plate') platePins.push([other, link.other.plate]);
      for (const [p, plate] of platePins) {
        const own = layers[plate - 1]!;
        if (outlines.some((ring, k) => layers[k]! > own && signedDistance(p, ring) < pinRoom)) {
          return 'link pin under a plate of a layer above';
        }
        for (const [j] of frame.links.entries()) {
          if (j === i) continue;
          const [a, b] = c.linkEnds[j]!;
          if (pointSegment(p, a, b) < pinRoom + E) return 'link pin through another link';
        }
      }
      const steps = Math.max(2, Math.ceil(Math.hypot(pin[0] - other[0], pin[1] - other[1]) / LINK_SAMPLE_MM));
      for (let s = 0; s <= steps; s++) {
        const q: P = [other[0] + ((pin[0] - other[0]) * s) / steps, other[1] + ((pin[1] - other[1]) * s) / steps];
        if (!opening(q)) continue;
        if (!outlines.some((ring) => -signedDistance(q, ring) >= E + ROOM_MARGIN_MM)) return 'link over the melt';
      }
    }
  }
  return null;
}

/**
 * The plates' layers (1-based, chain order) as the planner assigns them (src/mechanise/mechanise-chain.ts
 * `plateLayers`): greedy colouring along the chain, each plate on the lowest layer not taken by its neighbour before
 * it nor by an earlier plate it overlaps at some station (which gives 1, 2, 1, 2, … when none overlap); null when
 * some pair's overlap is within `ROOM_MARGIN_MM` of the limit, so the planner's coarser outlines might decide it the
 * other way.
 *
 * @param outlines outlines[s][k]: plate k + 1's outer ring at station s
 */
function plateLayers(outlines: readonly (readonly P[][])[]): number[] | null {
  const n = outlines[0]?.length ?? 0;
  const layers: number[] = [];
  for (let k = 0; k < n; k++) {
    const taken = new Set<number>();
    if (k > 0) taken.add(layers[k - 1]!);
    for (let j = 0; j < k - 1; j++) {
      const gap = Math.min(...outlines.map((plates) => ringGap(plates[j]!, plates[k]!)));
      if (Math.abs(gap) < ROOM_MARGIN_MM) return null;
      if (gap < 0) taken.add(layers[j]!);
    }
    let layer = 1;
    while (taken.has(layer)) layer++;
    layers.push(layer);
  }
  return layers;
}

/**
 * Gap between two rings, mm: the smallest vertex-to-boundary distance when they are apart; when they overlap, minus
 * the deepest any vertex of one reaches inside the other (the planner's measure).
 */
function ringGap(a: readonly P[], b: readonly P[]): number {
  let gap = Number.POSITIVE_INFINITY;
  let depth = 0;
  for (const [from, to] of [
    [a, b],
    [b, a],
  ] as const) {
    for (const p of from) {
      const d = signedDistance(p, to);
      if (d < 0) depth = Math.max(depth, -d);
      else gap = Math.min(gap, d);
    }
  }
  return depth > 0 ? -depth : gap;
}

/** Distance from p to a closed ring's boundary, positive outside the ring and negative inside, mm. */
function signedDistance(p: P, ring: readonly P[]): number {
  let d = Number.POSITIVE_INFINITY;
  for (let k = 0; k < ring.length; k++) d = Math.min(d, pointSegment(p, ring[k]!, ring[(k + 1) % ring.length]!));
  return pointInRing(p, ring) ? -d : d;
}

/**
 * The mechanism's motion between its extreme stations, every `stepRad` of input (the generator's own sampling by
 * default), each configuration solved in closed form as the stations were: what the clearance rules were checked on.
 */
export function motionOf(m: RandomMechanism, stepRad = MOTION_STEP_RAD): MotionSample[] {
  const frame: Frame = { lengths: m.lengths, start: m.start, end: m.end, links: m.links, elbowUp: m.elbowUp };
  const inputs = m.stations.map((s) => s.inputRad);
  const lo = Math.min(...inputs);
  const hi = Math.max(...inputs);
  const steps = Math.ceil((hi - lo) / stepRad);
  return Array.from({ length: steps + 1 }, (_, s) => {
    const inputRad = lo + ((hi - lo) * s) / steps;
    const c = solve(frame, inputRad);
    if (typeof c === 'string') throw new Error(`motionOf(${m.seed}): ${c} at ${inputRad} rad`);
    return { inputRad, ...c };
  });
}

/** One configuration of a mechanism's motion. */
export interface MotionSample {
  /** Plate 1's angle, radians. */
  readonly inputRad: number;
  /** Chain pivots start … end, die-body frame, mm. */
  readonly pivots: P[];
  readonly angles: number[];
  /** Both pin centres of every link, [other end, pin on the driven plate], mm. */
  readonly linkEnds: [P, P][];
}

/** The schedule body of POST /v1/plans for a drawn mechanism. */
function scheduleOf(seed: number, m: Drawn, o: Resolved): ScheduleWireInput {
  return {
    name: `random-mechanism-${seed}`,
    material: 'PVC-U',
    limits: { fit_tolerance_mm: o.fitToleranceMm },
    plates: { pivot_hole_diameter_mm: HOLE_DIAMETER_MM, ligament_mm: LIGAMENT_MM, depth_mm: PLATE_DEPTH_MM },
    actuators: { count: 1 },
    ...(o.movingSpan === 'walls' ? { moving_span: wallSpan(m) } : {}),
    stations: m.stations.map((s) => ({
      position_m: s.positionM,
      orifice: { outer: s.orifice.outer.map((p): [number, number] => [p[0], p[1]]), holes: [] },
    })),
  };
}

/** Explicit span ends on both walls, 1 mm below the lowest melt edge there over the stations (`meltEdgeY`). */
function wallSpan(m: Drawn): { start: [number, number]; end: [number, number] } {
  const low = (x: number) => Math.min(...m.stations.map((s) => meltEdgeY(s.pivots, E, x))) - 1;
  return { start: [0, low(0)], end: [m.widthMm, low(m.widthMm)] };
}

/** Angle wrapped into (−π, π]. */
export function wrap(a: number): number {
  return a - 2 * Math.PI * Math.ceil((a - Math.PI) / (2 * Math.PI));
}

/** Unsigned angle between two vectors, [0, π] (clamped before acos). */
export function angleBetween(u: P, v: P): number {
  const c = (u[0] * v[0] + u[1] * v[1]) / (Math.hypot(u[0], u[1]) * Math.hypot(v[0], v[1]));
  return Math.acos(Math.max(-1, Math.min(1, c)));
}

/** Distance from p to the rectangle [0, width] × [0, height] (0 inside), mm. */
function distanceToBox(p: P, width: number, height: number): number {
  const dx = Math.max(0 - p[0], 0, p[0] - width);
  const dy = Math.max(0 - p[1], 0, p[1] - height);
  return Math.hypot(dx, dy);
}

/** Distance from segment ab to a closed ring's boundary, 0 when the segment enters the ring, mm. */
export function segmentToRingClearance(a: P, b: P, ring: readonly P[]): number {
  if (pointInRing(a, ring) || pointInRing(b, ring)) return 0;
  let best = Number.POSITIVE_INFINITY;
  for (let k = 0; k < ring.length; k++) {
    best = Math.min(best, segmentDistance(a, b, ring[k]!, ring[(k + 1) % ring.length]!));
  }
  return best;
}

/** Even–odd point-in-polygon test (ray casting). */
function pointInRing(p: P, ring: readonly P[]): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const a = ring[i]!;
    const b = ring[j]!;
    if (a[1] > p[1] !== b[1] > p[1] && p[0] < ((b[0] - a[0]) * (p[1] - a[1])) / (b[1] - a[1]) + a[0]) inside = !inside;
  }
  return inside;
}

/** Distance between segments ab and cd: 0 when they cross, else the least of the four point-to-segment distances. */
function segmentDistance(a: P, b: P, c: P, d: P): number {
  const orient = (p: P, q: P, r: P) => (q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0]);
  const d1 = orient(a, b, c);
  const d2 = orient(a, b, d);
  const d3 = orient(c, d, a);
  const d4 = orient(c, d, b);
  if (d1 * d2 < 0 && d3 * d4 < 0) return 0;
  return Math.min(pointSegment(a, c, d), pointSegment(b, c, d), pointSegment(c, a, b), pointSegment(d, a, b));
}

function pointSegment(p: P, a: P, b: P): number {
  const vx = b[0] - a[0];
  const vy = b[1] - a[1];
  const len2 = vx * vx + vy * vy;
  const t = len2 > 0 ? Math.max(0, Math.min(1, ((p[0] - a[0]) * vx + (p[1] - a[1]) * vy) / len2)) : 0;
  return Math.hypot(p[0] - a[0] - t * vx, p[1] - a[1] - t * vy);
}
