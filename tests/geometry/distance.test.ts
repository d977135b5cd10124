import { describe, expect, it } from 'vitest';
import {
  closestPointOnPolyline,
  closestPointOnSegment,
  directedHausdorffDistance,
  hausdorffDistance,
  type Point,
  offsetRegions,
  pointToRingDistance,
  pointToSegmentDistance,
  type Region,
  regionBoundaryHausdorff,
} from '../../src/geometry/index.js';
import { mulberry32, rectangle, regularPolygon, reversed } from './shapes.js';

/** An arc of radius R centred at the origin, symmetric about +y, spanning a chord of length L, in `segments` pieces. */
function arcOverChord(R: number, L: number, segments: number): Point[] {
  const half = Math.asin(L / (2 * R));
  return Array.from({ length: segments + 1 }, (_, i) => {
    const a = Math.PI / 2 + half - (2 * half * i) / segments;
    return [R * Math.cos(a), R * Math.sin(a)] as const;
  });
}

describe('point to segment and polyline', () => {
  it('pointToSegmentDistance is the perpendicular distance inside the span and the end distance beyond it', () => {
    // analytic: perpendicular foot inside the segment; 3-4-5 triangle beyond the end
    expect(pointToSegmentDistance([5, 3], [0, 0], [10, 0])).toBeCloseTo(3, 12);
    expect(pointToSegmentDistance([13, 4], [0, 0], [10, 0])).toBeCloseTo(5, 12);
    expect(pointToSegmentDistance([1, 1], [2, 2], [2, 2])).toBeCloseTo(Math.SQRT2, 12);
  });

  it('closestPointOnSegment returns the foot of the perpendicular and its parameter', () => {
    const p = closestPointOnSegment([4, 7], [0, 0], [10, 0]);
    expect(p.point).toEqual([4, 0]);
    expect(p.t).toBeCloseTo(0.4, 12);
    expect(p.distance).toBeCloseTo(7, 12);
  });

  it('closestPointOnPolyline finds the nearest segment, and the closing segment only when closed', () => {
    const square = rectangle(10, 10);
    // analytic: (−1, 5) is 1 mm from the left side x = 0, which is the closing segment 3 → 0
    const open = closestPointOnPolyline([-1, 5], square);
    expect(open.segment).toBe(0);
    expect(open.distance).toBeCloseTo(Math.hypot(1, 5), 12);
    const closed = closestPointOnPolyline([-1, 5], square, true);
    expect(closed.segment).toBe(3);
    expect(closed.point).toEqual([0, 5]);
    expect(closed.t).toBeCloseTo(0.5, 12);
    expect(closed.distance).toBeCloseTo(1, 12);
  });
});

describe('Hausdorff distance', () => {
  it('hausdorffDistance(chord 10, arc R 50 with a vertex at its middle) equals the sagitta 0.250628', () => {
    const arc = arcOverChord(50, 10, 64);
    const chord: Point[] = [arc[0]!, arc[arc.length - 1]!];
    const h = hausdorffDistance(chord, arc);
    // standard geometry (docs/MODEL.md §5): sagitta R − √(R² − L²/4); R 50, L 10 → 0.250628
    expect(h.distance).toBeCloseTo(50 - Math.sqrt(2500 - 25), 9);
    expect(h.distance).toBeCloseTo(0.250628, 6);
    // The realising pair: the chord's middle and the arc's middle.
    expect(h.fromA[0]).toBeCloseTo(0, 9);
    expect(h.toB[0]).toBeCloseTo(0, 9);
    expect(Math.hypot(h.fromA[0] - h.toB[0], h.fromA[1] - h.toB[1])).toBeCloseTo(h.distance, 12);
  });

  it('hausdorffDistance(chord, 9-segment arc) is reached inside the segments, at R·cos(δ/2) − √(R² − L²/4)', () => {
    const R = 50;
    const L = 10;
    const n = 9;
    const arc = arcOverChord(R, L, n);
    const chord: Point[] = [arc[0]!, arc[n]!];
    const delta = (2 * Math.asin(L / (2 * R))) / n;
    // analytic: with an odd segment count the arc's middle is the middle of a flat segment at height R·cos(δ/2); the
    // chord's midpoint, an interior point of the chord, is that far below it
    const exact = R * Math.cos(delta / 2) - Math.sqrt(R * R - (L * L) / 4);
    const h = hausdorffDistance(chord, arc, { maxErrorMm: 1e-9 });
    expect(h.distance).toBeLessThanOrEqual(exact + 1e-12);
    expect(exact - h.distance).toBeLessThan(1e-9);
  });

  it('directedHausdorffDistance finds a maximum strictly inside a segment that vertex checks miss (1.5, not 0.3)', () => {
    // A = the segment (−1, 0)–(2.3, 0); B = three sides of a box over x ∈ [−1, 2], y ∈ [0, 2].
    const a: Point[] = [
      [-1, 0],
      [2.3, 0],
    ];
    const b: Point[] = [
      [-1, 0],
      [-1, 2],
      [2, 2],
      [2, 0],
    ];
    // analytic: along A, dist = min(x + 1, 2 − x, 2) for x ≤ 2 (largest 1.5 at x = 0.5) and x − 2 beyond; the vertices
    // alone give only max(0, 0.3) = 0.3
    for (const maxError of [1e-2, 1e-4, 1e-9]) {
      const d = directedHausdorffDistance([{ points: a, closed: false }], [{ points: b, closed: false }], maxError);
      expect(d.distance).toBeLessThanOrEqual(1.5 + 1e-12);
      expect(1.5 - d.distance).toBeLessThanOrEqual(maxError);
    }
    const fine = directedHausdorffDistance([{ points: a, closed: false }], [{ points: b, closed: false }], 1e-9);
    expect(fine.from[0]).toBeCloseTo(0.5, 8);
  });

  it('hausdorffDistance(square side 10, same square shifted by (0.3, 0.4)) is 0.5 as closed rings', () => {
    const a = rectangle(10, 10);
    const b = rectangle(10, 10, 0.3, 0.4);
    // analytic: a translation by v moves every corner |v| = 0.5 from its old ring; no point is farther
    expect(hausdorffDistance(a, b, { closedA: true, closedB: true }).distance).toBeCloseTo(0.5, 6);
  });

  it('regionBoundaryHausdorff(octagon with octagonal hole, octagon) is the hole-to-outer gap 6·cos(π/8)', () => {
    const outer = regularPolygon(8, 10);
    const withHole = { outer, holes: [reversed(regularPolygon(8, 4))] };
    const without = { outer, holes: [] };
    const h = regionBoundaryHausdorff(withHole, without);
    // analytic: the hole's sides run parallel to the outer sides, 10·cos(π/8) − 4·cos(π/8) = 6·cos(π/8) apart
    expect(h.distance).toBeCloseTo(6 * Math.cos(Math.PI / 8), 9);
    expect(regionBoundaryHausdorff(without, without).distance).toBeCloseTo(0, 12);
  });

  it('regionBoundaryHausdorff(720-gon R 20, its 1 mm round offset) is 1 mm within the arc tolerance, quickly', () => {
    const disc: Region = { outer: regularPolygon(720, 20), holes: [] };
    const grown = offsetRegions([disc], 1)[0]!;
    const start = performance.now();
    const h = regionBoundaryHausdorff(disc, grown);
    // analytic: every point of an outward offset of a convex ring lies exactly d from it, and vice versa; the offset
    // polygon's chords cut inside the true arcs by at most 2.25 × 0.005 mm, and vertices are rounded to 1e-4 mm
    expect(h.distance).toBeGreaterThan(1 - 2.25 * 0.005 - 1e-4);
    expect(h.distance).toBeLessThan(1 + 1e-4 + 1e-4);
    // The offset runs parallel to the ring everywhere; the convex bound settles such stretches without subdividing.
    expect(performance.now() - start).toBeLessThan(2000);
  });

  it('directedHausdorffDistance of random polylines brackets a dense-sampling reference within maxError and spacing', () => {
    const rand = mulberry32(4242);
    const walk = (n: number): Point[] => {
      let x = 0;
      let y = 0;
      return Array.from({ length: n }, () => {
        x += 4 * rand() - 1;
        y += 4 * rand() - 2;
        return [x, y] as const;
      });
    };
    for (let k = 0; k < 20; k++) {
      const a = walk(12);
      const b = walk(15);
      const maxError = 1e-4;
      const d = directedHausdorffDistance([{ points: a, closed: false }], [{ points: b, closed: false }], maxError);
      // reference: brute force, 2000 samples per segment of A (spacing h), each measured to every segment of B; the
      // distance to B is 1-Lipschitz, so exact ∈ [sampled max, sampled max + h/2]
      let sampled = 0;
      let h = 0;
      for (let i = 0; i + 1 < a.length; i++) {
        const [p, q] = [a[i]!, a[i + 1]!];
        h = Math.max(h, Math.hypot(q[0] - p[0], q[1] - p[1]) / 2000);
        for (let s = 0; s <= 2000; s++) {
          const x: Point = [p[0] + ((q[0] - p[0]) * s) / 2000, p[1] + ((q[1] - p[1]) * s) / 2000];
          sampled = Math.max(sampled, closestPointOnPolyline(x, b).distance);
        }
      }
      expect(d.distance + maxError).toBeGreaterThanOrEqual(sampled - 1e-12);
      expect(d.distance).toBeLessThanOrEqual(sampled + h / 2 + 1e-12);
    }
  });
});

describe('pointToRingDistance', () => {
  it('from outside, inside and far away to a regular 1000-gon of circumradius 10 mm: r − R at a vertex, r − R·cos(π/n) at an edge middle (elementary geometry)', () => {
    const n = 1000;
    const R = 10;
    const ring: Point[] = Array.from({ length: n }, (_, k) => [
      R * Math.cos((2 * Math.PI * k) / n),
      R * Math.sin((2 * Math.PI * k) / n),
    ]);
    const apothem = R * Math.cos(Math.PI / n);
    for (const k of [0, 1, 250, 499, 731, 999]) {
      const vertex = (2 * Math.PI * k) / n;
      const middle = vertex + Math.PI / n;
      for (const r of [0, 3, 9.5, 12, 100]) {
        const atVertex: Point = [r * Math.cos(vertex), r * Math.sin(vertex)];
        const atMiddle: Point = [r * Math.cos(middle), r * Math.sin(middle)];
        // outside, the nearest point along a vertex direction is the vertex; inside it is on one of its two edges
        if (r > R) expect(pointToRingDistance(atVertex, ring)).toBeCloseTo(r - R, 9);
        expect(pointToRingDistance(atMiddle, ring)).toBeCloseTo(Math.abs(r - apothem), 9);
      }
    }
    expect(pointToRingDistance([1, 2], [])).toBe(Number.POSITIVE_INFINITY);
  });

  it('equals the smallest point-to-segment distance over every edge on random rings and points', () => {
    const random = mulberry32(20261202);
    for (let trial = 0; trial < 200; trial++) {
      const m = 3 + Math.floor(random() * 60);
      const ring: Point[] = Array.from({ length: m }, () => [random() * 100 - 50, random() * 100 - 50]);
      const p: Point = [random() * 160 - 80, random() * 160 - 80];
      let brute = Number.POSITIVE_INFINITY;
      for (let i = 0; i < m; i++) brute = Math.min(brute, pointToSegmentDistance(p, ring[i]!, ring[(i + 1) % m]!));
      expect(pointToRingDistance(p, ring)).toBe(brute);
    }
  });
});
