import {
  discreteCurvature,
  type Point,
  type Polyline,
  polylineLength,
  resampleByArcLength,
} from '../geometry/index.js';
import type { MovingSpan } from '../span/index.js';

/** What the chain fit aims at in one station. Millimetres, die-body frame. */
export interface PivotTarget {
  readonly station: number;
  /** The moving span resampled by arc length, walked clockwise (melt on the right, plates on the left). */
  readonly span: Polyline;
  /** Span length, mm. */
  readonly spanLengthMm: number;
  /**
   * The pivot line: the span offset by `e` to the plate side, extended straight past both ends by `extensionMm` along
   * the end tangents (into the die body, where the end pivots sit).
   */
  readonly pivotLine: Polyline;
  /** Signed curvature of the resampled span at each point, 1/mm (circle through neighbours; + for left turns). */
  readonly curvature: readonly number[];
  /** Unit tangents of the span at its start and end, in the walking direction. */
  readonly startTangent: Point;
  readonly endTangent: Point;
}

/**
 * Targets for the chain fit (docs/MODEL.md §2): a pivot pin needs a hole and steel round it, so the pivot line runs at
 * e = hole radius + ligament behind the orifice edge, and the plates' melt edge is the pivot polyline swollen by e.
 * Each span is resampled every `spacingMm` and offset by e to the left of travel (the plate side); where a concave
 * bend is tighter than e the offset would fold over itself, so folded stretches are cut out.
 */
export function preparePivotTargets(
  spans: readonly MovingSpan[],
  offsetMm: number,
  extensionMm: number,
  spacingMm: number,
): PivotTarget[] {
  return spans.map((span, station) => {
    const length = polylineLength(span.path);
    const count = Math.max(8, Math.ceil(length / spacingMm) + 1);
    const resampled = resampleByArcLength(span.path, count);
    const startTangent = unit(sub(resampled[1]!, resampled[0]!));
    const endTangent = unit(sub(resampled[count - 1]!, resampled[count - 2]!));
    const offset = removeFolds(offsetLeft(resampled, offsetMm));
    const first = offset[0]!;
    const last = offset[offset.length - 1]!;
    const pivotLine = [
      [first[0] - startTangent[0] * extensionMm, first[1] - startTangent[1] * extensionMm] as Point,
      ...offset,
      [last[0] + endTangent[0] * extensionMm, last[1] + endTangent[1] * extensionMm] as Point,
    ];
    const curvature = discreteCurvature(resampled);
    return { station, span: resampled, spanLengthMm: length, pivotLine, curvature, startTangent, endTangent };
  });
}

/** Offsets a polyline by d to the left of travel along the vertex bisectors (mitre, limited to 4·d). */
function offsetLeft(points: readonly Point[], d: number): Point[] {
  const n = points.length;
  return points.map((p, i) => {
    const tIn = i > 0 ? unit(sub(p, points[i - 1]!)) : null;
    const tOut = i < n - 1 ? unit(sub(points[i + 1]!, p)) : null;
    const nIn = tIn ? left(tIn) : null;
    const nOut = tOut ? left(tOut) : null;
    if (!nIn) return add(p, scale(nOut!, d));
    if (!nOut) return add(p, scale(nIn, d));
    const bis = unit(add(nIn, nOut));
    const cosHalf = bis[0] * nIn[0] + bis[1] * nIn[1];
    return add(p, scale(bis, d / Math.max(cosHalf, 0.25)));
  });
}

/**
 * Cuts loops out of an offset polyline: where segment i crosses a later segment j, the points between are dropped and
 * the crossing point kept. Quadratic, fine for the few hundred points of a span.
 */
function removeFolds(points: Point[]): Point[] {
  const out: Point[] = [...points];
  for (let i = 0; i < out.length - 1; i++) {
    for (let j = out.length - 2; j > i + 1; j--) {
      const x = segmentCrossing(out[i]!, out[i + 1]!, out[j]!, out[j + 1]!);
      if (x) {
        out.splice(i + 1, j - i, x);
        break;
      }
    }
  }
  return out;
}

function segmentCrossing(a: Point, b: Point, c: Point, d: Point): Point | null {
  const r = sub(b, a);
  const s = sub(d, c);
  const denom = r[0] * s[1] - r[1] * s[0];
  if (Math.abs(denom) < 1e-12) return null;
  const ac = sub(c, a);
  const t = (ac[0] * s[1] - ac[1] * s[0]) / denom;
  const u = (ac[0] * r[1] - ac[1] * r[0]) / denom;
  if (t <= 0 || t >= 1 || u <= 0 || u >= 1) return null;
  return [a[0] + t * r[0], a[1] + t * r[1]];
}

const sub = (a: Point, b: Point): Point => [a[0] - b[0], a[1] - b[1]];
const add = (a: Point, b: Point): Point => [a[0] + b[0], a[1] + b[1]];
const scale = (a: Point, k: number): Point => [a[0] * k, a[1] * k];
const left = (t: Point): Point => [-t[1], t[0]];
function unit(v: Point): Point {
  const l = Math.hypot(v[0], v[1]);
  return l > 0 ? [v[0] / l, v[1] / l] : [1, 0];
}
