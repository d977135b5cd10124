import type { Tolerances } from '../numeric/index.js';
import { forEachNearbySegmentPair, segmentContact, type TaggedSegment } from './find-segment-contacts.js';
import { pointInRing } from './point-in-ring.js';
import { pointToSegmentDistance } from './point-to-segment-distance.js';
import type { Point, Region, Ring } from './types.js';

/** The kinds of problem `validateRegion` finds in a region's rings. */
export type RegionFaultKind =
  | 'too-few-points'
  | 'zero-area'
  | 'self-intersection'
  | 'hole-outside-outer'
  | 'holes-overlap'
  | 'non-finite';

/** One problem with a region, located and explained in plain words. */
export interface RegionFault {
  readonly kind: RegionFaultKind;
  /** The ring at fault: `'outer'`, or the index of the hole (0-based). */
  readonly ring: 'outer' | number;
  /** The other ring involved, for faults between two rings (`hole-outside-outer`, `holes-overlap`). */
  readonly otherRing?: 'outer' | number;
  /** Where the fault is, mm: a crossing point, an offending vertex, or a vertex of the ring at fault. */
  readonly at: Point;
  /** Edge indices involved (edge i runs from vertex i to the next kept vertex, in the input ring's numbering): both
   * from `ring` for a self-intersection; `[edge of ring, edge of otherRing]` for a crossing between two rings. */
  readonly edges?: readonly [number, number];
  /** Index of the offending vertex, for `non-finite`. */
  readonly vertex?: number;
  /** The fault in plain words for a process engineer, with the position in mm and 0-based edge numbers. */
  readonly message: string;
}

interface CheckedRing {
  readonly id: 'outer' | number;
  /** Points with consecutive repeats dropped. */
  readonly pts: readonly Point[];
  /** Input edge number of each kept edge (kept edge k runs from kept point k to the next). */
  readonly index: readonly number[];
}

function fmt(p: Point): string {
  return `(${p[0].toFixed(1)}, ${p[1].toFixed(1)}) mm`;
}

function ringName(id: 'outer' | number): string {
  return id === 'outer' ? 'the outer boundary' : `hole ${id}`;
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/**
 * Drops consecutive repeats (and a repeated closing point) within `eps`; `index[k]` is the input vertex whose outgoing
 * edge is kept edge k.
 */
function dedupe(ring: Ring, eps: number): { pts: Point[]; index: number[] } {
  const pts: Point[] = [];
  const index: number[] = [];
  ring.forEach((p, i) => {
    const last = pts[pts.length - 1];
    if (last === undefined || Math.hypot(p[0] - last[0], p[1] - last[1]) > eps) {
      pts.push(p);
      index.push(i);
    } else {
      // The edge leaving a run of repeats is the input edge leaving its last member.
      index[index.length - 1] = i;
    }
  });
  while (pts.length > 1) {
    const a = pts[0]!;
    const b = pts[pts.length - 1]!;
    if (Math.hypot(a[0] - b[0], a[1] - b[1]) > eps) break;
    pts.pop();
    index.pop();
  }
  return { pts, index };
}

/** Whether every point lies within `eps` of one straight line (a ring that encloses nothing). */
function onOneLine(pts: readonly Point[], eps: number): boolean {
  const p0 = pts[0]!;
  let far = p0;
  let farD = 0;
  for (const p of pts) {
    const d = Math.hypot(p[0] - p0[0], p[1] - p0[1]);
    if (d > farD) {
      farD = d;
      far = p;
    }
  }
  if (farD <= eps) return true;
  return pts.every((p) => lineDistance(p, p0, far) <= eps);
}

/** Mean width of a ring, mm: twice its enclosed area over its perimeter (w for a long strip of width w). */
function meanWidth(pts: readonly Point[]): number {
  let twiceArea = 0;
  let perimeter = 0;
  for (let i = 0; i < pts.length; i++) {
    const a = pts[i]!;
    const b = pts[(i + 1) % pts.length]!;
    twiceArea += a[0] * b[1] - b[0] * a[1];
    perimeter += Math.hypot(b[0] - a[0], b[1] - a[1]);
  }
  return perimeter > 0 ? Math.abs(twiceArea) / perimeter : 0;
}

function lineDistance(p: Point, a: Point, b: Point): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  return Math.abs(dx * (p[1] - a[1]) - dy * (p[0] - a[0])) / Math.hypot(dx, dy);
}

/**
 * Checks that a region is fit for area, offset and wall calculations, mm, and lists every problem found; an empty list
 * means the region is valid. Nothing is repaired (see `normalizeRegion` for orientation and repeated points, which are
 * not faults).
 *
 * Checks, per ring: every coordinate finite; at least three distinct points (closer than `tol.lengthMm` counts as the
 * same); some area (not every point within `tol.lengthMm` of one straight line, and a mean width 2A/P above
 * `tol.lengthMm`, so a speck or a sliver is refused like a line); no two edges crossing or touching
 * (within `tol.lengthMm`), including an edge folding back over its neighbour. Between rings: every hole strictly
 * inside the outer ring, and holes neither crossing, touching nor nested (one fault per pair of rings). Segment pairs
 * are found by a sort-and-sweep along x, so a profile of a few thousand vertices checks in tens of milliseconds.
 */
export function validateRegion(region: Region, tol: Tolerances): RegionFault[] {
  const eps = tol.lengthMm;
  const faults: RegionFault[] = [];
  const usable: CheckedRing[] = [];
  const rings: { id: 'outer' | number; ring: Ring }[] = [
    { id: 'outer', ring: region.outer },
    ...region.holes.map((ring, i) => ({ id: i, ring })),
  ];

  for (const { id, ring } of rings) {
    const bad = ring.findIndex((p) => !Number.isFinite(p[0]) || !Number.isFinite(p[1]));
    if (bad >= 0) {
      const near = ring.find((p) => Number.isFinite(p[0]) && Number.isFinite(p[1])) ?? [0, 0];
      faults.push({
        kind: 'non-finite',
        ring: id,
        at: near,
        vertex: bad,
        message: `Point ${bad} of ${ringName(id)} has a coordinate that is not a finite number.`,
      });
      continue;
    }
    const { pts, index } = dedupe(ring, eps);
    if (pts.length < 3) {
      faults.push({
        kind: 'too-few-points',
        ring: id,
        at: pts[0] ?? ring[0] ?? [0, 0],
        message: `${capitalise(ringName(id))} has only ${pts.length} distinct point${pts.length === 1 ? '' : 's'}; a boundary needs at least 3.`,
      });
      continue;
    }
    if (onOneLine(pts, eps)) {
      faults.push({
        kind: 'zero-area',
        ring: id,
        at: pts[0]!,
        message: `${capitalise(ringName(id))} encloses no area: its points lie on one line, starting near ${fmt(pts[0]!)}.`,
      });
      continue;
    }
    usable.push({ id, pts, index });
  }

  const segments: TaggedSegment[] = [];
  usable.forEach((r, k) => {
    const n = r.pts.length;
    for (let e = 0; e < n; e++) segments.push({ a: r.pts[e]!, b: r.pts[(e + 1) % n]!, ring: k, edge: e });
  });

  const touchingPairs = new Set<string>();
  forEachNearbySegmentPair(segments, eps, (i, j) => {
    let s = segments[i]!;
    let t = segments[j]!;
    if (s.ring > t.ring || (s.ring === t.ring && s.edge > t.edge)) [s, t] = [t, s];
    const rs = usable[s.ring]!;
    const rt = usable[t.ring]!;
    if (s.ring === t.ring) {
      const n = rs.pts.length;
      const adjacent = t.edge === s.edge + 1 || (s.edge === 0 && t.edge === n - 1);
      if (adjacent) {
        // Neighbours always share a vertex; they are at fault only when one folds back along the other.
        const [first, second] = t.edge === s.edge + 1 ? [s, t] : [t, s];
        const foldsBack =
          pointToSegmentDistance(second.b, first.a, first.b) <= eps ||
          pointToSegmentDistance(first.a, second.a, second.b) <= eps;
        if (!foldsBack) return;
        faults.push({
          kind: 'self-intersection',
          ring: rs.id,
          at: first.b,
          edges: [rs.index[s.edge]!, rs.index[t.edge]!],
          message: `${capitalise(ringName(rs.id))} folds back on itself near ${fmt(first.b)}, at edges ${rs.index[s.edge]} and ${rs.index[t.edge]}.`,
        });
        return;
      }
      const c = segmentContact(s.a, s.b, t.a, t.b, eps);
      if (c === undefined) return;
      const verb = c.proper ? 'crosses' : 'touches';
      faults.push({
        kind: 'self-intersection',
        ring: rs.id,
        at: c.point,
        edges: [rs.index[s.edge]!, rs.index[t.edge]!],
        message: `${capitalise(ringName(rs.id))} ${verb} itself near ${fmt(c.point)}, between edges ${rs.index[s.edge]} and ${rs.index[t.edge]}.`,
      });
      return;
    }
    // One fault per pair of rings is enough to say what is wrong.
    const key = `${s.ring}:${t.ring}`;
    if (touchingPairs.has(key)) return;
    const c = segmentContact(s.a, s.b, t.a, t.b, eps);
    if (c === undefined) return;
    touchingPairs.add(key);
    const verb = c.proper ? 'crosses' : 'touches';
    if (rs.id === 'outer') {
      faults.push({
        kind: 'hole-outside-outer',
        ring: rt.id,
        otherRing: 'outer',
        at: c.point,
        edges: [rt.index[t.edge]!, rs.index[s.edge]!],
        message:
          `Hole ${rt.id} ${verb} the outer boundary near ${fmt(c.point)} ` +
          `(hole edge ${rt.index[t.edge]}, outer edge ${rs.index[s.edge]}); ` +
          'a hole must lie inside the outer boundary with material all round it.',
      });
    } else {
      faults.push({
        kind: 'holes-overlap',
        ring: rs.id,
        otherRing: rt.id,
        at: c.point,
        edges: [rs.index[s.edge]!, rt.index[t.edge]!],
        message:
          `Holes ${rs.id} and ${rt.id} ${c.proper ? 'cross each other' : 'touch'} near ${fmt(c.point)} ` +
          `(edges ${rs.index[s.edge]} and ${rt.index[t.edge]}); holes must be separate, with material between them.`,
      });
    }
  });

  // A ring that does not cross itself but is a speck or a sliver encloses as good as nothing (a crossing ring's net
  // area may vanish, e.g. a bow-tie, so it is told by its crossing instead).
  const crossed = new Set(faults.filter((f) => f.kind === 'self-intersection').map((f) => f.ring));
  for (const r of usable) {
    if (crossed.has(r.id)) continue;
    const width = meanWidth(r.pts);
    if (width > eps) continue;
    faults.push({
      kind: 'zero-area',
      ring: r.id,
      at: r.pts[0]!,
      message: `${capitalise(ringName(r.id))} encloses next to no area (mean width ${width.toExponential(1)} mm), starting near ${fmt(r.pts[0]!)}.`,
    });
  }

  // Rings that neither cross nor touch are either nested or apart: one vertex tells which.
  const outer = usable[0]?.id === 'outer' ? usable[0] : undefined;
  const holes = usable.filter((r) => r.id !== 'outer');
  if (outer !== undefined) {
    for (const h of holes) {
      if (touchingPairs.has(`0:${usable.indexOf(h)}`)) continue;
      const p = h.pts[0]!;
      if (pointInRing(p, outer.pts, tol) === 'outside') {
        faults.push({
          kind: 'hole-outside-outer',
          ring: h.id,
          otherRing: 'outer',
          at: p,
          message: `Hole ${h.id} lies outside the outer boundary (its point near ${fmt(p)} is outside); a hole must lie inside it.`,
        });
      }
    }
  }
  for (let a = 0; a < holes.length; a++) {
    for (let b = a + 1; b < holes.length; b++) {
      const ha = holes[a]!;
      const hb = holes[b]!;
      if (touchingPairs.has(`${usable.indexOf(ha)}:${usable.indexOf(hb)}`)) continue;
      const [inner, container] =
        pointInRing(hb.pts[0]!, ha.pts, tol) === 'inside'
          ? [hb, ha]
          : pointInRing(ha.pts[0]!, hb.pts, tol) === 'inside'
            ? [ha, hb]
            : [undefined, undefined];
      if (inner === undefined || container === undefined) continue;
      faults.push({
        kind: 'holes-overlap',
        ring: inner.id,
        otherRing: container.id,
        at: inner.pts[0]!,
        message: `Hole ${inner.id} lies inside hole ${container.id}, near ${fmt(inner.pts[0]!)}; holes must be separate, with material between them.`,
      });
    }
  }
  return faults;
}
