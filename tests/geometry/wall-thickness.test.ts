import { describe, expect, it } from 'vitest';
import {
  findThinWalls,
  maxInscribedCircle,
  measureWalls,
  type Point,
  pointInRegion,
  pointToSegmentDistance,
  type Region,
} from '../../src/geometry/index.js';
import { DEFAULT_TOLERANCES as tol } from '../../src/numeric/index.js';
import { annulus, mulberry32, randomStar, rectangle, regularPolygon } from './shapes.js';

const poly = (outer: Point[]): Region => ({ outer, holes: [] });

/** Brute force: distance from p to the nearest edge of every ring, O(n). */
function clearance(p: Point, region: Region): number {
  let best = Number.POSITIVE_INFINITY;
  for (const ring of [region.outer, ...region.holes]) {
    for (let i = 0; i < ring.length; i++) {
      best = Math.min(best, pointToSegmentDistance(p, ring[i]!, ring[(i + 1) % ring.length]!));
    }
  }
  return best;
}

describe('measureWalls: walls measured across, corners and strip ends excluded', () => {
  it('measureWalls(40 × 8 rectangle) is 8 mm thinnest and thickest within 1e-4 mm', () => {
    const w = measureWalls(poly(rectangle(40, 8)), tol);
    // analytic: a 40 × 8 strip is one 8 mm wall; its square ends and 90° corners are not thinner walls
    expect(Math.abs(w.minWallMm - 8)).toBeLessThan(1e-4);
    expect(Math.abs(w.maxWallMm - 8)).toBeLessThan(1e-4);
    expect(w.thickThinRatio).toBeCloseTo(1, 4);
    expect(w.minAt[1]).toBeCloseTo(4, 6);
    const [p, q] = w.minAcross;
    expect(Math.hypot(p[0] - q[0], p[1] - q[1])).toBeCloseTo(8, 6);
  });

  it('measureWalls(annulus R 20 r 12, 720-gons) is R − r thinnest and thickest within the polygon sagitta', () => {
    const w = measureWalls(annulus(20, 12, 720), tol);
    // analytic: an annulus is one wall R − r = 8 mm; the 720-gons depart from their circles by R(1 − cos(π/720))
    const sagitta = 20 * (1 - Math.cos(Math.PI / 720));
    expect(Math.abs(w.minWallMm - 8)).toBeLessThan(sagitta + 1e-6);
    expect(Math.abs(w.maxWallMm - 8)).toBeLessThan(sagitta + 1e-6);
    expect(Math.hypot(...w.minAt)).toBeGreaterThan(12);
    expect(Math.hypot(...w.minAt)).toBeLessThan(20);
  });

  it('measureWalls(annulus R 20 r 12, 5000-gons: the documented ring limit) is 8 mm within 1e-5', () => {
    const w = measureWalls(annulus(20, 12, 5000), tol);
    // analytic: R − r; sagitta 20(1 − cos(π/5000)) ≈ 4e-6 mm
    expect(Math.abs(w.minWallMm - 8)).toBeLessThan(1e-5);
    expect(Math.abs(w.maxWallMm - 8)).toBeLessThan(1e-5);
  });

  it('measureWalls(wedge strip 2 → 6 mm over 40 mm) is thinnest at the thin end face and thickest at the thick end', () => {
    const wedge = poly([
      [0, 0],
      [40, 0],
      [40, 6],
      [0, 2],
    ]);
    const w = measureWalls(wedge, tol);
    // analytic: the top rises 0.1 mm per mm, so the wall is 2 + 0.1x measured square to the base: 2 mm at x = 0
    expect(Math.abs(w.minWallMm - 2)).toBeLessThan(1e-4);
    expect(w.minAt[0]).toBeLessThan(1e-3);
    // analytic: the largest disc sits in the thick end, tangent to the base, the end face x = 40 and the top line
    // y = 2 + 0.1x: centre (40 − r, r) at distance r from the line gives r = 6 / (1.1 + √1.01)
    const r = 6 / (1.1 + Math.sqrt(1.01));
    expect(Math.abs(w.maxWallMm - 2 * r)).toBeLessThan(1e-4);
    expect(w.maxAt[0]).toBeCloseTo(40 - r, 3);
  });

  it('measureWalls(circle as a 3600-gon, R 20) is its diameter, thickest and thinnest', () => {
    const w = measureWalls(poly(regularPolygon(3600, 20)), tol);
    // analytic: the largest disc in a regular n-gon is its incircle, radius R cos(π/n)
    const d = 2 * 20 * Math.cos(Math.PI / 3600);
    expect(Math.abs(w.maxWallMm - d)).toBeLessThan(1e-4);
    expect(Math.hypot(...w.maxAt)).toBeLessThan(1e-3);
    // analytic: every chord along a side's normal of an even regular n-gon crosses to the opposite side, d long
    expect(Math.abs(w.minWallMm - d)).toBeLessThan(1e-4);
  });

  it('measureWalls(equilateral triangle side 10) has no facing walls: thinnest = thickest = incircle diameter', () => {
    const w = measureWalls(poly(regularPolygon(3, 10 / Math.sqrt(3))), tol);
    // analytic: inradius a/(2√3); three 60° corners, no two faces facing each other
    expect(Math.abs(w.maxWallMm - 10 / Math.sqrt(3))).toBeLessThan(1e-4);
    expect(w.minWallMm).toBeCloseTo(w.maxWallMm, 9);
  });

  it('measureWalls(parallelogram strip, 8 mm thick with 38.7° sharp end corners) is 8 mm: an acute corner is not a wall', () => {
    // bottom (0,0)–(40,0), top (10,8)–(50,8): the ends lean 51.3° from vertical, their acute corners are 38.66°
    const w = measureWalls(
      poly([
        [0, 0],
        [40, 0],
        [50, 8],
        [10, 8],
      ]),
      tol,
    );
    // analytic: the perpendicular distance between the two long sides is 8 mm
    expect(Math.abs(w.minWallMm - 8)).toBeLessThan(1e-4);
  });

  it('measureWalls(block with a 0.6 mm fin, rounded tip) finds the fin: a rounded tip is really thin across', () => {
    // 10 × 10 block; fin x 4.7–5.3 from y 10 to 18, tip a semicircle of radius 0.3 in 16 segments
    const tip = Array.from({ length: 17 }, (_, i) => {
      const a = (Math.PI * i) / 16;
      return [5 + 0.3 * Math.cos(a), 18 + 0.3 * Math.sin(a)] as Point;
    });
    const w = measureWalls(poly([[0, 0], [10, 0], [10, 10], [5.3, 10], ...tip, [4.7, 10], [0, 10]] as Point[]), tol);
    // analytic: the fin is 0.6 mm across its straight sides
    expect(Math.abs(w.minWallMm - 0.6)).toBeLessThan(1e-4);
    expect(w.minAt[0]).toBeCloseTo(5, 3);
    expect(w.minAt[1]).toBeGreaterThan(10);
  });

  it('measureWalls and findThinWalls(eccentric ring, 2000-gons, thinnest 0.5 mm on the +x side) find the one thin place', () => {
    // outer circle R 20 at the origin; hole r 12 centred at (7.5, 0)
    const hole = regularPolygon(2000, 12, 7.5, 0).reverse();
    const region: Region = { outer: regularPolygon(2000, 20), holes: [hole] };
    const w = measureWalls(region, tol);
    // analytic: between eccentric circles the wall is thinnest on the line of centres, R − (d + r) = 0.5 mm; the
    // 2000-gons depart from their circles by at most R(1 − cos(π/2000)) ≈ 2.5e-5 mm
    expect(Math.abs(w.minWallMm - 0.5)).toBeLessThan(1e-4);
    expect(w.minAt[0]).toBeGreaterThan(19);
    // analytic: near y = 0 the wall is 0.5 + y²(1/(2r) − 1/(2R)) ≈ 0.5 + 0.0167y², so the polygons' error (≈ 5e-5 mm)
    // can move the thinnest point by up to about 0.06 mm along the wall
    expect(Math.abs(w.minAt[1])).toBeLessThan(0.1);
    const thin = findThinWalls(region, 1, tol);
    // analytic: the wall is below 1 mm only near +x (R − |(x, y) − c| − r < 1 for a short arc round the thinnest point)
    expect(thin).toHaveLength(1);
    expect(thin[0]!.centroid[0]).toBeGreaterThan(18);
    expect(Math.abs(thin[0]!.centroid[1])).toBeLessThan(0.1);
  });

  it('findThinWalls(40 × 8 strip, 7.9) is empty without an opening: the survey rules it out', () => {
    // analytic: the strip is 8 mm thick, above 7.9
    expect(findThinWalls(poly(rectangle(40, 8)), 7.9, tol)).toEqual([]);
  });
});

describe('maxInscribedCircle against a brute-force search', () => {
  it('maxInscribedCircle(20 seeded random star polygons) fits and is within the brute-force grid bracket', () => {
    const rand = mulberry32(9);
    for (let k = 0; k < 20; k++) {
      const region = poly(randomStar(rand, 8 + Math.floor(rand() * 17), 0, 0, 3, 10));
      const c = maxInscribedCircle(region, tol);
      // reference: brute force, O(n) clearance at every node of a 0.05 mm grid over the bounding box (O(n·cells)).
      // The clearance is 1-Lipschitz, so the true largest radius lies in [best node, best node + g/√2].
      const g = 0.05;
      let best = 0;
      for (let x = -10; x <= 10; x += g) {
        for (let y = -10; y <= 10; y += g) {
          const p: Point = [x, y];
          if (pointInRegion(p, region, tol) !== 'inside') continue;
          best = Math.max(best, clearance(p, region));
        }
      }
      // reference: the reported circle fits (brute-force clearance of its centre)
      expect(pointInRegion(c.center, region, tol)).toBe('inside');
      expect(clearance(c.center, region)).toBeGreaterThanOrEqual(c.radiusMm - 1e-9);
      expect(c.radiusMm).toBeGreaterThanOrEqual(best - 1e-9);
      expect(c.radiusMm).toBeLessThanOrEqual(best + g / Math.SQRT2);
    }
  });
});

describe('measureWalls thinnest wall against a brute-force search', () => {
  it('measureWalls(10 seeded smooth blobs with an off-centre hole) finds the brute-force least ring-to-ring gap', () => {
    const rand = mulberry32(17);
    for (let k = 0; k < 10; k++) {
      // outer: radius 10 + three random harmonics (amplitude ≤ 1.2 in all), 240 vertices; hole: circle r 2, 120-gon,
      // centred 4.5–6 mm from the origin, so the thinnest wall (0.8–3.5 mm) lies between hole and outer ring
      const h = Array.from({ length: 3 }, (_, m) => ({ a: 0.4 * rand(), f: m + 2, p: 2 * Math.PI * rand() }));
      const outer = Array.from({ length: 240 }, (_, i): Point => {
        const t = (2 * Math.PI * i) / 240;
        const r = 10 + h.reduce((sum, c) => sum + c.a * Math.sin(c.f * t + c.p), 0);
        return [r * Math.cos(t), r * Math.sin(t)];
      });
      const phi = 2 * Math.PI * rand();
      const d = 4.5 + 1.5 * rand();
      const hole = regularPolygon(120, 2, d * Math.cos(phi), d * Math.sin(phi)).reverse();
      const region: Region = { outer, holes: [hole] };
      // reference: brute force, every vertex of each ring against every segment of the other, O(n·m); the least
      // distance between two disjoint polygons is attained between a vertex and a segment
      let gap = Number.POSITIVE_INFINITY;
      for (const [from, to] of [
        [outer, hole],
        [hole, outer],
      ] as const) {
        for (const v of from) {
          for (let i = 0; i < to.length; i++)
            gap = Math.min(gap, pointToSegmentDistance(v, to[i]!, to[(i + 1) % to.length]!));
        }
      }
      const w = measureWalls(region, tol);
      // the ends of that shortest segment face each other square on, so it is a chord along an inward normal
      expect(Math.abs(w.minWallMm - gap)).toBeLessThan(1e-5);
      expect(clearance(w.minAt, region)).toBeCloseTo(gap / 2, 4);
    }
  });
});
