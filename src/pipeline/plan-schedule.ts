import type { Caution, Finding, Schedule } from '../domain/index.js';
import { type ChainFit, fitChain, resolveChainFitOptions } from '../synthesis/index.js';
import { type ScheduleCheck, checkSchedule } from './check-schedule.js';
import { type MechanisationResult, mechaniseChain } from '../mechanise/index.js';
import { chainMechanism, type PlanMechanism } from './chain-mechanism.js';

/** A plan: the check, the fitted chain and the mechanism built from it, or why it stopped. */
export interface Plan {
  readonly status: 'done' | 'failed';
  /** Why the plan stopped, in a sentence, when it failed. */
  readonly error: string | null;
  readonly check: ScheduleCheck;
  readonly fit: ChainFit | null;
  /** Binary links and actuators that drive the chain through every station, or why none were found. */
  readonly mechanisation: MechanisationResult | null;
  /** The mechanism the plan reports: the mechanised one, or else the bare chain with its degrees of freedom. */
  readonly mechanism: PlanMechanism | null;
  readonly findings: readonly Finding[];
  readonly cautions: readonly Caution[];
}

/**
 * request → validated schedule → profile checks → chain fit → mechanisation (binary links and actuators, proved by
 * driving the mechanism through every station). Pure and synchronous; a plan whose stations
 * cannot be reconciled into one moving span, or with fewer than two stations, fails with the reason and the check's
 * findings.
 */
export function planSchedule(schedule: Schedule): Plan {
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
  const fit = fitChain(
    schedule.stations.map((s) => s.orifice),
    spans.map((s) => s!),
    resolveChainFitOptions({
      toleranceMm: schedule.limits.fitToleranceMm,
      maxPlates: schedule.limits.maxPlates,
      pivotHoleDiameterMm: schedule.plates.pivotHoleDiameterMm,
      ligamentMm: schedule.plates.ligamentMm,
      depthMm: schedule.plates.depthMm,
    }),
  );
  const mechanisation = mechaniseChain(fit, {
    actuatorCount: schedule.actuators.count,
    periodic: schedule.repeatLengthM !== null,
    fitToleranceMm: schedule.limits.fitToleranceMm,
  });
  const bare = chainMechanism(fit);
  const mechanism: PlanMechanism = mechanisation.mechanism
    ? { ...mechanisation.mechanism, findings: [] }
    : { ...bare, findings: [] };
  return {
    status: 'done',
    error: null,
    ...base,
    fit,
    mechanisation,
    mechanism,
    findings: [...check.findings, ...fit.findings, ...mechanisation.findings],
  };
}

function failed(base: Pick<Plan, 'check' | 'cautions'>, findings: readonly Finding[], error: string): Plan {
  return { status: 'failed', error, ...base, fit: null, mechanisation: null, mechanism: null, findings };
}
