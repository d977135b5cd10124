import type { Finding } from '../domain/index.js';
import {
  boundingBox,
  closestPointOnPolyline,
  type Point,
  pointInRegion,
  type Region,
  regionArea,
  regionBoundaryHausdorff,
  symmetricDifferenceArea,
} from '../geometry/index.js';
import { DEFAULT_TOLERANCES, type LeastSquaresResult, solveLeastSquares } from '../numeric/index.js';
import type { MovingSpan } from '../span/index.js';
import { plateOpening, stationEnvelope } from './achieved-orifice.js';
import {
  type ChainProblemSpec,
  chainFromParameters,
  chainLayout,
  type EndKind,
  extensionIndex,
  makeChainProblem,
} from './chain-problem.js';
import { equalArcPivots, marchChain } from './march-chain.js';
import { type ChainEnd, endPoint, type PlateChain } from './plate-chain.js';
import { pivotFans, plateOutline, type PlateShape } from './plate-outline.js';
import { type PivotTarget, preparePivotTargets } from './pivot-targets.js';
import { nearestPlate } from './nearest-plate.js';
import { jointArticulation } from './joint-articulation.js';
import { mergePlatesStart } from './merge-plates-start.js';
import { type EdgeProfile, shapePlateEdges } from './shape-plate-edges.js';

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
  /** Fewest plates the search may return (the plant's own lower bound). @default 1 */
  readonly minPlates: number;
  /** May an end pin run in a slot when pinned ends cannot follow the stations? @default true */
  readonly allowSlots: boolean;
  /** May one plate telescope when pinned ends cannot follow the stations and no slot may be used? @default true */
  readonly allowTelescoping: boolean;
  /** May plates carry shaped edges (common to all stations) when straight edges miss? @default true */
  readonly shapedEdges: boolean;
  /**
   * Asked before each further start and plate count: true ends the search there with what it has (the caller's time
   * limit; the core reads no clock). A single least-squares solve is never interrupted. @default never
   */
  readonly stop: () => boolean;
}

function describeForm(spec: Pick<ChainProblemSpec, 'startKind' | 'endKind' | 'telescoping'>): string {
  if (spec.startKind === 'slot') return 'slot at start';
  if (spec.endKind === 'slot') return 'slot at end';
  const t = spec.telescoping ?? [];
  return t.length > 0 ? `telescoping plate ${t.map((k) => k + 1).join(', ')}` : 'pinned';
}

/** How the chain is held and which plate, if any, telescopes. */
export interface ChainForm {
  readonly startKind: EndKind;
  readonly endKind: EndKind;
  readonly telescoping: readonly number[];
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
    minPlates: 1,
    allowSlots: true,
    allowTelescoping: true,
    shapedEdges: true,
    stop: () => false,
    ...partial,
  };
}

/** How well the achieved orifice of one station matches its target. */
export interface StationFit {
  readonly station: number;
  readonly targetOrifice: Region;
  readonly achievedOrifice: Region;
  /** Pieces of the die opening the plates leave uncovered apart from the orifice (melt would leak there), mm. */
  readonly uncovered: readonly Region[];
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
  /** How the chain was held: `pinned`, `slot at start`, `slot at end`, `telescoping plate k` (1-based). */
  readonly form: string;
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
  /** Each plate's shaped melt edge in its own frame, or null for a straight edge. */
  readonly edgeProfiles: readonly (EdgeProfile | null)[];
  readonly opening: Region;
  readonly stations: readonly StationFit[];
  readonly solver: {
    readonly status: LeastSquaresResult['status'];
    readonly iterations: number;
    readonly reason: string;
  };
  readonly attempts: readonly FitAttempt[];
  /** What the plate-count search covered, and the evidence that one plate fewer misses. */
  readonly search: PlateCountSearch;
  readonly findings: readonly Finding[];
}

/** The plate counts the fit searched and what it found at the count below its answer. */
export interface PlateCountSearch {
  /** Smallest and largest plate count tried. */
  readonly lowestTried: number;
  readonly highestTried: number;
  /** Chain forms tried, in words (`pinned`, `slot at end`, `telescoping plate k`). */
  readonly forms: readonly string[];
  /**
   * One plate fewer than the answer: how many independent starts were solved and the smallest miss among them (exact
   * deviation, or the sample miss when the chain did not close or the samples already missed), mm. Null when the
   * answer is the plate count asked for, the lower bound, or the search found no passing chain.
   */
  readonly belowAnswer: { readonly plateCount: number; readonly starts: number; readonly bestMissMm: number } | null;
  /** The caller's stop ended the search before it was complete (upward to a pass, or downward to a miss). */
  readonly stoppedEarly: boolean;
}

/**
 * Finds the plates and pivots whose edges trace every station's moving span (docs/MODEL.md §2–3): pivot-line targets at
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
  // stations that repeat an earlier one exactly (a periodic schedule returning to its first profile, a dwell) add
  // nothing to fit: fit the distinct ones and give the repeats the same pose
  const keys = orifices.map((o, i) => JSON.stringify([o, spans[i]!.path]));
  const first = keys.map((k) => keys.indexOf(k));
  const distinct = [...new Set(first)];
  if (distinct.length === orifices.length || distinct.length < 1) return fitDistinctStations(orifices, spans, options);
  const fit = fitDistinctStations(
    distinct.map((i) => orifices[i]!),
    distinct.map((i) => spans[i]!),
    options,
  );
  const slot = first.map((i) => distinct.indexOf(i));
  const expandEnd = (end: ChainEnd): ChainEnd =>
    end.kind === 'pivot' ? end : { ...end, travelMm: slot.map((u) => end.travelMm[u]!) };
  return {
    ...fit,
    chain: {
      ...fit.chain,
      start: expandEnd(fit.chain.start),
      end: expandEnd(fit.chain.end),
      pivots: slot.map((u) => fit.chain.pivots[u]!),
      telescoping: fit.chain.telescoping.map((t) => ({
        ...t,
        stationLengthsMm: slot.map((u) => t.stationLengthsMm[u]!),
      })),
    },
    plates: slot.map((u) => fit.plates[u]!),
    stations: slot.map((u, i) => ({ ...fit.stations[u]!, station: i })),
    findings: fit.findings.map((f) => (f.station === undefined ? f : { ...f, station: distinct[f.station]! })),
  };
}

function fitDistinctStations(
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
  const keepOut = spans.map((span) => keepOutPoints(span, extension + 2 * e + options.minPlateLengthMm, 1.0));
  // the die opening is the envelope of every station: what the plates leave of it is orifice (or a leak)
  const envelope = stationEnvelope(orifices);
  const openings = spans.map(() => envelope);

  const march = marchChain(
    targets.map((t) => t.pivotLine),
    0.8 * options.toleranceMm,
    options.minPlateLengthMm,
    options.maxPlates,
  );
  const estimate = options.plateCount ?? Math.max(1, Math.min(options.maxPlates, march.lengthsMm.length));
  // marching overestimates where stations bend at different places: the scan starts a little below it
  const lowest = options.plateCount ?? Math.max(1, options.minPlates, estimate - Math.max(2, Math.round(estimate / 4)));
  type Solved = ReturnType<typeof refineChain>;
  const fromScratch = (n: number, form: ChainForm): Solved => {
    // a telescoping plate keeps its place along the chain when the plate count changes
    const ends: ChainForm = {
      ...form,
      telescoping: form.telescoping.map((k) =>
        Math.min(n - 2, Math.max(1, Math.round(((k + 0.5) * n) / lowest - 0.5))),
      ),
    };
    const start = initialChain(targets, samples, keepOut, n, ends, e, options, null);
    let best = refineChain(start.x, start.spec, options);
    if (n === march.lengthsMm.length && best.result.maxAbsResidual > options.toleranceMm) {
      const marchedStart = initialChain(targets, samples, keepOut, n, ends, e, options, march.pivots);
      const other = refineChain(marchedStart.x, marchedStart.spec, options);
      if (other.result.cost < best.result.cost) best = other;
    }
    return best;
  };
  // how the chain is held: pinned at both ends; one end in a slot (the end whose tangent changes least between
  // stations, along it); or pinned with one telescoping plate (tried where the stations' chords differ most). The
  // forms are scanned together from the lowest plate count up, each count continuing from that form's chain one plate
  // shorter; the first count at which a form passes the exact check wins, and at equal counts the simpler form wins
  // (a slot or a telescoping pair is hardware a pinned chain does not need).
  const pinned: ChainForm = { startKind: 'pivot', endKind: 'pivot', telescoping: [] };
  const forms: ChainForm[] = [pinned];
  const slotted = options.allowSlots ? slotEnd(targets) : null;
  if (slotted) forms.push({ ...slotted, telescoping: [] });
  // a slotted end takes up differences in span length more simply than a telescoping pair; telescoping plates are
  // tried where no slot may be used
  if (options.allowTelescoping && !slotted && targets.length > 1 && lowest >= 3) {
    for (const k of telescopingCandidates(targets, lowest).slice(0, 3)) forms.push({ ...pinned, telescoping: [k] });
  }

  interface Candidate {
    readonly form: ChainForm;
    solved: Solved;
    readonly miss: { sampleMm: number; closureMm: number };
    evaluation: ReturnType<typeof evaluateChain> | null;
  }
  const attempts: FitAttempt[] = [];
  const judge = (form: ChainForm, solved: Solved): Candidate => {
    const measured = chainMiss(solved.x, solved.spec);
    // samples can pass while plate bodies or round ends miss between them: the exact check has the last word
    // a chain that cannot move (N − 2 + slots + telescoping pairs < 1) can only pass between stations by being
    // taken apart: it never passes when the stations differ
    const spec = solved.spec;
    const freedom =
      spec.plateCount -
      2 +
      (spec.startKind === 'slot' ? 1 : 0) +
      (spec.endKind === 'slot' ? 1 : 0) +
      (spec.telescoping?.length ?? 0);
    const movable = freedom >= 1 || orifices.length < 2;
    // an immovable chain counts as one that does not close: it never passes, shaped or not
    const miss = movable ? measured : { ...measured, closureMm: Number.POSITIVE_INFINITY };
    const candidate: Candidate = { form, solved, miss, evaluation: null };
    const closes = miss.closureMm <= CLOSURE_LIMIT_MM;
    if (miss.sampleMm <= options.toleranceMm && closes) {
      candidate.evaluation = evaluateChain(chainFromParameters(solved.x, solved.spec), orifices, openings, shape);
    }
    attempts.push({
      plateCount: solved.spec.plateCount,
      form: movable ? describeForm(solved.spec) : `${describeForm(solved.spec)}, cannot move`,
      solverStatus: solved.result.status,
      iterations: solved.result.iterations,
      maxSampleResidualMm: miss.sampleMm,
      closureGapMm: measured.closureMm,
      maxDeviationMm: candidate.evaluation?.worst ?? null,
    });
    return candidate;
  };
  /**
   * The chain refitted for shaped edges: the pivots are pulled onto the samples near them (the round ends must meet
   * the target there) while mid-plate samples are left to the edge, then the edges are shaped and checked exactly.
   */
  const shapedCandidate = (solved: Solved) => {
    const weights = edgeSampleWeights(chainFromParameters(solved.x, solved.spec), solved.spec.samples, e);
    const refit = refineChain(solved.x, { ...solved.spec, sampleWeights: weights, emphasisMm: 0 }, options);
    if (chainMiss(refit.x, refit.spec).closureMm > CLOSURE_LIMIT_MM) return null;
    const chain = chainFromParameters(refit.x, refit.spec);
    const edges = shapePlateEdges(chain, refit.spec.samples, { edgeOffsetMm: e, ligamentMm: options.ligamentMm }).map(
      (edge, k) => (chain.telescoping.some((t) => t.plate === k) ? null : edge),
    );
    return { solved: refit, evaluation: evaluateChain(chain, orifices, openings, shape, edges) };
  };
  /**
   * Straight edges miss by their sagitta, shaped edges only by how much the stations differ locally: the closest
   * candidates of a plate count that failed with straight edges get a try with shaped ones.
   */
  const tryShaped = (c: Candidate): void => {
    if (!options.shapedEdges || c.miss.closureMm > CLOSURE_LIMIT_MM || c.miss.sampleMm > SHAPED_REACH_MM) return;
    const shaped = shapedCandidate(c.solved);
    if (shaped && (c.evaluation === null || shaped.evaluation.worst < c.evaluation.worst)) {
      c.solved = shaped.solved;
      c.evaluation = shaped.evaluation;
      attempts.push({
        plateCount: shaped.solved.spec.plateCount,
        form: `${describeForm(shaped.solved.spec)}, shaped edges`,
        solverStatus: shaped.solved.result.status,
        iterations: shaped.solved.result.iterations,
        maxSampleResidualMm: c.miss.sampleMm,
        closureGapMm: chainMiss(shaped.solved.x, shaped.solved.spec).closureMm,
        maxDeviationMm: shaped.evaluation.worst,
      });
    }
  };
  const passes = (c: Candidate) => c.evaluation !== null && c.evaluation.worst <= options.toleranceMm;
  /** How far a candidate is from passing, for choosing the best effort. */
  const distance = (c: Candidate) =>
    c.evaluation?.worst ?? (c.miss.closureMm <= CLOSURE_LIMIT_MM ? c.miss.sampleMm : Number.POSITIVE_INFINITY);

  const closest = (cs: readonly Candidate[]) => cs.reduce((a, b) => (distance(b) < distance(a) ? b : a));
  // forms are tried in order of simplicity and the first that passes ends the first level
  let live: Candidate[] = [];
  for (const form of forms) {
    live.push(judge(form, fromScratch(lowest, form)));
    if (passes(live[live.length - 1]!)) break;
  }
  const shapeNearest = (cs: readonly Candidate[]) => {
    if (cs.some(passes)) return;
    const near = distance(closest(cs));
    for (const c of cs) if (distance(c) <= 1.5 * near) tryShaped(c);
  };
  shapeNearest(live);
  let best = closest(live);
  let winner = live.find(passes) ?? null;
  // of several telescoping places, only the most promising goes on
  const telescopers = live.filter((c) => c.form.telescoping.length > 0);
  if (telescopers.length > 1) {
    const keep = telescopers.reduce((a, b) => (distance(b) < distance(a) ? b : a));
    live = live.filter((c) => c.form.telescoping.length === 0 || c === keep);
  }
  const last = options.plateCount ?? options.maxPlates;
  let stoppedEarly = false;
  const stopNow = () => {
    if (options.stop()) stoppedEarly = true;
    return stoppedEarly;
  };
  for (let n = lowest + 1; winner === null && n <= last && !stopNow(); n++) {
    // as at the first level, the first form (in order of simplicity) that passes ends the level: the forms after it
    // could not win
    const next: Candidate[] = [];
    for (const c of live) {
      if (next.length > 0 && stopNow()) break;
      // a shaped-edge refit weighs samples for shaped edges; the next count is fitted for straight edges again
      const plain: ChainProblemSpec = {
        ...c.solved.spec,
        sampleWeights: undefined,
        emphasisMm: 0.7 * options.toleranceMm,
      };
      const split = splitWorstPlate(c.solved.x, plain, options);
      let tried = judge(c.form, split ? refineChain(split.x, split.spec, options) : fromScratch(n, c.form));
      // a split keeps the shorter chain's bends where they were: an independent start may find other ones
      if (split && !passes(tried) && !stopNow()) {
        const fresh = judge(c.form, fromScratch(n, c.form));
        if (passes(fresh) || distance(fresh) < distance(tried)) tried = fresh;
      }
      next.push(tried);
      if (passes(tried)) break;
    }
    live = next;
    shapeNearest(live);
    for (const c of live) if (distance(c) < distance(best)) best = c;
    winner = live.find(passes) ?? null;
  }
  // the upward scan proves nothing about counts it did not reach, and a count it passed at may still hold a pivot that
  // never turns: go down from the winner, one plate at a time, from several independent starts (the winner with each
  // of its least-turning pivots removed, and fresh starts in every form) until a count fails from all of them
  if (winner && options.plateCount === null) {
    for (;;) {
      const m = winner.solved.spec.plateCount - 1;
      if (m < Math.max(1, options.minPlates) || stopNow()) break;
      const tries: Candidate[] = [];
      const plainWinner: ChainProblemSpec = {
        ...winner.solved.spec,
        sampleWeights: undefined,
        emphasisMm: 0.7 * options.toleranceMm,
      };
      const turning = jointArticulation(chainFromParameters(winner.solved.x, plainWinner));
      const order = turning.map((t, j) => ({ t, pivot: j + 1 })).sort((a, b) => a.t - b.t);
      for (const { pivot } of order.slice(0, MERGE_STARTS)) {
        if (tries.length > 0 && stopNow()) break;
        const start = mergePlatesStart(winner.solved.x, plainWinner, pivot);
        if (!start) continue;
        tries.push(judge(winner.form, refineChain(start.x, start.spec, options)));
        if (passes(tries[tries.length - 1]!)) break;
      }
      if (!tries.some(passes) && !stopNow()) {
        for (const form of forms) {
          if (form.telescoping.length > 0 && m < 3) continue;
          if (stopNow()) break;
          tries.push(judge(form, fromScratch(m, form)));
          if (passes(tries[tries.length - 1]!)) break;
        }
      }
      shapeNearest(tries);
      const pass = tries.find(passes);
      // a count cut short by the stop is no evidence that it misses
      if (!pass || stoppedEarly) {
        if (pass) winner = pass;
        break;
      }
      winner = pass;
    }
  }
  const status: ChainFit['status'] = winner ? 'fitted' : 'best-effort';
  const final = winner ?? best;
  const { x, spec, result } = final.solved;
  const chain = chainFromParameters(x, spec);
  const { fits, plates, edges } = final.evaluation ?? evaluateChain(chain, orifices, openings, shape);
  const chosen = spec.plateCount;
  const { startKind, endKind } = spec;
  // a telescoping plate that ended up the same length everywhere is just a rigid plate
  const rigidified: PlateChain = {
    ...chain,
    lengthsMm: chain.lengthsMm.map((l, k) => {
      const t = chain.telescoping.find((x) => x.plate === k);
      return t ? t.stationLengthsMm.reduce((a, b) => a + b, 0) / t.stationLengthsMm.length : l;
    }),
    telescoping: chain.telescoping.filter(
      (t) => Math.max(...t.stationLengthsMm) - Math.min(...t.stationLengthsMm) > RIGID_STROKE_MM,
    ),
  };
  const tried = attempts.map((a) => a.plateCount);
  const below = chosen - 1;
  const belowAttempts = attempts.filter((a) => a.plateCount === below);
  const missOf = (a: FitAttempt) =>
    a.maxDeviationMm ?? (a.closureGapMm <= CLOSURE_LIMIT_MM ? a.maxSampleResidualMm : Number.POSITIVE_INFINITY);
  const search: PlateCountSearch = {
    lowestTried: Math.min(...tried),
    highestTried: Math.max(...tried),
    forms: forms.map(describeForm),
    belowAnswer:
      winner && belowAttempts.length > 0
        ? { plateCount: below, starts: belowAttempts.length, bestMissMm: Math.min(...belowAttempts.map(missOf)) }
        : null,
    stoppedEarly,
  };
  const findings = fitFindings(rigidified, fits, orifices, status, options, startKind, endKind, spans, search);
  return {
    status,
    chain: rigidified,
    plateCount: chosen,
    shape,
    plates,
    edgeProfiles: edges ?? chain.lengthsMm.map(() => null),
    opening: openings[0]!,
    stations: fits,
    solver: { status: result.status, iterations: result.iterations, reason: result.reason },
    attempts,
    search,
    findings,
  };
}

/**
 * Interior plates to try as the telescoping one, most promising first: by how much their chords differ between
 * stations when every station's pivot line is cut into equal arc-length fractions (Shamsudin et al. 2013 put the
 * prismatic joint where the stations differ in length).
 */
function telescopingCandidates(targets: readonly PivotTarget[], n: number): number[] {
  const guess = equalArcPivots(
    targets.map((t) => t.pivotLine),
    n,
  );
  const spread = (k: number) => {
    const chords = guess.map((p) => Math.hypot(p[k + 1]![0] - p[k]![0], p[k + 1]![1] - p[k]![1]));
    return Math.max(...chords) - Math.min(...chords);
  };
  return Array.from({ length: Math.max(0, n - 2) }, (_, i) => i + 1).sort((a, b) => spread(b) - spread(a));
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

/**
 * The start vector of the chain least-squares problem for n plates held in a given form: pivots at equal arc-length
 * fractions (or the marching pivots) on every pivot line, end pins at the mean line ends, a slot along the mean end
 * tangent, common lengths the station mean. Exported for the benchmark, which runs other optimisers from it.
 */
export function initialChain(
  targets: readonly PivotTarget[],
  samples: readonly (readonly Point[])[],
  keepOut: readonly (readonly Point[])[],
  n: number,
  ends: ChainForm,
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
    startKind: ends.startKind,
    endKind: ends.endKind,
    telescoping: ends.telescoping.filter((k) => k < n),
    startAnchor,
    endAnchor,
    emphasisMm: 0.7 * options.toleranceMm,
    keepOut,
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
    const mean = Math.max(options.minPlateLengthMm, sum / guess.length);
    x[layout.lengths + k] = mean;
    guess.forEach((p, i) => {
      const ext = extensionIndex(layout, k, i);
      if (ext >= 0) {
        const chord = Math.hypot(p[k + 1]![0] - p[k]![0], p[k + 1]![1] - p[k]![1]);
        x[ext] = Math.max(TELESCOPING_MIN_FACTOR * options.minPlateLengthMm, chord);
      }
    });
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
      const near = nearestPlate(q, pivots);
      worst[near.plate] = Math.max(worst[near.plate]!, Math.abs(near.distance - spec.edgeOffsetMm));
    }
  });
  let pick = -1;
  for (let k = 0; k < n; k++) {
    if (layout.telescoping.includes(k)) continue;
    if (x[layout.lengths + k]! >= 2 * options.minPlateLengthMm && (pick < 0 || worst[k]! > worst[pick]!)) pick = k;
  }
  if (pick < 0) return null;
  const next: ChainProblemSpec = {
    ...spec,
    plateCount: n + 1,
    telescoping: layout.telescoping.map((k) => (k > pick ? k + 1 : k)),
  };
  const nl = chainLayout(next);
  const y = new Float64Array(nl.parameterCount);
  y.set(x.subarray(layout.start, layout.start + layout.startSize), nl.start);
  y.set(x.subarray(layout.end, layout.end + layout.endSize), nl.end);
  y.set(x.subarray(layout.extensions, layout.parameterCount), nl.extensions);
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

/** Levenberg–Marquardt from `x`, then proximal polishing passes that re-tie the end pins where the solve ended. */
function refineChain(x0: Float64Array, spec: ChainProblemSpec, options: ChainFitOptions) {
  const layout = chainLayout(spec);
  const n = layout.plateCount;
  const lower = new Float64Array(layout.parameterCount).fill(Number.NEGATIVE_INFINITY);
  for (let k = 0; k < n; k++) lower[layout.lengths + k] = options.minPlateLengthMm;
  for (let c = layout.extensions; c < layout.parameterCount; c++) {
    lower[c] = TELESCOPING_MIN_FACTOR * options.minPlateLengthMm;
  }
  const solve = (s: ChainProblemSpec, from: Float64Array, maxIterations: number) => {
    const problem = makeChainProblem(s);
    return solveLeastSquares(
      {
        parameterCount: layout.parameterCount,
        residualCount: layout.residualCount,
        residuals: problem.residuals,
        normalEquations: problem.normalEquations,
      },
      from,
      { maxIterations, lowerBounds: lower, costTolerance: 1e-9 },
    );
  };
  let result = solve(spec, x0, options.maxIterations);
  if (chainMiss(result.x, spec).closureMm > CLOSURE_LIMIT_MM) {
    // from a poor start the emphasis on large misses can outweigh the closure: settle the chain by plain least
    // squares first, then emphasise
    const plain = solve({ ...spec, emphasisMm: 0 }, x0, options.maxIterations);
    const again = solve(spec, plain.x, options.maxIterations);
    if (chainMiss(again.x, spec).closureMm < chainMiss(result.x, spec).closureMm) {
      result = { ...again, iterations: result.iterations + plain.iterations + again.iterations };
    }
  }
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

/** Pivots of a passing chain (least-turning first) removed one at a time as starts for one plate fewer. */
const MERGE_STARTS = 3;

/**
 * A telescoping pair is two plates sliding on each other: its shortest pivot-to-pivot length must hold both plates'
 * holes and the slide between them, taken as 1.5 plate minimums (common practice, no source).
 */
const TELESCOPING_MIN_FACTOR = 1.5;

/**
 * Points of the die-body boundary near the span's ends, every `spacing` mm, out to `reach` mm from either end: where
 * plates leaving the opening would cover the melt channel if they strayed.
 */
function keepOutPoints(span: MovingSpan, reach: number, spacing: number): Point[] {
  const out: Point[] = [];
  const near = (p: Point) =>
    Math.hypot(p[0] - span.start[0], p[1] - span.start[1]) <= reach ||
    Math.hypot(p[0] - span.end[0], p[1] - span.end[1]) <= reach;
  const line = span.fixed;
  for (let i = 0; i + 1 < line.length; i++) {
    const a = line[i]!;
    const b = line[i + 1]!;
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    const steps = Math.max(1, Math.ceil(len / spacing));
    for (let k = i === 0 ? 1 : 0; k < steps; k++) {
      const p: Point = [a[0] + ((b[0] - a[0]) * k) / steps, a[1] + ((b[1] - a[1]) * k) / steps];
      if (near(p)) out.push(p);
    }
  }
  return out;
}

/**
 * A fitted chain must close onto its end pin to within this, mm, or it will not assemble: well inside the clearance of
 * a reamed pin in its hole (a few hundredths of a millimetre; common practice, no source).
 */
const CLOSURE_LIMIT_MM = 5e-3;

/**
 * Weights for refitting a chain that will carry shaped edges: 1 for samples facing a plate's ends (within the edge's
 * blend length of a pivot), falling smoothly to 5 % at mid-plate, where the shaped edge takes over.
 */
function edgeSampleWeights(chain: PlateChain, samples: readonly (readonly Point[])[], e: number): number[][] {
  return chain.pivots.map((pivots, i) =>
    samples[i]!.map((q) => {
      const near = nearestPlate(q, pivots);
      const length = Math.max(near.plateLengthMm, 1e-9);
      const along = near.t * length;
      const blend = Math.min(e, length / 3);
      const x = Math.min(along, length - along) / blend;
      const c = Math.max(0, Math.min(1, x));
      return Math.max(0.05, 1 - c * c * (3 - 2 * c));
    }),
  );
}

/** A telescoping plate whose length changes less than this between stations is reported rigid, mm. */
const RIGID_STROKE_MM = 1e-3;

/** Shaped edges are tried on chains whose straight-edge samples miss by up to this much, mm. */
const SHAPED_REACH_MM = 1;

/** Largest sample miss |dist − e| and largest closure gap of a parameter vector, mm. */
function chainMiss(x: Float64Array, spec: ChainProblemSpec): { sampleMm: number; closureMm: number } {
  const chain = chainFromParameters(x, spec);
  let sampleMm = 0;
  let closureMm = 0;
  chain.pivots.forEach((pivots, i) => {
    const n = pivots.length - 1;
    for (const q of spec.samples[i]!) {
      sampleMm = Math.max(sampleMm, Math.abs(nearestPlate(q, pivots).distance - spec.edgeOffsetMm));
    }
    const pin = endPoint(chain.end, i);
    closureMm = Math.max(closureMm, Math.hypot(pivots[n]![0] - pin[0], pivots[n]![1] - pin[1]));
  });
  return { sampleMm, closureMm };
}

/** Exact check: plate outlines, achieved orifice by clipping, deviation and area error per station. */
function evaluateChain(
  chain: PlateChain,
  orifices: readonly Region[],
  openings: readonly Region[],
  shape: PlateShape,
  edges: readonly (EdgeProfile | null)[] | null = null,
) {
  const plates: Region[][] = [];
  const fans = pivotFans(chain.pivots);
  const fits: StationFit[] = chain.pivots.map((pivots, i) => {
    const stationPlates: Region[] = [];
    for (let k = 0; k + 1 < pivots.length; k++) {
      const fan = { atA: fans[k]!, atB: fans[k + 1]! };
      stationPlates.push(plateOutline(pivots[k]!, pivots[k + 1]!, shape, edges?.[k] ?? null, fan));
    }
    plates.push(stationPlates);
    const target = orifices[i]!;
    // pins fill the pivot holes: the plates cover the opening with their outlines
    const covers = stationPlates.map((p) => ({ outer: p.outer, holes: [] }));
    const { orifice: achieved, strays } = plateOpening(openings[i]!, covers, target);
    const targetArea = regionArea(target);
    if (achieved.outer.length < 3) {
      const box = boundingBox(target.outer);
      return {
        station: i,
        targetOrifice: target,
        achievedOrifice: achieved,
        uncovered: strays,
        // the plates close the whole orifice: it is missed by its full extent
        maxDeviationMm: Math.hypot(box.maxX - box.minX, box.maxY - box.minY),
        worstTarget: target.outer[0]!,
        worstAchieved: target.outer[0]!,
        symmetricDifferenceMm2: targetArea,
        areaErrorPct: -100,
      };
    }
    const h = regionBoundaryHausdorff(target, achieved);
    let worst = { distance: h.distance, target: h.fromA, achieved: h.toB };
    // uncovered opening away from the orifice leaks melt: it counts by how far it lies from the target
    for (const stray of strays) {
      for (const v of stray.outer) {
        const near = closestPointOnPolyline(v, target.outer, true);
        if (near.distance > worst.distance) worst = { distance: near.distance, target: near.point, achieved: v };
      }
    }
    const strayArea = strays.reduce((sum, r) => sum + regionArea(r), 0);
    return {
      station: i,
      targetOrifice: target,
      achievedOrifice: achieved,
      uncovered: strays,
      maxDeviationMm: worst.distance,
      worstTarget: worst.target,
      worstAchieved: worst.achieved,
      symmetricDifferenceMm2: symmetricDifferenceArea([target], [achieved]) + strayArea,
      areaErrorPct: ((regionArea(achieved) + strayArea - targetArea) / targetArea) * 100,
    };
  });
  return { fits, plates, worst: Math.max(...fits.map((f) => f.maxDeviationMm)), edges };
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
  search: PlateCountSearch,
): Finding[] {
  const findings: Finding[] = [];
  const n = chain.lengthsMm.length;
  const searched =
    search.lowestTried === search.highestTried
      ? `${search.lowestTried} plates`
      : `${search.lowestTried} to ${search.highestTried} plates`;
  if (search.stoppedEarly) {
    findings.push({
      code: 'FIT_SEARCH_STOPPED',
      severity: 'warning',
      value: search.highestTried,
      message:
        status === 'fitted'
          ? `The plate-count search reached its time limit after passing with ${n} plates and before it could show that fewer miss (it tried ${searched}): a chain of fewer plates may exist.`
          : `The plate-count search reached its time limit after ${searched} without a chain that meets the tolerance: more plates than it reached may. Plan a smaller schedule, or fix the count with limits.plate_count.`,
    });
  }
  if (status === 'fitted') {
    const b = search.belowAnswer;
    findings.push({
      code: 'PLATE_COUNT',
      severity: 'info',
      value: n,
      message:
        options.plateCount !== null
          ? `${n} plates, as limits.plate_count asks; fewer were not searched.`
          : b === null
            ? search.stoppedEarly
              ? `${n} plates; fewer were not tried before the search's time limit.`
              : `${n} plates, the fewest the search allowed (limits.min_plates ${options.minPlates}).`
            : `${n} plates is the fewest found: with ${b.plateCount} the best of ${b.starts} independent starts misses by ${Number.isFinite(b.bestMissMm) ? `${fmt(b.bestMissMm)} mm` : 'a chain that does not close'} (tolerance ${options.toleranceMm} mm). This is evidence from local fits, not a proof.`,
    });
  }
  if (status === 'best-effort') {
    const worst = fits.reduce((a, b) => (b.maxDeviationMm > a.maxDeviationMm ? b : a));
    findings.push({
      code: 'FIT_TOLERANCE_NOT_MET',
      severity: 'error',
      station: worst.station,
      value: worst.maxDeviationMm,
      limit: options.toleranceMm,
      at: worst.worstTarget,
      message: `No chain the search tried (${searched}; ${search.forms.join(', ')}) traces every station within ${options.toleranceMm} mm; the best (${chain.lengthsMm.length} plates) misses station ${worst.station} by ${fmt(worst.maxDeviationMm)} mm near (${fmt(worst.worstTarget[0])}, ${fmt(worst.worstTarget[1])}) mm. More plates (limits.max_plates), a smaller pivot hole or ligament (tighter curves), a telescoping plate, or a looser fit_tolerance_mm would help.`,
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
  for (const f of fits) {
    if (f.uncovered.length === 0) continue;
    const piece = f.uncovered[0]!;
    const at = piece.outer[0]!;
    findings.push({
      code: 'UNCOVERED_OPENING',
      severity: 'error',
      station: f.station,
      value: f.uncovered.reduce((sum, r) => sum + regionArea(r), 0),
      at,
      message: `At station ${f.station} the plates leave ${f.uncovered.length} piece(s) of the die opening uncovered apart from the orifice (near (${fmt(at[0])}, ${fmt(at[1])}) mm); melt would leak there. Deeper plates (plates.depth_mm) or more plates would cover it.`,
    });
  }
  for (const t of chain.telescoping) {
    const stroke = Math.max(...t.stationLengthsMm) - Math.min(...t.stationLengthsMm);
    const shortest = Math.min(...t.stationLengthsMm);
    // the two plates of the pair overlap by the shortest length less one plate minimum at each end
    const overlap = shortest - options.minPlateLengthMm;
    findings.push({
      code: 'TELESCOPING_PLATE',
      severity: overlap < options.minPlateLengthMm / 2 ? 'warning' : 'info',
      value: stroke,
      message: `Plate ${t.plate + 1} is a telescoping pair: its pivots are ${fmt(shortest)}–${fmt(Math.max(...t.stationLengthsMm))} mm apart across stations (stroke ${fmt(stroke)} mm), leaving about ${fmt(overlap)} mm of slide overlap at its shortest. Check the slide's guidance and sealing with the tool maker.`,
    });
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
