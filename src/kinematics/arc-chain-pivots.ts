import type { Point } from '../geometry/index.js';

/**
 * Pivots p0 = a, p1, …, pN = b of a chain with the given link lengths, all on one circular arc, so the chain is
 * assembled exactly (internal helper of the chain builders). The arc's total angle θ solves
 * Σ 2·asin(Lk / 2R) = θ with R = |ab| / (2·sin(θ/2)), found by bisection; `side` +1 bulges the chain to the left of
 * a→b, −1 to the right. Throws when the chain is not longer than |ab| or cannot lie on an arc.
 */
export function arcChainPivots(lengths: readonly number[], a: Point, b: Point, side: 1 | -1): Point[] {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const span = Math.hypot(dx, dy);
  const total = lengths.reduce((s, l) => s + l, 0);
  if (!(total > span) || lengths.some((l) => !(l > 0))) {
    throw new Error(`chain of total length ${total} mm cannot span ${span} mm between its ground pivots`);
  }
  const radius = (theta: number) => span / (2 * Math.sin(theta / 2));
  const gap = (theta: number) => {
    const r = radius(theta);
    return lengths.reduce((s, l) => s + 2 * Math.asin(Math.min(1, l / (2 * r))), 0) - theta;
  };
  let lo = 1e-9;
  let hi = 2 * Math.PI - 1e-9;
  for (let it = 0; it < 200 && hi - lo > 1e-15; it++) {
    const mid = 0.5 * (lo + hi);
    if (gap(mid) > 0) lo = mid;
    else hi = mid;
  }
  const theta = 0.5 * (lo + hi);
  const r = radius(theta);
  if (lengths.some((l) => l > 2 * r * (1 + 1e-12))) {
    throw new Error('chain links cannot all lie on one arc between the ground pivots; give pivot positions instead');
  }
  const ux = dx / span;
  const uy = dy / span;
  const h = r * Math.cos(theta / 2);
  const cx = 0.5 * (a[0] + b[0]) + side * h * uy;
  const cy = 0.5 * (a[1] + b[1]) - side * h * ux;
  let psi = Math.atan2(a[1] - cy, a[0] - cx);
  const pivots: Point[] = [a];
  lengths.forEach((l, k) => {
    psi -= side * 2 * Math.asin(Math.min(1, l / (2 * r)));
    pivots.push(k === lengths.length - 1 ? b : [cx + r * Math.cos(psi), cy + r * Math.sin(psi)]);
  });
  return pivots;
}
