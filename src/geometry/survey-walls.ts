import type { Tolerances } from '../numeric/index.js';
import { type WallProbe, probeWall } from './probe-wall.js';
import { buildSegmentGrid, type SegmentGrid } from './segment-grid.js';
import { type BoundaryBall, shrinkingBall } from './shrinking-ball.js';
import { isCornerChord, ringTurns } from './corner-chord.js';
import type { Point, Region } from './types.js';
import { nearestBoundaryPoint } from './nearest-boundary-point.js';
import type { WallOptions } from './wall-options.js';
import { siteSample, type WallSite, wallSites } from './wall-site.js';

/** The thinnest and thickest walls of a region from one pass over its boundary (internal). */
export interface WallSurvey {
  readonly grid: SegmentGrid;
  /** Every first-pass probe, in site order. */
  readonly probes: readonly WallProbe[];
  /** The probe with the shortest facing chord after refinement; undefined when no two faces face each other. */
  readonly thinnest: WallProbe | undefined;
  /** The largest medial disc found, refined. */
  readonly thickest: BoundaryBall;
  /** Medial discs computed (for the benchmark). */
  readonly balls: number;
  /** The wall thickness of first-pass probe i, mm: its chord, or +∞ when the chord only spans a corner. */
  readonly wallAt: (i: number) => number;
}

const GOLDEN = (Math.sqrt(5) - 1) / 2;
const REFINED = 6;

/**
 * Surveys the walls of a normalised region (outer CCW, holes CW) at boundary samples about `sampleSpacingMm` apart
 * (coarser when the perimeter would need more than `maxSamples`).
 *
 * Thinnest: the shortest facing chord (`probeWall`). The thinnest place between two facing sides is a local minimum of
 * the distance between them, and there the connecting segment is normal to both sides (a double normal), so it is
 * a chord along the inward normal: the few shortest samples are refined by golden-section search along the boundary
 * between their neighbours, until the bracket is below `refineResolutionMm`.
 *
 * Thickest: the largest medial disc (Blum 1967), by the shrinking-ball iteration (Ma, Bae & Amenta 2012) from each
 * sample. The disc touching a sample is no larger than half its chord, so samples are taken in decreasing order of
 * half-chord and the search stops once that bound is within `radiusResolutionMm` of the largest disc found (branch and
 * bound); the largest few are refined like the thinnest.
 *
 * Cost: linear in the samples times the grid queries, each about constant on evenly spread vertices.
 */
export function surveyWalls(region: Region, tol: Tolerances, o: WallOptions): WallSurvey {
  const grid = buildSegmentGrid(region);
  let perimeter = 0;
  for (let s = 0; s < grid.ax.length; s++)
    perimeter += Math.hypot(grid.bx[s]! - grid.ax[s]!, grid.by[s]! - grid.ay[s]!);
  const spacing = Math.max(o.sampleSpacingMm, perimeter / o.maxSamples);
  const sites = wallSites(grid, spacing);
  const diagonal = Math.hypot(grid.nx * grid.cell, grid.ny * grid.cell);
  const tolMm = Math.max(tol.lengthMm * 1e-3, 1e-12 * diagonal);
  // Samples no nearer a vertex than this, so the discs and chords there stay far above the tolerance.
  const marginMm = Math.max(o.refineResolutionMm, 100 * tolMm);
  const probe = (site: WallSite, u: number): WallProbe => probeWall(grid, site, u, o.facingAngleRad, tolMm);
  const probes: WallProbe[] = [];
  const origin: { site: WallSite; index: number }[] = [];
  for (const site of sites) {
    for (let index = 0; index < site.k; index++) {
      probes.push(probe(site, siteSample(site, index)));
      origin.push({ site, index });
    }
  }
  const bracket = (i: number): [number, number, number] => {
    const { site, index } = origin[i]!;
    const scale = site.kind === 'fan' ? 1 : siteLength(grid, site);
    const margin = Math.min(marginMm / scale, (site.hi - site.lo) / 4);
    const lo = index > 0 ? siteSample(site, index - 1) : site.lo + margin;
    const hi = index + 1 < site.k ? siteSample(site, index + 1) : site.hi - margin;
    return [lo, hi, o.refineResolutionMm / scale];
  };

  const turns = ringTurns(grid);
  // A chord that only spans a corner is no wall: +∞ (checked lazily, shortest chords first, as it walks the boundary).
  const wall = (site: WallSite, u: number, p: WallProbe): number => {
    if (!Number.isFinite(p.thicknessMm) || p.hit === undefined) return Number.POSITIVE_INFINITY;
    const sq = p.hit.segment;
    const ex = grid.bx[sq]! - grid.ax[sq]!;
    const ey = grid.by[sq]! - grid.ay[sq]!;
    const uq = ((p.hit.point[0] - grid.ax[sq]!) * ex + (p.hit.point[1] - grid.ay[sq]!) * ey) / (ex * ex + ey * ey);
    const up = site.kind === 'edge' ? u : 0;
    const corner = isCornerChord(
      grid,
      turns,
      site.segment,
      up,
      sq,
      uq,
      o.facingAngleRad,
      o.cornerDetailMm,
      o.facingAngleRad,
    );
    return corner ? Number.POSITIVE_INFINITY : p.thicknessMm;
  };
  let thinnest: WallProbe | undefined;
  let thinnestMm = Number.POSITIVE_INFINITY;
  const byThickness = probes.map((_, i) => i).sort((a, b) => probes[a]!.thicknessMm - probes[b]!.thicknessMm);
  let refined = 0;
  for (const i of byThickness) {
    if (refined >= REFINED || !Number.isFinite(probes[i]!.thicknessMm)) break;
    const { site, index } = origin[i]!;
    if (!Number.isFinite(wall(site, siteSample(site, index), probes[i]!))) continue;
    refined++;
    const [lo, hi, res] = bracket(i);
    let top = probes[i]!;
    let topMm = top.thicknessMm;
    goldenSection(
      (u) => probe(site, u),
      (q, u) => {
        const t = wall(site, u, q);
        if (t < topMm) {
          top = q;
          topMm = t;
        }
        return t;
      },
      lo,
      hi,
      res,
    );
    if (topMm < thinnestMm) {
      thinnest = top;
      thinnestMm = topMm;
    }
  }

  let balls = 0;
  const ball = (p: WallProbe): BoundaryBall => {
    balls++;
    return shrinkingBall(grid, p.at, p.normal, halfChord(p, diagonal), tolMm);
  };
  const byChord = probes
    .map((_, i) => i)
    .sort((a, b) => halfChord(probes[b]!, diagonal) - halfChord(probes[a]!, diagonal));
  const found: { i: number; ball: BoundaryBall }[] = [];
  let best = 0;
  for (const i of byChord) {
    const p = probes[i]!;
    if (halfChord(p, diagonal) <= best + o.radiusResolutionMm) break;
    // Discs tangent at p are nested, so one reaching past a boundary point at radius rho rules out any larger one.
    const rho = best + o.radiusResolutionMm;
    const c: Point = [p.at[0] + rho * p.normal[0], p.at[1] + rho * p.normal[1]];
    if (best > 0 && nearestBoundaryPoint(grid, c, rho - tolMm).distance < rho - tolMm) continue;
    const b = ball(p);
    found.push({ i, ball: b });
    if (b.radius > best) best = b.radius;
  }
  found.sort((a, b) => b.ball.radius - a.ball.radius);
  let thickest = found[0]?.ball ?? ball(probes[0]!);
  for (const { i, ball: start } of found.slice(0, REFINED)) {
    const [lo, hi, res] = bracket(i);
    const site = origin[i]!.site;
    let top = start;
    goldenSection(
      (u) => probe(site, u),
      (q) => {
        // Half the chord bounds the disc: skip discs that cannot beat the largest found (costly near a circle).
        if (halfChord(q, diagonal) <= top.radius + o.radiusResolutionMm) return -halfChord(q, diagonal);
        const b = ball(q);
        if (b.radius > top.radius) top = b;
        return -b.radius;
      },
      lo,
      hi,
      res,
    );
    if (top.radius > thickest.radius) thickest = top;
  }
  const wallAt = (i: number): number => {
    const { site, index } = origin[i]!;
    return wall(site, siteSample(site, index), probes[i]!);
  };
  return { grid, probes, thinnest, thickest, balls, wallAt };
}

/** Half the probe's chord, an upper bound on the medial disc touching its point; the grid's diagonal without one. */
function halfChord(p: WallProbe, diagonal: number): number {
  return p.hit === undefined ? diagonal : p.hit.distance / 2;
}

function siteLength(grid: SegmentGrid, site: WallSite): number {
  const s = site.segment;
  return Math.hypot(grid.bx[s]! - grid.ax[s]!, grid.by[s]! - grid.ay[s]!);
}

/** Golden-section search for the smallest `key` on [lo, hi], both ends looked at; the caller keeps the best seen. */
function goldenSection(
  f: (u: number) => WallProbe,
  key: (p: WallProbe, u: number) => number,
  lo: number,
  hi: number,
  resolution: number,
): void {
  const look = (u: number): number => key(f(u), u);
  look(lo);
  look(hi);
  let a = lo;
  let b = hi;
  let c = b - GOLDEN * (b - a);
  let d = a + GOLDEN * (b - a);
  let fc = look(c);
  let fd = look(d);
  for (let k = 0; k < 80 && b - a > resolution; k++) {
    if (fc <= fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - GOLDEN * (b - a);
      fc = look(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + GOLDEN * (b - a);
      fd = look(d);
    }
  }
}
