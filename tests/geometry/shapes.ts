/** Test shapes and a seeded random generator for the geometry tests (not a test file itself). */
import type { Point, Region, Ring } from '../../src/geometry/index.js';

/** Regular n-gon of circumradius r centred at (cx, cy), counter-clockwise, first vertex at angle `phase`. */
export function regularPolygon(n: number, r: number, cx = 0, cy = 0, phase = 0): Point[] {
  return Array.from({ length: n }, (_, i) => {
    const a = phase + (2 * Math.PI * i) / n;
    return [cx + r * Math.cos(a), cy + r * Math.sin(a)] as const;
  });
}

/** Axis-aligned rectangle from (x0, y0), counter-clockwise. */
export function rectangle(w: number, h: number, x0 = 0, y0 = 0): Point[] {
  return [
    [x0, y0],
    [x0 + w, y0],
    [x0 + w, y0 + h],
    [x0, y0 + h],
  ];
}

/** Reversed copy of a ring (turns a CCW ring into a CW hole). */
export function reversed(ring: Ring): Point[] {
  return [...ring].reverse();
}

/** Annulus of outer radius R and inner radius r as n-gons (outer CCW, hole CW). */
export function annulus(R: number, r: number, n: number): Region {
  return { outer: regularPolygon(n, R), holes: [reversed(regularPolygon(n, r))] };
}

/**
 * An E-like edging profile: a 40 × 4 mm base with two 4 mm legs 8 mm tall at the ends and a single 1 mm rib 8 mm
 * tall in the middle (x 19.5 to 20.5). Walls are 4 mm except the rib.
 */
export function ribProfile(): Region {
  return {
    outer: [
      [0, 0],
      [40, 0],
      [40, 12],
      [36, 12],
      [36, 4],
      [20.5, 4],
      [20.5, 12],
      [19.5, 12],
      [19.5, 4],
      [4, 4],
      [4, 12],
      [0, 12],
    ],
    holes: [],
  };
}

/** Mulberry32, a small well-mixed 32-bit PRNG (public-domain algorithm by Tommy Ettinger), for repeatable tests. */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * A random star-shaped (hence simple) polygon about (cx, cy), counter-clockwise: vertex i at angle (i + u)·2π/n with u
 * uniform in [0, 0.8), so consecutive angles differ by less than π, at a random radius in [rMin, rMax]. Coordinates
 * are rounded to `grid` mm (0 for no rounding).
 */
export function randomStar(
  rand: () => number,
  n: number,
  cx: number,
  cy: number,
  rMin: number,
  rMax: number,
  grid = 0,
): Point[] {
  const snap = (v: number): number => (grid > 0 ? Math.round(v / grid) * grid : v);
  return Array.from({ length: n }, (_, i) => {
    const a = ((i + 0.8 * rand()) * 2 * Math.PI) / n;
    const r = rMin + (rMax - rMin) * rand();
    return [snap(cx + r * Math.cos(a)), snap(cy + r * Math.sin(a))] as const;
  });
}
