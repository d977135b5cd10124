import { describe, expect, it } from 'vitest';
import {
  type Region,
  regionArea,
  regionCentroid,
  regionPerimeter,
  ringPerimeter,
  signedRingArea,
} from '../../src/geometry/index.js';
import { annulus, rectangle, regularPolygon, reversed } from './shapes.js';

describe('areas and perimeters', () => {
  it('signedRingArea(regular 3600-gon R 20) equals the n-gon formula to 1e-12 and πR² within 1e-6', () => {
    const n = 3600;
    const R = 20;
    const area = signedRingArea(regularPolygon(n, R));
    // analytic: area of regular n-gon = n/2·R²·sin(2π/n)
    expect(area / ((n / 2) * R * R * Math.sin((2 * Math.PI) / n)) - 1).toBeCloseTo(0, 12);
    // analytic: disc area πR²; the n-gon falls short by a relative (2π/n)²/6 ≈ 5.1e-7
    expect(Math.abs(area / (Math.PI * R * R) - 1)).toBeLessThan(1e-6);
  });

  it('signedRingArea is positive for counter-clockwise and negative for clockwise rings', () => {
    const ccw = rectangle(3, 2);
    // analytic: rectangle area w·h; shoelace sign convention + for CCW with y up
    expect(signedRingArea(ccw)).toBeCloseTo(6, 12);
    expect(signedRingArea(reversed(ccw))).toBeCloseTo(-6, 12);
  });

  it('signedRingArea keeps precision for a 1 mm square 1 km from the origin', () => {
    // analytic: 1 mm² whatever the position (the shoelace sum is taken relative to the first point)
    expect(signedRingArea(rectangle(1, 1, 1e6, 1e6))).toBeCloseTo(1, 9);
  });

  it('regionArea(regular 12-gon R 7) is n/2·R²·sin(2π/n) exactly', () => {
    // analytic: area of regular n-gon = n/2·R²·sin(2π/n) = 3R² for n = 12
    expect(regionArea({ outer: regularPolygon(12, 7), holes: [] })).toBeCloseTo(3 * 49, 11);
  });

  it('regionArea(annulus R20 r10) is π(R²−r²) within 0.1%', () => {
    const area = regionArea(annulus(20, 10, 360));
    // analytic: annulus area π(R² − r²)
    const exact = Math.PI * (400 - 100);
    expect(Math.abs(area / exact - 1)).toBeLessThan(1e-3);
  });

  it('regionArea counts holes as removed whatever their orientation', () => {
    const hole = rectangle(2, 2, 1, 1);
    // analytic: 10·10 − 2·2
    expect(regionArea({ outer: rectangle(10, 10), holes: [hole] })).toBeCloseTo(96, 12);
    expect(regionArea({ outer: reversed(rectangle(10, 10)), holes: [reversed(hole)] })).toBeCloseTo(96, 12);
  });

  it('ringPerimeter(regular 17-gon R 5) is 2nR·sin(π/n)', () => {
    const n = 17;
    // analytic: perimeter of regular n-gon = 2nR·sin(π/n)
    expect(ringPerimeter(regularPolygon(n, 5))).toBeCloseTo(2 * n * 5 * Math.sin(Math.PI / n), 12);
  });

  it('regionPerimeter(annulus) is the sum of both rings, 2nR·sin(π/n) + 2nr·sin(π/n)', () => {
    const n = 64;
    // analytic: n-gon perimeters of outer and hole add
    const expected = 2 * n * (20 + 16) * Math.sin(Math.PI / n);
    expect(regionPerimeter(annulus(20, 16, n))).toBeCloseTo(expected, 10);
  });

  it('regionCentroid(10×10 square with a 2×2 hole at one corner) follows the composite-area rule', () => {
    const region: Region = { outer: rectangle(10, 10), holes: [reversed(rectangle(2, 2, 7, 7))] };
    // analytic: composite centroid x = (100·5 − 4·8) / (100 − 4) = 468/96 = 4.875, same for y by symmetry
    const [x, y] = regionCentroid(region);
    expect(x).toBeCloseTo(4.875, 12);
    expect(y).toBeCloseTo(4.875, 12);
  });

  it('regionCentroid(regular hexagon centred at (3, −4)) is its centre', () => {
    // analytic: a regular polygon's centroid is its centre
    const [x, y] = regionCentroid({ outer: regularPolygon(6, 2, 3, -4, 0.3), holes: [] });
    expect(x).toBeCloseTo(3, 12);
    expect(y).toBeCloseTo(-4, 12);
  });

  it('regionCentroid throws for a region with no area', () => {
    expect(() =>
      regionCentroid({
        outer: [
          [0, 0],
          [1, 1],
          [2, 2],
        ],
        holes: [],
      }),
    ).toThrow(RangeError);
  });
});
