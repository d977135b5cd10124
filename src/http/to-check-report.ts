import type { Caution, Finding, Schedule } from '../domain/index.js';
import type { ScheduleCheck } from '../pipeline/index.js';
import type { CheckReport, FindingOut } from './report-schema.js';
import { mm, pointMm, sig } from './wire-format.js';

/** Domain check → wire report: snake_case, mm, m/min, kg/h, bar; numbers rounded once. */
export function toCheckReport(schedule: Schedule, check: ScheduleCheck): CheckReport {
  const swell2 = schedule.process.dieSwell ** 2;
  return {
    name: schedule.name,
    material: schedule.material,
    throughput_kg_per_h: sig(check.throughputKgPerS * 3600),
    throughput_source: check.throughputFromFirstStation ? 'first_station' : 'request',
    target_draw_down: sig(check.targetDrawDown),
    puller_follows_area: schedule.process.pullerFollowsArea === true,
    stations: check.stations.map((s) => ({
      index: s.index,
      position_m: s.positionM,
      area_mm2: mm(s.areaMm2),
      perimeter_mm: mm(s.perimeterMm),
      centroid_mm: pointMm(s.centroid),
      min_wall_mm: mm(s.minWallMm),
      min_wall_at_mm: pointMm(s.minWallAt),
      max_wall_mm: mm(s.maxWallMm),
      max_wall_at_mm: pointMm(s.maxWallAt),
      wall_ratio: sig(s.process.wallRatio),
      thin_walls: s.thinWalls.map((t) => ({
        centroid_mm: pointMm(t.centroid),
        area_mm2: mm(t.areaMm2),
        bbox_mm: { min: pointMm([t.bbox.minX, t.bbox.minY]), max: pointMm([t.bbox.maxX, t.bbox.maxY]) },
      })),
      puller_speed_m_per_min: sig(s.process.pullerSpeedMPerS * 60),
      draw_down_ratio: sig(s.process.drawDownRatio),
      velocity_draw_ratio: sig(s.process.velocityDrawRatio),
      product_area_mm2: mm(s.process.productAreaMm2),
      melt_speed_m_per_min: sig(s.process.meltSpeedMPerS * 60),
      puller_speed_for_target_m_per_min: sig(s.process.pullerSpeedForTargetMPerS * 60),
      swollen_area_mm2: mm(s.areaMm2 * swell2),
      equivalent_gap_mm: mm(s.process.equivalentGapMm),
      land_pressure_bar: sig(s.process.landPressureBar),
      flow_imbalance_ratio: sig(s.process.flowImbalanceRatio),
      wall_pressure_ratio: sig(s.process.wallPressureRatio),
      moving_span: s.movingSpan
        ? {
            start_mm: pointMm(s.movingSpan.start),
            end_mm: pointMm(s.movingSpan.end),
            length_mm: mm(s.movingSpan.lengthMm),
            path_mm: s.movingSpan.path.map(pointMm),
          }
        : null,
    })),
    findings: check.findings.map(toFindingWire),
    cautions: check.cautions.map(toCautionWire),
  };
}

export function toFindingWire(f: Finding): FindingOut {
  return {
    code: f.code,
    severity: f.severity,
    ...(f.station !== undefined ? { station: f.station } : {}),
    ...(f.positionM !== undefined ? { position_m: f.positionM } : {}),
    ...(f.toPositionM !== undefined && Number.isFinite(f.toPositionM) ? { to_position_m: f.toPositionM } : {}),
    // value, limit and place are optional on the wire: one that is not a finite number is left out, never sent as
    // NaN (which JSON cannot carry and the response schema refuses); the message still says what was found
    ...(f.value !== undefined && Number.isFinite(f.value) ? { value: sig(f.value) } : {}),
    ...(f.limit !== undefined && Number.isFinite(f.limit) ? { limit: sig(f.limit) } : {}),
    ...(f.at !== undefined && Number.isFinite(f.at[0]) && Number.isFinite(f.at[1]) ? { at_mm: pointMm(f.at) } : {}),
    message: f.message,
  };
}

export function toCautionWire(c: Caution): { code: string; hazard: string; message: string } {
  return { code: c.code, hazard: c.hazard, message: c.message };
}
