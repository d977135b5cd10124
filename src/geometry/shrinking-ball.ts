import { nearestBoundaryPoint } from './nearest-boundary-point.js';
import type { SegmentGrid } from './segment-grid.js';
import type { Point } from './types.js';

/** The largest disc inside a region that touches its boundary at a given point. */
export interface BoundaryBall {
  /** The boundary point it touches by construction, mm. */
  readonly at: Point;
  /** Radius, mm. */
  readonly radius: number;
  /** Centre, mm: the touching point plus `radius` along the inward normal. */
  readonly center: Point;
  /** Another boundary point on the disc's rim, mm (the one that stopped it growing). */
  readonly contact: Point;
  /** Iterations taken. */
  readonly iterations: number;
}

/**
 * The largest disc inside a region that touches the boundary at `p` with inward unit normal `normal`, starting from a
 * disc of radius `startRadius` that is known to be at least as large (e.g. half the chord along the normal), mm.
 *
 * Method: the shrinking-ball iteration of Ma, Bae & Amenta ("3D medial axis point approximation using nearest neighbors
 * and the normal field", The Visual Computer 28, 2012), here in the plane and against segments rather than points:
 * while the boundary point q nearest the centre lies inside the disc, replace the disc by the one tangent at p through
 * q, of radius |p − q|² / (2 n·(q − p)). Each step shrinks the disc; it stops when no boundary point is closer to the
 * centre than the radius less `toleranceMm`. The disc is a maximal (medial) disc of the region (Blum, "A transformation
 * for extracting new descriptors of shape", 1967).
 */
export function shrinkingBall(
  grid: SegmentGrid,
  p: Point,
  normal: Point,
  startRadius: number,
  toleranceMm: number,
): BoundaryBall {
  let r = startRadius;
  let contact: Point = [p[0] + 2 * r * normal[0], p[1] + 2 * r * normal[1]];
  let iterations = 0;
  for (; iterations < 64; iterations++) {
    const c: Point = [p[0] + r * normal[0], p[1] + r * normal[1]];
    const near = nearestBoundaryPoint(grid, c);
    if (near.distance >= r - toleranceMm) break;
    const qx = near.point[0] - p[0];
    const qy = near.point[1] - p[1];
    const along = qx * normal[0] + qy * normal[1];
    if (!(along > 0)) {
      // A boundary point at p itself or behind it: the disc cannot grow at all here.
      r = 0;
      contact = near.point;
      break;
    }
    const next = (qx * qx + qy * qy) / (2 * along);
    contact = near.point;
    if (!(next < r)) break;
    r = next;
  }
  return { at: p, radius: r, center: [p[0] + r * normal[0], p[1] + r * normal[1]], contact, iterations };
}
