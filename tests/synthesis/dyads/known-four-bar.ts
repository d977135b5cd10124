/**
 * Coupler poses of a known four-bar, computed here independently of src/ by circle intersection: ground pivots A0, B0,
 * crank a = |A0A|, coupler b = |AB|, rocker c = |B0B| (Norton, *Design of Machinery*, Ex. 4-1 proportions a, b, c =
 * 40, 120, 80 with the ground tilted and moved). The coupler frame is placed off the pivots on purpose, so the moving
 * pivots have nontrivial local coordinates.
 */
export type P = [number, number];

export interface PoseLike {
  angleRad: number;
  origin: readonly [number, number];
}

export const A0: P = [12, -7];
export const B0: P = [108, 18];
export const CRANK = 40;
export const COUPLER = 120;
export const ROCKER = 80;
/** Moving pivot A in the coupler frame, mm. */
export const A_LOCAL: P = [-15, 8];
/** Frame angle minus the angle of A→B, rad. */
const DELTA = 0.4;
/** Moving pivot B in the coupler frame: A_LOCAL + R(−δ)(b, 0), mm. */
export const B_LOCAL: P = [A_LOCAL[0] + COUPLER * Math.cos(-DELTA), A_LOCAL[1] + COUPLER * Math.sin(-DELTA)];

/** Rotates v by angle (counter-clockwise) and adds o. */
export function place(pose: PoseLike, v: readonly [number, number]): P {
  const c = Math.cos(pose.angleRad);
  const s = Math.sin(pose.angleRad);
  return [c * v[0] - s * v[1] + pose.origin[0], s * v[0] + c * v[1] + pose.origin[1]];
}

/** Intersection of circle (p, rp) and circle (q, rq) to the left of p→q (the open circuit here). */
export function circleMeet(p: P, rp: number, q: P, rq: number): P {
  const dx = q[0] - p[0];
  const dy = q[1] - p[1];
  const d = Math.hypot(dx, dy);
  const along = (rp * rp - rq * rq + d * d) / (2 * d);
  const h = Math.sqrt(rp * rp - along * along);
  if (!Number.isFinite(h)) throw new Error('four-bar does not assemble');
  return [p[0] + (along * dx - h * dy) / d, p[1] + (along * dy + h * dx) / d];
}

/** Coupler pose (relative to the ground) at crank angle θ2 (degrees, from the x-axis). */
export function couplerPose(theta2Deg: number): PoseLike {
  const t = (theta2Deg * Math.PI) / 180;
  const a: P = [A0[0] + CRANK * Math.cos(t), A0[1] + CRANK * Math.sin(t)];
  const b = circleMeet(a, COUPLER, B0, ROCKER);
  const angleRad = Math.atan2(b[1] - a[1], b[0] - a[0]) + DELTA;
  const r = place({ angleRad, origin: [0, 0] }, A_LOCAL);
  return { angleRad, origin: [a[0] - r[0], a[1] - r[1]] };
}

export function couplerPoses(theta2Deg: readonly number[]): PoseLike[] {
  return theta2Deg.map(couplerPose);
}

export function dist(p: readonly [number, number], q: readonly [number, number]): number {
  return Math.hypot(p[0] - q[0], p[1] - q[1]);
}

/** max |distance − mean| of a link (centre in the ground, circle point in the coupler) over the poses, mm. */
export function linkSpread(
  poses: readonly PoseLike[],
  centre: readonly [number, number],
  local: readonly [number, number],
): number {
  const d = poses.map((pose) => dist(place(pose, local), centre));
  const mean = d.reduce((s, v) => s + v, 0) / d.length;
  return Math.max(...d.map((v) => Math.abs(v - mean)));
}

/** Circumcentre of three points by the absolute-coordinate formula (intersection of perpendicular bisectors). */
export function circumcentre(a: P, b: P, c: P): P {
  const d = 2 * (a[0] * (b[1] - c[1]) + b[0] * (c[1] - a[1]) + c[0] * (a[1] - b[1]));
  const a2 = a[0] * a[0] + a[1] * a[1];
  const b2 = b[0] * b[0] + b[1] * b[1];
  const c2 = c[0] * c[0] + c[1] * c[1];
  return [
    (a2 * (b[1] - c[1]) + b2 * (c[1] - a[1]) + c2 * (a[1] - b[1])) / d,
    (a2 * (c[0] - b[0]) + b2 * (a[0] - c[0]) + c2 * (b[0] - a[0])) / d,
  ];
}
