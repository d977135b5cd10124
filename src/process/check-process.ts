import type { Point } from '../geometry/index.js';
import type { Finding, Schedule } from '../domain/index.js';
import { MATERIAL_PRESETS } from '../domain/index.js';
import { areaDrawDownRatio, pullerSpeedForDrawDown, throughputForDrawDown, velocityDrawRatio } from './draw-down.js';
import { meltSpeedMPerS, productAreaMm2 } from './mass-balance.js';
import { messageNumber as fmt, ratioText } from './message-number.js';
import { fitToleranceFinding, PLAUSIBLE, pullerSpeedRangeMPerMin, scaleFindings } from './plausibility-findings.js';
import { slitFlowRatioAtEqualPressure, slitPressureDropPa, slitPressureRatioAtEqualFlow } from './slit-flow.js';

/** What geometry measured on one station, the input of the process checks. */
export interface StationMeasures {
  readonly areaMm2: number;
  readonly perimeterMm: number;
  readonly minWallMm: number;
  readonly maxWallMm: number;
  readonly minWallAt: Point;
  /** Longer side of the orifice's bounding box, mm (for the scale plausibility check). */
  readonly extentMm: number;
  /** Pieces thinner than the schedule's minimum wall, with their centroids (mm, die-body frame). */
  readonly thinWalls: readonly { readonly centroid: Point; readonly areaMm2: number }[];
}

/** Process figures of one station. Speeds m/s, areas mm², pressure bar. */
export interface StationProcess {
  /**
   * Puller speed this station is evaluated at, m/s: the nominal line speed, or, when the puller follows the area
   * (`process.pullerFollowsArea`), the speed that holds the target draw-down here (`pullerSpeedForTargetMPerS`).
   */
  readonly pullerSpeedMPerS: number;
  /** Product cross-section at `pullerSpeedMPerS`, mm². */
  readonly productAreaMm2: number;
  /** Area draw-down ratio A_orifice/A_product at `pullerSpeedMPerS`. */
  readonly drawDownRatio: number;
  /** Velocity draw ratio v_puller/v_melt at `pullerSpeedMPerS`. */
  readonly velocityDrawRatio: number;
  /** Mean melt speed in the orifice, m/s. */
  readonly meltSpeedMPerS: number;
  /** Puller speed that holds the target draw-down at this station, m/s. */
  readonly pullerSpeedForTargetMPerS: number;
  /** Thin-slit equivalent gap 2A/P, mm. */
  readonly equivalentGapMm: number;
  /** Estimated pressure drop across the die land at the equivalent gap, bar (power-law slit, isothermal). */
  readonly landPressureBar: number;
  /** Flow ratio thickest/thinnest wall at equal pressure, (H_max/H_min)^(2+1/n). */
  readonly flowImbalanceRatio: number;
  /** Pressure ratio thinnest/thickest wall at equal flow per width, (H_max/H_min)^(1+2n). */
  readonly wallPressureRatio: number;
  /** Thickest over thinnest wall. */
  readonly wallRatio: number;
}

export interface ProcessCheck {
  /** Mass throughput used for every station, kg/s. */
  readonly throughputKgPerS: number;
  /** True when the first station set the throughput at the target draw-down. */
  readonly throughputFromFirstStation: boolean;
  /** Middle of the draw-down range, the puller table's target. */
  readonly targetDrawDown: number;
  /** True when each station is evaluated at the puller speed that holds the target draw-down there. */
  readonly pullerFollowsArea: boolean;
  readonly stations: readonly StationProcess[];
  readonly findings: readonly Finding[];
}

const PA_PER_BAR = 1e5;
/** Upper end of the usual melt-pressure range (docs/MODEL.md §4: often 70–350 bar). */
const HIGH_LAND_PRESSURE_BAR = 350;
/** Pressure swing between stations worth a warning: common practice, no source. */
const PRESSURE_SWING_RATIO = 1.5;
/**
 * Largest flow ratio per width, thickest over thinnest wall at equal pressure and land, before the die needs
 * balancing (common practice, no source): beyond a few-fold the thick wall outruns the thin one and the product bows
 * or tears unless land lengths or restrictors even the flow out.
 */
export const FLOW_IMBALANCE_LIMIT = 5;

/**
 * Mass balance, draw-down, slit-flow balance and pressure per station, with findings. Throughput is the schedule's,
 * or the one that gives the first station the target draw-down at the nominal line speed. Each station's draw-down is
 * taken at the nominal line speed, or, when the puller follows the area (`process.pullerFollowsArea`), at the puller
 * speed that holds the target draw-down there at that throughput (ṁ = ρ·A·v, docs/MODEL.md §3): the draw-down is then
 * the target, and the puller speed is flagged instead where it leaves the puller's range (`limits.pullerSpeedMPerS`,
 * by default the plausible 0.01–200 m/min: `PULLER_SPEED_OUT_OF_RANGE`); without it, the line speed is checked
 * against that range once.
 *
 * @param measures  one entry per station, in schedule order.
 */
export function checkProcess(schedule: Schedule, measures: readonly StationMeasures[]): ProcessCheck {
  if (measures.length !== schedule.stations.length) throw new Error('checkProcess: one measure per station expected');
  const { process: p, limits } = schedule;
  const targetDrawDown = (limits.drawDownMin + limits.drawDownMax) / 2;
  const first = measures[0];
  const throughputKgPerS =
    p.throughputKgPerS ??
    (first ? throughputForDrawDown(first.areaMm2, targetDrawDown, p.solidDensityKgPerM3, p.lineSpeedMPerS) : 0);
  const follows = p.pullerFollowsArea === true;
  const pullerRange = pullerSpeedRangeMPerMin(schedule);
  const pullerRangeText = schedule.limits.pullerSpeedMPerS
    ? 'the puller runs at (limits.puller_speed_m_per_min)'
    : 'a profile puller plausibly runs at (the default of limits.puller_speed_m_per_min, the range line_speed_m_per_min accepts; common practice, no source)';
  const scale = scaleFindings(schedule, measures);
  // A station drawn at the wrong scale gets its scale finding only: walls, draw-down and pressure figured from it
  // would bury the one message that matters (the scale finding says so).
  const misScaled = new Set(scale.map((f) => f.station));
  const findings: Finding[] = [...materialFindings(schedule), ...scale];
  const lineMPerMin = p.lineSpeedMPerS * 60;
  if (!follows && (lineMPerMin < pullerRange.min || lineMPerMin > pullerRange.max)) {
    const slow = lineMPerMin < pullerRange.min;
    findings.push({
      code: 'PULLER_SPEED_OUT_OF_RANGE',
      severity: 'warning',
      value: lineMPerMin,
      limit: slow ? pullerRange.min : pullerRange.max,
      message: `The line speed ${fmt(lineMPerMin)} m/min is ${slow ? 'below' : 'above'} the ${fmt(slow ? pullerRange.min : pullerRange.max)} m/min ${pullerRangeText}. Change the line speed or the puller.`,
    });
  }
  const thinnest = Math.min(...measures.filter((_, i) => !misScaled.has(i)).map((m) => m.minWallMm));
  // a wall measured as nothing is THIN_WALL's business; a tolerance against it says nothing more
  const coarse = Number.isFinite(thinnest) && thinnest > 0 ? fitToleranceFinding(schedule, thinnest) : null;
  if (coarse) findings.push(coarse);

  const stations = measures.map((m, i): StationProcess => {
    const station = schedule.stations[i]!;
    const at = { station: i, positionM: station.positionM };
    const own: Finding[] = [];
    const pullerSpeed = pullerSpeedForDrawDown(throughputKgPerS, p.solidDensityKgPerM3, m.areaMm2, targetDrawDown);
    // an orifice of no area has no speed to follow (its scale finding says why); it is evaluated at the line speed
    const runSpeed = follows && m.areaMm2 > 0 ? pullerSpeed : p.lineSpeedMPerS;
    const productArea = productAreaMm2(throughputKgPerS, p.solidDensityKgPerM3, runSpeed);
    const adr = areaDrawDownRatio(m.areaMm2, productArea);
    const equivalentGapMm = (2 * m.areaMm2) / m.perimeterMm;
    const widthMm = m.perimeterMm / 2;
    const qM2PerS = throughputKgPerS / p.meltDensityKgPerM3 / (widthMm / 1000);
    const slit = { gapMm: equivalentGapMm, landMm: p.dieLandLengthMm, n: p.powerLawN, mPaSn: p.powerLawMPaSn };
    const landPressureBar = slitPressureDropPa(slit, qM2PerS) / PA_PER_BAR;
    const wallRatio = m.maxWallMm / m.minWallMm;
    const flowImbalanceRatio = slitFlowRatioAtEqualPressure(m.maxWallMm, m.minWallMm, p.powerLawN);
    const wallPressureRatio = slitPressureRatioAtEqualFlow(m.maxWallMm, m.minWallMm, p.powerLawN);

    if (m.minWallMm < limits.minWallMm) {
      const where = m.thinWalls[0]?.centroid ?? m.minWallAt;
      own.push({
        code: 'THIN_WALL',
        severity: 'error',
        ...at,
        value: m.minWallMm,
        limit: limits.minWallMm,
        at: where,
        message: `A wall is ${fmt(m.minWallMm)} mm thin near (${fmt(where[0])}, ${fmt(where[1])}) mm, below the ${fmt(limits.minWallMm)} mm minimum (${m.thinWalls.length} thin place(s)). Thicken the wall there or lower the limit if the material allows it.`,
      });
    }
    if (wallRatio > limits.maxWallRatio) {
      own.push({
        code: 'WALL_RATIO',
        severity: 'warning',
        ...at,
        value: wallRatio,
        limit: limits.maxWallRatio,
        message: `Thickest wall ${fmt(m.maxWallMm)} mm is ${fmt(wallRatio)}× the thinnest ${fmt(m.minWallMm)} mm, above the ${fmt(limits.maxWallRatio)} limit (limits.max_wall_ratio; the default 2.5 is common practice, no source). Even out the walls, or balance the die land for the flow difference this causes.`,
      });
    }
    if (flowImbalanceRatio > FLOW_IMBALANCE_LIMIT) {
      own.push({
        code: 'FLOW_IMBALANCE',
        severity: 'warning',
        ...at,
        value: flowImbalanceRatio,
        limit: FLOW_IMBALANCE_LIMIT,
        message: `At equal pressure and land length the thickest wall (${fmt(m.maxWallMm)} mm) flows ${ratioText(flowImbalanceRatio)} faster per width than the thinnest (${fmt(m.minWallMm)} mm) (power-law slit, n ${fmt(p.powerLawN)}; limit ${FLOW_IMBALANCE_LIMIT}×, common practice, no source). Balancing by land length alone would need the thick wall's land ${ratioText(wallPressureRatio)} longer than the thin wall's; even out the walls or add flow restrictors.`,
      });
    }
    if (adr < limits.drawDownMin || adr > limits.drawDownMax) {
      const low = adr < limits.drawDownMin;
      own.push({
        code: low ? 'DRAW_DOWN_LOW' : 'DRAW_DOWN_HIGH',
        severity: 'warning',
        ...at,
        value: adr,
        limit: low ? limits.drawDownMin : limits.drawDownMax,
        message: `At ${follows ? 'the puller speed that follows the area' : 'the nominal line speed'} the area draw-down ratio is ${fmt(adr)}, ${low ? 'below' : 'above'} the ${fmt(low ? limits.drawDownMin : limits.drawDownMax)} limit. The puller-speed table holds ${fmt(targetDrawDown)} by running at ${fmt(pullerSpeed * 60)} m/min here; otherwise change the orifice area or the throughput.`,
      });
    }
    const pullerMPerMin = pullerSpeed * 60;
    if (follows && (pullerMPerMin < pullerRange.min || pullerMPerMin > pullerRange.max)) {
      const slow = pullerMPerMin < pullerRange.min;
      const limit = slow ? pullerRange.min : pullerRange.max;
      own.push({
        code: 'PULLER_SPEED_OUT_OF_RANGE',
        severity: 'warning',
        ...at,
        value: pullerMPerMin,
        limit,
        message: `To hold draw-down ${fmt(targetDrawDown)} here the puller would run at ${fmt(pullerMPerMin)} m/min, ${slow ? 'below' : 'above'} the ${fmt(limit)} m/min ${pullerRangeText}. Change the throughput or the orifice area, or let the puller run at the line speed (process.puller_follows_area false) and accept the draw-down findings.`,
      });
    }
    if (landPressureBar > PLAUSIBLE.maxLandPressureBar) {
      own.push({
        code: 'LAND_PRESSURE_OUT_OF_RANGE',
        severity: 'warning',
        ...at,
        value: landPressureBar,
        limit: PLAUSIBLE.maxLandPressureBar,
        message: `The land-pressure estimate comes out above ${PLAUSIBLE.maxLandPressureBar} bar, beyond any extruder, so it is outside the range of its model (isothermal power-law slit at the equivalent gap ${fmt(equivalentGapMm)} mm) and not a pressure to quote. Check the orifice's scale, the throughput, the land length and the power-law constants; if they are right, this orifice cannot run at this output.`,
      });
    } else if (landPressureBar > HIGH_LAND_PRESSURE_BAR) {
      own.push({
        code: 'HIGH_LAND_PRESSURE',
        severity: 'warning',
        ...at,
        value: landPressureBar,
        limit: HIGH_LAND_PRESSURE_BAR,
        message: `The die land alone needs about ${fmt(landPressureBar)} bar at this throughput (equivalent gap ${fmt(equivalentGapMm)} mm, land ${fmt(p.dieLandLengthMm)} mm), above the usual 350 bar. Check the extruder's pressure rating and rupture disc, shorten the land or lower the throughput.`,
      });
    }
    if (!misScaled.has(i)) findings.push(...own);
    return {
      pullerSpeedMPerS: runSpeed,
      productAreaMm2: productArea,
      drawDownRatio: adr,
      velocityDrawRatio: velocityDrawRatio(adr, p.meltDensityKgPerM3, p.solidDensityKgPerM3),
      meltSpeedMPerS: meltSpeedMPerS(throughputKgPerS, p.meltDensityKgPerM3, m.areaMm2),
      pullerSpeedForTargetMPerS: pullerSpeed,
      equivalentGapMm,
      landPressureBar,
      flowImbalanceRatio,
      wallPressureRatio,
      wallRatio,
    };
  });

  if (misScaled.size === 0) findings.push(...pressureSwingFindings(schedule, stations));
  return {
    throughputKgPerS,
    throughputFromFirstStation: p.throughputKgPerS === null,
    targetDrawDown,
    pullerFollowsArea: follows,
    stations,
    findings,
  };
}

function pressureSwingFindings(schedule: Schedule, stations: readonly StationProcess[]): Finding[] {
  if (stations.length < 2) return [];
  let lo = 0;
  let hi = 0;
  stations.forEach((s, i) => {
    if (s.landPressureBar < stations[lo]!.landPressureBar) lo = i;
    if (s.landPressureBar > stations[hi]!.landPressureBar) hi = i;
  });
  const ratio = stations[hi]!.landPressureBar / stations[lo]!.landPressureBar;
  if (!(ratio > PRESSURE_SWING_RATIO)) return [];
  return [
    {
      code: 'PRESSURE_SWING',
      severity: 'warning',
      station: hi,
      positionM: schedule.stations[hi]!.positionM,
      value: ratio,
      limit: PRESSURE_SWING_RATIO,
      message: `Die pressure at station ${hi} is ${ratioText(ratio)} that at station ${lo} at constant output: closing the orifice raises pressure steeply. Make sure the pressure interlock and rupture disc cover the highest value, and ramp the motion slowly enough for the melt pump or screw control to follow.`,
    },
  ];
}

function materialFindings(schedule: Schedule): Finding[] {
  const findings: Finding[] = [];
  const p = schedule.process;
  if (schedule.material !== 'custom') {
    const range = MATERIAL_PRESETS[schedule.material].solidDensityRange;
    const rho = p.solidDensityKgPerM3 / 1000;
    if (rho < range.min || rho > range.max) {
      findings.push({
        code: 'DENSITY_UNUSUAL',
        severity: 'warning',
        value: rho,
        limit: rho < range.min ? range.min : range.max,
        message: `Solid density ${fmt(rho)} g/cm³ lies outside the handbook range ${range.min}–${range.max} g/cm³ for ${schedule.material}. Check the resin data sheet; mass balance and puller speeds scale with it.`,
      });
    }
  }
  if (p.meltDensityKgPerM3 > p.solidDensityKgPerM3) {
    findings.push({
      code: 'MELT_DENSER_THAN_SOLID',
      severity: 'warning',
      value: p.meltDensityKgPerM3 / 1000,
      limit: p.solidDensityKgPerM3 / 1000,
      message:
        'The melt density is above the solid density; polymers expand when they melt, so one of the two values is probably wrong.',
    });
  }
  if (schedule.material === 'PVC-U' && p.dieTemperatureC > 210) {
    findings.push({
      code: 'PVC_TOO_HOT',
      severity: 'warning',
      value: p.dieTemperatureC,
      limit: 210,
      message: `Die temperature ${fmt(p.dieTemperatureC)} °C is above the usual 160–210 °C for PVC-U melt; PVC degrades and releases hydrogen chloride faster above 200 °C.`,
    });
  }
  return findings;
}
