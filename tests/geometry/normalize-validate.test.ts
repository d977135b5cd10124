import { describe, expect, it } from 'vitest';
import { DEFAULT_TOLERANCES as tol } from '../../src/numeric/index.js';
import {
  normalizeRegion,
  normalizeRing,
  type Point,
  pointInRegion,
  pointInRing,
  ringLocator,
  signedRingArea,
  validateRegion,
} from '../../src/geometry/index.js';
import { annulus, mulberry32, rectangle, reversed } from './shapes.js';

describe('normalizeRing and normalizeRegion', () => {
  it('normalizeRing drops repeated, collinear and closing points and turns the ring counter-clockwise', () => {
    const messy: Point[] = [
      [0, 0],
      [0, 10],
      [0, 10 + 1e-9],
      [10, 10],
      [10, 5],
      [10, 0],
      [5, 0],
      [0, 0],
    ];
    // reference: the clockwise 10×10 square's four corners, re-ordered counter-clockwise from the first point
    expect(normalizeRing(messy, tol)).toEqual([
      [0, 0],
      [10, 0],
      [10, 10],
      [0, 10],
    ]);
  });

  it('normalizeRing removes a zero-width spike that folds back along an edge', () => {
    const spiky: Point[] = [
      [0, 0],
      [10, 0],
      [15, 0],
      [10, 0],
      [10, 10],
      [0, 10],
    ];
    const ring = normalizeRing(spiky, tol);
    // reference: the square without the spike to (15, 0)
    expect(ring).toHaveLength(4);
    expect(signedRingArea(ring)).toBeCloseTo(100, 12);
  });

  it('normalizeRing keeps points that deviate from the line by more than tol.lengthMm', () => {
    const ring: Point[] = [
      [0, 0],
      [5, 2e-6],
      [10, 0],
      [10, 10],
    ];
    expect(normalizeRing(ring, tol)).toHaveLength(4);
  });

  it('normalizeRegion makes the outer ring counter-clockwise and holes clockwise', () => {
    const region = normalizeRegion({ outer: reversed(rectangle(10, 10)), holes: [rectangle(2, 2, 4, 4)] }, tol);
    expect(signedRingArea(region.outer)).toBeGreaterThan(0);
    expect(signedRingArea(region.holes[0]!)).toBeLessThan(0);
  });

  it('normalizeRegion drops a hole that collapses to fewer than three points', () => {
    const region = normalizeRegion(
      {
        outer: rectangle(10, 10),
        holes: [
          [
            [2, 2],
            [3, 3],
            [4, 4],
          ],
        ],
      },
      tol,
    );
    expect(region.holes).toHaveLength(0);
  });
});

describe('pointInRing and pointInRegion', () => {
  it('pointInRing tells inside, outside and boundary of a square', () => {
    const sq = rectangle(10, 10);
    expect(pointInRing([5, 5], sq, tol)).toBe('inside');
    expect(pointInRing([15, 5], sq, tol)).toBe('outside');
    expect(pointInRing([10, 5], sq, tol)).toBe('boundary');
  });

  it('pointInRing and ringLocator on a regular 720-gon of radius 20 mm: inside below the apothem, boundary within the tolerance, outside beyond', () => {
    // a regular n-gon of circumradius R has apothem R·cos(π/n) (elementary geometry); the vertices and the middle of
    // every edge lie on its boundary
    const n = 720;
    const R = 20;
    const ring: Point[] = Array.from({ length: n }, (_, k) => [
      R * Math.cos((2 * Math.PI * k) / n),
      R * Math.sin((2 * Math.PI * k) / n),
    ]);
    const apothem = R * Math.cos(Math.PI / n);
    for (const locate of [(p: Point) => pointInRing(p, ring, tol), ringLocator(ring, tol)]) {
      for (let k = 0; k < 97; k++) {
        const t = (2 * Math.PI * k) / 97 + 0.01;
        const at = (r: number): Point => [r * Math.cos(t), r * Math.sin(t)];
        expect(locate(at(apothem - 10 * tol.lengthMm))).toBe('inside');
        expect(locate(at(0.5 * R))).toBe('inside');
        expect(locate(at(R + 10 * tol.lengthMm))).toBe('outside');
        expect(locate(at(3 * R))).toBe('outside');
      }
      for (let k = 0; k < n; k += 37) {
        const [a, b] = [ring[k]!, ring[(k + 1) % n]!];
        expect(locate(a)).toBe('boundary');
        const mid: Point = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
        expect(locate(mid)).toBe('boundary');
        // a point just inside the tolerance off the edge's middle, outwards, is still on the boundary
        const out: Point = [
          mid[0] * (1 + (0.5 * tol.lengthMm) / apothem),
          mid[1] * (1 + (0.5 * tol.lengthMm) / apothem),
        ];
        expect(locate(out)).toBe('boundary');
      }
    }
  });

  it('ringLocator answers as pointInRing on random rings, for points anywhere, on vertices and edges, and just off them', () => {
    const random = mulberry32(7);
    for (let trial = 0; trial < 40; trial++) {
      // a star-shaped ring of 64–600 vertices (bucketed) or 5–60 (direct), radii 5–25 mm, sometimes axis-aligned runs
      const m = trial % 4 === 0 ? 5 + Math.floor(random() * 56) : 64 + Math.floor(random() * 537);
      const ring: Point[] = Array.from({ length: m }, (_, k) => {
        const a = (2 * Math.PI * k) / m;
        const r = 5 + 20 * random();
        return trial % 3 === 0
          ? [Math.round(r * Math.cos(a)), Math.round(r * Math.sin(a))]
          : [r * Math.cos(a), r * Math.sin(a)];
      });
      const locate = ringLocator(ring, tol);
      expect(ringLocator(ring, tol)).toBe(locate);
      const queries: Point[] = [];
      for (let q = 0; q < 300; q++) queries.push([random() * 70 - 35, random() * 70 - 35]);
      for (let k = 0; k < m; k += 3) {
        const [a, b] = [ring[k]!, ring[(k + 1) % m]!];
        const s = random();
        const on: Point = [a[0] + s * (b[0] - a[0]), a[1] + s * (b[1] - a[1])];
        queries.push(a, on);
        for (const d of [0.5, 1, 2, 10]) {
          queries.push(
            [on[0] + d * tol.lengthMm, on[1]],
            [on[0], on[1] - d * tol.lengthMm],
            [a[0], a[1] + d * tol.lengthMm],
          );
        }
      }
      for (const p of queries) expect(locate(p), `${p}`).toBe(pointInRing(p, ring, tol));
    }
  });

  it('pointInRegion puts a point in the hole of an annulus outside the material', () => {
    const ring = annulus(20, 10, 64);
    expect(pointInRegion([0, 0], ring, tol)).toBe('outside');
    expect(pointInRegion([15, 0], ring, tol)).toBe('inside');
  });
});

describe('validateRegion', () => {
  it('validateRegion(square) finds nothing wrong', () => {
    expect(validateRegion({ outer: rectangle(10, 10), holes: [reversed(rectangle(2, 2, 4, 4))] }, tol)).toEqual([]);
  });

  it('validateRegion(bow-tie) reports a self-intersection at the crossing point (5, 5) between edges 0 and 2', () => {
    const bowTie: Point[] = [
      [0, 0],
      [10, 10],
      [10, 0],
      [0, 10],
    ];
    const faults = validateRegion({ outer: bowTie, holes: [] }, tol);
    expect(faults).toHaveLength(1);
    const f = faults[0]!;
    expect(f.kind).toBe('self-intersection');
    expect(f.ring).toBe('outer');
    // analytic: the diagonals of the 10×10 square cross at its centre
    expect(f.at[0]).toBeCloseTo(5, 12);
    expect(f.at[1]).toBeCloseTo(5, 12);
    expect(f.edges).toEqual([0, 2]);
    expect(f.message).toBe('The outer boundary crosses itself near (5.0, 5.0) mm, between edges 0 and 2.');
  });

  it('validateRegion reports a self-intersection in input edge numbers even with repeated points', () => {
    const bowTie: Point[] = [
      [0, 0],
      [0, 0],
      [10, 10],
      [10, 0],
      [0, 10],
    ];
    const faults = validateRegion({ outer: bowTie, holes: [] }, tol);
    expect(faults.map((f) => f.edges)).toEqual([[1, 3]]);
  });

  it('validateRegion reports a hole outside the outer ring', () => {
    const faults = validateRegion({ outer: rectangle(10, 10), holes: [reversed(rectangle(2, 2, 20, 20))] }, tol);
    expect(faults).toHaveLength(1);
    expect(faults[0]!.kind).toBe('hole-outside-outer');
    expect(faults[0]!.ring).toBe(0);
    expect(faults[0]!.message).toMatch(/^Hole 0 lies outside the outer boundary/);
  });

  it('validateRegion reports a hole crossing the outer ring where it crosses', () => {
    const faults = validateRegion({ outer: rectangle(10, 10), holes: [reversed(rectangle(4, 2, 8, 4))] }, tol);
    expect(faults).toHaveLength(1);
    expect(faults[0]!.kind).toBe('hole-outside-outer');
    // analytic: the hole's bottom edge y = 4 meets the outer edge x = 10 at (10, 4)
    expect(faults[0]!.at[0]).toBeCloseTo(10, 12);
    expect([4, 6]).toContain(faults[0]!.at[1]);
  });

  it('validateRegion reports overlapping and nested holes', () => {
    const crossing = validateRegion(
      { outer: rectangle(20, 20), holes: [rectangle(6, 6, 2, 2), rectangle(6, 6, 5, 5)] },
      tol,
    );
    expect(crossing.map((f) => f.kind)).toEqual(['holes-overlap']);
    const nested = validateRegion(
      { outer: rectangle(20, 20), holes: [rectangle(10, 10, 2, 2), rectangle(2, 2, 5, 5)] },
      tol,
    );
    expect(nested.map((f) => [f.kind, f.ring, f.otherRing])).toEqual([['holes-overlap', 1, 0]]);
  });

  it('validateRegion reports too few points, zero area and non-finite coordinates', () => {
    const faults = validateRegion(
      {
        outer: [
          [0, 0],
          [5, 0],
          [10, 0],
        ],
        holes: [
          [
            [1, 1],
            [2, 2],
          ],
          [
            [1, 1],
            [Number.NaN, 2],
            [2, 1],
          ],
        ],
      },
      tol,
    );
    expect(faults.map((f) => [f.kind, f.ring])).toEqual([
      ['zero-area', 'outer'],
      ['too-few-points', 0],
      ['non-finite', 1],
    ]);
    expect(faults[2]!.vertex).toBe(1);
  });

  it('validateRegion reports an edge folding back over its neighbour', () => {
    const ring: Point[] = [
      [0, 0],
      [10, 0],
      [5, 0],
      [5, 5],
    ];
    const faults = validateRegion({ outer: ring, holes: [] }, tol);
    expect(faults.some((f) => f.kind === 'self-intersection')).toBe(true);
  });

  it('validateRegion reports a hole folding back over its previous edge, as on an outer ring', () => {
    const hole: Point[] = [
      [2, 2],
      [8, 2],
      [5, 2],
      [5, 6],
    ];
    const faults = validateRegion({ outer: rectangle(10, 10), holes: [hole] }, tol);
    expect(faults.map((f) => [f.kind, f.ring])).toContainEqual(['self-intersection', 0]);
  });

  it('validateRegion reports a speck or a sliver (mean width 2A/P at most tol.lengthMm) as zero-area', () => {
    // analytic: a right triangle of legs 2e-6 mm has 2A/P = 4e-12 / (2e-6 (2 + √2)) ≈ 5.9e-7 mm < 1e-6 mm
    const speck: Point[] = [
      [5, 5],
      [5 + 2e-6, 5],
      [5, 5 + 2e-6],
    ];
    const holeFaults = validateRegion({ outer: rectangle(10, 10), holes: [speck] }, tol);
    expect(holeFaults.map((f) => [f.kind, f.ring])).toEqual([['zero-area', 0]]);
    expect(holeFaults[0]!.message).toMatch(/^Hole 0 encloses next to no area/);
    // analytic: a 10 mm sliver 0.2–1.2 µm wide has 2A/P = 2 · 7e-6 / 20 = 7e-7 mm, though one corner lies 1.2 µm
    // (more than tol.lengthMm) off the line through the others, so it is not caught as points on one line
    const sliver: Point[] = [
      [0, 0],
      [10, 0],
      [10, 2e-7],
      [0, 1.2e-6],
    ];
    expect(validateRegion({ outer: sliver, holes: [] }, tol).map((f) => f.kind)).toEqual(['zero-area']);
    // a bow-tie's net area vanishes too, but it is told by its crossing, not as zero-area
    const bowTie: Point[] = [
      [0, 0],
      [10, 10],
      [10, 0],
      [0, 10],
    ];
    expect(validateRegion({ outer: bowTie, holes: [] }, tol).map((f) => f.kind)).toEqual(['self-intersection']);
  });

  it('validateRegion checks a 4000-vertex profile in well under a second', () => {
    const n = 4000;
    const wavy: Point[] = Array.from({ length: n }, (_, i) => {
      const a = (2 * Math.PI * i) / n;
      const r = 20 + Math.sin(40 * a);
      return [r * Math.cos(a), r * Math.sin(a)] as const;
    });
    const start = performance.now();
    expect(validateRegion({ outer: wavy, holes: [] }, tol)).toEqual([]);
    expect(performance.now() - start).toBeLessThan(1000);
  });
});
