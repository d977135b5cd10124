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
 * pivots, so neighbouring plates seal against each other at any relative angle (docs/MODEL.md §2); on the body side
 * each end may fan round its pivot to the full depth (`fans`, radians from the body-side normal toward the plate's own
 * axis; see `pivotFans`), so that where the chain bends away from the body, neighbours on alternate layers still
 * overlap behind the pivot and no wedge of die opening opens between them; two pivot holes. Outer ring
 * counter-clockwise, holes clockwise.
 *
 * @param edge a shaped melt edge in the plate frame (see `shapePlateEdges`); null for the straight edge at e.
 */
export function plateOutline(
  a: Point,
  b: Point,
  shape: PlateShape,
  edge: readonly Point[] | null = null,
  fans: { readonly atA: number; readonly atB: number } = { atA: 0, atB: 0 },
): Region {
  const e = shape.edgeOffsetMm;
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len = Math.hypot(dx, dy);
  const u: Point = len > 0 ? [dx / len, dy / len] : [1, 0];
  const left: Point = [-u[1], u[0]];
  const back = Math.max(shape.depthMm - e, e);
  const forward = Math.atan2(u[1], u[0]);
  const tol = shape.arcToleranceMm;
  const outer: Point[] = [];
  // counter-clockwise from the melt side: the round end of radius e round b from the right normal past forward to
  // the fan angle, out to the body radius, round to the left normal; the back edge; the same round a in mirror
  outer.push(...arc(b, e, forward - Math.PI / 2, forward + Math.PI / 2 - fans.atB, tol));
  if (fans.atB > 0) outer.push(...arc(b, back, forward + Math.PI / 2 - fans.atB, forward + Math.PI / 2, tol));
  else outer.push([b[0] + left[0] * back, b[1] + left[1] * back]);
  if (fans.atA > 0) outer.push(...arc(a, back, forward + Math.PI / 2, forward + Math.PI / 2 + fans.atA, tol));
  else outer.push([a[0] + left[0] * back, a[1] + left[1] * back]);
  outer.push(...arc(a, e, forward + Math.PI / 2 + fans.atA, forward + (3 * Math.PI) / 2, tol));
  // a shaped melt edge, given in the plate frame (s along a→b, d toward the body), from a's end to b's
  if (edge) {
    for (const [along, d] of edge) outer.push([a[0] + u[0] * along + left[0] * d, a[1] + u[1] * along + left[1] * d]);
  }
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

/**
 * How far the plate bodies must fan round each pivot (radians, one per pivot): the largest bend away from the body
 * side (a right turn, walking the chain) over all stations, so the wedge between neighbours stays covered; never so
 * far that the fan reaches past the next plate's melt edge on a bend toward the body (fan + left turn < 90°).
 *
 * @param pivots pivots[i][k] at station i
 */
export function pivotFans(pivots: readonly (readonly Point[])[]): number[] {
  const count = pivots[0]?.length ?? 0;
  const fans: number[] = new Array(count).fill(0);
  for (let k = 1; k + 1 < count; k++) {
    let right = 0;
    let left = 0;
    for (const p of pivots) {
      const a = p[k - 1]!;
      const b = p[k]!;
      const c = p[k + 1]!;
      const turn = Math.atan2(
        (b[0] - a[0]) * (c[1] - b[1]) - (b[1] - a[1]) * (c[0] - b[0]),
        (b[0] - a[0]) * (c[0] - b[0]) + (b[1] - a[1]) * (c[1] - b[1]),
      );
      right = Math.max(right, -turn);
      left = Math.max(left, turn);
    }
    fans[k] = Math.max(0, Math.min(right + FAN_MARGIN_RAD, Math.PI / 2 - left - FAN_MARGIN_RAD));
  }
  return fans;
}

/** Extra fan beyond the largest bend, radians (5°). */
const FAN_MARGIN_RAD = Math.PI / 36;
