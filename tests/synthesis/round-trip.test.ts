import { beforeAll, describe, expect, it } from 'vitest';
import { ScheduleWire } from '../../src/http/schedule-schema.js';
import { toSchedule } from '../../src/http/to-schedule.js';
import { type Plan, planSchedule } from '../../src/pipeline/index.js';
import { meltEdgeY, type P } from '../support/known-chain.js';
import {
  EDGE_OFFSET_MM,
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
    // the die model of DOMAIN.md §2: a pin keeps e of steel from the pivot line and from the back edge, which lies
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
