import type { Point } from '../geometry/index.js';
import { pointAtArc, type RingWalk } from './ring-walk.js';

/** A straight die-body wall at one end of a span, the line the span's end may slide along. Die-body frame, mm. */
export interface WallLine {
  /** The span end the line was taken at, mm. */
  readonly origin: Point;
  /** Unit vector along the wall, pointing from the die body into the span. */
  readonly along: readonly [number, number];
  /** Unit normal pointing away from the melt (out of the orifice). */
  readonly outward: readonly [number, number];
}

/**
 * The straight wall a span end sits on: the boundary over the last max-1-mm (perimeter/100 if shorter) of die body
 * behind the end, when it is straight within `tolMm`; null at a corner or a curve. `dir` is +1 for the end where the
 * span leaves the die body counter-clockwise, −1 for the other end.
 */
export function wallLineAt(walk: RingWalk, s0: number, dir: 1 | -1, tolMm: number): WallLine | null {
  const back = Math.min(1.0, walk.perimeterMm / 100);
  const p0 = pointAtArc(walk, s0);
  const q = pointAtArc(walk, s0 - dir * back);
  const dx = p0[0] - q[0];
  const dy = p0[1] - q[1];
  const len = Math.hypot(dx, dy);
  if (len < tolMm) return null;
  const ux = dx / len;
  const uy = dy / len;
  const mid = pointAtArc(walk, s0 - (dir * back) / 2);
  if (Math.abs((mid[0] - q[0]) * uy - (mid[1] - q[1]) * ux) > tolMm) return null;
  // a CCW ring has the melt on the left of travel; walking it backwards (dir −1) flips the side
  return { origin: p0, along: [ux, uy], outward: [dir * uy, -dir * ux] };
}
