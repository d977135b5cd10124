import {
  differenceRegions,
  interiorPoint,
  intersectRegions,
  measureWalls,
  type Point,
  ringLocator,
  pointToRingDistance,
  type Region,
  type Ring,
  type WallMeasurement,
  regionArea,
  regionPerimeter,
  regionsArea,
} from '../geometry/index.js';
import {
  bodyPose,
  createPositionSolver,
  dyadTransmissionAngles,
  initialPose,
  jointPoint,
  type Mechanism,
  type Pose,
  pointOnBody,
  transmissionAngles,
} from '../kinematics/index.js';
import { type ClearanceParts, makeClearanceInspector } from '../mechanise/index.js';
import { type ActuatorTrajectory, sampleTrajectory } from '../motion/index.js';
import { DEFAULT_TOLERANCES, toDegrees } from '../numeric/index.js';
import { type PlateShape, plateOutline } from '../synthesis/index.js';

/** What the per-step simulation drives and measures: a mechanism, its plates and the die opening, as plain data. */
export interface MotionSimulationInput {
  /** The kinematic model, one driver per trajectory; its bodies' `initial` poses are the first station's. */
  readonly mechanism: Mechanism;
  /** One trajectory per driver of `mechanism`, same order (radians or mm). */
  readonly trajectories: readonly ActuatorTrajectory[];
  /** The chain pivots in chain order: plate k spans pivot k−1 to pivot k; each carried by a body at a local point. */
  readonly pivots: readonly { readonly body: string; readonly local: Point }[];
  readonly shape: PlateShape;
  /** Shaped melt edge of each plate in its own frame, or null for a straight one (one per plate). */
  readonly edges: readonly (readonly Point[] | null)[];
  /** Fan of every pivot, radians (see `pivotFans`). */
  readonly fans: readonly number[];
  /** The die opening (die-body frame, mm). */
  readonly opening: Region;
  /** The stations: line position and target orifice, schedule order. */
  readonly stations: readonly { readonly positionM: number; readonly target: Region }[];
  /** Repeat length when the schedule is periodic (the steps after the last station lead back to the first), m. */
  readonly repeatLengthM: number | null;
  /** The fit tolerance, mm: plates are drawn with chords of a tenth of it (or the fit's own, if finer). */
  readonly toleranceMm: number;
  /** Parts whose room is checked (see `clearancePartsOf`); null to skip the clearance checks. */
  readonly clearance: ClearanceParts | null;
}

/** How much of the simulation to run. */
export interface MotionSimulationSettings {
  /** Line positions of the steps, m, increasing (not wrapped). */
  readonly positionsM: readonly number[];
  /** Times of the steps, s (for the tip speeds). */
  readonly timesS: readonly number[];
  /** Clip the plates at every step (area, leaks, pieces outside the stations); false: kinematics only. */
  readonly clip: boolean;
  /** Measure the thinnest wall, the transmission angles and the clearances every this many steps (≥ 1), and at the last. */
  readonly wallStride: number;
  /** Steps measured whatever the stride (the stations). @default none */
  readonly alsoMeasure?: readonly number[];
}

/** One value per step; `null` where the quantity was not measured at that step (walls and clearances at a stride). */
export interface MotionSimulation {
  readonly positionsM: readonly number[];
  readonly timesS: readonly number[];
  /** True where the position solve converged; where it did not, the step keeps the last solved configuration. */
  readonly solved: readonly boolean[];
  /** Worst Newton iterations of any step, and the total, for the benchmark. */
  readonly iterations: { readonly max: number; readonly total: number };
  /** Every joint's point per step, die-body frame, mm, in `mechanism.joints` order. */
  readonly joints: readonly { readonly id: string; readonly positionsMm: readonly Point[] }[];
  /** Fastest pivot (plate tip) speed per step, mm/s (central differences over the steps). */
  readonly tipSpeedMmPerS: readonly number[];
  /** Transmission angle farthest from 90° over binary links and dyad joints per step, degrees; null without any. */
  readonly transmissionDeg: readonly (number | null)[];
  /** Which link or joint has it. */
  readonly transmissionAt: readonly (string | null)[];
  /** Orifice area per step, mm² (0 without clipping). */
  readonly areaMm2: readonly number[];
  /** Orifice perimeter per step, mm. */
  readonly perimeterMm: readonly number[];
  /** Opening the plates leave uncovered apart from the orifice (melt would leak there), mm² per step. */
  readonly leakAreaMm2: readonly number[];
  /**
   * A point inside the largest leaking piece per step, die-body frame, mm (where to look); null without a leak. Absent
   * from plans stored before it was recorded.
   */
  readonly leakAt?: readonly (Point | null)[];
  /**
   * How far the orifice reaches outside both neighbouring stations' orifices per step, mm (0 inside either): above the
   * fit tolerance the opening is larger there than either station asks for.
   */
  readonly beyondStationsMm: readonly number[];
  /** Thinnest wall measured across, mm, at the wall stride; null between. */
  readonly minWallMm: readonly (number | null)[];
  /** Where the thinnest wall is (its middle, die-body frame, mm), at the wall stride; null between. */
  readonly minWallAt: readonly (Point | null)[];
  /** Thickest wall (largest inscribed circle's diameter), mm, at the wall stride; null between. */
  readonly maxWallMm: readonly (number | null)[];
  /** Smallest room between any two parts, mm (negative: overlap), at the wall stride; null between or unchecked. */
  readonly clearanceMm: readonly (number | null)[];
  /** Which parts have it. */
  readonly clearanceParts: readonly (string | null)[];
}

/**
 * Drives the mechanism along the commanded motion (every trajectory sampled at each step's line position), never by
 * straight lines in actuator space: each step is a Newton solve warm-started from the previous step (Nikravesh; Haug),
 * which is the continuation of docs/MODEL.md §3 "Position analysis". With `clip`, each step also puts the plates
 * where the mechanism has them (`plateOutline`) and clips the opening (opening − plates, one boolean): the piece that
 * overlaps the neighbouring stations most is the orifice (less the station's holes), every other piece is leaking
 * opening; how far the orifice reaches outside both neighbouring stations' orifices is measured at its vertices. At `wallStride` the thinnest and
 * thickest walls (`measureWalls`), transmission angles and clearances are measured too. Pure and deterministic.
 */
export function simulateMotion(input: MotionSimulationInput, settings: MotionSimulationSettings): MotionSimulation {
  const { mechanism, trajectories, pivots, stations } = input;
  const { positionsM, timesS, clip } = settings;
  const stride = Math.max(1, Math.floor(settings.wallStride));
  const n = positionsM.length;
  if (timesS.length !== n) throw new Error('simulateMotion: one time per position expected');
  if (trajectories.length !== mechanism.drivers.length) throw new Error('simulateMotion: one trajectory per driver');
  const solver = createPositionSolver(mechanism);
  const always = new Set(settings.alsoMeasure ?? []);
  // plates drawn with chords of a tenth of the tolerance (at least the fit's own): the clip's cost follows their vertices
  const shape = { ...input.shape, arcToleranceMm: Math.max(input.shape.arcToleranceMm, input.toleranceMm / 10) };
  const holes = stations.map((s) => s.target.holes.map((h) => ({ outer: [...h].reverse(), holes: [] })));
  const outers = stations.map((s) => s.target.outer);

  const solved: boolean[] = [];
  const jointTracks = mechanism.joints.map((j) => ({ id: j.id, positionsMm: [] as Point[] }));
  const pivotTracks: Point[][] = [];
  const transmissionDeg: (number | null)[] = [];
  const transmissionAt: (string | null)[] = [];
  const areaMm2: number[] = [];
  const perimeterMm: number[] = [];
  const leakAreaMm2: number[] = [];
  const leakAt: (Point | null)[] = [];
  const beyondStationsMm: number[] = [];
  const minWallMm: (number | null)[] = [];
  const minWallAt: (Point | null)[] = [];
  const maxWallMm: (number | null)[] = [];
  const clearanceMm: (number | null)[] = [];
  const clearanceParts: (string | null)[] = [];
  let maxIterations = 0;
  let totalIterations = 0;

  const actuatorsAt = (x: number) => trajectories.map((t) => sampleTrajectory(t, x).value);
  let pose: Pose = initialPose(mechanism);
  for (let j = 0; j < n; j++) {
    const x = positionsM[j]!;
    const r = solver.solve(actuatorsAt(x), pose);
    maxIterations = Math.max(maxIterations, r.iterations);
    totalIterations += r.iterations;
    const ok = r.status === 'converged';
    solved.push(ok);
    if (ok) pose = r.pose;
    mechanism.joints.forEach((joint, k) => {
      jointTracks[k]!.positionsMm.push(jointPoint(pose, joint.id));
    });
    const pv = pivots.map((p) => pointOnBody(pose, p.body, p.local));
    pivotTracks.push(pv);
    const measured = j % stride === 0 || j === n - 1 || always.has(j);
    if (measured) {
      const worst = worstTransmission(pose);
      transmissionDeg.push(worst ? worst.deg : null);
      transmissionAt.push(worst ? worst.id : null);
    } else {
      transmissionDeg.push(null);
      transmissionAt.push(null);
    }
    if (measured && input.clearance) {
      const inspector = makeClearanceInspector(input.clearance);
      inspector.inspect((id) => bodyPose(pose, id), { position: null, leg: null, fraction: 0 });
      const tightest = inspector.records()[0];
      clearanceMm.push(tightest ? tightest.clearanceMm : null);
      clearanceParts.push(tightest ? `${tightest.parts[0]}–${tightest.parts[1]} (${tightest.kind})` : null);
    } else {
      clearanceMm.push(null);
      clearanceParts.push(null);
    }
    if (!clip) {
      areaMm2.push(0);
      perimeterMm.push(0);
      leakAreaMm2.push(0);
      leakAt.push(null);
      beyondStationsMm.push(0);
      minWallMm.push(null);
      minWallAt.push(null);
      maxWallMm.push(null);
      continue;
    }
    const plates: Region[] = [];
    for (let k = 0; k + 1 < pv.length; k++) {
      const outline = plateOutline(pv[k]!, pv[k + 1]!, shape, input.edges[k] ?? null, {
        atA: input.fans[k] ?? 0,
        atB: input.fans[k + 1] ?? 0,
      });
      plates.push({ outer: outline.outer, holes: [] });
    }
    const [from, to] = neighbours(stations, input.repeatLengthM, x);
    const near = from === to ? [outers[from]!] : [outers[from]!, outers[to]!];
    const nearRegions = near.map((outer) => ({ outer, holes: [] }));
    const open = differenceRegions([input.opening], plates);
    let best = 0;
    if (open.length > 1) {
      let bestOverlap = -1;
      open.forEach((piece, i) => {
        const overlap = regionsArea(intersectRegions([piece], nearRegions));
        if (overlap > bestOverlap) {
          bestOverlap = overlap;
          best = i;
        }
      });
    }
    let orifice: Region = open[best] ?? { outer: [], holes: [] };
    let leak = 0;
    let largestLeak: Region | null = null;
    open.forEach((piece, i) => {
      if (i === best) return;
      const a = regionArea(piece);
      leak += a;
      if (largestLeak === null || a > regionArea(largestLeak)) largestLeak = piece;
    });
    if (holes[from]!.length > 0 && orifice.outer.length >= 3) {
      const cut = differenceRegions([orifice], holes[from]!);
      orifice = cut.reduce((a, b) => (regionArea(b) > regionArea(a) ? b : a), cut[0] ?? orifice);
    }
    const area = orifice.outer.length >= 3 ? regionArea(orifice) : 0;
    areaMm2.push(area);
    perimeterMm.push(area > 0 ? regionPerimeter(orifice) : 0);
    leakAreaMm2.push(leak);
    leakAt.push(largestLeak !== null && (largestLeak as Region).outer.length >= 3 ? interiorPoint(largestLeak) : null);
    beyondStationsMm.push(area > 0 ? reachBeyond(orifice, near) : 0);
    const walls = measured && area > 0 ? wallsOf(orifice) : null;
    minWallMm.push(walls ? walls.minWallMm : null);
    minWallAt.push(walls ? walls.minAt : null);
    maxWallMm.push(walls ? walls.maxWallMm : null);
  }
  return {
    positionsM: [...positionsM],
    timesS: [...timesS],
    solved,
    iterations: { max: maxIterations, total: totalIterations },
    joints: jointTracks,
    tipSpeedMmPerS: tipSpeeds(pivotTracks, timesS),
    transmissionDeg,
    transmissionAt,
    areaMm2,
    perimeterMm,
    leakAreaMm2,
    leakAt,
    beyondStationsMm,
    minWallMm,
    minWallAt,
    maxWallMm,
    clearanceMm,
    clearanceParts,
  };
}

/** The stations before and after line position x (indices; equal at or beyond the ends of a non-periodic schedule). */
export function neighbours(
  stations: readonly { readonly positionM: number }[],
  repeatLengthM: number | null,
  x: number,
): [number, number] {
  const first = stations[0]!.positionM;
  const last = stations.length - 1;
  let at = x;
  if (repeatLengthM !== null) at = first + ((((x - first) % repeatLengthM) + repeatLengthM) % repeatLengthM);
  if (at <= first) return [0, 0];
  for (let i = 0; i < last; i++) {
    const a = stations[i]!.positionM;
    const b = stations[i + 1]!.positionM;
    if (at === a) return [i, i];
    if (at > a && at < b) return [i, i + 1];
  }
  if (at === stations[last]!.positionM) return [last, last];
  return repeatLengthM === null ? [last, last] : [last, 0];
}

/**
 * How far the orifice's boundary reaches outside both neighbouring stations' orifices, mm: the largest distance from a
 * vertex of the orifice lying outside every ring of `near` to the nearest of them (0 when none lies outside). A
 * reach within the fit tolerance is the fit's own sliver; beyond it the opening is larger there than either station.
 */
function reachBeyond(orifice: Region, near: readonly Ring[]): number {
  let reach = 0;
  for (const p of orifice.outer) {
    let nearest = Number.POSITIVE_INFINITY;
    let inside = false;
    for (const ring of near) {
      if (ringLocator(ring, DEFAULT_TOLERANCES)(p) !== 'outside') {
        inside = true;
        break;
      }
      nearest = Math.min(nearest, pointToRingDistance(p, ring));
    }
    if (!inside) reach = Math.max(reach, nearest);
  }
  return reach;
}

function wallsOf(orifice: Region): WallMeasurement | null {
  try {
    return measureWalls(orifice, DEFAULT_TOLERANCES);
  } catch {
    // a region with no measurable area has no wall; the area series shows it
    return null;
  }
}

/** The transmission angle farthest from 90° over the binary links and the dyad joints of a pose, degrees. */
function worstTransmission(pose: Pose): { deg: number; id: string } | null {
  let worst: { deg: number; id: string } | null = null;
  const consider = (mu: number, id: string) => {
    const deg = toDegrees(mu);
    if (!worst || Math.abs(90 - deg) > Math.abs(90 - worst.deg)) worst = { deg, id };
  };
  for (const t of transmissionAngles(pose)) consider(t.mu, t.linkId);
  for (const t of dyadTransmissionAngles(pose)) consider(t.mu, t.jointId);
  return worst;
}

/** Fastest pivot speed per step, mm/s: central differences inside, one-sided at the ends. */
function tipSpeeds(tracks: readonly (readonly Point[])[], timesS: readonly number[]): number[] {
  const n = tracks.length;
  return tracks.map((_, j) => {
    if (n < 2) return 0;
    const a = Math.max(0, j - 1);
    const b = Math.min(n - 1, j + 1);
    const dt = timesS[b]! - timesS[a]!;
    if (!(dt > 0)) return 0;
    let fastest = 0;
    tracks[j]!.forEach((_, k) => {
      const p = tracks[a]![k]!;
      const q = tracks[b]![k]!;
      fastest = Math.max(fastest, Math.hypot(q[0] - p[0], q[1] - p[1]) / dt);
    });
    return fastest;
  });
}
