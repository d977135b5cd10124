import { closestPointOnPolyline, type Point, pointInRing } from '../geometry/index.js';
import type { BodyPose, Joint } from '../kinematics/index.js';
import { DEFAULT_TOLERANCES, safeAcos, toRadians } from '../numeric/index.js';
import { circlePointForCentre, displacementPoles, invertPoses, type RelativePose } from '../synthesis/index.js';
import type { LinkDesign } from './link-design.js';
import { bodyPoseAt, type MechaniseContext, placeOn } from './mechanise-context.js';
import { segmentClearance } from './segment-clearance.js';
import { type SynthesisedDyad, synthesiseDyads } from './synthesise-dyads.js';

/**
 * Why a candidate link was turned down. Screening: `COLLINEAR`, `RESIDUAL`, `GROUND_OUTSIDE_FRAME`,
 * `GROUND_IN_OPENING`, `GROUND_IN_MELT`, `GROUND_UNDER_PLATE`, `PIN_OUTSIDE_PLATE`, `TOO_SHORT`, `TOO_LONG`, `CROSSES_MELT`,
 * `TRANSMISSION_AT_STATIONS`; driving the partial mechanism: `BRANCH_DEFECT`, `ORDER_DEFECT`, `CIRCUIT_DEFECT`,
 * `SINGULAR_STATION`, `TRANSMISSION_IN_MOTION`.
 */
export type LinkRejection = string;

/** A screened link with its station transmission quality seen from either end of the chain. */
export interface LinkCandidate {
  readonly link: LinkDesign;
  /**
   * Smallest sin μ over the distinct stations, μ the transmission angle at the link's pin on B against B's joint
   * toward the chain's start (`up`) or end (`down`); null when μ leaves the limit band at some station.
   */
  readonly up: number | null;
  readonly down: number | null;
}

/** The candidate links of one plate and the tally of those turned down. */
export interface PlateCandidates {
  readonly body: string;
  /** Screened candidates, best first by the better of `up` and `down`, at most `candidatesPerPlate` per end. */
  readonly candidates: readonly LinkCandidate[];
  /** Dyads synthesised (before screening). */
  readonly tried: number;
  /** Of those, links from the die body. */
  readonly triedFromGround: number;
  readonly rejections: ReadonlyMap<LinkRejection, number>;
  /** The rejections of links from the die body alone. */
  readonly groundRejections: ReadonlyMap<LinkRejection, number>;
  /**
   * Where the plate turns between stations: the mean of its finite displacement poles relative to the die body
   * (Erdman, Sandor & Kota, *Mechanism Design*), die-body frame, mm; null when it only translates. Ground pivots of
   * rigid links gather round it when the plate mostly turns.
   */
  readonly pole: Point | null;
}

/**
 * Candidate binary links onto chain body `body` (a plate or a telescoping half): from the die body, and from every
 * plate not joined to it within `plateLinkSpan` places along the chain, synthesised for the distinct positions (`synthesiseDyads`) from the circle-point grid of
 * each plate's pin region; then screened: link length within limits, ground pivot in the allowed region
 * (`groundPivotRegion`) or plate pin in the other plate's pin region, least-squares residual within the limit, the
 * link's centre line at least the pin clearance away from every station's orifice (melt) at that station, and the
 * transmission angle at the plate pin within the limit band at every distinct station, measured against the plate's
 * joint toward the chain's start or toward its end (one of the two must pass).
 */
export function linkCandidates(context: MechaniseContext, body: string): PlateCandidates {
  const { topology, options } = context;
  const rejections = new Map<LinkRejection, number>();
  const groundRejections = new Map<LinkRejection, number>();
  let fromGround = false;
  const reject = (why: LinkRejection) => {
    rejections.set(why, (rejections.get(why) ?? 0) + 1);
    if (fromGround) groundRejections.set(why, (groundRejections.get(why) ?? 0) + 1);
  };
  const distinct = context.stations.representatives.length;
  const m = topology.bodies.findIndex((b) => b.id === body);
  const upJoint = topology.joints[m]!;
  const downJoint = topology.joints[m + 1]!;
  const neighbours = new Set(
    topology.joints.flatMap((j) => (j.bodyI === body ? [j.bodyJ] : j.bodyJ === body ? [j.bodyI] : [])),
  );
  const others = [
    'die_body',
    ...topology.bodies
      .filter(
        (b) =>
          b.role !== 'slider' &&
          b.id !== body &&
          !neighbours.has(b.id) &&
          Math.abs(b.plate - topology.bodies[m]!.plate) <= options.plateLinkSpan,
      )
      .map((b) => b.id),
  ];
  const pinB = context.pinRegions.get(body)!;
  const gridB = pinB.grid(options.circlePointSteps);
  const posesB = Array.from({ length: distinct }, (_, s) => bodyPoseAt(context, s, body));
  const settings = {
    linkLengthMinMm: options.linkLengthMinMm,
    linkLengthMaxMm: options.linkLengthMaxMm,
    residualLimitMm: context.residualLimitMm,
  };
  const [limMin, limMax] = options.transmissionLimitDeg.map(toRadians) as [number, number];
  const screened: LinkCandidate[] = [];
  let tried = 0;
  let triedFromGround = 0;
  let pole: Point | null = null;

  for (const a of others) {
    if (a === 'die_body' && neighbours.has('die_body')) continue;
    fromGround = a === 'die_body';
    const posesA = Array.from({ length: distinct }, (_, s) => bodyPoseAt(context, s, a));
    const relative: RelativePose[] = posesB.map((pb, s) => relativePose(posesA[s]!, pb));
    const found: SynthesisedDyad[] = [];
    const fromB = synthesiseDyads(relative, { ...settings, circlePoints: gridB, pinRegion: pinB });
    found.push(...fromB.dyads);
    for (let k = 0; k < fromB.collinear; k++) reject('COLLINEAR');
    for (let k = 0; k < fromB.residualTooLarge; k++) reject('RESIDUAL');
    for (let k = 0; k < fromB.outsidePinRegion; k++) reject('PIN_OUTSIDE_PLATE');
    const pinA = a === 'die_body' ? null : context.pinRegions.get(a)!;
    if (!pinA && relative.length === 3) {
      // any centre has its circle point for three positions: sample the allowed die body too (kinematic inversion)
      for (const centre of context.groundGrid) {
        const c = circlePointForCentre(relative, centre);
        if (c.status === 'ok' && pinB.contains(c.circlePointLocal)) found.push({ ...c, synthesis: 'circumcentre' });
      }
    }
    if (pinA && relative.length <= 3) {
      // both ends must sit in a plate: also start from A's grid (the inversion: centre in B, circle point in A)
      const fromA = synthesiseDyads(invertPoses(relative), {
        ...settings,
        circlePoints: pinA.grid(options.circlePointSteps),
        pinRegion: pinA,
      });
      for (const d of fromA.dyads) {
        found.push({ ...d, centre: d.circlePointLocal, circlePointLocal: d.centre });
      }
    }
    tried += found.length;
    if (fromGround) {
      triedFromGround = found.length;
      const poles = displacementPoles(relative).flatMap((p) => (p.pole ? [p.pole] : []));
      if (poles.length > 0) {
        pole = [poles.reduce((t, p) => t + p[0], 0) / poles.length, poles.reduce((t, p) => t + p[1], 0) / poles.length];
      }
    }
    for (const d of found) {
      const link: LinkDesign = {
        id: 'candidate',
        bodyA: a,
        pinA: d.centre,
        bodyB: body,
        pinB: d.circlePointLocal,
        lengthMm: d.radiusMm,
        residualMm: d.residualMm,
        synthesis: d.synthesis,
      };
      if (!(d.residualMm <= Math.max(context.residualLimitMm, 1e-6))) {
        reject('RESIDUAL');
        continue;
      }
      if (d.radiusMm < options.linkLengthMinMm) {
        reject('TOO_SHORT');
        continue;
      }
      if (!(d.radiusMm <= options.linkLengthMaxMm)) {
        reject('TOO_LONG');
        continue;
      }
      if (pinA) {
        if (!pinA.contains(d.centre) || !pinB.contains(d.circlePointLocal)) {
          reject('PIN_OUTSIDE_PLATE');
          continue;
        }
      } else {
        const where = context.groundRegion.check(d.centre) ?? underPlate(context, d.centre);
        if (where) {
          reject(where);
          continue;
        }
      }
      const up = stationTransmission(posesA, posesB, link, upJoint, body, limMin, limMax);
      const down = stationTransmission(posesA, posesB, link, downJoint, body, limMin, limMax);
      if (up === null && down === null) {
        reject('TRANSMISSION_AT_STATIONS');
        continue;
      }
      if (crossesMelt(context, link)) {
        reject('CROSSES_MELT');
        continue;
      }
      screened.push({ link, up, down });
    }
  }
  const keep = options.candidatesPerPlate;
  // exact links first (they reproduce the stations to round-off), then by transmission, then the shorter
  const best = (key: 'up' | 'down') =>
    screened
      .filter((c) => c[key] !== null)
      .sort((p, q) => inexact(p) - inexact(q) || q[key]! - p[key]! || p.link.lengthMm - q.link.lengthMm)
      .slice(0, keep);
  const candidates = [...new Set([...best('up'), ...best('down')])];
  candidates.sort(
    (p, q) =>
      inexact(p) - inexact(q) ||
      Math.max(q.up ?? 0, q.down ?? 0) - Math.max(p.up ?? 0, p.down ?? 0) ||
      p.link.lengthMm - q.link.lengthMm,
  );
  return { body, candidates, tried, triedFromGround, rejections, groundRejections, pole };
}

/**
 * `GROUND_UNDER_PLATE` when a ground pivot lies within a pin radius of a plate at some station: the plate would sweep
 * over the pin that reaches from the die body to the link (checked again along the whole motion by the clearance
 * inspector).
 */
function underPlate(context: MechaniseContext, p: Point): 'GROUND_UNDER_PLATE' | null {
  const r = context.shape.holeRadiusMm;
  for (const plates of context.platesAt) {
    for (const ring of plates) {
      if (pointInRing(p, ring, DEFAULT_TOLERANCES) !== 'outside') return 'GROUND_UNDER_PLATE';
      if (closestPointOnPolyline(p, ring, true).distance < r) return 'GROUND_UNDER_PLATE';
    }
  }
  return null;
}

/** 0 for an exact link (residual within round-off), 1 for one rigid only to within the residual limit. */
function inexact(c: LinkCandidate): number {
  return c.link.residualMm <= EXACT_LINK_MM ? 0 : 1;
}

/** A link whose pin distance varies less than this over the stations is exact, mm. */
const EXACT_LINK_MM = 1e-8;

/** Pose of B relative to A: B's point p lies at R·p + origin in A's frame. */
export function relativePose(a: BodyPose, b: BodyPose): RelativePose {
  const c = Math.cos(a.phi);
  const s = Math.sin(a.phi);
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  return { angleRad: b.phi - a.phi, origin: [c * dx + s * dy, -s * dx + c * dy] };
}

/**
 * Smallest sin μ over the stations, μ the angle at the link's pin on B between the link and B's reference line to
 * `joint` (to its centre for a pin, along the normal of a slide), as `transmissionAngles` measures it; null when μ
 * leaves [limMin, limMax] at a station.
 */
function stationTransmission(
  posesA: readonly BodyPose[],
  posesB: readonly BodyPose[],
  link: LinkDesign,
  joint: Joint,
  body: string,
  limMin: number,
  limMax: number,
): number | null {
  let worst = 1;
  for (let s = 0; s < posesB.length; s++) {
    const pb = posesB[s]!;
    const q = placeOn(pb, link.pinB);
    const p = placeOn(posesA[s]!, link.pinA);
    let dir: Point;
    if (joint.kind === 'revolute') {
      const r = placeOn(pb, joint.bodyI === body ? joint.pointI : joint.pointJ);
      dir = [r[0] - q[0], r[1] - q[1]];
    } else {
      const axis = joint.bodyI === body ? joint.axisI : joint.axisJ;
      const c = Math.cos(pb.phi);
      const sn = Math.sin(pb.phi);
      dir = [-(sn * axis[0] + c * axis[1]), c * axis[0] - sn * axis[1]];
    }
    const lx = p[0] - q[0];
    const ly = p[1] - q[1];
    const mu = safeAcos((lx * dir[0] + ly * dir[1]) / (Math.hypot(lx, ly) * Math.hypot(dir[0], dir[1])));
    if (!(mu >= limMin && mu <= limMax)) return null;
    worst = Math.min(worst, Math.sin(mu));
  }
  return worst;
}

/** True when the link's centre line comes closer than the pin clearance to a station's orifice at that station. */
function crossesMelt(context: MechaniseContext, link: LinkDesign): boolean {
  const index = new Map(context.topology.bodies.map((b, m) => [b.id, m] as const));
  return context.stations.poses.some((poses, i) => {
    const a = link.bodyA === 'die_body' ? link.pinA : placeOn(poses[index.get(link.bodyA)!]!, link.pinA);
    const b = placeOn(poses[index.get(link.bodyB)!]!, link.pinB);
    return segmentClearance(a, b, context.orifices[i]!) < context.clearanceMm;
  });
}
