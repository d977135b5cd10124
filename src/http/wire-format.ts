import type { Point } from '../geometry/index.js';

/**
 * Numbers on the wire are rounded once, here: lengths to 0.1 µm, ratios to 6 significant digits, so the same input
 * gives byte-identical responses and files.
 */
export function roundTo(x: number, decimals: number): number {
  if (!Number.isFinite(x)) return x;
  const f = 10 ** decimals;
  const r = Math.round(x * f) / f;
  return Object.is(r, -0) ? 0 : r;
}

/** Length in mm, rounded to 0.1 µm. */
export const mm = (x: number): number => roundTo(x, 4);

/** A point in mm, rounded. */
export const pointMm = (p: Point): [number, number] => [mm(p[0]), mm(p[1])];

/** A dimensionless ratio or a figure in any unit, six significant digits. */
export function sig(x: number, digits = 6): number {
  if (!Number.isFinite(x) || x === 0) return x;
  const magnitude = Math.floor(Math.log10(Math.abs(x)));
  return roundTo(x, Math.max(0, digits - 1 - magnitude));
}
