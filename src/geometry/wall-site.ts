import type { SegmentGrid } from './segment-grid.js';
import type { Point } from './types.js';

/**
 * A stretch of boundary from which walls are measured, with a parameter u on [lo, hi] (internal to the wall
 * measurement): the inside of a segment (u the fraction along it, normal its inward normal), or the fan of inward
 * directions at a reflex vertex (u the direction's angle, radians, the point fixed at the vertex).
 */
export interface WallSite {
  readonly kind: 'edge' | 'fan';
  /** The segment (edge) or the segment that leaves the vertex (fan), as indexed in the grid. */
  readonly segment: number;
  readonly lo: number;
  readonly hi: number;
  /** The site is first sampled at k parameters, the middles of k equal parts of [lo, hi] (`siteSample`). */
  readonly k: number;
}

/** The j-th first sample's parameter of a site (0 ≤ j < k). */
export function siteSample(site: WallSite, j: number): number {
  return site.lo + ((j + 0.5) * (site.hi - site.lo)) / site.k;
}

/** The point and inward unit normal of a site at parameter u. */
export function sitePoint(grid: SegmentGrid, site: WallSite, u: number): { at: Point; normal: Point } {
  const s = site.segment;
  if (site.kind === 'fan') return { at: [grid.ax[s]!, grid.ay[s]!], normal: [Math.cos(u), Math.sin(u)] };
  const ex = grid.bx[s]! - grid.ax[s]!;
  const ey = grid.by[s]! - grid.ay[s]!;
  const len = Math.hypot(ex, ey);
  // Material lies on the left of every normalised ring (outer CCW, holes CW).
  return { at: [grid.ax[s]! + u * ex, grid.ay[s]! + u * ey], normal: [-ey / len, ex / len] };
}

/**
 * The wall sites of a gridded, normalised region: every segment, sampled about every `spacingMm` (at least once, at
 * its middle), and every reflex vertex, its fan of inward directions sampled about every π/16. Convex vertices carry
 * no site: no disc inside the region touches the boundary only there.
 */
export function wallSites(grid: SegmentGrid, spacingMm: number): WallSite[] {
  const sites: WallSite[] = [];
  const count = grid.ax.length;
  for (let s = 0; s < count; s++) {
    const len = Math.hypot(grid.bx[s]! - grid.ax[s]!, grid.by[s]! - grid.ay[s]!);
    if (!(len > 0)) continue;
    const k = Math.max(1, Math.ceil(len / spacingMm));
    sites.push({ kind: 'edge', segment: s, lo: 0, hi: 1, k });
  }
  for (let s = 0; s < count; s++) {
    // The segment that arrives at this segment's start vertex: the previous one on the same ring.
    const prev = s > 0 && grid.ring[s - 1] === grid.ring[s] ? s - 1 : lastOfRing(grid, s);
    const ux = grid.bx[prev]! - grid.ax[prev]!;
    const uy = grid.by[prev]! - grid.ay[prev]!;
    const vx = grid.bx[s]! - grid.ax[s]!;
    const vy = grid.by[s]! - grid.ay[s]!;
    const turn = Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy);
    // A right turn (material on the left) is a reflex vertex of the material.
    if (!(turn < -1e-9)) continue;
    const a0 = Math.atan2(ux, -uy);
    const a1 = a0 + turn;
    const k = Math.max(1, Math.ceil(-turn / (Math.PI / 16)));
    sites.push({ kind: 'fan', segment: s, lo: a1, hi: a0, k });
  }
  return sites;
}

function lastOfRing(grid: SegmentGrid, s: number): number {
  let e = s;
  while (e + 1 < grid.ring.length && grid.ring[e + 1] === grid.ring[s]) e++;
  return e;
}
