import { beforeAll, describe, expect, it } from 'vitest';
import { ScheduleWire } from '../../src/http/schedule-schema.js';
import { toSchedule } from '../../src/http/to-schedule.js';
import { type Plan, planSchedule } from '../../src/pipeline/index.js';
import { meltEdgeY, type P } from '../support/known-chain.js';
import {
  EDGE_OFFSET_MM,
  HOLE_DIAMETER_MM,
  type MotionSample,
  motionOf,
  PLATE_DEPTH_MM,
  type RandomMechanism,
  type RandomStation,
  randomMechanism,
} from '../support/random-mechanism.js';

/** Seeds of the round trip (each a different random mechanism, tests/support/random-mechanism.ts). */
const SEEDS = Array.from({ length: 30 }, (_, i) => i + 1);
const MECHANISMS = new Map(SEEDS.map((seed) => [seed, randomMechanism(seed)] as const));
const E = EDGE_OFFSET_MM;

const dist = (a: P, b: P) => Math.hypot(a[0] - b[0], a[1] - b[1]);
const cross = (o: P, a: P, b: P) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
const deg = (rad: number) => (rad * 180) / Math.PI;
const wrapAngle = (a: number) => Math.atan2(Math.sin(a), Math.cos(a));

/** Plate k's angle (1-based) read back from the station's pivots alone (atan2 of pivot k − 1 → pivot k). */
function plateAngle(s: RandomStation, k: number): number {
  const a = s.pivots[k - 1]!;
  const b = s.pivots[k]!;
  return Math.atan2(b[1] - a[1], b[0] - a[0]);
}

/** A point in plate k's frame (origin pivot k − 1, x toward pivot k, y its left normal), from the pivots alone. */
function onPlateFromPivots(s: RandomStation, k: number, local: P): P {
  const a = s.pivots[k - 1]!;
  const t = plateAngle(s, k);
  return [
    a[0] + Math.cos(t) * local[0] - Math.sin(t) * local[1],
    a[1] + Math.sin(t) * local[0] + Math.cos(t) * local[1],
  ];
}

/** Both pin centres of a link at a station, rebuilt from the station's pivots and the link's definition. */
function linkPins(m: RandomMechanism, s: RandomStation, i: number): [P, P] {
  const link = m.links[i]!;
  const other =
    link.other.kind === 'ground' ? link.other.point : onPlateFromPivots(s, link.other.plate, link.other.pin);
  return [other, onPlateFromPivots(s, link.plate, link.pin)];
}

/** Whether two closed-segment pairs properly cross (strict orientation test). */
function crosses(a: P, b: P, c: P, d: P): boolean {
  return cross(a, b, c) * cross(a, b, d) < 0 && cross(c, d, a) * cross(c, d, b) < 0;
}

/** A convex piece of a plate body: a disc, or a counter-clockwise convex polygon, die-body frame, mm. */
type Piece = { readonly disc: P; readonly r: number } | { readonly poly: readonly P[] };

/** Signed distance from p to a convex piece, mm: positive outside, minus the depth inside. */
function pieceDistance(p: P, piece: Piece): number {
  if ('disc' in piece) return dist(p, piece.disc) - piece.r;
  const ring = piece.poly;
  let outside = Number.POSITIVE_INFINITY;
  let inside = true;
  let depth = Number.POSITIVE_INFINITY;
  for (let k = 0; k < ring.length; k++) {
    const a = ring[k]!;
    const b = ring[(k + 1) % ring.length]!;
    const len = dist(a, b);
    if (len < 1e-12) continue;
    // signed distance to the edge's line, positive on the inner (left) side of a counter-clockwise ring
    const side = cross(a, b, p) / len;
    if (side < 0) inside = false;
    depth = Math.min(depth, side);
    const t = Math.max(0, Math.min(1, ((p[0] - a[0]) * (b[0] - a[0]) + (p[1] - a[1]) * (b[1] - a[1])) / len ** 2));
    outside = Math.min(outside, dist(p, [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])]));
  }
  return inside ? -depth : outside;
}

/**
 * Plate k's body (1-based) at a configuration, as convex pieces built here from the plate model the planner publishes
 * (src/synthesis/plate-outline.ts, DEVELOPERS.md): the strip from the melt edge e in front of the pivot line to
 * depth − e behind it, a disc of radius e round each pivot, and a fan sector of radius depth − e round each interior
 * pivot from the plate's body-side normal toward its neighbour by `fans[pivot]` radians (sectors drawn with 0.5°
 * chords, which lie inside the arc).
 */
function plateBody(pivots: readonly P[], k: number, fans: readonly number[]): Piece[] {
  const a = pivots[k - 1]!;
  const b = pivots[k]!;
  const len = dist(a, b);
  const u: P = [(b[0] - a[0]) / len, (b[1] - a[1]) / len];
  const n: P = [-u[1], u[0]];
  const back = PLATE_DEPTH_MM - E;
  const at = (o: P, s: number, d: number): P => [o[0] + u[0] * s + n[0] * d, o[1] + u[1] * s + n[1] * d];
  const sector = (c: P, from: number, to: number): Piece => {
    const steps = Math.max(1, Math.ceil(Math.abs(to - from) / (Math.PI / 360)));
    const lo = Math.min(from, to);
    const arc = Array.from({ length: steps + 1 }, (_, i): P => {
      const t = lo + (Math.abs(to - from) * i) / steps;
      return [c[0] + back * Math.cos(t), c[1] + back * Math.sin(t)];
    });
    return { poly: [c, ...arc] };
  };
  const normal = Math.atan2(n[1], n[0]);
  const pieces: Piece[] = [
    { poly: [at(a, 0, -E), at(a, len, -E), at(a, len, back), at(a, 0, back)] },
    { disc: a, r: E },
    { disc: b, r: E },
  ];
  if (fans[k - 1]! > 0) pieces.push(sector(a, normal, normal + fans[k - 1]!));
  if (fans[k]! > 0) pieces.push(sector(b, normal - fans[k]!, normal));
  return pieces;
}

/**
 * The fan of every pivot over a mechanism's stations (the rule of src/synthesis/plate-outline.ts `pivotFans`, computed
 * here): 0 at the start and end pivots; at pivot k the largest right turn of the chain there over the stations + 5°,
 * capped at 90° − the largest left turn − 5°, and never negative.
 */
function fansOf(m: RandomMechanism): number[] {
  const count = m.lengths.length + 1;
  const margin = (5 * Math.PI) / 180;
  return Array.from({ length: count }, (_, k) => {
    if (k === 0 || k === count - 1) return 0;
    const turns = m.stations.map((s) => {
      const [a, b, c] = [s.pivots[k - 1]!, s.pivots[k]!, s.pivots[k + 1]!];
      return wrapAngle(Math.atan2(c[1] - b[1], c[0] - b[0]) - Math.atan2(b[1] - a[1], b[0] - a[0]));
    });
    const right = Math.max(0, ...turns.map((t) => -t));
    const left = Math.max(0, ...turns);
    return Math.max(0, Math.min(right + margin, Math.PI / 2 - left - margin));
  });
}

/** Points on the boundary of every piece of a plate body, at most 0.5 mm (or 5° of a disc) apart. */
function boundarySamples(pieces: readonly Piece[]): P[] {
  return pieces.flatMap((piece) => {
    if ('disc' in piece) {
      return Array.from({ length: 72 }, (_, i): P => {
        const t = (2 * Math.PI * i) / 72;
        return [piece.disc[0] + piece.r * Math.cos(t), piece.disc[1] + piece.r * Math.sin(t)];
      });
    }
    return piece.poly.flatMap((a, k) => {
      const b = piece.poly[(k + 1) % piece.poly.length]!;
      const steps = Math.max(1, Math.ceil(dist(a, b) / 0.5));
      return Array.from(
        { length: steps },
        (_, i): P => [a[0] + ((b[0] - a[0]) * i) / steps, a[1] + ((b[1] - a[1]) * i) / steps],
      );
    });
  });
}

/**
 * The plates' layers (1-based, chain order) by the planner's rule (src/mechanise/mechanise-chain.ts `plateLayers`,
 * computed here): each plate on the lowest layer not taken by the plate before it nor by an earlier plate it overlaps
 * (a boundary point of one more than 0.05 mm inside the other) at some station.
 */
function layersOf(m: RandomMechanism, fans: readonly number[]): number[] {
  const bodies = m.stations.map((s) => m.lengths.map((_, k) => plateBody(s.pivots, k + 1, fans)));
  const inside = (x: P, body: readonly Piece[]) => Math.min(...body.map((piece) => pieceDistance(x, piece))) < -0.05;
  const overlap = (i: number, j: number) =>
    bodies.some(
      (b) =>
        boundarySamples(b[i]!).some((x) => inside(x, b[j]!)) || boundarySamples(b[j]!).some((x) => inside(x, b[i]!)),
    );
  const layers: number[] = [];
  m.lengths.forEach((_, k) => {
    const taken = new Set<number>(k > 0 ? [layers[k - 1]!] : []);
    for (let j = 0; j < k - 1; j++) if (overlap(j, k)) taken.add(layers[j]!);
    let layer = 1;
    while (taken.has(layer)) layer++;
    layers.push(layer);
  });
  return layers;
}

/** Both pin centres of a link at a motion sample, rebuilt from the sample's pivots and the link's definition. */
function samplePins(m: RandomMechanism, c: MotionSample, i: number): [P, P] {
  const asStation = { pivots: c.pivots } as RandomStation;
  return linkPins(m, asStation, i);
}

/** Every link pin that sits on a plate at a motion sample: [link index, pin, plate number]. */
function platePins(m: RandomMechanism, c: MotionSample): [number, P, number][] {
  return m.links.flatMap((link, i) => {
    const [other, pin] = samplePins(m, c, i);
    const pins: [number, P, number][] = [[i, pin, link.plate]];
    if (link.other.kind === 'plate') pins.push([i, other, link.other.plate]);
    return pins;
  });
}

/**
 * Whether q lies at least r inside plate body `pieces`: q inside, and 180 points on the circle of radius r about q
 * each inside some piece (the body is one simply connected region).
 */
function deepInside(q: P, r: number, pieces: readonly Piece[]): boolean {
  if (pieces.some((p) => pieceDistance(q, p) <= -r)) return true;
  for (let i = 0; i < 180; i++) {
    const t = (2 * Math.PI * i) / 180;
    const c: P = [q[0] + r * Math.cos(t), q[1] + r * Math.sin(t)];
    if (!pieces.some((p) => pieceDistance(c, p) <= 0)) return false;
  }
  return true;
}

describe('randomMechanism (the generator alone, checked against facts computed here)', () => {
  const all = [...MECHANISMS.values()];

  it('randomMechanism(seed) is deterministic and different seeds give different mechanisms', () => {
    // the same seed replays the same mulberry32 stream
    expect(randomMechanism(7)).toEqual(MECHANISMS.get(7));
    expect(MECHANISMS.get(7)!.lengths).not.toEqual(MECHANISMS.get(8)!.lengths);
  });

  it('draws 3–5 plates, N − 3 links and 3–8 stations, and covers every plate count over the seeds', () => {
    for (const m of all) {
      expect(m.lengths.length).toBeGreaterThanOrEqual(3);
      expect(m.lengths.length).toBeLessThanOrEqual(5);
      expect(m.links).toHaveLength(m.lengths.length - 3);
      expect(m.stations.length).toBeGreaterThanOrEqual(3);
      expect(m.stations.length).toBeLessThanOrEqual(8);
      for (const l of m.lengths) expect(l >= 10 && l <= 25).toBe(true);
    }
    expect(new Set(all.map((m) => m.lengths.length))).toEqual(new Set([3, 4, 5]));
  });

  it('every mechanism has Grübler–Kutzbach mobility 1', () => {
    // M = 3(n − 1) − 2·j1: n = die body + N plates + links, j1 = N + 1 chain pivots + 2 pins per link
    for (const m of all) {
      const n = 1 + m.lengths.length + m.links.length;
      const j = m.lengths.length + 1 + 2 * m.links.length;
      expect(3 * (n - 1) - 2 * j).toBe(1);
    }
  });

  it('every plate keeps its length and the chain closes on its start and end pivots at every station (1e-9 mm)', () => {
    // rigidity, measured pivot to pivot on the stored pivots
    for (const m of all) {
      for (const s of m.stations) {
        expect(s.pivots).toHaveLength(m.lengths.length + 1);
        expect(dist(s.pivots[0]!, m.start)).toBeLessThan(1e-9);
        expect(dist(s.pivots.at(-1)!, m.end)).toBeLessThan(1e-9);
        m.lengths.forEach((l, k) => {
          expect(Math.abs(dist(s.pivots[k]!, s.pivots[k + 1]!) - l)).toBeLessThan(1e-9);
        });
      }
    }
  });

  it('every link keeps its length at every station (1e-9 mm), its pins rebuilt from the pivots alone', () => {
    // the pins are placed here from each station's pivots (plate frames by atan2), not from the generator's angles
    for (const m of all) {
      for (const s of m.stations) {
        m.links.forEach((link, i) => {
          const [a, b] = linkPins(m, s, i);
          expect(Math.abs(dist(a, b) - link.lengthMm)).toBeLessThan(1e-9);
          expect(dist(a, s.linkEnds[i]![0])).toBeLessThan(1e-9);
          expect(dist(b, s.linkEnds[i]![1])).toBeLessThan(1e-9);
        });
      }
    }
  });

  it('no branch flips: every driven pin and the closing joint stay on their reference side at every station', () => {
    // the side of a point to a line by the sign of the cross product
    for (const m of all) {
      const n = m.lengths.length;
      for (const s of m.stations) {
        m.links.forEach((link, i) => {
          const [other, pin] = linkPins(m, s, i);
          expect(Math.sign(cross(s.pivots[link.plate - 1]!, other, pin))).toBe(link.branch);
        });
        expect(cross(s.pivots[n - 2]!, m.end, s.pivots[n - 1]!) > 0).toBe(m.elbowUp);
      }
    }
  });

  it('links are 10–200 mm long, their pins lie in the plate bodies and their ground pivots in the die body', () => {
    // the die model of docs/MODEL.md §2: a pin keeps e of steel from the pivot line and from the back edge, which lies
    // depth − e behind it, and a hole diameter plus a ligament from each pivot; a ground pivot lies outside the
    // channel [0, W] × [0, H] by more than e and within 80 mm of the opening's bounding box
    const pinInBody = (pin: P, length: number) =>
      pin[1] >= E && pin[1] <= PLATE_DEPTH_MM - 2 * E && pin[0] >= 0 && pin[0] <= length && dist(pin, [0, 0]) >= E + 2;
    for (const m of all) {
      for (const link of m.links) {
        expect(link.lengthMm >= 10 && link.lengthMm <= 200).toBe(true);
        expect(pinInBody(link.pin, m.lengths[link.plate - 1]!)).toBe(true);
        expect(dist(link.pin, [m.lengths[link.plate - 1]!, 0])).toBeGreaterThanOrEqual(E + 2);
        if (link.other.kind === 'plate') {
          expect(link.other.plate).toBeLessThanOrEqual(link.plate - 2);
          expect(pinInBody(link.other.pin, m.lengths[link.other.plate - 1]!)).toBe(true);
        } else {
          const [x, y] = link.other.point;
          const dx = Math.max(-x, 0, x - m.widthMm);
          const dy = Math.max(-y, 0, y - m.heightMm);
          expect(Math.hypot(dx, dy)).toBeGreaterThan(E);
          expect(x > -80 && x < m.widthMm + 80 && y > -80 && y < m.heightMm + 80).toBe(true);
        }
      }
    }
  });

  it('every link clears the melt by more than e and transmits at 40°–140° at every station', () => {
    // clearance sampled here every 0.1 mm along the link against the melt region {0 ≤ x ≤ W, 0 ≤ y ≤ melt edge}
    // (vertices of the orifice); transmission angle μ at the driven pin against the plate's line to its pivot
    // toward the input (Norton, Design of Machinery: 40°–140° usual rule)
    for (const m of all) {
      for (const s of m.stations) {
        m.links.forEach((link, i) => {
          const [a, b] = linkPins(m, s, i);
          const steps = Math.ceil(dist(a, b) / 0.1);
          let clearance = Number.POSITIVE_INFINITY;
          for (let t = 0; t <= steps; t++) {
            const p: P = [a[0] + ((b[0] - a[0]) * t) / steps, a[1] + ((b[1] - a[1]) * t) / steps];
            const inMelt = p[0] >= 0 && p[0] <= m.widthMm && p[1] >= 0 && p[1] <= meltEdgeY(s.pivots, E, p[0]);
            if (inMelt) clearance = 0;
            for (const v of s.orifice.outer) clearance = Math.min(clearance, dist(p, v));
          }
          expect(clearance).toBeGreaterThan(E);
          const pivot = s.pivots[link.plate - 1]!;
          const u: P = [a[0] - b[0], a[1] - b[1]];
          const v: P = [pivot[0] - b[0], pivot[1] - b[1]];
          const mu = deg(Math.acos((u[0] * v[0] + u[1] * v[1]) / (Math.hypot(...u) * Math.hypot(...v))));
          expect(mu >= 40 && mu <= 140).toBe(true);
        });
      }
    }
  });

  it('every joint turns by at least 2° across the stations (the truth is not reducible to fewer plates)', () => {
    // start and end pivots: plate 1 and plate N against the die body; inner pivots: neighbouring plates' relative
    // angle; all read back from the pivots by atan2
    for (const m of all) {
      const n = m.lengths.length;
      const joints: ((s: RandomStation) => number)[] = [
        (s) => plateAngle(s, 1),
        ...Array.from(
          { length: n - 1 },
          (_, k) => (s: RandomStation) => wrapAngle(plateAngle(s, k + 2) - plateAngle(s, k + 1)),
        ),
        (s) => plateAngle(s, n),
      ];
      for (const joint of joints) {
        const values = m.stations.map(joint);
        expect(deg(Math.max(...values) - Math.min(...values))).toBeGreaterThanOrEqual(2);
      }
    }
  });

  describe("the planner's clearance rules, DEVELOPERS.md / src/mechanise/motion-clearance.ts, over the whole motion", () => {
    // the motion between the extreme stations every 0.004 rad of input (`motionOf`, checked first to be the
    // mechanism's own); plate bodies, fans and the opening built here; pin radius 2 mm, e = 5 mm
    const pinRadius = HOLE_DIAMETER_MM / 2;
    const motions = new Map(all.map((m) => [m, motionOf(m)] as const));
    const bodiesAt = (m: RandomMechanism, c: MotionSample, fans: readonly number[]) =>
      m.lengths.map((_, k) => plateBody(c.pivots, k + 1, fans));

    it('the plate body built here has the published dimensions (e in front of the pivot line, depth − e behind)', () => {
      // a level plate from (0, 0) to (20, 0): the pivot line's midpoint lies exactly e inside (melt edge at y = −e),
      // a point 14 mm behind it 6 mm inside (back edge at depth − e = 20 mm); a 30° fan at the far pivot covers
      // 60°–90° out to depth − e round it, beyond the plate's end, and nothing at 50°
      const body = plateBody(
        [
          [0, 0],
          [20, 0],
        ],
        1,
        [0, Math.PI / 6],
      );
      expect(deepInside([10, 0], E - 0.01, body)).toBe(true);
      expect(deepInside([10, 0], E + 0.01, body)).toBe(false);
      expect(deepInside([10, 14], 6 - 0.01, body)).toBe(true);
      expect(deepInside([10, 14], 6 + 0.01, body)).toBe(false);
      const inFan: P = [20 + 15 * Math.sin(Math.PI / 12), 15 * Math.cos(Math.PI / 12)];
      expect(Math.min(...body.map((p) => pieceDistance(inFan, p)))).toBeLessThan(0);
      const pastFan: P = [20 + 15 * Math.cos((50 * Math.PI) / 180), 15 * Math.sin((50 * Math.PI) / 180)];
      expect(Math.min(...body.map((p) => pieceDistance(pastFan, p)))).toBeGreaterThan(0);
    });

    it('motionOf samples every 0.004 rad between the extreme stations, each a configuration of the mechanism', () => {
      // rigidity, closure and branch re-measured on the sampled pivots, as for the stations above
      for (const m of all) {
        const samples = motions.get(m)!;
        const inputs = m.stations.map((s) => s.inputRad);
        expect(samples[0]!.inputRad).toBeCloseTo(Math.min(...inputs), 12);
        expect(samples.at(-1)!.inputRad).toBeCloseTo(Math.max(...inputs), 12);
        const bad: string[] = [];
        samples.forEach((c, i) => {
          if (i > 0 && !(c.inputRad - samples[i - 1]!.inputRad <= 0.004 + 1e-12)) bad.push(`step at ${i}`);
          if (dist(c.pivots[0]!, m.start) > 1e-9 || dist(c.pivots.at(-1)!, m.end) > 1e-9) bad.push(`open at ${i}`);
          m.lengths.forEach((l, k) => {
            if (Math.abs(dist(c.pivots[k]!, c.pivots[k + 1]!) - l) > 1e-9) bad.push(`plate ${k + 1} at ${i}`);
          });
          m.links.forEach((link, j) => {
            const [a, b] = samplePins(m, c, j);
            if (Math.abs(dist(a, b) - link.lengthMm) > 1e-9) bad.push(`link ${j + 1} length at ${i}`);
            if (Math.sign(cross(c.pivots[link.plate - 1]!, a, b)) !== link.branch)
              bad.push(`link ${j + 1} branch at ${i}`);
          });
        });
        expect(bad, `seed ${m.seed}`).toEqual([]);
      }
    });

    it('every ground pivot stays clear of every plate by ≥ 2 mm over the whole motion', () => {
      // rule 1: a die-body pin reaches through every plate layer; its distance to each convex piece of every plate
      let tightest = Number.POSITIVE_INFINITY;
      for (const m of all) {
        const fans = fansOf(m);
        for (const c of motions.get(m)!) {
          const bodies = bodiesAt(m, c, fans);
          m.links.forEach((link, i) => {
            if (link.other.kind !== 'ground') return;
            const [g] = samplePins(m, c, i);
            for (const body of bodies) for (const piece of body) tightest = Math.min(tightest, pieceDistance(g, piece));
          });
        }
      }
      expect(tightest).toBeGreaterThanOrEqual(pinRadius);
    });

    it('every link pin on a plate clears every plate of a higher layer by ≥ 2 mm, and every other link by ≥ 2 + e', () => {
      // rule 2, with any link numbering: plate layers by the planner's colouring (1, 2, 1, 2, … unless plates on one
      // layer would overlap), the links on layers above every plate, so a pin passes every plate of a higher layer than
      // its own; and whichever link is lower, the other's plate pins pass it
      let toPlates = Number.POSITIVE_INFINITY;
      let toLinks = Number.POSITIVE_INFINITY;
      for (const m of all) {
        const fans = fansOf(m);
        const layers = m.links.length > 0 ? layersOf(m, fans) : [];
        for (const c of motions.get(m)!) {
          const bodies = bodiesAt(m, c, fans);
          for (const [i, pin, plate] of platePins(m, c)) {
            bodies.forEach((body, k) => {
              if (layers[k]! <= layers[plate - 1]!) return;
              for (const piece of body) toPlates = Math.min(toPlates, pieceDistance(pin, piece));
            });
            m.links.forEach((_, j) => {
              if (j === i) return;
              const [a, b] = samplePins(m, c, j);
              const t = Math.max(
                0,
                Math.min(1, ((pin[0] - a[0]) * (b[0] - a[0]) + (pin[1] - a[1]) * (b[1] - a[1])) / dist(a, b) ** 2),
              );
              toLinks = Math.min(toLinks, dist(pin, [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])]));
            });
          }
        }
      }
      expect(toPlates).toBeGreaterThanOrEqual(pinRadius);
      expect(toLinks).toBeGreaterThanOrEqual(pinRadius + E);
    });

    it('every link over the die opening stays at least e inside some plate over the whole motion', () => {
      // rule 3: the opening is the union of the stations' orifices, here the region under the highest of their melt
      // edges (read from the orifice vertices, linear between them); each link's pin line sampled every 0.25 mm. With
      // the generator's ground pivots above the plates the links in fact stay above the opening (7 mm and more over
      // seeds 1–100 when this was written), so this rule holds with room to spare
      const failures: string[] = [];
      for (const m of all) {
        const fans = fansOf(m);
        const tops = m.stations.map((s) => s.orifice.outer.slice(2).reverse());
        const top = (x: number) =>
          Math.max(
            ...tops.map((ring) => {
              const i = ring.findIndex((p) => p[0] >= x);
              if (i <= 0) return ring[Math.max(0, i)]![1];
              const [p, q] = [ring[i - 1]!, ring[i]!];
              return p[1] + ((q[1] - p[1]) * (x - p[0])) / (q[0] - p[0]);
            }),
          );
        for (const c of motions.get(m)!) {
          const bodies = bodiesAt(m, c, fans);
          m.links.forEach((_, i) => {
            const [a, b] = samplePins(m, c, i);
            const steps = Math.ceil(dist(a, b) / 0.25);
            for (let t = 0; t <= steps; t++) {
              const q: P = [a[0] + ((b[0] - a[0]) * t) / steps, a[1] + ((b[1] - a[1]) * t) / steps];
              if (!(q[0] >= 0 && q[0] <= m.widthMm && q[1] >= 0 && q[1] <= top(q[0]))) continue;
              if (!bodies.some((body) => deepInside(q, E, body))) {
                failures.push(`seed ${m.seed} link ${i + 1} at (${q[0].toFixed(2)}, ${q[1].toFixed(2)})`);
                return;
              }
            }
          });
        }
      }
      expect(failures).toEqual([]);
    });
  });

  it('every orifice is a simple counter-clockwise ring in the channel, its melt edge 3 mm from floor and top', () => {
    // shoelace area > 0 (counter-clockwise), no two non-adjacent edges crossing (brute force), the floor from (0, 0)
    // to (W, 0), every other vertex on the melt edge of known-chain.ts within 3 mm ≤ y ≤ H − 3 mm
    for (const m of all) {
      for (const s of m.stations) {
        const ring = s.orifice.outer;
        expect(s.orifice.holes).toEqual([]);
        let area = 0;
        for (let k = 0; k < ring.length; k++) {
          const a = ring[k]!;
          const b = ring[(k + 1) % ring.length]!;
          area += a[0] * b[1] - b[0] * a[1];
        }
        expect(area / 2).toBeGreaterThan(0);
        expect(ring[0]).toEqual([0, 0]);
        expect(ring[1]).toEqual([m.widthMm, 0]);
        // one assertion per station: expect() per vertex pair would take tens of seconds
        const offEdge = ring
          .slice(2)
          .filter(
            (p) =>
              !(p[0] >= -1e-9 && p[0] <= m.widthMm + 1e-9) ||
              !(p[1] >= 3 && p[1] <= m.heightMm - 3) ||
              !(Math.abs(p[1] - meltEdgeY(s.pivots, E, p[0])) < 1e-9),
          );
        expect(offEdge).toEqual([]);
        const crossings: [number, number][] = [];
        for (let i = 0; i < ring.length; i++) {
          for (let j = i + 2; j < ring.length; j++) {
            if (i === 0 && j === ring.length - 1) continue;
            if (crosses(ring[i]!, ring[(i + 1) % ring.length]!, ring[j]!, ring[(j + 1) % ring.length]!)) {
              crossings.push([i, j]);
            }
          }
        }
        expect(crossings).toEqual([]);
      }
    }
  });

  it('every schedule body passes the wire schema and toSchedule, with increasing line positions', () => {
    // the service's own validation (zod schema, ring validity, station order) accepts it as posted
    for (const m of all) {
      const mapping = toSchedule(ScheduleWire.parse(m.schedule));
      expect(mapping.ok).toBe(true);
      const positions = m.schedule.stations.map((s) => s.position_m);
      for (let i = 1; i < positions.length; i++) expect(positions[i]!).toBeGreaterThan(positions[i - 1]!);
      expect(m.schedule.actuators?.count).toBe(1);
    }
  });
});

/**
 * The round trip: each random mechanism's schedule posted through the real path (wire schema → toSchedule →
 * planSchedule) must come back with the truth: within the fit tolerance, no more plates than the mechanism that made
 * it, and one actuator driving it (the mechanism exists by construction, so a 1-actuator mechanisation exists).
 */
describe.each(SEEDS.map((seed) => [seed, MECHANISMS.get(seed)!] as const))(
  'planSchedule round trip, seed %i',
  (seed, m) => {
    const n = m.lengths.length;
    const tolerance = m.schedule.limits!.fit_tolerance_mm!;
    let plan: Plan;
    beforeAll(() => {
      const mapping = toSchedule(ScheduleWire.parse(m.schedule));
      if (!mapping.ok) throw new Error(`seed ${seed}: schedule rejected: ${JSON.stringify(mapping.problems)}`);
      plan = planSchedule(mapping.schedule);
    }, 120_000);

    it(`fits all ${m.stations.length} stations within ${tolerance} mm`, () => {
      // symmetric Hausdorff distance target vs achieved orifice, as the plan reports it (the schedule's tolerance)
      expect(plan.fit, plan.error ?? '').not.toBeNull();
      expect(plan.fit!.stations).toHaveLength(m.stations.length);
      for (const s of plan.fit!.stations) expect(s.maxDeviationMm).toBeLessThanOrEqual(tolerance);
    });

    it(`fits at most the ${n} plates of the mechanism that made the stations`, () => {
      // constructed here: N plates reproduce every station exactly, so the fewest that do are at most N
      expect(plan.fit?.plateCount).toBeLessThanOrEqual(n);
    });

    it(`mechanises with the 1 actuator asked for (the truth has ${m.links.length} link(s) and 1 actuator)`, () => {
      // constructed here: the stations come from a 1-DOF mechanism, so one actuator suffices
      expect(plan.mechanisation?.status).toBe('mechanised');
      expect(plan.mechanisation?.mechanism?.actuators).toHaveLength(1);
    });
  },
);
