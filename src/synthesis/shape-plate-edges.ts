import type { Point } from '../geometry/index.js';
import { nearestPlate } from './nearest-plate.js';
import type { PlateChain } from './plate-chain.js';

/**
 * A plate's melt edge in its own frame: points (s, d), s along the plate from its first pivot (mm), d across it (mm,
 * positive toward the plate body, so the straight edge is d = −e). Runs from s = 0 to s = L with d = −e at both
 * ends, where it meets the round ends.
 */
export type EdgeProfile = readonly Point[];

export interface EdgeShapeOptions {
  /** e, mm. */
  readonly edgeOffsetMm: number;
  /** The edge stays at least this far on the melt side of the pivot line, mm (steel between pivot line and melt). */
  readonly ligamentMm: number;
  /** Spacing of the profile points along the plate, mm. @default 0.25 */
  readonly spacingMm?: number;
}

/**
 * Shaped edges common to all stations (docs/MODEL.md §2): for every plate, the pieces of each station's span that the
 * plate forms are carried into the plate's own frame and averaged; the mean becomes the plate's edge, blended into
 * the round ends over min(e, L/3) at each end so that neighbours still seal at any angle. Where stations share
 * curvature the edge follows it exactly, and what is left is how much the stations differ locally. A plate that no
 * station's span touches keeps its straight edge (null).
 *
 * @param samples span samples per station (mm, die-body frame), as fitted
 */
export function shapePlateEdges(
  chain: PlateChain,
  samples: readonly (readonly Point[])[],
  options: EdgeShapeOptions,
): (EdgeProfile | null)[] {
  const e = options.edgeOffsetMm;
  const spacing = options.spacingMm ?? 0.25;
  const n = chain.lengthsMm.length;
  // per plate, per station: (s as a fraction of the plate's length at that station, d) pairs
  const pieces: { t: number; d: number }[][][] = Array.from({ length: n }, () => samples.map(() => []));
  chain.pivots.forEach((pivots, i) => {
    for (const q of samples[i]!) {
      const { plate, t: bestT } = nearestPlate(q, pivots);
      // only points that face the plate's edge (not its round ends) shape it
      if (bestT <= 0 || bestT >= 1) continue;
      const a = pivots[plate]!;
      const b = pivots[plate + 1]!;
      const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
      const left: Point = [-(b[1] - a[1]) / len, (b[0] - a[0]) / len];
      const d = (q[0] - a[0]) * left[0] + (q[1] - a[1]) * left[1];
      pieces[plate]![i]!.push({ t: bestT, d });
    }
  });

  return pieces.map((byStation, k) => {
    const covered = byStation.filter((p) => p.length >= 2).map((p) => [...p].sort((x, y) => x.t - y.t));
    if (covered.length === 0) return null;
    const length = chain.lengthsMm[k]!;
    const steps = Math.max(8, Math.ceil(length / spacing));
    const blend = Math.min(e, length / 3) / length;
    const profile: Point[] = [];
    for (let j = 0; j <= steps; j++) {
      const t = j / steps;
      let sum = 0;
      let count = 0;
      for (const piece of covered) {
        const d = interpolate(piece, t);
        if (d !== null) {
          sum += d;
          count++;
        }
      }
      const target = count > 0 ? sum / count : -e;
      const w = smoothstep(Math.min(t, 1 - t) / blend);
      const d = Math.min(-options.ligamentMm, -e + w * (target + e));
      profile.push([t * length, d]);
    }
    return profile;
  });
}

/** Linear interpolation of d at t within the piece's covered range, or null outside it. */
function interpolate(piece: readonly { t: number; d: number }[], t: number): number | null {
  if (t < piece[0]!.t || t > piece[piece.length - 1]!.t) return null;
  let lo = 0;
  let hi = piece.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (piece[mid]!.t <= t) lo = mid;
    else hi = mid;
  }
  const a = piece[lo]!;
  const b = piece[hi]!;
  return b.t > a.t ? a.d + ((t - a.t) / (b.t - a.t)) * (b.d - a.d) : a.d;
}

/** 0 at x ≤ 0, 1 at x ≥ 1, smooth (3x² − 2x³) between. */
function smoothstep(x: number): number {
  const c = Math.max(0, Math.min(1, x));
  return c * c * (3 - 2 * c);
}
