import { describe, expect, it } from 'vitest';
import {
  closestPointOnPolyline,
  discreteCurvature,
  type Point,
  pointAtArcLength,
  polylineLength,
  resampleByArcLength,
} from '../../src/geometry/index.js';
import { mulberry32, regularPolygon } from './shapes.js';

/** Points on a circle of radius r at the given angles (radians). */
function onCircle(r: number, angles: readonly number[], cx = 0, cy = 0): Point[] {
  return angles.map((a) => [cx + r * Math.cos(a), cy + r * Math.sin(a)] as const);
}

describe('polyline length and arc-length positions', () => {
  const zigzag: Point[] = [
    [0, 0],
    [3, 4],
    [3, 10],
  ];

  it('polylineLength(3-4-5 leg then 6 up) is 11, and 11 + closing edge √(9+100) closed', () => {
    // analytic: 3-4-5 triangle leg 5, vertical leg 6; closing edge from (3,10) to (0,0)
    expect(polylineLength(zigzag)).toBeCloseTo(11, 12);
    expect(polylineLength(zigzag, true)).toBeCloseTo(11 + Math.sqrt(109), 12);
  });

  it('pointAtArcLength(s = 7) lies 2 mm up the second segment with tangent (0, 1)', () => {
    const at = pointAtArcLength(zigzag, 7);
    // analytic: 5 mm along the first segment, 2 mm along the vertical one
    expect(at.point[0]).toBeCloseTo(3, 12);
    expect(at.point[1]).toBeCloseTo(6, 12);
    expect(at.tangent).toEqual([0, 1]);
    expect(at.segment).toBe(1);
    expect(at.t).toBeCloseTo(2 / 6, 12);
  });

  it('pointAtArcLength clamps an open polyline and wraps a ring', () => {
    expect(pointAtArcLength(zigzag, -3).point).toEqual([0, 0]);
    expect(pointAtArcLength(zigzag, 99).point).toEqual([3, 10]);
    const square: Point[] = [
      [0, 0],
      [1, 0],
      [1, 1],
      [0, 1],
    ];
    // analytic: perimeter 4, so s = 4.5 wraps to 0.5 on the first edge, and s = −0.5 to 3.5 on the closing edge
    expect(pointAtArcLength(square, 4.5, true).point).toEqual([0.5, 0]);
    const back = pointAtArcLength(square, -0.5, true);
    expect(back.segment).toBe(3);
    expect(back.point[1]).toBeCloseTo(0.5, 12);
  });

  it('resampleByArcLength(open, 12) spaces points equally and keeps both ends', () => {
    const pts = resampleByArcLength(zigzag, 12);
    expect(pts).toHaveLength(12);
    expect(pts[0]).toEqual([0, 0]);
    expect(pts[11]).toEqual([3, 10]);
    // analytic: 11 mm in 11 steps of 1 mm along the path; points 0..5 on the first segment are 1 mm apart
    for (let i = 1; i <= 5; i++) {
      expect(Math.hypot(pts[i]![0] - pts[i - 1]![0], pts[i]![1] - pts[i - 1]![1])).toBeCloseTo(1, 12);
    }
    expect(pts[7]![0]).toBeCloseTo(3, 12);
    expect(pts[7]![1]).toBeCloseTo(6, 12);
  });

  it('resampleByArcLength(closed square, 8) puts points at corners and edge midpoints without repeating the first', () => {
    const square = regularPolygon(4, Math.SQRT2, 0, 0, Math.PI / 4);
    const pts = resampleByArcLength(square, 8, true);
    expect(pts).toHaveLength(8);
    // analytic: perimeter 8, spacing 1: every odd sample is an edge midpoint on the unit lines |x| = 1 or |y| = 1
    expect(pts[1]![0]).toBeCloseTo(0, 12);
    expect(pts[1]![1]).toBeCloseTo(1, 12);
    expect(pts[7]![0]).toBeCloseTo(1, 12);
    expect(pts[7]![1]).toBeCloseTo(0, 12);
  });

  it('resampleByArcLength of an arc R 50 into 10 mm chords leaves a sagitta of 0.250628 at each chord middle', () => {
    const R = 50;
    const half = Math.asin(0.1); // half the angle a 10 mm chord subtends on R 50
    const arc = onCircle(
      R,
      Array.from({ length: 6001 }, (_, i) => (i / 6000) * 12 * half),
    );
    const pts = resampleByArcLength(arc, 7);
    for (let i = 1; i < pts.length; i++) {
      const a = pts[i - 1]!;
      const b = pts[i]!;
      // analytic: equal arcs of angle 2·asin(L/2R) give chords of L = 10 mm
      expect(Math.hypot(b[0] - a[0], b[1] - a[1])).toBeCloseTo(10, 6);
      const mid: Point = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
      // standard geometry (docs/MODEL.md §5): sagitta R − √(R² − L²/4); R 50, L 10 → 0.250628
      expect(closestPointOnPolyline(mid, arc).distance).toBeCloseTo(0.250628, 6);
    }
  });

  it('resampleByArcLength rejects a count below 2 (3 for a ring)', () => {
    expect(() => resampleByArcLength(zigzag, 1)).toThrow(RangeError);
    expect(() => resampleByArcLength(zigzag, 2, true)).toThrow(RangeError);
  });
});

describe('discreteCurvature', () => {
  it('discreteCurvature(points on a circle R 7, unevenly spaced) is 1/R at every vertex', () => {
    const rand = mulberry32(7);
    let a = 0;
    const angles = Array.from({ length: 40 }, () => (a += 0.02 + 0.1 * rand()));
    const kappa = discreteCurvature(onCircle(7, angles, 3, -2));
    // analytic: the circle through three points of a circle is that circle, so κ = 1/R exactly
    for (const k of kappa) expect(k).toBeCloseTo(1 / 7, 12);
  });

  it('discreteCurvature is negative for a clockwise circle and zero on a straight line', () => {
    const cw = discreteCurvature(regularPolygon(12, 4).reverse(), true);
    // analytic: circumradius of the 12-gon is 4; turning right gives −1/R
    for (const k of cw) expect(k).toBeCloseTo(-1 / 4, 12);
    const line = discreteCurvature([
      [0, 0],
      [1, 1],
      [2, 2],
      [5, 5],
    ]);
    expect(line).toEqual([0, 0, 0, 0]);
  });

  it('discreteCurvature throws on a repeated point', () => {
    expect(() =>
      discreteCurvature([
        [0, 0],
        [0, 0],
        [1, 1],
      ]),
    ).toThrow(RangeError);
  });
});
