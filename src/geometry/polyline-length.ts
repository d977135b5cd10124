import type { Polyline } from './types.js';

/**
 * Length of a polyline, mm: the sum of its segment lengths. With `closed` the closing segment from the last point back
 * to the first counts too (the perimeter of a ring).
 *
 * @param closed Treat the polyline as a ring. @default false
 */
export function polylineLength(polyline: Polyline, closed = false): number {
  const n = polyline.length;
  let length = 0;
  for (let i = 1; i < n; i++) {
    const a = polyline[i - 1]!;
    const b = polyline[i]!;
    length += Math.hypot(b[0] - a[0], b[1] - a[1]);
  }
  if (closed && n > 2) {
    const a = polyline[n - 1]!;
    const b = polyline[0]!;
    length += Math.hypot(b[0] - a[0], b[1] - a[1]);
  }
  return length;
}
