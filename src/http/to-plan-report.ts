import type { Region } from '../geometry/index.js';
import type { PlanSimulation } from '../pipeline/index.js';
import type { PlanRecord } from '../store/index.js';
import type { PlanReport } from './plan-schema.js';
import { toCautionWire, toFindingWire } from './to-check-report.js';
import { mm, pointMm, sig } from './wire-format.js';

const regionMm = (r: Region) => ({ outer: r.outer.map(pointMm), holes: r.holes.map((h) => h.map(pointMm)) });

/** Domain plan → wire report (`GET /v1/plans/{id}` as api-spec/openapi.json describes it). */
export function toPlanReport(record: PlanRecord): PlanReport {
  const { plan, schedule } = record;
  const fit = plan.fit;
  const driven = plan.mechanisation?.status === 'mechanised' ? plan.mechanisation : null;
  const stations = fit
    ? fit.stations.map((s, i) => ({
        index: i,
        position_m: schedule.stations[i]!.positionM,
        target_orifice: regionMm(s.targetOrifice),
        // computed from the assembled mechanism when there is one, else from the fitted chain
        achieved_orifice: regionMm(driven?.stations[i]?.achievedOrifice ?? s.achievedOrifice),
        fit: {
          max_deviation_mm: mm(driven?.stations[i]?.deviationMm ?? s.maxDeviationMm),
          area_error_pct: sig(s.areaErrorPct),
          symmetric_difference_mm2: mm(s.symmetricDifferenceMm2),
          worst_target_mm: pointMm(s.worstTarget),
          worst_achieved_mm: pointMm(s.worstAchieved),
        },
        plates: fit.chain.lengthsMm.map((_, k) => ({
          plate: `plate_${k + 1}`,
          pivots_mm: [pointMm(fit.chain.pivots[i]![k]!), pointMm(fit.chain.pivots[i]![k + 1]!)] as [
            [number, number],
            [number, number],
          ],
        })),
      }))
    : [];
  const end = (e: NonNullable<typeof fit>['chain']['start']) =>
    e.kind === 'pivot' ? { kind: 'pivot' as const } : { kind: 'slot' as const, travel_mm: e.travelMm.map(mm) };
  return {
    id: record.id,
    name: schedule.name,
    status: plan.status,
    ...(plan.error ? { error: plan.error } : {}),
    outcome: { meets_request: plan.outcome.meetsRequest, shortfalls: [...plan.outcome.shortfalls] },
    chains_tried: plan.chainsTried.map((c) => ({
      variant: c.variant,
      plate_count: Number.isFinite(c.plateCount) ? c.plateCount : null,
      fit_status: c.fitStatus,
      max_deviation_mm: Number.isFinite(c.maxDeviationMm) ? mm(c.maxDeviationMm) : null,
      chain_degrees_of_freedom: Number.isFinite(c.chainDegreesOfFreedom) ? c.chainDegreesOfFreedom : null,
      mechanised: c.mechanised,
      actuator_count: c.actuatorCount,
      verdict: c.verdict,
    })),
    created_at: record.createdAt,
    findings: plan.findings.map(toFindingWire),
    cautions: plan.cautions.map(toCautionWire),
    stations,
    chain: fit
      ? {
          status: fit.status,
          plate_count: fit.plateCount,
          plate_lengths_mm: fit.chain.lengthsMm.map(mm),
          edge_offset_mm: mm(fit.shape.edgeOffsetMm),
          start: end(fit.chain.start),
          end: end(fit.chain.end),
          telescoping: fit.chain.telescoping.map((t) => ({
            plate: `plate_${t.plate + 1}`,
            station_lengths_mm: t.stationLengthsMm.map(mm),
            stroke_mm: mm(Math.max(...t.stationLengthsMm) - Math.min(...t.stationLengthsMm)),
          })),
          solver: fit.solver,
          search: {
            lowest_plate_count_tried: fit.search.lowestTried,
            highest_plate_count_tried: fit.search.highestTried,
            forms: [...fit.search.forms],
            stopped_early: fit.search.stoppedEarly,
            below_answer: fit.search.belowAnswer
              ? {
                  plate_count: fit.search.belowAnswer.plateCount,
                  starts: fit.search.belowAnswer.starts,
                  best_miss_mm: Number.isFinite(fit.search.belowAnswer.bestMissMm)
                    ? mm(fit.search.belowAnswer.bestMissMm)
                    : null,
                }
              : null,
          },
          attempts: fit.attempts.map((a) => ({
            plate_count: a.plateCount,
            form: a.form,
            solver_status: a.solverStatus,
            iterations: a.iterations,
            max_sample_residual_mm: mm(a.maxSampleResidualMm),
            closure_gap_mm: mm(a.closureGapMm),
            max_deviation_mm: a.maxDeviationMm === null ? null : mm(a.maxDeviationMm),
          })),
        }
      : null,
    mechanisation: plan.mechanisation
      ? {
          status: plan.mechanisation.status,
          mode: plan.mechanisation.mode,
          requested_actuators: schedule.actuators.count,
          actuator_count: plan.mechanism?.actuators.length ?? 0,
          chain_degrees_of_freedom: plan.mechanisation.chainDegreesOfFreedom,
          smallest_actuator_count: plan.mechanisation.smallestActuatorCount,
          distinct_positions: plan.mechanisation.distinctPositions,
          synthesis: plan.mechanisation.synthesis,
          ground_pivot_rule: plan.mechanisation.groundPivotRule,
          layer_model: plan.mechanisation.layerModel,
          link_count: plan.mechanisation.links.length,
          transmission_angle_deg: {
            min: plan.mechanisation.transmission.minDeg === null ? null : sig(plan.mechanisation.transmission.minDeg),
            max: plan.mechanisation.transmission.maxDeg === null ? null : sig(plan.mechanisation.transmission.maxDeg),
            joints: plan.mechanisation.transmission.joints.map((j) => ({
              joint: j.jointId,
              min: sig(j.minDeg),
              max: sig(j.maxDeg),
              worst: sig(j.worstDeg),
            })),
          },
          clearances: plan.mechanisation.clearances.slice(0, 12).map((c) => {
            const reps = plan.mechanisation!.stations.length > 0 ? plan.mechanisation! : null;
            const station = (p: number) => reps?.stations.find((s) => s.position === p)?.station ?? p;
            return {
              kind: c.kind,
              parts: [c.parts[0], c.parts[1]] as [string, string],
              clearance_mm: mm(c.clearanceMm),
              station: c.at.leg ? station(c.at.leg[0]) : c.at.position === null ? null : station(c.at.position),
              leg_to_station: c.at.leg ? station(c.at.leg[1]) : null,
              leg_fraction: sig(c.at.fraction),
            };
          }),
          stations: plan.mechanisation.stations.map((s) => ({
            residual_mm: sig(s.residualMm),
            deviation_mm: mm(s.deviationMm),
          })),
        }
      : null,
    mechanism: plan.mechanism
      ? {
          mobility: plan.mechanism.mobility,
          mobility_by_jacobian_rank: plan.mechanisation?.mobility?.numerical ?? null,
          bodies: plan.mechanism.bodies.map((b) => ({ ...b })),
          joints: plan.mechanism.joints.map((j) => ({
            id: j.id,
            type: j.type,
            bodies: [j.bodies[0], j.bodies[1]] as [string, string],
            station_positions: j.stationPositions.map(pointMm),
          })),
          actuators: plan.mechanism.actuators.map((a) => ({
            id: a.id,
            joint: a.joint,
            kind: a.kind,
            station_values: a.stationValues.map((v) => sig(v)),
          })),
        }
      : null,
    motion: plan.motion
      ? {
          law: plan.motion.law,
          rest_to_rest: plan.motion.law !== 'monotone-cubic',
          time_step_s: plan.motion.timeStepS,
          periodic: plan.motion.trajectories[0]!.timeBase.periodic,
        }
      : null,
    simulation: plan.simulation ? simulationSummary(plan.simulation) : null,
  };
}

/** Smallest and largest finite value of a series (null where none is finite), rounded. */
function range(values: readonly (number | null)[], round: (x: number) => number = sig) {
  const finite = values.filter((v): v is number => v !== null && Number.isFinite(v));
  return finite.length === 0
    ? { min: null, max: null }
    : { min: round(Math.min(...finite)), max: round(Math.max(...finite)) };
}

/** The plan's simulation in a few figures (the series are in the downloads). */
function simulationSummary(s: PlanSimulation) {
  const walls = range(s.minWallMm, mm);
  const room = range(s.clearanceMm, mm);
  return {
    steps: s.positionsM.length,
    time_step_s: sig(s.timeStepS),
    capped: s.capped,
    wall_stride: s.wallStride,
    puller_follows_area: s.pullerFollowsArea,
    target_draw_down_ratio: sig(s.targetDrawDown),
    duration_s: sig(s.timesS[s.timesS.length - 1]!),
    area_mm2: range(s.areaMm2, mm),
    draw_down_ratio: range(s.drawDownRatio),
    puller_speed_m_per_min: range(s.pullerSpeedMPerS.map((v) => v * 60)),
    die_pressure_ratio: range(s.diePressureRatio),
    min_wall_mm: walls.min,
    max_leak_area_mm2: mm(Math.max(0, ...s.leakAreaMm2)),
    max_tip_speed_mm_per_s: sig(Math.max(0, ...s.tipSpeedMmPerS)),
    transmission_angle_deg: range(s.transmissionDeg),
    min_clearance_mm: room.min,
    unsolved_steps: s.solved.filter((ok) => !ok).length,
    tracking: s.tracking
      ? {
          law_max_residual_mm: mm(Math.max(0, ...s.tracking.lawResidualMm)),
          tracked_max_residual_mm: mm(Math.max(0, ...s.tracking.residualMm)),
        }
      : null,
  };
}
