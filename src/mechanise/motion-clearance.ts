import {
  closestPointOnPolyline,
  type Point,
  pointInRing,
  pointToSegmentDistance,
  type Ring,
  ringLocator,
} from '../geometry/index.js';
import type { BodyPose, Mechanism } from '../kinematics/index.js';
import { DEFAULT_TOLERANCES } from '../numeric/index.js';
import { pivotFans, plateOutline } from '../synthesis/index.js';
import { pivotPoints } from './assemble-stations.js';
import type { MotionDefect, MotionPlace } from './drive-through-stations.js';
import type { LinkDesign } from './link-design.js';
import type { MechaniseContext } from './mechanise-context.js';
import { placeOn } from './mechanise-context.js';

/**
 * What was checked for room: `ground-pivot`: a link's die-body pin against a plate (the pin reaches from the die body
 * through every plate layer to its link); `pin-through-layer`: a link's plate pin against a body on a layer between
 * the plate and the link; `same-layer`: two plates on one layer; `link-in-melt`: a link over the melt channel.
 */
export type ClearanceKind = 'ground-pivot' | 'pin-through-layer' | 'same-layer' | 'link-in-melt';

/** The smallest room found for one pair of parts over the whole motion. */
export interface ClearanceRecord {
  readonly kind: ClearanceKind;
  /** The two parts, by id (a link's pin is named by its link). */
  readonly parts: readonly [string, string];
  /**
   * Smallest gap, mm: pin surface to plate outline, outline to outline, or (for a link over the melt) how far inside
   * the plates covering the opening the link stays; negative where the parts overlap.
   */
  readonly clearanceMm: number;
  readonly at: MotionPlace;
}

/** Collects the clearances of one mechanism sample by sample (`inspect`), then reports them. */
export interface ClearanceInspector {
  /** One configuration: each part's pose by id (die-body frame). */
  inspect(poseOf: (id: string) => BodyPose, at: MotionPlace): void;
  /** The smallest gap per pair of parts over every sample inspected, smallest first. */
  records(): ClearanceRecord[];
  /**
   * Pairs of links where one's plate pin comes over the other's pin line somewhere along the motion, whatever their
   * layers: the pin's link must then lie below the other (its pin stops short of the other's layer).
   */
  linkOverlaps(): { readonly pinLink: string; readonly lineLink: string }[];
}

/** The parts whose room is checked, as plain data in their own frames. */
export interface ClearanceParts {
  /** Rigid plates: outer ring in the plate's own frame, mm, and stack layer. */
  readonly plates: readonly { readonly id: string; readonly layer: number; readonly outline: Ring }[];
  /** Binary links: frame at the pin on `bodyA`, x toward the pin on `bodyB` at (`lengthMm`, 0); stack layer. */
  readonly links: readonly {
    readonly id: string;
    readonly layer: number;
    readonly lengthMm: number;
    readonly bodyA: string;
    readonly bodyB: string;
  }[];
  /** Layer of every part a link pin may sit on (plates, telescoping halves), by id. */
  readonly layerOf: ReadonlyMap<string, number>;
  /** The die opening's outer ring (die-body frame), mm: outside it nothing is melt. */
  readonly opening: Ring;
  /** Radius of a pin, mm. */
  readonly pinRadiusMm: number;
  /** Steel round a pin line: a link's half width, and how far inside the plates a link over the opening must stay, mm. */
  readonly steelMm: number;
}

/**
 * Room between the moving parts along the whole traced motion, not only at the stations (docs/MODEL.md §2–3):
 * - every link's die-body pin clear of every plate by at least the pin radius (the die-body pivots lie outside the
 *   area the plates sweep);
 * - every link's plate pin clear, by its radius, of the plates on the layers between its plate and its link, and of
 *   the links on those layers (capsules of the steel width round their pin lines);
 * - plates on one layer clear of each other;
 * - every link over the die opening stays over plates, at least the steel width inside their outlines (never over
 *   melt).
 * Point-to-polygon distances, no clipping, so it is cheap enough to run on every sample of every complete candidate.
 */
export function makeClearanceInspector(parts: ClearanceParts): ClearanceInspector {
  const { plates, links, layerOf, opening, pinRadiusMm: pinRadius, steelMm: steel } = parts;
  // the opening is the same ring at every configuration: located through its bucketed edges
  const inOpening = ringLocator(opening, DEFAULT_TOLERANCES);
  const worst = new Map<string, ClearanceRecord>();
  const overlaps = new Set<string>();
  const note = (kind: ClearanceKind, a: string, b: string, clearanceMm: number, at: MotionPlace) => {
    const key = `${kind}|${a}|${b}`;
    const seen = worst.get(key);
    if (!seen || clearanceMm < seen.clearanceMm) worst.set(key, { kind, parts: [a, b], clearanceMm, at });
  };
  return {
    inspect(poseOf, at) {
      const world = plates.map((p) => {
        const bp = poseOf(p.id);
        return { ...p, ring: p.outline.map((q) => placeOn(bp, q)) };
      });
      const linkEnds = links.map((l) => {
        const lp = poseOf(l.id);
        return { link: l, a: placeOn(lp, [0, 0]), b: placeOn(lp, [l.lengthMm, 0]) };
      });
      for (const { link, a, b } of linkEnds) {
        if (link.bodyA === 'die_body') {
          for (const p of world) note('ground-pivot', link.id, p.id, signedDistance(a, p.ring) - pinRadius, at);
        }
        // each plate pin passes through the layers between its plate and the link
        for (const [end, body] of [
          [b, link.bodyB],
          [a, link.bodyA],
        ] as const) {
          if (body === 'die_body') continue;
          const low = layerOf.get(body) ?? 0;
          for (const p of world) {
            if (p.id === body || p.layer <= low || p.layer >= link.layer) continue;
            note('pin-through-layer', link.id, p.id, signedDistance(end, p.ring) - pinRadius, at);
          }
          for (const other of linkEnds) {
            if (other.link === link || other.link.layer <= low) continue;
            const gap = pointToSegmentDistance(end, other.a, other.b) - pinRadius - steel;
            if (gap < 0) overlaps.add(`${link.id}|${other.link.id}`);
            if (other.link.layer < link.layer) note('pin-through-layer', link.id, other.link.id, gap, at);
          }
        }
        // over the opening a link must stay over plates: sample its pin line
        const steps = Math.max(2, Math.ceil(Math.hypot(b[0] - a[0], b[1] - a[1]) / LINK_SAMPLE_MM));
        let cover = Number.POSITIVE_INFINITY;
        for (let s = 0; s <= steps; s++) {
          const q: Point = [a[0] + ((b[0] - a[0]) * s) / steps, a[1] + ((b[1] - a[1]) * s) / steps];
          if (inOpening(q) === 'outside') continue;
          // how deep inside the plates q lies: the largest depth over the plates covering it
          let depth = Number.NEGATIVE_INFINITY;
          for (const p of world) depth = Math.max(depth, -signedDistance(q, p.ring));
          cover = Math.min(cover, depth - steel);
        }
        if (Number.isFinite(cover)) note('link-in-melt', link.id, 'melt', cover, at);
      }
      for (let i = 0; i < world.length; i++) {
        for (let j = i + 1; j < world.length; j++) {
          const p = world[i]!;
          const q = world[j]!;
          if (p.layer !== q.layer) continue;
          note('same-layer', p.id, q.id, ringGap(p.ring, q.ring), at);
        }
      }
    },
    records() {
      return [...worst.values()].sort((x, y) => x.clearanceMm - y.clearanceMm);
    },
    linkOverlaps() {
      return [...overlaps].map((key) => {
        const [pinLink, lineLink] = key.split('|') as [string, string];
        return { pinLink, lineLink };
      });
    },
  };
}

/**
 * An order of the links, bottom layer first, in which no link's plate pin passes through the layer of a link whose pin
 * line it crosses (each overlap asks for the pin's link below the other): a topological order (Kahn's algorithm),
 * keeping the given order where it is free. Null when the overlaps go both ways round (no order avoids them).
 */
export function linkLayerOrder(
  ids: readonly string[],
  overlaps: readonly { readonly pinLink: string; readonly lineLink: string }[],
): string[] | null {
  const below = new Map(ids.map((id) => [id, new Set<string>()] as const));
  for (const o of overlaps) below.get(o.lineLink)?.add(o.pinLink);
  const order: string[] = [];
  const left = [...ids];
  while (left.length > 0) {
    const k = left.findIndex((id) => [...below.get(id)!].every((b) => order.includes(b)));
    if (k < 0) return null;
    order.push(left.splice(k, 1)[0]!);
  }
  return order;
}

/**
 * The parts of a mechanism built on a fitted chain, for `makeClearanceInspector`: each rigid plate's outline as the
 * fit draws it (straight melt edge, pivot fans) with 0.2 mm chords, taken into the plate's own frame at the first
 * distinct position, plus a boss of radius e round every link pin that is closer than e to the plate's edge (the plate
 * is widened there); the links of `mechanism` with their layers. Telescoping halves and slider blocks carry no
 * outline here.
 */
export function clearancePartsOf(
  context: MechaniseContext,
  mechanism: Mechanism,
  links: readonly LinkDesign[],
): ClearanceParts {
  const { topology, stations, shape } = context;
  const coarse = { ...shape, arcToleranceMm: Math.max(shape.arcToleranceMm, COARSE_CHORD_MM) };
  const first = stations.representatives[0]!;
  const allPivots = stations.poses.map((p) => pivotPoints(topology, p));
  const fans = pivotFans(allPivots);
  const pivots = allPivots[first]!;
  const plates: { id: string; layer: number; outline: Ring }[] = [];
  topology.bodies.forEach((b, m) => {
    if (b.role !== 'plate' || b.pivotsLocal.length < 2) return;
    const k = b.plate - 1;
    const outline = plateOutline(pivots[k]!, pivots[k + 1]!, coarse, null, { atA: fans[k]!, atB: fans[k + 1]! });
    const pose = stations.poses[first]![m]!;
    plates.push({ id: b.id, layer: b.layer, outline: outline.outer.map((p) => toLocal(pose, p)) });
  });
  // a link pin near a plate's side edge sits in a boss the plate is widened by (steel of e round the pin): the boss
  // moves with the plate and needs room like the rest of it
  for (const l of links) {
    for (const [body, pin] of [
      [l.bodyB, l.pinB],
      [l.bodyA, l.pinA],
    ] as const) {
      const plate = plates.find((p) => p.id === body);
      if (!plate || signedDistance(pin, plate.outline) < -shape.edgeOffsetMm) continue;
      plates.push({ id: body, layer: plate.layer, outline: boss(pin, shape.edgeOffsetMm) });
    }
  }
  const layerOf = new Map(mechanism.bodies.map((b) => [b.id, b.layer] as const));
  return {
    plates,
    links: links.map((l) => ({
      id: l.id,
      layer: layerOf.get(l.id)!,
      lengthMm: l.lengthMm,
      bodyA: l.bodyA,
      bodyB: l.bodyB,
    })),
    layerOf,
    opening: context.opening.outer,
    pinRadiusMm: shape.holeRadiusMm,
    steelMm: shape.edgeOffsetMm,
  };
}

/**
 * Collisions among the clearance records: every pair that overlaps, as motion defects, except plates sharing a layer,
 * which the layer assignment (not the mechanism) must resolve and which are reported as findings instead.
 */
export function collisionDefects(records: readonly ClearanceRecord[]): MotionDefect[] {
  return records
    .filter((c) => c.clearanceMm < 0 && c.kind !== 'same-layer')
    .map((c) => ({
      code: 'COLLISION' as const,
      ...(c.at.position !== null ? { position: c.at.position } : {}),
      ...(c.at.leg ? { leg: c.at.leg } : {}),
      value: c.clearanceMm,
      message: `${c.parts[0]} and ${c.parts[1]} overlap by ${(-c.clearanceMm).toFixed(2)} mm (${describeClearance(c.kind)})`,
    }));
}

/** What a clearance kind checks, in words. */
export function describeClearance(kind: ClearanceKind): string {
  switch (kind) {
    case 'ground-pivot':
      return 'a die-body pin where a plate sweeps';
    case 'pin-through-layer':
      return 'a link pin crossing a part on a layer between its plate and its link';
    case 'same-layer':
      return 'two plates on one layer';
    case 'link-in-melt':
      return 'a link over the melt channel';
  }
}

/** Plate outlines for the clearance checks are drawn with chords this coarse, mm. */
const COARSE_CHORD_MM = 0.2;

/** A link's pin line is checked against the melt every this many mm. */
const LINK_SAMPLE_MM = 1;

/** Distance from p to a ring's boundary, mm: positive outside the ring, negative inside. */
function signedDistance(p: Point, ring: Ring): number {
  const d = closestPointOnPolyline(p, ring, true).distance;
  return pointInRing(p, ring, DEFAULT_TOLERANCES) === 'outside' ? d : -d;
}

/**
 * Gap between two rings, mm: the smallest vertex-to-boundary distance when they are apart; when they overlap, minus
 * the deepest any vertex of one reaches inside the other.
 */
export function ringGap(a: Ring, b: Ring): number {
  let gap = Number.POSITIVE_INFINITY;
  let depth = 0;
  for (const [from, to] of [
    [a, b],
    [b, a],
  ] as const) {
    for (const p of from) {
      const d = closestPointOnPolyline(p, to, true).distance;
      if (pointInRing(p, to, DEFAULT_TOLERANCES) === 'inside') depth = Math.max(depth, d);
      else gap = Math.min(gap, d);
    }
  }
  return depth > 0 ? -depth : gap;
}

/** A disc of radius r round c as a 24-gon (chord error under 1 % of r), counter-clockwise. */
function boss(c: Point, r: number): Ring {
  return Array.from({ length: 24 }, (_, k): Point => {
    const a = (2 * Math.PI * k) / 24;
    return [c[0] + r * Math.cos(a), c[1] + r * Math.sin(a)];
  });
}

/** A die-body point in a body's own frame. */
function toLocal(pose: BodyPose, p: Point): Point {
  const c = Math.cos(pose.phi);
  const s = Math.sin(pose.phi);
  const dx = p[0] - pose.x;
  const dy = p[1] - pose.y;
  return [c * dx + s * dy, -s * dx + c * dy];
}
