import { describe, expect, it } from 'vitest';
import { DEFAULT_TOLERANCES as tol } from '../../src/numeric/index.js';
import {
  findThinWalls,
  interiorPoint,
  maxInscribedCircle,
  measureMinWall,
  measureWalls,
  type Point,
  type Region,
  pointInRegion,
  regionArea,
  resolveWallOptions,
  unionRegions,
} from '../../src/geometry/index.js';
import { annulus, rectangle, regularPolygon, reversed, ribProfile } from './shapes.js';

const box = (w: number, h: number, x0 = 0, y0 = 0): Region => ({ outer: rectangle(w, h, x0, y0), holes: [] });

describe('maxInscribedCircle', () => {
  it('maxInscribedCircle(40×8 rectangle) has radius 4 within 0.005 mm, centred on the mid-line', () => {
    const c = maxInscribedCircle(box(40, 8), tol);
    // analytic: the largest disc in a w×h rectangle (w ≥ h) has radius h/2, centre anywhere on the mid-line
    expect(Math.abs(c.radiusMm - 4)).toBeLessThan(0.005);
    expect(c.radiusMm).toBeLessThanOrEqual(4 + 1e-9);
    expect(c.center[1]).toBeCloseTo(4, 2);
    expect(c.upperBoundMm).toBeGreaterThanOrEqual(4 - 1e-9);
  });

  it('maxInscribedCircle(equilateral triangle side 10) is its incircle, radius 10/(2√3), at the centroid', () => {
    const tri: Point[] = [
      [0, 0],
      [10, 0],
      [5, 5 * Math.sqrt(3)],
    ];
    const c = maxInscribedCircle({ outer: tri, holes: [] }, tol);
    // analytic: inradius of an equilateral triangle r = a/(2√3); incentre = centroid (5, 5/√3)
    const r = 10 / (2 * Math.sqrt(3));
    expect(Math.abs(c.radiusMm - r)).toBeLessThan(0.005);
    expect(Math.hypot(c.center[0] - 5, c.center[1] - 5 / Math.sqrt(3))).toBeLessThan(0.02);
  });

  it('maxInscribedCircle(annulus R 20 r 16) has radius 2 and its centre in the material at radius 18', () => {
    const c = maxInscribedCircle(annulus(20, 16, 200), tol);
    // analytic: the wall is 4 mm; the 200-gon outer ring's sides sit 20(1 − cos(π/200)) ≈ 0.0025 mm inside R
    const wall = 20 * Math.cos(Math.PI / 200) - 16;
    expect(Math.abs(c.radiusMm - wall / 2)).toBeLessThan(0.005);
    expect(Math.abs(Math.hypot(...c.center) - 18)).toBeLessThan(0.05);
  });
});

describe('findThinWalls', () => {
  it('findThinWalls(40×8 rectangle, 1.5) finds no thin wall: its sharp corner slivers are ignored', () => {
    // reference: every wall is 8 mm; the opening only rounds the four 90° corners (slivers within r·cot 45° = r)
    expect(findThinWalls(box(40, 8), 1.5, tol)).toEqual([]);
  });

  it('findThinWalls(profile with one 1 mm rib among 4 mm walls, 1.5) finds exactly one piece, at the rib', () => {
    const walls = findThinWalls(ribProfile(), 1.5, tol);
    expect(walls).toHaveLength(1);
    const w = walls[0]!;
    // reference: the rib occupies x 19.5–20.5, y 4–12 (8 mm² less the disc bulges at its mouth)
    expect(w.centroid[0]).toBeCloseTo(20, 3);
    expect(w.centroid[1]).toBeGreaterThan(7);
    expect(w.centroid[1]).toBeLessThan(9);
    expect(w.bbox.minX).toBeCloseTo(19.5, 3);
    expect(w.bbox.maxX).toBeCloseTo(20.5, 3);
    expect(w.bbox.maxY).toBeCloseTo(12, 3);
    expect(w.areaMm2).toBeGreaterThan(7.5);
    expect(w.areaMm2).toBeLessThan(8);
    expect(regionArea(w.region)).toBeCloseTo(w.areaMm2, 12);
  });

  it('findThinWalls(rib profile, 0.9) finds nothing: the 1 mm rib is thick enough for 0.9', () => {
    expect(findThinWalls(ribProfile(), 0.9, tol)).toEqual([]);
  });

  it('findThinWalls(triangle with a 30° tip, 2) ignores the tip but flags a short 1 mm stub', () => {
    // A 30° tip is a sharp corner, not a wall: its sliver reaches r·cot(15°) ≈ 3.7 mm from the apex.
    const tip: Point[] = [
      [0, 0],
      [20, 0],
      [20, 20 * Math.tan(Math.PI / 6)],
    ];
    expect(findThinWalls({ outer: tip, holes: [] }, 2, tol)).toEqual([]);
    // A square-ended 1 mm stub on a 10 mm block turns through 180° at its end: a real thin wall.
    const stub = unionRegions([box(10, 10), box(3, 1, 10, 4.5)])[0]!;
    const walls = findThinWalls(stub, 2, tol);
    expect(walls).toHaveLength(1);
    expect(walls[0]!.centroid[0]).toBeGreaterThan(10);
  });

  it('findThinWalls ignores a 90° corner rounded with a radius smaller than the opening', () => {
    // A 10×10 square whose corners are filleted with radius 0.3 mm (16 segments), probed at t = 2 (r = 1 > 0.3).
    const corner = (cx: number, cy: number, a0: number): Point[] =>
      Array.from({ length: 17 }, (_, i) => {
        const a = a0 + ((Math.PI / 2) * i) / 16;
        return [cx + 0.3 * Math.cos(a), cy + 0.3 * Math.sin(a)] as const;
      });
    const rounded: Point[] = [
      ...corner(9.7, 0.3, -Math.PI / 2),
      ...corner(9.7, 9.7, 0),
      ...corner(0.3, 9.7, Math.PI / 2),
      ...corner(0.3, 0.3, Math.PI),
    ];
    expect(findThinWalls({ outer: rounded, holes: [] }, 2, tol)).toEqual([]);
  });
});

describe('measureMinWall and measureWalls', () => {
  it('measureWalls(annulus R 20 r 16) gives min ≈ max ≈ 4 mm within 0.05', () => {
    const w = measureWalls(annulus(20, 16, 200), tol);
    // analytic: an annulus has one uniform wall R − r = 4 mm
    expect(Math.abs(w.minWallMm - 4)).toBeLessThan(0.05);
    expect(Math.abs(w.maxWallMm - 4)).toBeLessThan(0.05);
    expect(w.thickThinRatio).toBeGreaterThanOrEqual(1);
    expect(w.thickThinRatio).toBeLessThan(1.01);
  });

  it('measureMinWall(40×4 rectangle) gives 4 mm within 0.01, located in the strip', () => {
    const m = measureMinWall(box(40, 4), tol);
    // analytic: a 40×4 strip is a 4 mm wall
    expect(Math.abs(m.minWallMm - 4)).toBeLessThan(0.01);
    expect(pointInRegion(m.at, box(40, 4), tol)).toBe('inside');
  });

  it('measureWalls(rib profile) gives min 1 mm at the rib and max 4.686 mm in a leg corner', () => {
    const w = measureWalls(ribProfile(), tol);
    // reference: the rib is 1 mm wide
    expect(Math.abs(w.minWallMm - 1)).toBeLessThan(0.01);
    expect(w.minAt[0]).toBeCloseTo(20, 2);
    expect(w.minAt[1]).toBeGreaterThan(4);
    // analytic: in the corner block where a 4 mm leg meets the 4 mm base, the largest disc touches both outer sides
    // and the inner (reflex) corner (4, 4): centre (c, c) with √2(4 − c) = c, so 2c = 8√2/(1 + √2) ≈ 4.6863
    expect(Math.abs(w.maxWallMm - (8 * Math.SQRT2) / (1 + Math.SQRT2))).toBeLessThan(0.01);
    expect(w.thickThinRatio).toBeCloseTo(w.maxWallMm / w.minWallMm, 12);
  });

  it('measureWalls(gasket: 30×3 base with a hollow bulb, 1.5 mm wall, 261 vertices) finds the 1.5 mm bulb wall', () => {
    const bulb: Region = { outer: regularPolygon(160, 8, 15, 10), holes: [reversed(regularPolygon(120, 6.5, 15, 10))] };
    const gasket = unionRegions([bulb, box(30, 3)])[0]!;
    const w = measureWalls(gasket, tol);
    // analytic: bulb wall = outer 160-gon inradius 8·cos(π/160) − hole 120-gon circumradius 6.5 ≈ 1.4985 mm
    expect(Math.abs(w.minWallMm - (8 * Math.cos(Math.PI / 160) - 6.5))).toBeLessThan(0.01);
    const r = Math.hypot(w.minAt[0] - 15, w.minAt[1] - 10);
    expect(r).toBeGreaterThan(6.5);
    expect(r).toBeLessThan(8);
  });
});

describe('wall ends, fillets and chamfers', () => {
  it('measureMinWall(right trapezoid, 8 mm end face under a 32° top) is 8 mm, at the thin end', () => {
    const h = 8;
    const slope = (32 * Math.PI) / 180;
    const trapezoid: Point[] = [
      [0, 0],
      [40, 0],
      [40, h + 40 * Math.tan(slope)],
      [0, h],
    ];
    const m = measureMinWall({ outer: trapezoid, holes: [] }, tol);
    // analytic: the wall tapers from the 8 mm end face upward; measured across (bottom to top, the faces 32° from
    // facing), it is thinnest at the end face, 8 mm. (The opening method reported 2h/(1 + cot(β/2)) ≈ 10.294 here,
    // the disc that fits the end's two corners.)
    expect(Math.abs(m.minWallMm - h)).toBeLessThan(1e-4);
    expect(m.at[0]).toBeLessThan(0.01);
    expect(m.at[1]).toBeCloseTo(h / 2, 3);
  });

  it('findThinWalls(40×4 strip with 0.5 mm fillets drawn in 8 segments, 1.5) finds nothing; its min wall is 4', () => {
    const fillet = (cx: number, cy: number, a0: number): Point[] =>
      Array.from({ length: 9 }, (_, i) => {
        const a = a0 + ((Math.PI / 2) * i) / 8;
        return [cx + 0.5 * Math.cos(a), cy + 0.5 * Math.sin(a)] as const;
      });
    const strip: Region = {
      outer: [
        ...fillet(39.5, 0.5, -Math.PI / 2),
        ...fillet(39.5, 3.5, 0),
        ...fillet(0.5, 3.5, Math.PI / 2),
        ...fillet(0.5, 0.5, Math.PI),
      ],
      holes: [],
    };
    // reference: docs/MODEL.md §5 minimum corner radius 0.5 mm (common practice); the strip is a 4 mm wall
    expect(findThinWalls(strip, 1.5, tol)).toEqual([]);
    expect(Math.abs(measureMinWall(strip, tol).minWallMm - 4)).toBeLessThan(0.01);
  });

  it('findThinWalls(10 mm square with 0.3 mm chamfers, 2) ignores the chamfered corners', () => {
    const c = 0.3;
    const chamfered: Point[] = [
      [c, 0],
      [10 - c, 0],
      [10, c],
      [10, 10 - c],
      [10 - c, 10],
      [c, 10],
      [0, 10 - c],
      [0, c],
    ];
    expect(findThinWalls({ outer: chamfered, holes: [] }, 2, tol)).toEqual([]);
  });
});

describe('interiorPoint', () => {
  it('interiorPoint(annulus) lies in the material although the centroid lies in the hole', () => {
    const ring = annulus(20, 16, 64);
    expect(pointInRegion(interiorPoint(ring), ring, tol)).toBe('inside');
  });

  it('interiorPoint(U shape) lies in one of the legs or the base, never in the gap', () => {
    const u: Point[] = [
      [0, 0],
      [10, 0],
      [10, 10],
      [8, 10],
      [8, 2],
      [2, 2],
      [2, 10],
      [0, 10],
    ];
    expect(pointInRegion(interiorPoint({ outer: u, holes: [] }), { outer: u, holes: [] }, tol)).toBe('inside');
  });
});

describe('wall options', () => {
  it('resolveWallOptions rejects a noise margin too small for the opening arc tolerance', () => {
    expect(() => resolveWallOptions({ openingArcToleranceMm: 0.01, noiseMarginMm: 0.005 })).toThrow(RangeError);
    expect(() => resolveWallOptions({ sampleSpacingMm: 0 })).toThrow(RangeError);
  });
});
