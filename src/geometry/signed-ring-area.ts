import type { Ring } from './types.js';

/**
 * Signed area of a ring by the shoelace formula (Gauss's area formula), mm².
 *
 * Positive for counter-clockwise rings with y up (as in DXF), negative for clockwise ones, zero for fewer than three
 * points. The closing edge from the last point back to the first is implied. Coordinates are taken relative to the
 * first point so that parts far from the origin keep their precision.
 */
export function signedRingArea(ring: Ring): number {
  const n = ring.length;
  if (n < 3) return 0;
  const [ox, oy] = ring[0]!;
  let twice = 0;
  let [px, py] = [0, 0];
  for (let i = 1; i < n; i++) {
    const [x, y] = ring[i]!;
    const qx = x - ox;
    const qy = y - oy;
    twice += px * qy - qx * py;
    px = qx;
    py = qy;
  }
  // The closing edge ends at the origin of the shifted frame, so it adds nothing.
  return twice / 2;
}
