import type { Ring } from './types.js';

/** Length of a closed ring, mm, including the implied closing edge from the last point back to the first. */
export function ringPerimeter(ring: Ring): number {
  const n = ring.length;
  if (n < 2) return 0;
  let length = 0;
  for (let i = 0; i < n; i++) {
    const a = ring[i]!;
    const b = ring[(i + 1) % n]!;
    length += Math.hypot(b[0] - a[0], b[1] - a[1]);
  }
  return length;
}
