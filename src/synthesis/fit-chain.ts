import type { Finding } from '../domain/index.js';
import {
  type Point,
  pointInRegion,
  type Region,
  regionArea,
  regionBoundaryHausdorff,
  symmetricDifferenceArea,
} from '../geometry/index.js';
import { DEFAULT_TOLERANCES, type LeastSquaresResult, solveLeastSquares } from '../numeric/index.js';
import type { MovingSpan } from '../span/index.js';
import { achievedOrifice, dieOpening } from './achieved-orifice.js';
import {
  type ChainProblemSpec,
  chainFromParameters,
  chainLayout,
  type EndKind,
  makeChainProblem,
} from './chain-problem.js';
import { equalArcPivots, marchChain } from './march-chain.js';
import { endPoint, type PlateChain } from './plate-chain.js';
import { plateOutline, type PlateShape } from './plate-outline.js';
import { type PivotTarget, preparePivotTargets } from './pivot-targets.js';

/** Settings of one chain fit; `resolveChainFitOptions` documents the defaults. */
export interface ChainFitOptions {
  /** Largest boundary deviation allowed, mm (symmetric Hausdorff distance, target vs achieved). */
  readonly toleranceMm: number;
  readonly maxPlates: number;
  readonly pivotHoleDiameterMm: number;
  readonly ligamentMm: number;
  /** Plate depth from the melt edge, mm. */
  readonly depthMm: number;
  /** Shortest pivot-to-pivot length: two holes and the ligament between them, mm. @default hole + ligament */
  readonly minPlateLengthMm: number;
  /** Spacing of the span samples the fit matches, mm (the exact check afterwards sees every vertex). @default 0.5 */
  readonly sampleSpacingMm: number;
  /** Iteration cap of each least-squares solve (the polishing passes add a quarter each). @default 60 */
  readonly maxIterations: number;
  /** Fit exactly this many plates instead of searching for the fewest. @default null */
  readonly plateCount: number | null;
}

export function resolveChainFitOptions(
  partial: Pick<ChainFitOptions, 'toleranceMm' | 'maxPlates' | 'pivotHoleDiameterMm' | 'ligamentMm' | 'depthMm'> &
    Partial<ChainFitOptions>,
): ChainFitOptions {
  return {
    minPlateLengthMm: partial.pivotHoleDiameterMm + partial.ligamentMm,
    sampleSpacingMm: 0.5,
    maxIterations: 60,
    plateCount: null,
    ...partial,
  };
}

/** How well the achieved orifice of one station matches its target. */
export interface StationFit {
  readonly station: number;
  readonly targetOrifice: Region;
  readonly achievedOrifice: Region;
  /** Symmetric Hausdorff distance between the target and achieved boundaries, mm. */
  readonly maxDeviationMm: number;
  /** Where the largest deviation is: the target point and the achieved point, mm. */
  readonly worstTarget: Point;
  readonly worstAchieved: Point;
  /** Area of target XOR achieved, mm². */
  readonly symmetricDifferenceMm2: number;
  /** (achieved − target) / target area, %. */
  readonly areaErrorPct: number;
}

/** One plate count tried, for the report. */
export interface FitAttempt {
  readonly plateCount: number;
  readonly solverStatus: LeastSquaresResult['status'];
  readonly iterations: number;
  /** Largest |distance − e| over the span samples after the solve, mm. */
  readonly maxSampleResidualMm: number;
  /** Largest gap between the chain's last pivot and its end pin over the stations, mm. */
  readonly closureGapMm: number;
  /** Largest exact deviation over stations (only computed for candidates that passed the samples), mm. */
  readonly maxDeviationMm: number | null;
}

export interface ChainFit {
  /** `fitted` meets the tolerance; `best-effort` is the closest found, with findings saying where it falls short. */
  readonly status: 'fitted' | 'best-effort';
  readonly chain: PlateChain;
  readonly plateCount: number;
  readonly shape: PlateShape;
  /** Plate outlines at each station, plates[i][k], die-body frame. */
  readonly plates: readonly (readonly Region[])[];
  readonly opening: Region;
  readonly stations: readonly StationFit[];
  readonly solver: {
    readonly status: LeastSquaresResult['status'];
    readonly iterations: number;
    readonly reason: string;
  };
  readonly attempts: readonly FitAttempt[];
  readonly findings: readonly Finding[];
}

/**
 * Finds the plates and pivots whose edges trace every station's moving span (DOMAIN.md §2–3): pivot-line targets at
 * e behind each span, greedy marching for a first plate count, Levenberg–Marquardt over common lengths and per-station
 * angles, then the exact achieved orifice by clipping (opening − plates). The smallest plate count that meets the
 * tolerance wins; if none does up to `maxPlates`, the best found comes back with findings. When the stations' spans
 * differ in length by more than the tolerance allows a chain fixed at both ends to absorb, one end's pin runs in a
 * straight slot along the span's end tangent (the end whose tangent changes least).
 *
 * @param orifices  target orifices in schedule order (normalised)
 * @param spans     their moving spans (same order)
 */
export function fitChain(
  orifices: readonly Region[],
  spans: readonly MovingSpan[],
  options: ChainFitOptions,
): ChainFit {
  const e = options.pivotHoleDiameterMm / 2 + options.ligamentMm;
  const shape: PlateShape = {
    edgeOffsetMm: e,
    depthMm: options.depthMm,
    holeRadiusMm: options.pivotHoleDiameterMm / 2,
    arcToleranceMm: Math.min(0.01, options.toleranceMm / 10),
  };
  const extension = e + options.pivotHoleDiameterMm;
  const targets = preparePivotTargets(spans, e, extension, options.sampleSpacingMm);
  const samples = targets.map((t) => t.span);
  const reach = 3 * (spanExtent(targets) + options.depthMm);
  const openings = spans.map((s) => dieOpening(s.fixed, reach));

  const march = marchChain(
    targets.map((t) => t.pivotLine),
    0.8 * options.toleranceMm,
    options.minPlateLengthMm,
    options.maxPlates,
  );
  const estimate = options.plateCount ?? Math.max(1, Math.min(options.maxPlates, march.lengthsMm.length));
  type Solved = ReturnType<typeof refineChain>;
  const fromScratch = (n: number, ends: { startKind: EndKind; endKind: EndKind }): Solved => {
    const start = initialChain(targets, samples, n, ends, e, options, null);
    let best = refineChain(start.x, start.spec, options);
    if (n === march.lengthsMm.length && best.result.maxAbsResidual > options.toleranceMm) {
      const marchedStart = initialChain(targets, samples, n, ends, e, options, march.pivots);
      const other = refineChain(marchedStart.x, marchedStart.spec, options);
      if (other.result.cost < best.result.cost) best = other;
    }
    return best;
  };
  // ends: pinned at both ends unless only a sliding end meets the tolerance (the end whose tangent changes least
  // between stations then runs in a slot along it); a slot adds a freedom that a pinned fit does not need, so pinned
  // wins whenever it is good enough
  const pinned = { startKind: 'pivot' as EndKind, endKind: 'pivot' as EndKind };
  let ends = pinned;
  const slotted = slotEnd(targets);
  const solved = new Map<number, Solved>();
  /** Solutions found from scratch while choosing the ends, offered again when the scan reaches their count. */
  const scratch = new Map<number, Solved>();
  const firstPinned = fromScratch(estimate, pinned);
  scratch.set(estimate, firstPinned);
  if (slotted && firstPinned.result.maxAbsResidual > options.toleranceMm) {
    const firstSlotted = fromScratch(estimate, slotted);
    if (firstSlotted.result.maxAbsResidual < firstPinned.result.maxAbsResidual) {
      ends = slotted;
      scratch.set(estimate, firstSlotted);
    }
  }
  const { startKind, endKind } = ends;

  const attempts: FitAttempt[] = [];
  const solveFor = (n: number): Solved => {
    let entry = solved.get(n);
    if (!entry) {
      // continue from the chain with one plate fewer when there is one: it can only get better
      const fewer = solved.get(n - 1);
      const split = fewer ? splitWorstPlate(fewer.x, fewer.spec, options) : null;
      entry = split ? refineChain(split.x, split.spec, options) : (scratch.get(n) ?? fromScratch(n, ends));
      const early = scratch.get(n);
      if (early && early.result.cost < entry.result.cost) entry = early;
      solved.set(n, entry);
    }
    return entry;
  };
  const evaluated = new Map<number, { fits: StationFit[]; plates: Region[][]; worst: number }>();
  const evaluate = (n: number) => {
    let ev = evaluated.get(n);
    if (!ev) {
      const { x, spec } = solveFor(n);
      ev = evaluateChain(chainFromParameters(x, spec), orifices, openings, shape);
      evaluated.set(n, ev);
    }
    return ev;
  };
  const passes = (n: number): boolean => {
    const { result, x, spec } = solveFor(n);
    const miss = chainMiss(x, spec);
    const closes = miss.closureMm <= CLOSURE_LIMIT_MM;
    const exact = miss.sampleMm <= options.toleranceMm && closes ? evaluate(n).worst : null;
    attempts.push({
      plateCount: n,
      solverStatus: result.status,
      iterations: result.iterations,
      maxSampleResidualMm: miss.sampleMm,
      closureGapMm: miss.closureMm,
      maxDeviationMm: exact,
    });
    return exact !== null && exact <= options.toleranceMm;
  };

  // search: marching overestimates where stations bend at different places, so scan upward from a few plates below
  // its estimate and take the first count that passes the exact check
  let chosen: number | null = null;
  if (options.plateCount !== null) {
    chosen = passes(estimate) ? estimate : null;
  } else {
    const lowest = Math.max(1, estimate - 3);
    for (let n = lowest; n <= options.maxPlates; n++) {
      if (passes(n)) {
        chosen = n;
        break;
      }
    }
  }
  let status: ChainFit['status'] = 'fitted';
  if (chosen === null) {
    status = 'best-effort';
    chosen = [...solved.keys()].reduce((best, n) =>
      solved.get(n)!.result.maxAbsResidual < solved.get(best)!.result.maxAbsResidual ? n : best,
    );
  }
  const { x, spec, result } = solveFor(chosen);
  const chain = chainFromParameters(x, spec);
  const { fits, plates } = evaluate(chosen);
  const findings = fitFindings(chain, fits, orifices, status, options, startKind, endKind, spans);
  return {
    status,
    chain,
    plateCount: chosen,
    shape,
    plates,
    opening: openings[0]!,
    stations: fits,
    solver: { status: result.status, iterations: result.iterations, reason: result.reason },
    attempts,
    findings,
  };
}

/**
 * The slotted alternative when spans differ in length: the end whose tangent changes least between stations runs in
 * a slot along that tangent. Null with a single station (nothing to absorb).
 */
function slotEnd(targets: readonly PivotTarget[]): { startKind: EndKind; endKind: EndKind } | null {
  if (targets.length < 2) return null;
  const angleSpread = (pick: (t: PivotTarget) => Point) => {
    const angles = targets.map((t) => Math.atan2(pick(t)[1], pick(t)[0]));
    return Math.max(...angles) - Math.min(...angles);
  };
  return angleSpread((t) => t.startTangent) < angleSpread((t) => t.endTangent)
    ? { startKind: 'slot', endKind: 'pivot' }
    : { startKind: 'pivot', endKind: 'slot' };
}

function spanExtent(targets: readonly PivotTarget[]): number {
  let minX = Number.POSITIVE_INFINITY;
  let minY = Number.POSITIVE_INFINITY;
  let maxX = Number.NEGATIVE_INFINITY;
  let maxY = Number.NEGATIVE_INFINITY;
  for (const t of targets) {
    for (const [x, y] of t.pivotLine) {
      minX = Math.min(minX, x);
      minY = Math.min(minY, y);
      maxX = Math.max(maxX, x);
      maxY = Math.max(maxY, y);
    }
  }
  return Math.hypot(maxX - minX, maxY - minY);
}

/** Builds the start vector for n plates and runs the least-squares refinement. */
/** The start vector for n plates: pivots at equal arc length (or the marching pivots) on every pivot line. */
function initialChain(
  targets: readonly PivotTarget[],
  samples: readonly (readonly Point[])[],
  n: number,
  ends: { startKind: EndKind; endKind: EndKind },
  e: number,
  options: ChainFitOptions,
  marched: readonly (readonly Point[])[] | null,
): { x: Float64Array; spec: ChainProblemSpec } {
  const lines = targets.map((t) => t.pivotLine);
  const mean = (pts: readonly Point[]): Point => [
    pts.reduce((s, p) => s + p[0], 0) / pts.length,
    pts.reduce((s, p) => s + p[1], 0) / pts.length,
  ];
  const startAnchor = mean(lines.map((l) => l[0]!));
  const endAnchor = mean(lines.map((l) => l[l.length - 1]!));
  const spec: ChainProblemSpec = {
    samples,
    plateCount: n,
    edgeOffsetMm: e,
    ...ends,
    startAnchor,
    endAnchor,
    emphasisMm: 0.7 * options.toleranceMm,
  };
  const layout = chainLayout(spec);
  const x = new Float64Array(layout.parameterCount);
  const guess = marched && marched[0]!.length === n + 1 ? marched.map((p) => [...p]) : equalArcPivots(lines, n);

  const writeEnd = (offset: number, kind: EndKind, anchor: Point, tangent: (t: PivotTarget) => Point, at: 0 | -1) => {
    x[offset] = anchor[0];
    x[offset + 1] = anchor[1];
    if (kind === 'slot') {
      const dir = mean(targets.map(tangent));
      const psi = Math.atan2(dir[1], dir[0]);
      x[offset + 2] = psi;
      guess.forEach((pivots, i) => {
        const p = pivots[at === 0 ? 0 : pivots.length - 1]!;
        x[offset + 3 + i] = (p[0] - anchor[0]) * Math.cos(psi) + (p[1] - anchor[1]) * Math.sin(psi);
      });
    }
  };
  writeEnd(layout.start, ends.startKind, startAnchor, (t) => t.startTangent, 0);
  writeEnd(layout.end, ends.endKind, endAnchor, (t) => t.endTangent, -1);
  for (const pivots of guess) {
    if (ends.startKind === 'pivot') pivots[0] = startAnchor;
    if (ends.endKind === 'pivot') pivots[n] = endAnchor;
  }
  for (let k = 0; k < n; k++) {
    let sum = 0;
    guess.forEach((p, i) => {
      const a = p[k]!;
      const b = p[k + 1]!;
      sum += Math.hypot(b[0] - a[0], b[1] - a[1]);
      x[layout.angles + i * n + k] = Math.atan2(b[1] - a[1], b[0] - a[0]);
    });
    x[layout.lengths + k] = Math.max(options.minPlateLengthMm, sum / guess.length);
  }
  return { x, spec };
}

/**
 * The start vector for n + 1 plates from a solved n-plate chain: the plate whose samples miss most is cut into two
 * collinear halves, so the start has exactly the n-plate chain's error and the refinement can only improve on it
 * (continuation in plate count). Null when no plate is long enough to halve.
 */
function splitWorstPlate(
  x: Float64Array,
  spec: ChainProblemSpec,
  options: ChainFitOptions,
): { x: Float64Array; spec: ChainProblemSpec } | null {
  const layout = chainLayout(spec);
  const n = layout.plateCount;
  const chain = chainFromParameters(x, spec);
  const worst = new Float64Array(n);
  chain.pivots.forEach((pivots, i) => {
    for (const q of spec.samples[i]!) {
      let best = Number.POSITIVE_INFINITY;
      let seg = 0;
      for (let k = 0; k < n; k++) {
        const d = segmentDistance(q, pivots[k]!, pivots[k + 1]!);
        if (d < best) {
          best = d;
          seg = k;
        }
      }
      worst[seg] = Math.max(worst[seg]!, Math.abs(best - spec.edgeOffsetMm));
    }
  });
  let pick = -1;
  for (let k = 0; k < n; k++) {
    if (x[layout.lengths + k]! >= 2 * options.minPlateLengthMm && (pick < 0 || worst[k]! > worst[pick]!)) pick = k;
  }
  if (pick < 0) return null;
  const next: ChainProblemSpec = { ...spec, plateCount: n + 1 };
  const nl = chainLayout(next);
  const y = new Float64Array(nl.parameterCount);
  y.set(x.subarray(layout.start, layout.start + layout.startSize), nl.start);
  y.set(x.subarray(layout.end, layout.end + layout.endSize), nl.end);
  for (let k = 0, j = 0; k < n; k++, j++) {
    const len = x[layout.lengths + k]!;
    y[nl.lengths + j] = k === pick ? len / 2 : len;
    for (let i = 0; i < layout.stationCount; i++) y[nl.angles + i * (n + 1) + j] = x[layout.angles + i * n + k]!;
    if (k === pick) {
      j++;
      y[nl.lengths + j] = len / 2;
      for (let i = 0; i < layout.stationCount; i++) y[nl.angles + i * (n + 1) + j] = x[layout.angles + i * n + k]!;
    }
  }
  return { x: y, spec: next };
}

function segmentDistance(q: Point, a: Point, b: Point): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const l2 = dx * dx + dy * dy;
  const t = l2 > 0 ? Math.max(0, Math.min(1, ((q[0] - a[0]) * dx + (q[1] - a[1]) * dy) / l2)) : 0;
  return Math.hypot(a[0] + t * dx - q[0], a[1] + t * dy - q[1]);
}

/** Levenberg–Marquardt from `x`, then proximal polishing passes that re-tie the end pins where the solve ended. */
function refineChain(x0: Float64Array, spec: ChainProblemSpec, options: ChainFitOptions) {
  const layout = chainLayout(spec);
  const n = layout.plateCount;
  const lower = new Float64Array(layout.parameterCount).fill(Number.NEGATIVE_INFINITY);
  for (let k = 0; k < n; k++) lower[layout.lengths + k] = options.minPlateLengthMm;
  const solve = (s: ChainProblemSpec, from: Float64Array, maxIterations: number) => {
    const problem = makeChainProblem(s);
    return solveLeastSquares(
      {
        parameterCount: layout.parameterCount,
        residualCount: layout.residualCount,
        residuals: problem.residuals,
        jacobian: problem.jacobian,
        jacobianSparsity: chainSparsity(s),
      },
      from,
      { maxIterations, lowerBounds: lower, costTolerance: 1e-9 },
    );
  };
  let result = solve(spec, x0, options.maxIterations);
  // the weak ties of the end pins to their first guesses bias the answer slightly; tie them again where the solve
  // ended and polish, so at convergence the ties cost nothing (a proximal step)
  let polished = spec;
  for (let pass = 0; pass < 2 && Number.isFinite(result.cost); pass++) {
    const again: ChainProblemSpec = {
      ...spec,
      startAnchor: [result.x[layout.start]!, result.x[layout.start + 1]!],
      endAnchor: [result.x[layout.end]!, result.x[layout.end + 1]!],
    };
    const next = solve(again, result.x, Math.max(20, Math.round(options.maxIterations / 4)));
    if (!(next.cost <= result.cost * (1 + 1e-12))) break;
    polished = again;
    result = { ...next, iterations: result.iterations + next.iterations };
  }
  return { x: result.x, spec: polished, result };
}

/** A fitted chain must close onto its end pin to within this, mm, or it will not assemble. */
const CLOSURE_LIMIT_MM = 1e-3;

/** Largest sample miss |dist − e| and largest closure gap of a parameter vector, mm. */
function chainMiss(x: Float64Array, spec: ChainProblemSpec): { sampleMm: number; closureMm: number } {
  const chain = chainFromParameters(x, spec);
  let sampleMm = 0;
  let closureMm = 0;
  chain.pivots.forEach((pivots, i) => {
    const n = pivots.length - 1;
    for (const q of spec.samples[i]!) {
      let best = Number.POSITIVE_INFINITY;
      for (let k = 0; k < n; k++) best = Math.min(best, segmentDistance(q, pivots[k]!, pivots[k + 1]!));
      sampleMm = Math.max(sampleMm, Math.abs(best - spec.edgeOffsetMm));
    }
    const pin = endPoint(chain.end, i);
    closureMm = Math.max(closureMm, Math.hypot(pivots[n]![0] - pin[0], pivots[n]![1] - pin[1]));
  });
  return { sampleMm, closureMm };
}

/** Columns each residual row may touch: both ends, every length, and its own station's angles. */
function chainSparsity(spec: ChainProblemSpec) {
  const layout = chainLayout(spec);
  const rowStarts: number[] = [0];
  const columns: number[] = [];
  const n = layout.plateCount;
  const endColumns = (offset: number, kind: EndKind, station: number): number[] =>
    kind === 'pivot' ? [offset, offset + 1] : [offset, offset + 1, offset + 2, offset + 3 + station];
  for (let i = 0; i < layout.stationCount; i++) {
    const cols = [
      ...endColumns(layout.start, spec.startKind, i),
      ...endColumns(layout.end, spec.endKind, i),
      ...Array.from({ length: n }, (_, k) => layout.lengths + k),
      ...Array.from({ length: n }, (_, k) => layout.angles + i * n + k),
    ].sort((a, b) => a - b);
    const rows = spec.samples[i]!.length + 2;
    for (let r = 0; r < rows; r++) {
      columns.push(...cols);
      rowStarts.push(columns.length);
    }
  }
  for (const c of [layout.start, layout.start + 1, layout.end, layout.end + 1]) {
    columns.push(c);
    rowStarts.push(columns.length);
  }
  return { rowStarts, columns };
}

/** Exact check: plate outlines, achieved orifice by clipping, deviation and area error per station. */
function evaluateChain(chain: PlateChain, orifices: readonly Region[], openings: readonly Region[], shape: PlateShape) {
  const plates: Region[][] = [];
  const fits: StationFit[] = chain.pivots.map((pivots, i) => {
    const stationPlates: Region[] = [];
    for (let k = 0; k + 1 < pivots.length; k++) stationPlates.push(plateOutline(pivots[k]!, pivots[k + 1]!, shape));
    plates.push(stationPlates);
    const target = orifices[i]!;
    const achieved = achievedOrifice(openings[i]!, stationPlates, target);
    const targetArea = regionArea(target);
    if (achieved.outer.length < 3) {
      return {
        station: i,
        targetOrifice: target,
        achievedOrifice: achieved,
        maxDeviationMm: Number.POSITIVE_INFINITY,
        worstTarget: target.outer[0]!,
        worstAchieved: target.outer[0]!,
        symmetricDifferenceMm2: targetArea,
        areaErrorPct: -100,
      };
    }
    const h = regionBoundaryHausdorff(target, achieved);
    return {
      station: i,
      targetOrifice: target,
      achievedOrifice: achieved,
      maxDeviationMm: h.distance,
      worstTarget: h.fromA,
      worstAchieved: h.toB,
      symmetricDifferenceMm2: symmetricDifferenceArea([target], [achieved]),
      areaErrorPct: ((regionArea(achieved) - targetArea) / targetArea) * 100,
    };
  });
  return { fits, plates, worst: Math.max(...fits.map((f) => f.maxDeviationMm)) };
}

function fitFindings(
  chain: PlateChain,
  fits: readonly StationFit[],
  orifices: readonly Region[],
  status: ChainFit['status'],
  options: ChainFitOptions,
  startKind: EndKind,
  endKind: EndKind,
  spans: readonly MovingSpan[],
): Finding[] {
  const findings: Finding[] = [];
  if (status === 'best-effort') {
    const worst = fits.reduce((a, b) => (b.maxDeviationMm > a.maxDeviationMm ? b : a));
    findings.push({
      code: 'FIT_TOLERANCE_NOT_MET',
      severity: 'error',
      station: worst.station,
      value: worst.maxDeviationMm,
      limit: options.toleranceMm,
      at: worst.worstTarget,
      message: `No chain of up to ${options.maxPlates} plates traces every station within ${options.toleranceMm} mm; the best (${chain.lengthsMm.length} plates) misses station ${worst.station} by ${fmt(worst.maxDeviationMm)} mm near (${fmt(worst.worstTarget[0])}, ${fmt(worst.worstTarget[1])}) mm. More plates (limits.max_plates), a smaller pivot hole or ligament (tighter curves), a telescoping plate, or a looser fit_tolerance_mm would help.`,
    });
  }
  for (const [which, end] of [
    ['start', chain.start],
    ['end', chain.end],
  ] as const) {
    for (let i = 0; i < orifices.length; i++) {
      const p = endPoint(end, i);
      if (pointInRegion(p, orifices[i]!, DEFAULT_TOLERANCES) !== 'outside') {
        findings.push({
          code: 'GROUND_PIVOT_IN_MELT',
          severity: 'error',
          station: i,
          at: p,
          message: `The chain's ${which} pin lies in the melt channel at station ${i}, (${fmt(p[0])}, ${fmt(p[1])}) mm; ground pivots and slots must sit in the die body. Give moving_span ends nearer the die-body walls.`,
        });
        break;
      }
    }
  }
  if (startKind === 'slot' || endKind === 'slot') {
    const end = startKind === 'slot' ? chain.start : chain.end;
    if (end.kind === 'slot') {
      const travel = Math.max(...end.travelMm) - Math.min(...end.travelMm);
      const lengths = spans.map((s) => s.lengthMm);
      findings.push({
        code: 'SLOT_END',
        severity: 'info',
        value: travel,
        message: `The moving span is ${fmt(Math.min(...lengths))}–${fmt(Math.max(...lengths))} mm long across stations, more than a chain pinned at both ends can follow, so the ${startKind === 'slot' ? 'start' : 'end'} pin runs in a straight slot with ${fmt(travel)} mm of travel.`,
      });
    }
  }
  return findings;
}

function fmt(x: number): string {
  return String(Math.round(x * 1000) / 1000);
}
