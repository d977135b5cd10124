import pc, { type Polygon } from 'polygon-clipping';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Point, Region, Ring } from '../../src/geometry/index.js';
import { regionArea } from '../../src/geometry/index.js';
import { findMovingSpans } from '../../src/span/index.js';
import { type ChainFit, fitChain, plateOutline, resolveChainFitOptions } from '../../src/synthesis/index.js';
import { channelOrifice, closeChain, type P } from '../support/known-chain.js';

/**
 * A known chain (the one of tests/synthesis/fit-chain.test.ts) in a channel 40 mm wide with a flat floor at y = 0,
 * the stations made by the independent die model of tests/support/known-chain.ts, fitted at its own plate count.
 */
const WIDTH = 40;
const E = 5; // hole ⌀4 / 2 + ligament 3
const LENGTHS = [11, 9, 10, 8.5, 9.5, 10.5];
const START: P = [-6, 14];
const END: P = [46, 14];
const BENDS = [
  [-0.55, -0.1, 0.2, 0.35],
  [-0.35, 0.15, 0.45, 0.1],
  [-0.7, 0.05, 0.05, 0.5],
];

let orifices: Region[];
let fit: ChainFit;

beforeAll(() => {
  const chains = BENDS.map((angles) => closeChain(LENGTHS, START, END, angles, false));
  orifices = chains.map((c) => channelOrifice(c, E, WIDTH, 0.02));
  const spans = findMovingSpans(orifices, { matchToleranceMm: 0.02, ends: null });
  if (spans.status !== 'found') throw new Error(`spans: ${JSON.stringify(spans)}`);
  fit = fitChain(
    orifices,
    spans.spans,
    resolveChainFitOptions({
      toleranceMm: 0.05,
      maxPlates: 12,
      pivotHoleDiameterMm: 4,
      ligamentMm: 3,
      depthMm: 25,
      plateCount: LENGTHS.length,
    }),
  );
});

type Pair = [number, number];

const toPc = (ring: Ring): Pair[] => ring.map((p): Pair => [p[0], p[1]]);

/** Shoelace area of a ring, counter-clockwise positive (written here so the reference does not use src/geometry). */
function shoelace(ring: readonly (readonly [number, number])[]): number {
  let twice = 0;
  for (let i = 0; i < ring.length; i++) {
    const a = ring[i]!;
    const b = ring[(i + 1) % ring.length]!;
    twice += a[0] * b[1] - b[0] * a[1];
  }
  return twice / 2;
}

/** Area of a polygon-clipping polygon: outer ring less its holes, whatever their orientation. */
function pcArea(polygon: Polygon): number {
  const [outer, ...holes] = polygon;
  return Math.abs(shoelace(outer!)) - holes.reduce((s, h) => s + Math.abs(shoelace(h)), 0);
}

/** Do the closed segments ab and cd share a point? (orientation tests, collinear overlaps included) */
function segmentsMeet(a: Point, b: Point, c: Point, d: Point): boolean {
  const orient = (p: Point, q: Point, r: Point) =>
    Math.sign((q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0]));
  const onSegment = (p: Point, q: Point, r: Point) =>
    Math.min(p[0], q[0]) <= r[0] &&
    r[0] <= Math.max(p[0], q[0]) &&
    Math.min(p[1], q[1]) <= r[1] &&
    r[1] <= Math.max(p[1], q[1]);
  const o1 = orient(a, b, c);
  const o2 = orient(a, b, d);
  const o3 = orient(c, d, a);
  const o4 = orient(c, d, b);
  if (o1 !== o2 && o3 !== o4) return true;
  return (
    (o1 === 0 && onSegment(a, b, c)) ||
    (o2 === 0 && onSegment(a, b, d)) ||
    (o3 === 0 && onSegment(c, d, a)) ||
    (o4 === 0 && onSegment(c, d, b))
  );
}

/** A ring is simple when no two of its edges meet except neighbours at their shared vertex. */
function isSimple(ring: Ring): boolean {
  const n = ring.length;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      if (j === i + 1 || (i === 0 && j === n - 1)) continue;
      if (segmentsMeet(ring[i]!, ring[(i + 1) % n]!, ring[j]!, ring[(j + 1) % n]!)) return false;
    }
  }
  return true;
}

describe('the achieved orifice of a fitted known chain', () => {
  it('fitChain fits the known chain at its plate count (the fixture the checks below rely on)', () => {
    expect(fit.plateCount).toBe(LENGTHS.length);
    expect(fit.chain.telescoping).toEqual([]);
    for (const s of fit.stations) expect(s.maxDeviationMm).toBeLessThan(0.05);
  });

  it('achievedOrifice agrees with polygon-clipping (opening − plates, the piece on the target) to 1e-3 mm² per 100 mm²', () => {
    // reference: polygon-clipping 0.15.7 (Martinez–Rueda sweep line in floating point): the die opening as the union
    // of every station's orifice (the envelope the die body is cut to), less the plate outlines (pins fill the pivot
    // holes). src clips with clipper-lib on an integer grid of 1e-4 mm (CLIPPER_SCALE): each vertex moves up to
    // 0.5e-4 mm per axis, which changes the area by a few 1e-4 mm² over a ~150 mm boundary; 1e-3 mm² per 100 mm² of
    // orifice bounds that with room to spare and still catches a lost sliver or a wrong piece.
    const [first, ...rest] = orifices.map((o): Polygon => [toPc(o.outer)]);
    const opening = pc.union(first!, ...rest);
    fit.stations.forEach((station, i) => {
      const plates = fit.plates[i]!.map((plate): Polygon => [toPc(plate.outer)]);
      const pieces = pc.difference(opening, ...plates);
      const target: Polygon = [toPc(orifices[i]!.outer)];
      const overlap = pieces.map((piece) => pc.intersection(piece, target).reduce((s, p) => s + pcArea(p), 0));
      const best = overlap.indexOf(Math.max(...overlap));
      const reference = pcArea(pieces[best]!);
      const targetArea = Math.abs(shoelace(orifices[i]!.outer));
      expect(Math.abs(regionArea(station.achievedOrifice) - reference)).toBeLessThanOrEqual(1e-3 * (targetArea / 100));
    });
  });

  it('every plate keeps its pivot-to-pivot length at every station (rigid plates) to 1e-9 mm', () => {
    // reference: the fitted common lengths fit.chain.lengthsMm, the plates being rigid (docs/MODEL.md §3)
    for (const pivots of fit.chain.pivots) {
      fit.chain.lengthsMm.forEach((length, k) => {
        const a = pivots[k]!;
        const b = pivots[k + 1]!;
        expect(Math.abs(Math.hypot(b[0] - a[0], b[1] - a[1]) - length)).toBeLessThanOrEqual(1e-9);
      });
    }
  });

  it('plateOutline gives a simple counter-clockwise ring with the area of body plus stadium, within the arc tolerance', () => {
    // reference [derived] from the outline plateOutline documents (no body fans): half-discs of radius e round both
    // pivots, the melt edge at e on the right of a→b, the body out to back = max(depth − e, e) on the left. That is
    // the rectangle L × (e + back) plus two half-discs, A = L·(e + back) + π·e². The arcs are polygonised with vertices
    // on the circle, so the ring's area is smaller by the chords' circular segments: 0 ≤ A − A_ring ≤ 2π·e·tolerance
    // (each segment is thinner than the tolerance along its chord, and the chords are shorter than the half-circles).
    const { edgeOffsetMm: e, depthMm, arcToleranceMm } = fit.shape;
    const back = Math.max(depthMm - e, e);
    for (const pivots of fit.chain.pivots) {
      for (let k = 0; k + 1 < pivots.length; k++) {
        const a = pivots[k]!;
        const b = pivots[k + 1]!;
        const length = Math.hypot(b[0] - a[0], b[1] - a[1]);
        const ring = plateOutline(a, b, fit.shape).outer;
        const area = shoelace(ring);
        expect(area).toBeGreaterThan(0);
        expect(isSimple(ring)).toBe(true);
        const analytic = length * (e + back) + Math.PI * e * e;
        expect(analytic - area).toBeGreaterThanOrEqual(-1e-9);
        expect(analytic - area).toBeLessThanOrEqual(2 * Math.PI * e * arcToleranceMm);
      }
    }
  });
});
