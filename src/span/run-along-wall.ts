import { edgeAt, pointAtArc, type RingWalk, wrapArc } from './ring-walk.js';
import type { WallLine } from './wall-line.js';

/**
 * How far a station's boundary continues on a wall line past arc length `s0`, walking `dir` (+1 counter-clockwise),
 * at most `availableMm`: vertex by vertex while each vertex lies within `tolMm` of the line and further along it, mm.
 * The edges between such vertices are straight, so the boundary is on the line between them too.
 */
export function runAlongWall(
  walk: RingWalk,
  s0: number,
  dir: 1 | -1,
  line: WallLine,
  availableMm: number,
  tolMm: number,
): number {
  const n = walk.ring.length;
  const [ux, uy] = line.along;
  const [ox, oy] = line.origin;
  const onLine = (p: readonly [number, number], lastAlong: number): { ok: boolean; along: number } => {
    const along = (p[0] - ox) * ux + (p[1] - oy) * uy;
    const across = (p[0] - ox) * uy - (p[1] - oy) * ux;
    return { ok: Math.abs(across) <= tolMm && along > lastAlong, along };
  };
  let reached = 0;
  let lastAlong = Number.NEGATIVE_INFINITY;
  const startEdge = edgeAt(walk, s0);
  for (let step = 0; step < n; step++) {
    const index = (((dir > 0 ? startEdge + 1 + step : startEdge - step) % n) + n) % n;
    const v = walk.cumulative[index]!;
    const d = dir > 0 ? wrapArc(walk, v - s0) : wrapArc(walk, s0 - v);
    if (d < tolMm / 1000) continue;
    if (d >= availableMm) return onLine(pointAtArc(walk, s0 + dir * availableMm), lastAlong).ok ? availableMm : reached;
    const probe = onLine(walk.ring[index]!, lastAlong);
    if (!probe.ok) return reached;
    reached = d;
    lastAlong = probe.along;
  }
  return reached;
}
