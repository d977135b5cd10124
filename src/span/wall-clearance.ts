import { type Point, pointInRegion, type Region, type Ring } from '../geometry/index.js';
import { DEFAULT_TOLERANCES } from '../numeric/index.js';
import type { WallLine } from './wall-line.js';

/**
 * How far along a wall line no station's melt lies just beyond it: the first place, within `maxMm` of the line's
 * origin, where the line shifted `probeMm` outward enters any station's orifice, mm (`maxMm` when none does). One
 * pass over every station's edges, so the cost grows linearly with the stations.
 */
export function wallClearance(line: WallLine, orifices: readonly Region[], probeMm: number, maxMm: number): number {
  const start: Point = [line.origin[0] + line.outward[0] * probeMm, line.origin[1] + line.outward[1] * probeMm];
  const end: Point = [start[0] + line.along[0] * maxMm, start[1] + line.along[1] * maxMm];
  let clear = maxMm;
  for (const orifice of orifices) {
    if (pointInRegion(start, orifice, DEFAULT_TOLERANCES) === 'inside') return 0;
    for (const ring of [orifice.outer, ...orifice.holes])
      clear = Math.min(clear, firstCrossing(start, end, ring) * maxMm);
  }
  return clear;
}

/** Parameter in [0, 1] along a→b of the first crossing with the ring's edges; 1 when there is none. */
function firstCrossing(a: Point, b: Point, ring: Ring): number {
  const rx = b[0] - a[0];
  const ry = b[1] - a[1];
  let first = 1;
  for (let i = 0; i < ring.length; i++) {
    const p = ring[i]!;
    const q = ring[(i + 1) % ring.length]!;
    const wx = q[0] - p[0];
    const wy = q[1] - p[1];
    const denom = rx * wy - ry * wx;
    // parallel edges cannot be entered through their side; the ends of the neighbouring edges catch the corner
    if (Math.abs(denom) <= 1e-12 * Math.hypot(rx, ry) * Math.hypot(wx, wy)) continue;
    const t = ((p[0] - a[0]) * wy - (p[1] - a[1]) * wx) / denom;
    const s = ((p[0] - a[0]) * ry - (p[1] - a[1]) * rx) / denom;
    if (t >= 0 && t <= first && s >= 0 && s <= 1) first = t;
  }
  return first;
}
