/** The one place where degrees become radians and back. */
export const RAD_PER_DEG = Math.PI / 180;

/** Degrees → radians. */
export function toRadians(deg: number): number {
  return deg * RAD_PER_DEG;
}

/** Radians → degrees. */
export function toDegrees(rad: number): number {
  return rad / RAD_PER_DEG;
}

/** Wraps an angle into (−π, π], radians. */
export function wrapAngle(rad: number): number {
  const twoPi = 2 * Math.PI;
  let a = rad % twoPi;
  if (a <= -Math.PI) a += twoPi;
  if (a > Math.PI) a -= twoPi;
  return a;
}

/** `acos` with its argument clamped to [−1, 1], so round-off never gives NaN. */
export function safeAcos(x: number): number {
  return Math.acos(Math.min(1, Math.max(-1, x)));
}
