import { describe, expect, it } from 'vitest';
import type { Point, Region } from '../../src/geometry/index.js';
import { findMovingSpans } from '../../src/span/index.js';

const ccw = (outer: Point[], holes: Point[][] = []): Region => ({ outer, holes });
const options = { matchToleranceMm: 0.02, ends: null };

/** A 40 mm wide strip on a flat base, its top edge given as y(x) sampled every 0.5 mm. */
function strip(top: (x: number) => number): Region {
  const topPoints: Point[] = [];
  for (let x = 40; x >= 0; x -= 0.5) topPoints.push([x, top(x)]);
  return ccw([[0, 0], [40, 0], ...topPoints]);
}

const flat = strip(() => 8);
const crown = strip((x) => 8 + 8 * Math.max(0, 1 - ((x - 20) / 12) ** 2));

describe('findMovingSpans', () => {
  it('finds the changing top edge of two strips, walked left to right with the melt below', () => {
    // constructed case: the base and side walls up to 8 mm are common, the top edge changes
    const result = findMovingSpans([flat, crown], options);
    expect(result.status).toBe('found');
    if (result.status !== 'found') return;
    // the crown's feet are at x = 8 and 32; the flat top outside them is common to both, so the die body holds it
    for (const span of result.spans) {
      expect(span.start[0]).toBeCloseTo(8, 1);
      expect(span.end[0]).toBeCloseTo(32, 1);
      expect(span.start[1]).toBeCloseTo(8, 6);
      expect(span.end[1]).toBeCloseTo(8, 6);
    }
    expect(result.spans[0]!.lengthMm).toBeCloseTo(24, 1);
  });

  it('slides the span ends up the side walls when the top rises everywhere', () => {
    // constructed case: the plates meet the side walls at 8 mm in one station and 12 mm in the other
    const low = ccw([
      [0, 0],
      [40, 0],
      [40, 8],
      [0, 8],
    ]);
    const high = ccw([
      [0, 0],
      [40, 0],
      [40, 12],
      [0, 12],
    ]);
    const result = findMovingSpans([low, high], options);
    expect(result.status).toBe('found');
    if (result.status !== 'found') return;
    const [a, b] = result.spans;
    expect(a!.start[0]).toBeCloseTo(0, 6);
    expect(a!.start[1]).toBeCloseTo(8, 2);
    expect(a!.end[1]).toBeCloseTo(8, 2);
    expect(a!.lengthMm).toBeCloseTo(40, 1);
    expect(b!.start[1]).toBeCloseTo(12, 2);
    expect(b!.end[1]).toBeCloseTo(12, 2);
    expect(b!.lengthMm).toBeCloseTo(40, 1);
    expect(b!.slideMm.start).toBeCloseTo(4, 2);
    expect(b!.slideMm.end).toBeCloseTo(4, 2);
  });

  it('reports two separate changing places as unreconciled', () => {
    // constructed case: the base moves down 1 mm in the second station as well as the top changing
    const moved = ccw([
      [0, 0],
      [10, 0],
      [10, -1],
      [30, -1],
      [30, 0],
      [40, 0],
      [40, 8],
      [0, 8],
    ]);
    const other = ccw([
      [0, 0],
      [40, 0],
      [40, 8],
      [20, 12],
      [0, 8],
    ]);
    const result = findMovingSpans([moved, other], options);
    expect(result.status).toBe('unreconciled');
    if (result.status === 'unreconciled') expect(result.message).toMatch(/separate places/);
  });

  it('takes explicit ends and keeps the die body outside them', () => {
    const result = findMovingSpans([flat, crown], { matchToleranceMm: 0.02, ends: { start: [0, 8], end: [40, 8] } });
    expect(result.status).toBe('found');
    if (result.status !== 'found') return;
    expect(result.spans[0]!.lengthMm).toBeCloseTo(40, 6);
    expect(result.spans[0]!.start).toEqual([0, 8]);
    expect(result.spans[1]!.end).toEqual([40, 8]);
  });

  it('with one station and explicit ends walks clockwise from start to end', () => {
    const result = findMovingSpans([flat], { matchToleranceMm: 0.02, ends: { start: [0, 8], end: [40, 8] } });
    expect(result.status).toBe('found');
    if (result.status === 'found') {
      expect(result.spans[0]!.path[1]![1]).toBeCloseTo(8, 9);
      expect(result.spans[0]!.fixed.some((p) => p[1] === 0)).toBe(true);
    }
  });

  it('refuses a hole that changes between stations', () => {
    const hole = (r: number): Point[] => [
      [20 - r, 3],
      [20 - r, 4],
      [20 + r, 4],
      [20 + r, 3],
    ];
    const a = ccw(
      [
        [0, 0],
        [40, 0],
        [40, 8],
        [0, 8],
      ],
      [hole(2)],
    );
    const b = ccw(
      [
        [0, 0],
        [40, 0],
        [40, 10],
        [0, 10],
      ],
      [hole(3)],
    );
    const result = findMovingSpans([a, b], options);
    expect(result.status).toBe('unreconciled');
  });

  it('says nothing moves when every station is the same', () => {
    expect(findMovingSpans([flat, flat], options).status).toBe('unknown');
  });
});
