import type { Point, Polyline } from './types.js';

/**
 * `count` points spaced equally by arc length along a polyline, mm (linear interpolation along its segments).
 *
 * Open polyline: the first and last points are kept, spacing length/(count − 1). Ring (`closed`): the points start at
 * vertex 0 and go once round with spacing perimeter/count, without repeating the first point, so the result is again
 * a ring. Corners between samples are cut, so the result is shorter than the input by up to the sagitta of each cut.
 *
 * @param closed Treat the polyline as a ring. @default false
 * @throws RangeError when `count` is not an integer ≥ 2 (≥ 3 for a ring) or the polyline has no length.
 */
export function resampleByArcLength(polyline: Polyline, count: number, closed = false): Point[] {
  const minCount = closed ? 3 : 2;
  if (!Number.isInteger(count) || count < minCount) {
    throw new RangeError(`resampleByArcLength: count must be an integer of at least ${minCount}`);
  }
  const n = polyline.length;
  const segments = closed && n > 2 ? n : n - 1;
  let total = 0;
  const lengths: number[] = [];
  for (let i = 0; i < segments; i++) {
    const a = polyline[i]!;
    const b = polyline[(i + 1) % n]!;
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    lengths.push(len);
    total += len;
  }
  if (!(total > 0)) throw new RangeError('resampleByArcLength: the polyline has no length');
  const step = total / (closed ? count : count - 1);
  const out: Point[] = [];
  let seg = 0;
  let segStart = 0;
  for (let k = 0; k < count; k++) {
    const s = k * step;
    while (seg < segments - 1 && segStart + lengths[seg]! <= s) {
      segStart += lengths[seg]!;
      seg++;
    }
    const a = polyline[seg]!;
    const b = polyline[(seg + 1) % n]!;
    const len = lengths[seg]!;
    const t = len > 0 ? Math.min((s - segStart) / len, 1) : 0;
    out.push([a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])]);
  }
  // Put the last point of an open polyline exactly on its end, free of accumulated round-off.
  if (!closed) out[count - 1] = polyline[n - 1]!;
  return out;
}
