import { describe, expect, it } from 'vitest';
import type { Point, Region } from '../../src/geometry/index.js';
import { findMovingSpans, type MovingSpanResult } from '../../src/span/index.js';
import { channelOrifice, closeChain, meltEdgeY, type P } from '../support/known-chain.js';

const tol = 0.02;
const auto = { matchToleranceMm: tol, ends: null };

/** A 40 mm wide strip on a flat base, its top edge y(x) sampled every 0.5 mm, walked counter-clockwise. */
function strip(top: (x: number) => number): Region {
  const topPoints: Point[] = [];
  for (let k = 80; k >= 0; k--) topPoints.push([k / 2, top(k / 2)]);
  return { outer: [[0, 0], [40, 0], ...topPoints], holes: [] };
}

/** Top edge tilted about its middle: corners at 8 − t (left) and 8 + t (right), mm. */
const tilted = (t: number) => strip((x) => 8 + (t * (x - 20)) / 20);

/** A crown of height c in the middle whose shoulders drop by c at the side walls: 8 + c·cos(π(x − 20)/20), mm. */
const crowned = (c: number) => strip((x) => 8 + c * Math.cos((Math.PI * (x - 20)) / 20));

/** Length of the sampled top edge of `strip(top)`, mm. */
function topLength(top: (x: number) => number): number {
  let sum = 0;
  for (let k = 0; k < 80; k++) sum += Math.hypot(0.5, top((k + 1) / 2) - top(k / 2));
  return sum;
}

function spansOf(result: MovingSpanResult) {
  if (result.status !== 'found') throw new Error(`expected spans, got ${JSON.stringify(result)}`);
  return result.spans;
}

/** Stations of a 3-plate chain pinned at (0, 12) and (40, 12), plates swollen by e = 5 mm, first plate at `angles`. */
function chainStations(angles: readonly number[]): { orifices: Region[]; pivots: P[][] } {
  const pivots = angles.map((a) => closeChain([14, 14, 14], [0, 12], [40, 12], [a], true));
  return { orifices: pivots.map((p) => channelOrifice(p, 5, 40, 0.25)), pivots };
}

const range = (n: number, a: number, b: number) => Array.from({ length: n }, (_, k) => a + ((b - a) * k) / (n - 1));

describe('findMovingSpans with stations that cross each other', () => {
  for (const t of [0.25, 0.05, 1]) {
    it(`runs a see-saw strip (corners at 8 ± ${t} mm) from corner to corner`, () => {
      const tilts = [t, 0, -t];
      const spans = spansOf(findMovingSpans(tilts.map(tilted), auto));
      tilts.forEach((tk, i) => {
        const span = spans[i]!;
        // constructed analytically: every top edge is a straight line from (0, 8 − t) to (40, 8 + t), all three
        // crossing at (20, 8); the side walls and base are the die body
        expect(span.start[0]).toBeCloseTo(0, 6);
        expect(span.start[1]).toBeCloseTo(8 - tk, 6);
        expect(span.end[0]).toBeCloseTo(40, 6);
        expect(span.end[1]).toBeCloseTo(8 + tk, 6);
        expect(span.lengthMm).toBeCloseTo(Math.hypot(40, 2 * tk), 6);
        // walked clockwise: left to right along the top, melt below
        expect(span.path[1]![0]).toBeGreaterThan(span.path[0]![0]);
      });
    });
  }

  it('runs a crown that grows while its shoulders drop from side wall to side wall', () => {
    const crowns = [0.1, 0.125, 0.15, 0.175, 0.2];
    const spans = spansOf(findMovingSpans(crowns.map(crowned), auto));
    crowns.forEach((c, i) => {
      const span = spans[i]!;
      // constructed analytically: 8 + c·cos(π(x − 20)/20) crosses y = 8 at x = 10 and 30 for every c, and meets the
      // side walls at 8 − c
      expect(span.start).toEqual([0, expect.closeTo(8 - c, 6)]);
      expect(span.end).toEqual([40, expect.closeTo(8 - c, 6)]);
      expect(span.lengthMm).toBeCloseTo(
        topLength((x) => 8 + c * Math.cos((Math.PI * (x - 20)) / 20)),
        6,
      );
    });
  });

  for (const n of [6, 8, 10]) {
    it(`spans a generated 3-plate chain over ${n} close stations from pin to pin`, () => {
      const { orifices, pivots } = chainStations(range(n, 0.3, 0.32));
      // the first and last stations' melt edges (constructed analytically, support/known-chain.ts) cross between
      // the pins: their difference changes sign, which is what made the old split see wall there
      const diff = (x: number) => meltEdgeY(pivots[0]!, 5, x) - meltEdgeY(pivots[n - 1]!, 5, x);
      const crossings = range(301, 6, 34).filter(
        (x, k, xs) => k > 0 && Math.sign(diff(x)) !== Math.sign(diff(xs[k - 1]!)),
      );
      expect(crossings.length).toBeGreaterThan(0);
      const spans = spansOf(findMovingSpans(orifices, auto));
      for (const span of spans) {
        // the melt edge next to a pin is the arc of radius e = 5 mm about it (the plate's capsule), the same in every
        // station: the span leaves the die body on those arcs
        expect(Math.hypot(span.start[0] - 0, span.start[1] - 12)).toBeCloseTo(5, 2);
        expect(Math.hypot(span.end[0] - 40, span.end[1] - 12)).toBeCloseTo(5, 2);
        // one contiguous span through every crossing
        const xs = span.path.map((p) => p[0]);
        for (const x of crossings) {
          expect(Math.min(...xs)).toBeLessThan(x);
          expect(Math.max(...xs)).toBeGreaterThan(x);
        }
      }
    });
  }
});

describe('findMovingSpans on a dense schedule', () => {
  it('reconciles 500 see-saw stations 5 µm apart in one pass, each from corner to corner', () => {
    const tilts = Array.from({ length: 500 }, (_, k) => k * 0.005);
    const spans = spansOf(findMovingSpans(tilts.map(tilted), auto));
    tilts.forEach((t, i) => {
      // constructed analytically: station i's top is the line from (0, 8 − t) to (40, 8 + t)
      expect(spans[i]!.start[1]).toBeCloseTo(8 - t, 6);
      expect(spans[i]!.end[1]).toBeCloseTo(8 + t, 6);
      expect(spans[i]!.lengthMm).toBeCloseTo(Math.hypot(40, 2 * t), 6);
    });
  });
});

describe('findMovingSpans with explicit ends', () => {
  it('takes the see-saw span between the closest boundary points to the given ends', () => {
    const tilts = [0.25, 0, -0.25];
    const result = findMovingSpans(tilts.map(tilted), { matchToleranceMm: tol, ends: { start: [0, 8], end: [40, 8] } });
    const spans = spansOf(result);
    if (result.status === 'found') expect(result.differsOutside).toBeNull();
    tilts.forEach((t, i) => {
      const span = spans[i]!;
      // constructed analytically: (0, 8) lies on a side wall when that corner is at or above 8; otherwise the closest
      // point is the foot of the perpendicular on the top line y = 8 − t + t·x/20 (slope m = t/20)
      const m = t / 20;
      const foot = (x0: number, y0: number, c: number): Point => {
        const x = (x0 + m * (y0 - c)) / (1 + m * m);
        return [x, c + m * x];
      };
      const expectedStart: Point = t > 0 ? foot(0, 8, 8 - t) : [0, 8];
      const expectedEnd: Point = t < 0 ? foot(40, 8, 8 - t) : [40, 8];
      expect(span.start[0]).toBeCloseTo(expectedStart[0], 6);
      expect(span.start[1]).toBeCloseTo(expectedStart[1], 6);
      expect(span.end[0]).toBeCloseTo(expectedEnd[0], 6);
      expect(span.end[1]).toBeCloseTo(expectedEnd[1], 6);
    });
  });

  it('holds given ends below the corners of a growing crown, up the side walls', () => {
    const crowns = [0.1, 0.15, 0.2];
    const spans = spansOf(
      findMovingSpans(crowns.map(crowned), { matchToleranceMm: tol, ends: { start: [0, 7.5], end: [40, 7.5] } }),
    );
    crowns.forEach((c, i) => {
      // constructed analytically: both ends lie on the side walls; the span climbs 0.5 − c up each wall
      expect(spans[i]!.start).toEqual([expect.closeTo(0, 9), expect.closeTo(7.5, 9)]);
      expect(spans[i]!.end).toEqual([expect.closeTo(40, 9), expect.closeTo(7.5, 9)]);
      const top = topLength((x) => 8 + c * Math.cos((Math.PI * (x - 20)) / 20));
      expect(spans[i]!.lengthMm).toBeCloseTo(top + 2 * (0.5 - c), 6);
    });
  });

  it('holds given ends on the side walls of generated chain stations', () => {
    const { orifices } = chainStations(range(8, 0.3, 0.32));
    const result = findMovingSpans(orifices, { matchToleranceMm: tol, ends: { start: [0, 6], end: [40, 6] } });
    // constructed analytically: the melt edge meets both walls at 12 − e = 7 mm in every station, so (0, 6) and
    // (40, 6) lie on the walls
    for (const span of spansOf(result)) {
      expect(span.start).toEqual([expect.closeTo(0, 9), expect.closeTo(6, 9)]);
      expect(span.end).toEqual([expect.closeTo(40, 9), expect.closeTo(6, 9)]);
    }
    if (result.status === 'found') expect(result.differsOutside).toBeNull();
  });

  it('keeps given ends even where stations differ outside them, and says where', () => {
    const result = findMovingSpans([0.25, 0, -0.25].map(tilted), {
      matchToleranceMm: tol,
      ends: { start: [10, 8], end: [30, 8] },
    });
    expect(result.status).toBe('found');
    if (result.status !== 'found') return;
    for (const span of result.spans) {
      expect(span.start[0]).toBeCloseTo(10, 2);
      expect(span.end[0]).toBeCloseTo(30, 2);
    }
    // the tops differ everywhere but at x = 20 (analytic), so also left of x = 10 and right of x = 30
    expect(result.differsOutside).not.toBeNull();
    const x = result.differsOutside!.at[0];
    expect(x < 10 || x > 30).toBe(true);
  });
});

describe('findMovingSpans when the span cannot be reconciled', () => {
  it('finds no die-body wall where two stations only cross, and says which options help', () => {
    // constructed analytically: a 10 mm square and the same square turned 2° about its centre cross at the middle
    // of every edge and nowhere coincide in direction
    const turn = (p: Point): Point => {
      const a = (2 * Math.PI) / 180;
      const [x, y] = [p[0] - 5, p[1] - 5];
      return [5 + x * Math.cos(a) - y * Math.sin(a), 5 + x * Math.sin(a) + y * Math.cos(a)];
    };
    const square: Point[] = [
      [0, 0],
      [10, 0],
      [10, 10],
      [0, 10],
    ];
    const result = findMovingSpans(
      [
        { outer: square, holes: [] },
        { outer: square.map(turn), holes: [] },
      ],
      auto,
    );
    expect(result.status).toBe('unreconciled');
    if (result.status !== 'unreconciled') return;
    expect(result.message).toMatch(/share no die-body wall/);
    expect(result.message).toMatch(/match_tolerance_mm/);
    expect(result.message).toMatch(/moving_span\.start and end/);
  });

  it('names moving_span with suggested ends that then reconcile the stations', () => {
    // constructed case: the base dips 1 mm between x = 10 and 30 in one station, the top rises in the other; the side
    // walls are common to both, so there are two separate walls
    const dipped: Region = {
      outer: [
        [0, 0],
        [10, 0],
        [10, -1],
        [30, -1],
        [30, 0],
        [40, 0],
        [40, 8],
        [0, 8],
      ],
      holes: [],
    };
    const peaked: Region = {
      outer: [
        [0, 0],
        [40, 0],
        [40, 8],
        [20, 12],
        [0, 8],
      ],
      holes: [],
    };
    const result = findMovingSpans([dipped, peaked], auto);
    expect(result.status).toBe('unreconciled');
    if (result.status !== 'unreconciled') return;
    expect(result.message).toMatch(/moving_span\.start \[-?\d+(\.\d+)?, -?\d+(\.\d+)?\] and end \[/);
    expect(result.suggestedEnds).not.toBeNull();
    const again = findMovingSpans([dipped, peaked], { matchToleranceMm: tol, ends: result.suggestedEnds });
    expect(again.status).toBe('found');
  });
});
