import type { Caution, Finding, Schedule } from '../domain/index.js';
import { type MechanisationResult, mechaniseChain } from '../mechanise/index.js';
import { type ChainFit, type ChainFitOptions, fitChain, resolveChainFitOptions } from '../synthesis/index.js';
import { chainMechanism, type PlanMechanism } from './chain-mechanism.js';
import { type ScheduleCheck, checkSchedule } from './check-schedule.js';
import { simulationFindings } from './motion-findings.js';
import { type PlanMotion, planMotion } from './plan-motion.js';
import { type PlanSimulation, simulatePlan } from './plan-simulation.js';

/** One chain the planner fitted and tried to drive, for the report. */
export interface ChainTried {
  /** What was changed from the schedule's own settings, in words (`as asked`, `pinned ends only`, …). */
  readonly variant: string;
  readonly plateCount: number;
  readonly fitStatus: ChainFit['status'];
  /** Worst exact deviation over stations of the fitted chain, mm. */
  readonly maxDeviationMm: number;
  readonly chainDegreesOfFreedom: number;
  readonly mechanised: boolean;
  /** Actuators of the mechanism built on this chain, or null when none was built. */
  readonly actuatorCount: number | null;
  /** Why this chain was not the answer, or `chosen`. */
  readonly verdict: string;
}

/** Whether the plan does what the schedule asks, and where it falls short. */
export interface PlanOutcome {
  readonly meetsRequest: boolean;
  /** One sentence per shortfall; empty when the request is met. */
  readonly shortfalls: readonly string[];
}

/** How the caller bounds a plan. */
export interface PlanSettings {
  /**
   * Asked between search steps: true ends the chain search with what it has, and no further chains are tried (the
   * caller's time limit; the core reads no clock). @default never
   */
  readonly stop?: () => boolean;
  /** Told the stage the plan enters and a coarse overall fraction 0–1 (for a job's progress). @default none */
  readonly progress?: (stage: string, fraction: number) => void;
}

/** A plan: the check, the fitted chain and the mechanism built from it, or why it stopped. */
export interface Plan {
  /**
   * `done`: the plan meets the request (every station within the fit tolerance, driven by the requested actuators);
   * `incomplete`: the plan was computed but falls short (see `outcome`), and carries the best mechanism found;
   * `failed`: no chain could be fitted at all (see `error`).
   */
  readonly status: 'done' | 'incomplete' | 'failed';
  /** Why the plan stopped, in a sentence, when it failed. */
  readonly error: string | null;
  readonly outcome: PlanOutcome;
  readonly check: ScheduleCheck;
  readonly fit: ChainFit | null;
  /** Binary links and actuators that drive the chain through every station, or why none were found. */
  readonly mechanisation: MechanisationResult | null;
  /** The mechanism the plan reports: the mechanised one, or else the bare chain with its degrees of freedom. */
  readonly mechanism: PlanMechanism | null;
  /**
   * The actuators' motion between stations (law, setpoint time step, one trajectory per actuator in the order of
   * `mechanism.actuators`); null when the plan failed or its mechanism has no actuators.
   */
  readonly motion: PlanMotion | null;
  /**
   * The commanded motion simulated step by step (mechanism assembled, orifice clipped and measured, process figures,
   * puller speed); null (or absent) without a driven mechanism and its motion. Findings with a position range come
   * from it.
   */
  readonly simulation?: PlanSimulation | null;
  /** Every chain fitted and tried, the chosen one marked. */
  readonly chainsTried: readonly ChainTried[];
  readonly findings: readonly Finding[];
  readonly cautions: readonly Caution[];
}

/**
 * request → validated schedule → profile checks → chain fit → mechanisation (binary links and actuators, proved by
 * driving the mechanism through every station) → motion (one trajectory per actuator by the schedule's law, checked
 * against the actuator limits: `ACTUATOR_LIMIT`) → the commanded motion simulated step by step (`simulatePlan`), with
 * findings over position ranges (`MOTION_…`). Pure and synchronous.
 *
 * Fit and mechanisation are one search (docs/MODEL.md §3, "Fit and links as one problem"): when the chain fitted as
 * asked cannot be driven by the requested actuators, other chains that trace the stations are fitted (pinned ends
 * only: a slot or a telescoping pair adds a degree of freedom; one plate more: pivots in other places; deeper plates:
 * room for link pins) and the first that the requested actuators drive wins. When none does, the plan is `incomplete`
 * and carries the mechanism with the fewest actuators found over all chains tried, fully built. A plan whose stations cannot be reconciled into one moving span, or with fewer
 * than two stations, fails with the reason and the check's findings.
 */
export function planSchedule(schedule: Schedule, settings: PlanSettings = {}): Plan {
  const stop = settings.stop ?? (() => false);
  const progress = settings.progress ?? (() => {});
  progress('check', 0);
  const check = checkSchedule(schedule);
  const base = { check, cautions: check.cautions };
  if (schedule.stations.length < 2) {
    return failed(base, check.findings, 'A plan needs at least two stations: with one there is nothing to move.');
  }
  const spans = check.stations.map((s) => s.movingSpan);
  if (spans.some((s) => s === null)) {
    const reason =
      check.findings.find((f) => f.code.startsWith('SPAN_'))?.message ?? 'The moving span could not be found.';
    return failed(base, check.findings, `No plates can be fitted: ${reason}`);
  }
  const orifices = schedule.stations.map((s) => s.orifice);
  const asked = resolveChainFitOptions({
    toleranceMm: schedule.limits.fitToleranceMm,
    maxPlates: schedule.limits.maxPlates,
    minPlates: schedule.limits.minPlates,
    plateCount: schedule.limits.plateCount,
    pivotHoleDiameterMm: schedule.plates.pivotHoleDiameterMm,
    ligamentMm: schedule.plates.ligamentMm,
    depthMm: schedule.plates.depthMm,
    stop,
  });
  const request = {
    actuatorCount: schedule.actuators.count,
    periodic: schedule.repeatLengthM !== null,
    fitToleranceMm: schedule.limits.fitToleranceMm,
    linkLengthMinMm: schedule.links.minLengthMm,
    linkLengthMaxMm: schedule.links.maxLengthMm,
  };
  const fitWith = (options: ChainFitOptions) =>
    fitChain(
      orifices,
      spans.map((s) => s!),
      options,
    );
  const worstOf = (fit: ChainFit) => Math.max(...fit.stations.map((s) => s.maxDeviationMm));

  const tried: ChainTried[] = [];
  const record = (variant: string, fit: ChainFit, m: MechanisationResult, verdict: string) =>
    tried.push({
      variant,
      plateCount: fit.plateCount,
      fitStatus: fit.status,
      maxDeviationMm: worstOf(fit),
      chainDegreesOfFreedom: m.chainDegreesOfFreedom,
      mechanised: m.status === 'mechanised',
      actuatorCount: m.mechanism ? m.mechanism.actuators.length : null,
      verdict,
    });

  progress('fit', 0.1);
  const fit = fitWith(asked);
  progress('mechanise', 0.5);
  const first = mechaniseChain(fit, request);
  if (fit.status === 'fitted' && first.status === 'mechanised') {
    record('as asked', fit, first, 'chosen');
    return finish(progress, schedule, base, check, fit, first, tried, []);
  }
  if (fit.status !== 'fitted') {
    record('as asked', fit, first, 'chosen: no chain the search tried meets the fit tolerance');
    const shortfall = `No chain the search tried traces every station within ${schedule.limits.fitToleranceMm} mm (best ${fmt(worstOf(fit))} mm).`;
    return finish(progress, schedule, base, check, fit, first, tried, [shortfall]);
  }
  record('as asked', fit, first, `the requested ${request.actuatorCount} actuator(s) do not drive it`);

  // other chains that trace the stations, most like the one asked for first
  const variants: { name: string; options: ChainFitOptions }[] = [];
  const heldBySlot = fit.chain.start.kind === 'slot' || fit.chain.end.kind === 'slot' || fit.chain.telescoping.length;
  if (heldBySlot && asked.plateCount === null) {
    variants.push({ name: 'pinned ends only', options: { ...asked, allowSlots: false, allowTelescoping: false } });
  }
  if (asked.plateCount === null && fit.plateCount < asked.maxPlates) {
    // more plates bend in more places: a pivot may land where a link can hold it
    variants.push({ name: `${fit.plateCount + 1} plates`, options: { ...asked, plateCount: fit.plateCount + 1 } });
  }
  variants.push({
    name: `plates ${fmt(asked.depthMm * DEEPER_PLATES)} mm deep`,
    options: { ...asked, depthMm: asked.depthMm * DEEPER_PLATES },
  });
  // when nothing meets the request, the chain that the fewest actuators drive is the fallback
  let fallback = { fit, mechanisation: first, row: 0 };
  for (const variant of variants) {
    progress('other chains', 0.6 + (0.35 * variants.indexOf(variant)) / variants.length);
    if (stop()) {
      tried.push({
        variant: variant.name,
        plateCount: Number.NaN,
        fitStatus: 'best-effort',
        maxDeviationMm: Number.NaN,
        chainDegreesOfFreedom: Number.NaN,
        mechanised: false,
        actuatorCount: null,
        verdict: 'not tried: the plan reached its time limit',
      });
      continue;
    }
    const other = fitWith(variant.options);
    if (other.status !== 'fitted') {
      tried.push({
        variant: variant.name,
        plateCount: other.plateCount,
        fitStatus: other.status,
        maxDeviationMm: worstOf(other),
        chainDegreesOfFreedom: Number.NaN,
        mechanised: false,
        actuatorCount: null,
        verdict: 'misses the fit tolerance',
      });
      continue;
    }
    const driven = mechaniseChain(other, request);
    if (driven.status === 'mechanised') {
      record(variant.name, other, driven, 'chosen');
      const note: Finding = {
        code: 'CHAIN_CHANGED_FOR_ACTUATORS',
        severity: 'warning',
        value: other.plateCount,
        message: `The chain fitted with the schedule's own settings (${fit.plateCount} plates) cannot be driven by ${request.actuatorCount} actuator(s); a chain with ${variant.name} (${other.plateCount} plates) traces every station and is driven by them, so it is the plan. See chains_tried.`,
      };
      return finish(progress, schedule, base, check, other, driven, tried, [], [note]);
    }
    record(variant.name, other, driven, `the requested ${request.actuatorCount} actuator(s) do not drive it`);
    const fewest = fallback.mechanisation.smallestActuatorCount;
    if (driven.smallestActuatorCount !== null && (fewest === null || driven.smallestActuatorCount < fewest)) {
      fallback = { fit: other, mechanisation: driven, row: tried.length - 1 };
    }
  }

  // nothing meets the request: the fewest actuators found, fully built, on the chain that needs them
  const smallest = fallback.mechanisation.smallestActuatorCount;
  // a search cut short by the time limit proves nothing about what it did not reach
  const cut = stop() ? ' The plan reached its time limit before the search was complete.' : '';
  const shortfall =
    smallest === null
      ? `No mechanism with ${request.actuatorCount} actuator(s) or more was found for any of the ${tried.length} chains tried.${cut}`
      : `${request.actuatorCount} actuator(s) were asked for; the fewest found to drive a chain that traces every station is ${smallest}, and that mechanism is returned.${cut}`;
  if (smallest !== null && smallest !== request.actuatorCount) {
    const built = mechaniseChain(fallback.fit, {
      ...request,
      actuatorCount: smallest,
      findSmallestActuatorCount: false,
    });
    if (built.status === 'mechanised') {
      const row = tried[fallback.row]!;
      tried[fallback.row] = { ...row, verdict: `chosen with ${smallest} actuators: the fewest found` };
      return finish(
        progress,
        schedule,
        base,
        check,
        fallback.fit,
        built,
        tried,
        [shortfall],
        fallback.mechanisation.findings,
      );
    }
  }
  return finish(progress, schedule, base, check, fit, first, tried, [shortfall]);
}

/** Plates tried this much deeper than asked when the chain's plates leave no room for link pins. */
const DEEPER_PLATES = 1.6;

function finish(
  progress: (stage: string, fraction: number) => void,
  schedule: Schedule,
  base: Pick<Plan, 'check' | 'cautions'>,
  check: ScheduleCheck,
  fit: ChainFit,
  mechanisation: MechanisationResult,
  chainsTried: readonly ChainTried[],
  shortfalls: readonly string[],
  extra: readonly Finding[] = [],
): Plan {
  const mechanism: PlanMechanism = mechanisation.mechanism
    ? { ...mechanisation.mechanism, findings: [] }
    : { ...chainMechanism(fit), findings: [] };
  // the deviation that counts is the one of the plates where the driven mechanism puts them
  const tolerance = mechanisation.options.fitToleranceMm;
  const driven = mechanisation.stations.filter((s) => s.deviationMm > tolerance * (1 + 1e-9));
  const all = [...shortfalls];
  if (driven.length > 0) {
    const worst = driven.reduce((a, b) => (b.deviationMm > a.deviationMm ? b : a));
    all.push(
      `Driven by its actuators, the mechanism misses ${driven.length} station(s) by more than ${tolerance} mm (worst: station ${worst.station}, ${fmt(worst.deviationMm)} mm).`,
    );
  }
  const meetsRequest = all.length === 0;
  let moved = planMotion(schedule, mechanism);
  let simulation: PlanSimulation | null = null;
  const unsimulated: Finding[] = [];
  if (moved.motion && mechanisation.status === 'mechanised') {
    progress('motion', 0.9);
    try {
      simulation = simulatePlan({ schedule, check, fit, mechanisation, motion: moved.motion });
    } catch (err) {
      // the plan stands without its simulation, and says why (the stations themselves were checked)
      unsimulated.push({
        code: 'MOTION_NOT_SIMULATED',
        severity: 'warning',
        message: `The motion between stations could not be simulated (${err instanceof Error ? err.message : String(err)}), so nothing between the stations was checked and the puller-speed table and motion.json are not available. Please report the schedule.`,
      });
    }
  }
  if (simulation?.pullerFollowsArea) {
    // the actuators keep their values per metre of line, so a faster puller moves them faster: check at the fastest
    const fastest = Math.max(...simulation.pullerSpeedMPerS.filter(Number.isFinite));
    if (fastest > schedule.process.lineSpeedMPerS)
      moved = planMotion(schedule, mechanism, { limitLineSpeedMPerS: fastest });
  }
  const kinds = mechanism.actuators.map((a) => a.kind);
  const simulated = simulation ? simulationFindings(simulation, schedule, kinds) : unsimulated;
  return {
    status: meetsRequest ? 'done' : 'incomplete',
    error: null,
    outcome: { meetsRequest, shortfalls: all },
    ...base,
    fit,
    mechanisation,
    mechanism,
    motion: moved.motion,
    simulation,
    chainsTried,
    findings: [
      ...check.findings,
      ...fit.findings,
      ...extra,
      ...mechanisation.findings,
      ...moved.findings,
      ...simulated,
    ],
  };
}

function failed(base: Pick<Plan, 'check' | 'cautions'>, findings: readonly Finding[], error: string): Plan {
  return {
    status: 'failed',
    error,
    outcome: { meetsRequest: false, shortfalls: [error] },
    ...base,
    fit: null,
    mechanisation: null,
    mechanism: null,
    motion: null,
    simulation: null,
    chainsTried: [],
    findings,
  };
}

function fmt(x: number): string {
  return String(Math.round(x * 1000) / 1000);
}
