import pc from 'polygon-clipping';
import { describe, expect, it } from 'vitest';
import {
  CLIPPER_SCALE,
  differenceRegions,
  intersectRegions,
  offsetRegions,
  type Point,
  type Region,
  regionArea,
  regionsArea,
  ringPerimeter,
  signedRingArea,
  symmetricDifferenceArea,
  unionRegions,
} from '../../src/geometry/index.js';
import { mulberry32, randomStar, rectangle, regularPolygon, reversed } from './shapes.js';

const box = (w: number, h: number, x0 = 0, y0 = 0): Region => ({ outer: rectangle(w, h, x0, y0), holes: [] });

describe('offsetRegions', () => {
  it('offsetRegions(40×20 rectangle, −3, miter) is a 34×14 rectangle, area exact', () => {
    const out = offsetRegions([box(40, 20)], -3, { join: 'miter' });
    expect(out).toHaveLength(1);
    // analytic: an inward offset by d of a w×h rectangle is (w − 2d)×(h − 2d); corners on the 1e-4 mm grid, so exact
    expect(regionArea(out[0]!)).toBeCloseTo(34 * 14, 9);
    expect(out[0]!.outer).toHaveLength(4);
  });

  it('offsetRegions(40×20 rectangle, +2, round) has area A + P·d + πd² within the arc-tolerance bound', () => {
    const d = 2;
    const arcTol = 0.005;
    const area = regionArea(offsetRegions([box(40, 20)], d)[0]!);
    // analytic (Steiner formula for a convex polygon): A + P·d + πd²
    const exact = 800 + 120 * d + Math.PI * d * d;
    // chords sit inside the true arcs by at most 2.25 × arc tolerance, over an arc length of 2πd
    expect(area).toBeLessThanOrEqual(exact + 1e-6);
    expect(exact - area).toBeLessThan(2.25 * arcTol * 2 * Math.PI * d);
  });

  it('offsetRegions(disc R 20 as a 1440-gon, −3) is a disc of radius 17', () => {
    const out = offsetRegions([{ outer: regularPolygon(1440, 20), holes: [] }], -3);
    expect(out).toHaveLength(1);
    // analytic: the inward offset of a disc of radius R by d is the disc of radius R − d; the 3600-gon's sides sit
    // R(1 − cos(π/n)) ≈ 7.6e-6 mm inside the circle, far below the grid-rounding allowance of 2e-4 mm used here
    for (const [x, y] of out[0]!.outer) expect(Math.abs(Math.hypot(x, y) - 17)).toBeLessThan(2e-4);
    expect(Math.abs(regionArea(out[0]!) / (Math.PI * 17 * 17) - 1)).toBeLessThan(1e-5);
  });

  it('offsetRegions(square, −6) vanishes when the inward offset exceeds the inscribed radius', () => {
    expect(offsetRegions([box(10, 10)], -6)).toEqual([]);
  });

  it('offsetRegions of a square with a square hole shrinks the outer ring and grows the hole (miter)', () => {
    const frame: Region = { outer: rectangle(20, 20), holes: [reversed(rectangle(10, 10, 5, 5))] };
    const out = offsetRegions([frame], -1, { join: 'miter' });
    // analytic: 18×18 outer minus 12×12 hole
    expect(out).toHaveLength(1);
    expect(regionArea(out[0]!)).toBeCloseTo(18 * 18 - 12 * 12, 9);
    expect(signedRingArea(out[0]!.outer)).toBeGreaterThan(0);
    expect(signedRingArea(out[0]!.holes[0]!)).toBeLessThan(0);
  });

  it('offsetRegions(square join, +1) cuts each corner flat at distance d', () => {
    const out = offsetRegions([box(10, 10)], 1, { join: 'square' });
    // analytic: clipper squares a 90° corner at distance d from the vertex, removing a triangle of legs
    // d·(√2 − 1)·√2 = d(2 − √2) from each of the four corners of the 12×12 mitred square
    const leg = 2 - Math.SQRT2;
    expect(regionArea(out[0]!)).toBeCloseTo(144 - (4 * (leg * leg)) / 2, 3);
  });
});

describe('boolean operations', () => {
  it('unionRegions of two overlapping squares is one region of area 2·100 − 25', () => {
    const out = unionRegions([box(10, 10), box(10, 10, 5, 5)]);
    expect(out).toHaveLength(1);
    // analytic: inclusion–exclusion, overlap 5×5
    expect(regionArea(out[0]!)).toBeCloseTo(175, 9);
  });

  it('differenceRegions(square, inner square) gives one region with a clockwise hole', () => {
    const out = differenceRegions([box(10, 10)], [box(4, 4, 3, 3)]);
    expect(out).toHaveLength(1);
    expect(out[0]!.holes).toHaveLength(1);
    expect(signedRingArea(out[0]!.outer)).toBeGreaterThan(0);
    expect(signedRingArea(out[0]!.holes[0]!)).toBeLessThan(0);
    // analytic: 100 − 16
    expect(regionArea(out[0]!)).toBeCloseTo(84, 9);
  });

  it('intersectRegions of two offset squares is their 5×5 overlap', () => {
    const out = intersectRegions([box(10, 10)], [box(10, 10, 5, 5)]);
    // analytic: overlap square [5,10]²
    expect(regionsArea(out)).toBeCloseTo(25, 9);
  });

  it('symmetricDifferenceArea(square, shifted square) is 2·(100 − 25), and 0 for identical shapes', () => {
    // analytic: |A ⊕ B| = |A| + |B| − 2|A ∩ B|
    expect(symmetricDifferenceArea([box(10, 10)], [box(10, 10, 5, 5)])).toBeCloseTo(150, 9);
    expect(symmetricDifferenceArea([box(10, 10)], [box(10, 10)])).toBeCloseTo(0, 12);
  });

  it('regionsArea counts an overlap once', () => {
    // analytic: inclusion–exclusion
    expect(regionsArea([box(10, 10), box(10, 10, 5, 5)])).toBeCloseTo(175, 9);
  });

  it('CLIPPER_SCALE is 1e4 units per mm, so results sit on a 0.1 µm grid', () => {
    expect(CLIPPER_SCALE).toBe(1e4);
    const out = unionRegions([{ outer: regularPolygon(7, 3.3333333), holes: [] }]);
    for (const [x, y] of out[0]!.outer) {
      expect(Math.abs(x * CLIPPER_SCALE - Math.round(x * CLIPPER_SCALE))).toBeLessThan(1e-6);
      expect(Math.abs(y * CLIPPER_SCALE - Math.round(y * CLIPPER_SCALE))).toBeLessThan(1e-6);
    }
  });

  it('clipper errors are thrown as exceptions, not alert() calls', () => {
    const huge: Region = { outer: rectangle(1e12, 1e12), holes: [] };
    expect(() => unionRegions([huge])).toThrow(/clipper/);
  });
});

describe('cross-check against polygon-clipping (float booleans)', () => {
  const toPc = (ring: readonly Point[]): [number, number][] => ring.map(([x, y]) => [x, y]);
  const pcArea = (mp: ReturnType<typeof pc.union>): number =>
    mp.reduce(
      (sum, poly) => sum + poly.reduce((s, ring, i) => s + (i === 0 ? 1 : -1) * Math.abs(shoelace(ring)), 0),
      0,
    );
  const shoelace = (ring: readonly (readonly [number, number])[]): number => signedRingArea(ring as Point[]);

  it('union and difference areas of 50 random star polygon pairs agree within 1e-4 mm × (perimeters)', () => {
    const rand = mulberry32(20261201);
    let worst = 0;
    for (let k = 0; k < 50; k++) {
      const n = 5 + Math.floor(rand() * 30);
      const m = 5 + Math.floor(rand() * 30);
      const a = randomStar(rand, n, 0, 0, 3, 15, 1 / CLIPPER_SCALE);
      const b = randomStar(rand, m, -5 + 10 * rand(), -5 + 10 * rand(), 2, 12, 1 / CLIPPER_SCALE);
      const ra: Region = { outer: a, holes: [] };
      const rb: Region = { outer: b, holes: [] };
      // Inputs sit on clipper's 1e-4 mm grid, so only the new crossing points are rounded; rounding moves a boundary by
      // under 1e-4 mm, so the area can change by at most that times the boundary length (a loose bound).
      const bound = 1e-4 * (ringPerimeter(a) + ringPerimeter(b));
      const union = regionsArea(unionRegions([ra, rb]));
      const unionRef = pcArea(pc.union([toPc(a)], [toPc(b)]));
      const diff = regionsArea(differenceRegions([ra], [rb]));
      const diffRef = pcArea(pc.difference([toPc(a)], [toPc(b)]));
      expect(Math.abs(union - unionRef)).toBeLessThan(bound);
      expect(Math.abs(diff - diffRef)).toBeLessThan(bound);
      worst = Math.max(worst, Math.abs(union - unionRef), Math.abs(diff - diffRef));
    }
    // In practice only the crossing points move, each by under 0.71e-4 mm, which shifts the area by at most about
    // 0.71e-4 × (its two edges, up to ~30 mm) / 2 ≈ 1e-3 mm² per crossing; observed worst about 5.5e-4 mm² on ~500 mm².
    expect(worst).toBeLessThan(1e-3);
  });
});
