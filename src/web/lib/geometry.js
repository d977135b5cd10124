// @ts-check
/**
 * Plane geometry for the review page, in millimetres in the die-body frame (x right, y up).
 * Pure: no DOM, no fetch; unit-tested in tests/web/geometry.test.ts.
 */

/** @typedef {readonly [number, number]} Point  [x, y] mm */
/** @typedef {{ outer: readonly Point[], holes?: readonly (readonly Point[])[] }} Region */

/**
 * Point between `a` and `b`: `a` at `t` = 0, `b` at `t` = 1.
 * @param {Point} a
 * @param {Point} b
 * @param {number} t
 * @returns {Point}
 */
export function lerpPoint(a, b, t) {
  return [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t];
}

/**
 * A plate outline drawn in its own frame, placed in the die-body frame. The plate frame has its origin at the first
 * pivot and its x axis toward the second pivot (y to the left of that direction); the outline is rotated by the
 * pivot line's angle and moved to the first pivot. Lengths are kept: a telescoping plate's outline is not stretched.
 * @param {readonly Point[]} outlineLocal  outline in the plate frame, mm
 * @param {Point} first  first pivot in the die-body frame, mm
 * @param {Point} second  second pivot in the die-body frame, mm
 * @returns {Point[]}
 */
export function placeOutline(outlineLocal, first, second) {
  const angle = Math.atan2(second[1] - first[1], second[0] - first[0]);
  const c = Math.cos(angle);
  const s = Math.sin(angle);
  return outlineLocal.map(([x, y]) => [first[0] + c * x - s * y, first[1] + s * x + c * y]);
}

/**
 * Signed area of a ring by the shoelace formula, mm²: positive for counter-clockwise rings (y up).
 * @param {readonly Point[]} ring
 */
export function ringArea(ring) {
  let twice = 0;
  for (let i = 0; i < ring.length; i++) {
    const p = ring[i];
    const q = ring[(i + 1) % ring.length];
    if (!p || !q) continue;
    twice += p[0] * q[1] - q[0] * p[1];
  }
  return twice / 2;
}

/**
 * Area of a region, mm²: the outer ring less its holes, whatever their orientation.
 * @param {Region} region
 */
export function regionArea(region) {
  let area = Math.abs(ringArea(region.outer));
  for (const hole of region.holes ?? []) area -= Math.abs(ringArea(hole));
  return area;
}

/**
 * Smallest axis-aligned box round every point given, or null for none.
 * @param {Iterable<Point>} points
 * @returns {{ minX: number, minY: number, maxX: number, maxY: number } | null}
 */
export function boundsOf(points) {
  let minX = Number.POSITIVE_INFINITY;
  let minY = Number.POSITIVE_INFINITY;
  let maxX = Number.NEGATIVE_INFINITY;
  let maxY = Number.NEGATIVE_INFINITY;
  for (const [x, y] of points) {
    if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
    minX = Math.min(minX, x);
    minY = Math.min(minY, y);
    maxX = Math.max(maxX, x);
    maxY = Math.max(maxY, y);
  }
  return minX <= maxX ? { minX, minY, maxX, maxY } : null;
}

/**
 * A plate outline in its own frame when the plan gives none: a bar round the pivot line, `halfWidthMm` to either side
 * and past either pivot (the pivot hole radius and ligament). The melt edge is the side at y = −halfWidthMm.
 * @param {number} lengthMm  pivot-to-pivot length
 * @param {number} halfWidthMm
 * @returns {Point[]}
 */
export function barOutline(lengthMm, halfWidthMm) {
  const e = halfWidthMm;
  return [
    [-e, -e],
    [lengthMm + e, -e],
    [lengthMm + e, e],
    [-e, e],
  ];
}
