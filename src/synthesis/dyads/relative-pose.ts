import type { Point } from '../../geometry/index.js';

/**
 * Where body B sits relative to body A at one station: a point p fixed in B (B's frame, mm) lies at
 * R(angleRad)·p + origin in A's frame (mm; angle counter-clockwise, radians, y up). Body A is the die body or a plate.
 */
export interface RelativePose {
  readonly angleRad: number;
  readonly origin: Point;
}

/** A point fixed in body B (B's frame, mm) at this station, in A's frame, mm. */
export function placePoint(pose: RelativePose, local: Point): Point {
  const c = Math.cos(pose.angleRad);
  const s = Math.sin(pose.angleRad);
  return [c * local[0] - s * local[1] + pose.origin[0], s * local[0] + c * local[1] + pose.origin[1]];
}

/** A point fixed in body A (A's frame, mm) at this station, in B's frame, mm: R(−angle)·(p − origin). */
export function localPoint(pose: RelativePose, p: Point): Point {
  const c = Math.cos(pose.angleRad);
  const s = Math.sin(pose.angleRad);
  const x = p[0] - pose.origin[0];
  const y = p[1] - pose.origin[1];
  return [c * x + s * y, -s * x + c * y];
}

/**
 * The kinematic inversion: the poses of A relative to B (angle −θ, origin −R(−θ)·origin). A dyad found for the
 * inverted poses has its centre in B and its circle point in A (Erdman, Sandor & Kota, *Mechanism Design*, the
 * inversion method of dyad synthesis).
 */
export function invertPoses(poses: readonly RelativePose[]): RelativePose[] {
  return poses.map((pose) => ({ angleRad: -pose.angleRad, origin: localPoint(pose, [0, 0]) }));
}

/** Throws (programmer misuse) when the pose count is out of range or a value is not finite. */
export function checkPoses(poses: readonly RelativePose[], caller: string, min: number, max = min): void {
  if (poses.length < min || poses.length > max) {
    const want = min === max ? `${min}` : max === Number.POSITIVE_INFINITY ? `at least ${min}` : `${min}…${max}`;
    throw new Error(`${caller}: expected ${want} poses, got ${poses.length}`);
  }
  poses.forEach((pose, i) => {
    if (![pose.angleRad, pose.origin[0], pose.origin[1]].every(Number.isFinite)) {
      throw new Error(`${caller}: pose ${i} is not finite`);
    }
  });
}

/** Throws (programmer misuse) when a point is not finite. */
export function checkPoint(p: Point, caller: string, name: string): void {
  if (!Number.isFinite(p[0]) || !Number.isFinite(p[1])) throw new Error(`${caller}: ${name} is not finite`);
}

/** Length scale of a pose set, mm: the largest distance of a pose origin from their centroid, at least 1. */
export function poseScale(poses: readonly RelativePose[]): { reference: Point; scaleMm: number } {
  let x = 0;
  let y = 0;
  for (const p of poses) {
    x += p.origin[0];
    y += p.origin[1];
  }
  const reference: Point = [x / poses.length, y / poses.length];
  let scaleMm = 1;
  for (const p of poses) {
    scaleMm = Math.max(scaleMm, Math.hypot(p.origin[0] - reference[0], p.origin[1] - reference[1]));
  }
  return { reference, scaleMm };
}
