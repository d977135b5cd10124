import { signedRingArea } from './signed-ring-area.js';
import type { Ring } from './types.js';

/** Turning sense of a ring with y up: `ccw` (counter-clockwise, positive area) or `cw`. */
export type RingOrientation = 'ccw' | 'cw';

/**
 * The ring traversed in the requested sense (y up): the same array when it already runs that way, otherwise its
 * reverse, starting from the same first point. Rings with no area (fewer than three points, or all on a line) are
 * returned unchanged.
 */
export function orientRing(ring: Ring, orientation: RingOrientation): Ring {
  const area = signedRingArea(ring);
  const wantPositive = orientation === 'ccw';
  if (area > 0 === wantPositive || !(Math.abs(area) > 0)) return ring;
  const first = ring[0]!;
  const reversed = [first];
  for (let i = ring.length - 1; i > 0; i--) reversed.push(ring[i]!);
  return reversed;
}
