import { boundingBox, type Point, type Region, regionBoundaryHausdorff } from '../geometry/index.js';
import { analyseMobility, grublerMobility, jointPoint, type Pose, pointOnBody } from '../kinematics/index.js';
import { toDegrees } from '../numeric/index.js';
import { achievedOrifice, pivotFans, plateOutline } from '../synthesis/index.js';
import { assembleStations, pivotPoints } from './assemble-stations.js';
import { type ChainTopology, chainTopology, type MechanisableChain } from './chain-topology.js';
import { directMode } from './direct-mode.js';
import type { MotionDefect } from './drive-through-stations.js';
import type { EvaluatedDesign } from './evaluate-design.js';
import { groundPivotRegion } from './ground-pivot-region.js';
import { ringGap } from './motion-clearance.js';
import type { PlateCandidates } from './link-candidates.js';
import type { MechanisationResult, MechanismReport, StationOutcome } from './mechanisation-result.js';
import type { MechaniseContext } from './mechanise-context.js';
import { failureFindings, LAYER_MODEL, successFindings } from './mechanise-findings.js';
import { type MechaniseRequest, resolveMechaniseOptions } from './mechanise-options.js';
import { platePinRegion } from './plate-pin-region.js';
import { type PlateSearch, reducedMode } from './reduced-mode.js';

/**
 * Turns a fitted plate chain into a complete mechanism with exactly `request.actuatorCount` actuators that passes
 * through every station in schedule order (docs/MODEL.md §3 "Mechanisation" and "Position analysis"):
 * 1. every station's chain is closed exactly (`assembleStations`) and coincident stations are merged;
 * 2. direct mode when the count equals the chain's degrees of freedom (actuators on joints, no links); otherwise
 *    reduced mode (`reducedMode`): binary links by Burmester theory for the distinct positions (circumcentres for up
 *    to three, the centre-point curve for four, Burmester points for five, least squares beyond), screened for length,
 *    ground-pivot region, melt clearance and transmission angle, accepted plate by plate only when the partial
 *    mechanism drives through every leg, then actuators placed on die-body pivots;
 * 3. the result is proved with the kinematics engine: Grübler and Jacobian-rank mobility, continuation through every
 *    leg without branch, order or circuit defect, transmission angles of every link along the whole motion;
 * 4. at each station the plates are put where the driven mechanism puts them and the achieved orifice is recomputed
 *    (`plateOutline`, `achievedOrifice`) with its deviation from the target (`regionBoundaryHausdorff`).
 * When nothing passes, `no-mechanism` with findings per plate, what would help, and the smallest actuator count that
 * works when a search upward finds one. Pure and deterministic.
 */
export function mechaniseChain(fit: MechanisableChain, request: MechaniseRequest): MechanisationResult {
  // a link needs two pin holes and the ligament between them, like the shortest plate: hole diameter + ligament
  const options = resolveMechaniseOptions({
    ...request,
    linkLengthMinMm: request.linkLengthMinMm ?? fit.shape.holeRadiusMm + fit.shape.edgeOffsetMm,
  });
  const alternating = chainTopology(fit);
  const stations = assembleStations(alternating, options.mergeToleranceMm);
  const distinct = stations.representatives.length;
  const e = fit.shape.edgeOffsetMm;
  const clearanceMm = options.pinClearanceMm ?? e;
  const orifices = fit.stations.map((s) => s.targetOrifice);
  const n = stations.distinctOf.length;
  const legs: [number, number][] = [];
  const legCount = options.periodic && n > 1 ? n : n - 1;
  for (let i = 0; i < legCount; i++) {
    const from = stations.distinctOf[i]!;
    const to = stations.distinctOf[(i + 1) % n]!;
    if (from !== to) legs.push([from, to]);
  }
  const groundRegion = groundPivotRegion(fit.opening, orifices, options.frameMarginMm, clearanceMm);
  const allPivots = stations.poses.map((p) => pivotPoints(alternating, p));
  const fans = pivotFans(allPivots);
  const coarse = { ...fit.shape, arcToleranceMm: Math.max(fit.shape.arcToleranceMm, 0.2) };
  const platesAt = stations.representatives.map((r) => {
    const pv = allPivots[r]!;
    return pv.slice(1).map((b, k) => plateOutline(pv[k]!, b, coarse, null, { atA: fans[k]!, atB: fans[k + 1]! }).outer);
  });
  // plates that overlap at a station when every other one shares a layer get a layer of their own
  const layers = fit.chain.telescoping.length === 0 ? plateLayers(platesAt) : null;
  const topology = layers ? chainTopology(fit, layers) : alternating;
  const context: MechaniseContext = {
    platesAt,
    options,
    topology,
    stations,
    shape: fit.shape,
    opening: fit.opening,
    orifices,
    groundRegion,
    groundGrid: distinct <= 3 ? groundRegion.grid(options.groundPivotSteps) : [],
    pinRegions: new Map(topology.bodies.map((b) => [b.id, platePinRegion(b, fit.shape, clearanceMm)])),
    clearanceMm,
    residualLimitMm: options.linkResidualLimitMm ?? options.fitToleranceMm / 4,
    arrivalToleranceMm: options.arrivalToleranceMm ?? (distinct <= 3 ? 1e-6 : options.fitToleranceMm / 2),
    legs,
  };
  const d = topology.degreesOfFreedom;
  const a = options.actuatorCount;
  const base = {
    requestedActuators: a,
    chainDegreesOfFreedom: d,
    distinctPositions: distinct,
    synthesis: describeSynthesis(distinct, context.residualLimitMm),
    groundPivotRule: context.groundRegion.rule,
    layerModel: LAYER_MODEL,
    options,
  };

  const noSearch = { assemblies: 0, partialTraces: 0, budgetExhausted: false };
  if (stations.status !== 'converged' || d < 1) {
    const reason = stations.status !== 'converged' ? 'closure' : 'rigid';
    return noMechanism(base, context, [], [], null, noSearch, reason);
  }
  const cache = new Map<string, PlateCandidates>();
  const attempt = (count: number) => {
    if (count === d) {
      const direct = directMode(context);
      return {
        design: direct.design,
        plates: [] as PlateSearch[],
        defects: direct.defects,
        search: { assemblies: direct.tried, partialTraces: 0, budgetExhausted: false },
      };
    }
    const reduced = reducedMode(context, count, cache);
    return {
      design: reduced.design,
      plates: reduced.plates,
      defects: reduced.assemblyDefects,
      search: {
        assemblies: reduced.assemblies,
        partialTraces: reduced.partialTraces,
        budgetExhausted: reduced.budgetExhausted,
      },
    };
  };
  // the smallest count that works, searched upward from `from` (each count's search has its own budgets)
  const smallestFrom = (from: number): number | null => {
    if (!options.findSmallestActuatorCount) return null;
    for (let count = from; count <= d; count++) if (attempt(count).design) return count;
    return null;
  };
  if (a > d) return noMechanism(base, context, [], [], smallestFrom(1), noSearch, 'too-many');
  const first = attempt(a);
  if (first.design) {
    return mechanised(
      base,
      context,
      first.design,
      a === d ? 'direct' : 'reduced',
      first.plates,
      first.search,
      fit.edgeProfiles ?? [],
    );
  }
  return noMechanism(base, context, first.plates, first.defects, smallestFrom(a + 1), first.search, 'search');
}

/**
 * Layers for the plates (1-based, chain order) so that no two plates on one layer overlap at any distinct position:
 * neighbours always differ (they overlap round their common pivot), and each plate takes the lowest layer left by its
 * neighbour and by the earlier plates it overlaps (greedy colouring). Null when plain alternation (1, 2, 1, …) already
 * keeps every layer clear.
 */
function plateLayers(platesAt: readonly (readonly (readonly Point[])[])[]): number[] | null {
  const n = platesAt[0]?.length ?? 0;
  const clash = (i: number, j: number) => platesAt.some((plates) => ringGap(plates[i]!, plates[j]!) < 0);
  const layers: number[] = [];
  for (let k = 0; k < n; k++) {
    const taken = new Set<number>();
    if (k > 0) taken.add(layers[k - 1]!);
    for (let j = 0; j < k - 1; j++) if (clash(j, k)) taken.add(layers[j]!);
    let layer = 1;
    while (taken.has(layer)) layer++;
    layers.push(layer);
  }
  return layers.every((l, k) => l === (k % 2 === 0 ? 1 : 2)) ? null : layers;
}

function describeSynthesis(distinct: number, residualLimitMm: number): string {
  if (distinct <= 2) return `${distinct} distinct position(s): a family of centres for every circle point`;
  if (distinct === 3) return '3 distinct positions: the circumcentre of every candidate circle point (exact links)';
  if (distinct === 4) return '4 distinct positions: samples of the centre-point curve (exact links)';
  if (distinct === 5) return '5 distinct positions: Burmester point pairs (exact links)';
  return `${distinct} distinct positions: least-squares links (Kåsa fits, then Levenberg–Marquardt), residual ≤ ${residualLimitMm} mm`;
}

type Base = Pick<
  MechanisationResult,
  | 'requestedActuators'
  | 'chainDegreesOfFreedom'
  | 'distinctPositions'
  | 'synthesis'
  | 'groundPivotRule'
  | 'layerModel'
  | 'options'
>;

function mechanised(
  base: Base,
  context: MechaniseContext,
  design: EvaluatedDesign,
  mode: 'direct' | 'reduced',
  plates: readonly PlateSearch[],
  search: MechanisationResult['search'],
  edges: NonNullable<MechanisableChain['edgeProfiles']>,
): MechanisationResult {
  const { stations } = context;
  const model = design.mechanism;
  const reached = stations.distinctOf.map((p) => design.motion.arrivals[p] ?? null);
  const poses: Pose[] = reached.map((r, i) => r ?? design.expected[stations.distinctOf[i]!]!);
  const outcomes = poses.map((pose, i) => stationOutcome(context, pose, i, edges));
  const grubler = grublerMobility(model);
  const rank = analyseMobility(poses[0]!);
  const report: MechanismReport = {
    mobility: grubler,
    bodies: model.bodies.map((b) => ({ id: b.id, kind: b.kind, layer: b.layer })),
    joints: model.joints.map((j) => ({
      id: j.id,
      type: j.kind,
      bodies: [j.bodyI, j.bodyJ] as const,
      stationPositions: poses.map((p) => jointPoint(p, j.id)),
    })),
    actuators: model.drivers.map((dr, k) => {
      const joint = model.joints.find((j) => j.id === dr.joint)!;
      const rotary = joint.kind === 'revolute';
      return {
        id: dr.id,
        joint: dr.joint,
        kind: rotary ? ('rotary' as const) : ('linear' as const),
        stationValues: poses.map((p) => (rotary ? toDegrees(p.actuators[k]!) : p.actuators[k]!)),
      };
    }),
    findings: [],
  };
  const transmission = transmissionSummary(design);
  const findings = successFindings(context, design, mode, report, outcomes, transmission, {
    grubler,
    numerical: rank.numerical,
  });
  return {
    ...base,
    status: 'mechanised',
    mode,
    mechanism: { ...report, findings },
    model,
    links: design.links,
    mobility: { grubler, numerical: rank.numerical, rank: rank.rank },
    stations: outcomes,
    legs: design.motion.legs,
    defects: design.motion.defects,
    transmission,
    clearances: design.clearances,
    maxCondition: design.motion.maxCondition,
    plates,
    smallestActuatorCount: base.requestedActuators === 1 ? 1 : null,
    search,
    findings,
  };
}

function noMechanism(
  base: Base,
  context: MechaniseContext,
  plates: readonly PlateSearch[],
  defects: readonly MotionDefect[],
  smallest: number | null,
  search: MechanisationResult['search'],
  reason: 'closure' | 'rigid' | 'too-many' | 'search',
): MechanisationResult {
  const findings = failureFindings(context, plates, defects, smallest, search, reason);
  return {
    ...base,
    status: 'no-mechanism',
    mode: null,
    mechanism: null,
    model: null,
    links: [],
    mobility: null,
    stations: [],
    legs: [],
    defects,
    transmission: { links: [], minDeg: null, maxDeg: null, joints: [] },
    clearances: [],
    maxCondition: null,
    plates,
    smallestActuatorCount: smallest,
    search,
    findings,
  };
}

function transmissionSummary(design: EvaluatedDesign): MechanisationResult['transmission'] {
  const links = design.motion.transmission;
  return {
    links,
    minDeg: links.length > 0 ? Math.min(...links.map((t) => t.minDeg)) : null,
    maxDeg: links.length > 0 ? Math.max(...links.map((t) => t.maxDeg)) : null,
    joints: design.motion.jointTransmission,
  };
}

/** Pivots where the driven mechanism puts them, the plates round them, and the orifice they leave. */
function stationOutcome(
  context: MechaniseContext,
  pose: Pose,
  station: number,
  edges: NonNullable<MechanisableChain['edgeProfiles']>,
): StationOutcome {
  const { topology, stations, shape, opening } = context;
  const pivots = drivenPivots(topology, pose);
  const assembled = pivotPoints(topology, stations.poses[station]!);
  const residualMm = Math.max(...pivots.map((p, k) => Math.hypot(p[0] - assembled[k]![0], p[1] - assembled[k]![1])));
  const plates: Region[] = [];
  const fans = pivotFans(stations.poses.map((pose) => pivotPoints(topology, pose)));
  for (let k = 0; k + 1 < pivots.length; k++) {
    // shaped edges go with their plates: the driven plates carry the same steel the fit checked
    plates.push(
      plateOutline(pivots[k]!, pivots[k + 1]!, shape, edges[k] ?? null, { atA: fans[k]!, atB: fans[k + 1]! }),
    );
  }
  const target = context.orifices[station]!;
  // pins fill the pivot holes: the plates cover the opening with their outlines
  const achieved = achievedOrifice(
    opening,
    plates.map((p) => ({ outer: p.outer, holes: [] })),
    target,
  );
  // when the plates close the whole orifice it is missed by its full extent (kept finite for the wire)
  const box = boundingBox(target.outer);
  let deviationMm = Math.hypot(box.maxX - box.minX, box.maxY - box.minY);
  let worstAt: Point | null = null;
  if (achieved.outer.length >= 3) {
    const h = regionBoundaryHausdorff(target, achieved);
    deviationMm = h.distance;
    worstAt = h.fromA;
  }
  return {
    station,
    position: stations.distinctOf[station]!,
    residualMm,
    closureAdjustmentMm: stations.closureAdjustmentMm[station]!,
    achievedOrifice: achieved,
    deviationMm,
    worstAt,
  };
}

function drivenPivots(topology: ChainTopology, pose: Pose): Point[] {
  return topology.pivots.map(({ body, local }) => pointOnBody(pose, body, local));
}
