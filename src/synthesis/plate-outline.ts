import type { Point, Region, Ring } from '../geometry/index.js';

/** Plate dimensions in the plate's own terms, mm. */
export interface PlateShape {
  /** Distance from the pivot line to the melt edge, e = hole radius + ligament. */
  readonly edgeOffsetMm: number;
  /** Depth of the plate from its melt edge away from the melt. */
  readonly depthMm: number;
  readonly holeRadiusMm: number;
  /** Largest gap between a true arc and its chords, mm. */
  readonly arcToleranceMm: number;
}

/**
 * Outline of a straight plate between pivots `a` and `b` (die-body frame, mm): its melt edge runs parallel to a→b at
 * e on the right (the melt side of a span walked clockwise), with ends that are arcs of radius e centred on the
 * pivots, so neighbouring plates seal against each other at any relative angle (DOMAIN.md §2); the body extends to
 * `depthMm` from the melt edge on the left; two pivot holes. Outer ring counter-clockwise, holes clockwise.
 *
 * @param edge a shaped melt edge in the plate frame (see `shapePlateEdges`); null for the straight edge at e.
 */
export function plateOutline(a: Point, b: Point, shape: PlateShape, edge: readonly Point[] | null = null): Region {
  const e = shape.edgeOffsetMm;
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len = Math.hypot(dx, dy);
  const u: Point = len > 0 ? [dx / len, dy / len] : [1, 0];
  const left: Point = [-u[1], u[0]];
  const back = Math.max(shape.depthMm - e, e);
  const angleLeft = Math.atan2(left[1], left[0]);
  const outer: Point[] = [];
  // around b from the left normal, through forward, to the right normal (clockwise in angle = −π)
  outer.push(...arc(b, e, angleLeft, angleLeft - Math.PI, shape.arcToleranceMm));
  // a shaped melt edge, given in the plate frame (s along a→b, d toward the body), from b's end back to a's
  if (edge) {
    for (let j = edge.length - 1; j >= 0; j--) {
      const [s, d] = edge[j]!;
      outer.push([a[0] + u[0] * s + left[0] * d, a[1] + u[1] * s + left[1] * d]);
    }
  }
  // around a from the right normal, through backward, to the left normal
  outer.push(...arc(a, e, angleLeft - Math.PI, angleLeft - 2 * Math.PI, shape.arcToleranceMm));
  outer.push([a[0] + left[0] * back, a[1] + left[1] * back]);
  outer.push([b[0] + left[0] * back, b[1] + left[1] * back]);
  // that ring runs clockwise; reverse to counter-clockwise
  outer.reverse();
  return {
    outer,
    holes: [circle(a, shape.holeRadiusMm, shape.arcToleranceMm), circle(b, shape.holeRadiusMm, shape.arcToleranceMm)],
  };
}

/** Points on an arc from angle `from` to `to` (either direction), both ends included, chord error ≤ tol. */
function arc(c: Point, r: number, from: number, to: number, tol: number): Point[] {
  const steps = arcSteps(r, Math.abs(to - from), tol);
  const out: Point[] = [];
  for (let k = 0; k <= steps; k++) {
    const t = from + ((to - from) * k) / steps;
    out.push([c[0] + r * Math.cos(t), c[1] + r * Math.sin(t)]);
  }
  return out;
}

/** A clockwise circle (a hole), chord error ≤ tol. */
function circle(c: Point, r: number, tol: number): Ring {
  const steps = Math.max(8, arcSteps(r, 2 * Math.PI, tol));
  const out: Point[] = [];
  for (let k = 0; k < steps; k++) {
    const t = (-2 * Math.PI * k) / steps;
    out.push([c[0] + r * Math.cos(t), c[1] + r * Math.sin(t)]);
  }
  return out;
}

/** Chords needed so that r(1 − cos(Δ/2)) ≤ tol (sagitta of each chord). */
function arcSteps(r: number, sweep: number, tol: number): number {
  const maxStep = 2 * Math.acos(Math.max(-1, Math.min(1, 1 - tol / r)));
  return Math.max(2, Math.ceil(sweep / Math.max(maxStep, 1e-3)));
}
