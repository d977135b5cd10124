import { describe, expect, it } from 'vitest';
import { barOutline, boundsOf, placeOutline, regionArea, ringArea } from '../../src/web/lib/geometry.js';

describe('page geometry', () => {
  it('placeOutline turns a plate outline onto pivots along a 3-4-5 triangle (cos 0.6, sin 0.8) and moves it there', () => {
    // pivot line from (10, 20) to (13, 24): length 5, direction (0.6, 0.8); local (5, 0) is the second pivot,
    // local (0, 1) lies one unit to the left of the line: (−0.8, 0.6)
    const placed = placeOutline(
      [
        [0, 0],
        [5, 0],
        [0, 1],
        [2, -1],
      ],
      [10, 20],
      [13, 24],
    );
    const expected = [
      [10, 20],
      [13, 24],
      [9.2, 20.6],
      [10 + 2 * 0.6 + 0.8, 20 + 2 * 0.8 - 0.6],
    ];
    placed.forEach((p, i) => {
      expect(p[0]).toBeCloseTo(expected[i]![0]!, 12);
      expect(p[1]).toBeCloseTo(expected[i]![1]!, 12);
    });
  });

  it('ringArea is +w·h for a counter-clockwise rectangle and −w·h clockwise (shoelace)', () => {
    const ccw = [
      [0, 0],
      [40, 0],
      [40, 8],
      [0, 8],
    ] as const;
    expect(ringArea(ccw)).toBeCloseTo(320, 12);
    expect(ringArea([...ccw].reverse())).toBeCloseTo(-320, 12);
  });

  it('regionArea subtracts holes whatever their orientation: 10×10 square less a 2×3 hole is 94 mm²', () => {
    const hole = [
      [2, 2],
      [4, 2],
      [4, 5],
      [2, 5],
    ] as const;
    const outer = [
      [0, 0],
      [10, 0],
      [10, 10],
      [0, 10],
    ] as const;
    expect(regionArea({ outer, holes: [hole] })).toBeCloseTo(94, 12);
    expect(regionArea({ outer, holes: [[...hole].reverse()] })).toBeCloseTo(94, 12);
  });

  it('barOutline reaches halfWidth past both pivots and to both sides; boundsOf skips non-finite points', () => {
    const bar = barOutline(14, 5);
    expect(boundsOf(bar)).toEqual({ minX: -5, minY: -5, maxX: 19, maxY: 5 });
    expect(
      boundsOf([
        [1, 2],
        [Number.NaN, 7],
        [-3, 4],
      ]),
    ).toEqual({ minX: -3, minY: 2, maxX: 1, maxY: 4 });
    expect(boundsOf([])).toBeNull();
  });
});
