/**
 * Stations made from a known chain with the die model of docs/MODEL.md §2, computed here independently of src/: the
 * melt edge is the pivot polyline swollen by e (a capsule of radius e round every plate), the orifice is the channel
 * below it. The chain's last two angles close it onto the end pivot by two-link inverse kinematics (law of cosines).
 */
export type P = [number, number];

export interface KnownChain {
  readonly lengths: number[];
  readonly start: P;
  readonly end: P;
  /** pivots[i][k] per station. */
  readonly pivots: P[][];
}

/** Closes a chain: angles of all but the last two plates given, the last two solved so the chain ends at `end`. */
export function closeChain(lengths: number[], start: P, end: P, freeAngles: number[], elbowUp: boolean): P[] {
  const pts: P[] = [start];
  let p = start;
  for (let k = 0; k < freeAngles.length; k++) {
    p = [p[0] + lengths[k]! * Math.cos(freeAngles[k]!), p[1] + lengths[k]! * Math.sin(freeAngles[k]!)];
    pts.push(p);
  }
  const a = lengths[lengths.length - 2]!;
  const b = lengths[lengths.length - 1]!;
  const dx = end[0] - p[0];
  const dy = end[1] - p[1];
  const d = Math.hypot(dx, dy);
  if (d > a + b || d < Math.abs(a - b)) throw new Error('known chain cannot close');
  // angle at p between p→end and the first of the two plates, law of cosines
  const alpha = Math.acos((a * a + d * d - b * b) / (2 * a * d));
  const base = Math.atan2(dy, dx);
  const th = elbowUp ? base + alpha : base - alpha;
  const q: P = [p[0] + a * Math.cos(th), p[1] + a * Math.sin(th)];
  pts.push(q, end);
  return pts;
}

/** Lowest point of the chain swollen by e above x (the melt edge), or +∞ when x is outside every capsule. */
export function meltEdgeY(pivots: readonly P[], e: number, x: number): number {
  let y = Number.POSITIVE_INFINITY;
  for (const c of pivots) {
    const dx = x - c[0];
    if (Math.abs(dx) <= e) y = Math.min(y, c[1] - Math.sqrt(e * e - dx * dx));
  }
  for (let k = 0; k + 1 < pivots.length; k++) {
    const a = pivots[k]!;
    const b = pivots[k + 1]!;
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    const ux = (b[0] - a[0]) / len;
    const uy = (b[1] - a[1]) / len;
    // the lower offset edge of the plate (normal pointing down for a plate running left to right)
    const nx = ux >= 0 ? uy : -uy;
    const ny = ux >= 0 ? -ux : ux;
    const ax = a[0] + e * nx;
    const bx = b[0] + e * nx;
    const lo = Math.min(ax, bx);
    const hi = Math.max(ax, bx);
    if (x < lo || x > hi || hi - lo < 1e-12) continue;
    const t = (x - ax) / (bx - ax);
    y = Math.min(y, a[1] + e * ny + t * (b[1] - a[1]));
  }
  return y;
}

/** The orifice under the melt edge in a channel 0 ≤ x ≤ width with a flat floor at y = 0, sampled every `step` mm. */
export function channelOrifice(
  pivots: readonly P[],
  e: number,
  width: number,
  step: number,
): { outer: P[]; holes: P[][] } {
  const top: P[] = [];
  const n = Math.round(width / step);
  for (let k = n; k >= 0; k--) {
    const x = (width * k) / n;
    top.push([x, meltEdgeY(pivots, e, x)]);
  }
  return { outer: [[0, 0], [width, 0], ...top], holes: [] };
}
