import type { Caution, Finding, Schedule } from '../domain/index.js';
import {
  type BoundingBox,
  boundingBox,
  findThinWalls,
  measureWalls,
  type Point,
  regionArea,
  regionCentroid,
  regionPerimeter,
} from '../geometry/index.js';
import { DEFAULT_TOLERANCES } from '../numeric/index.js';
import { checkProcess, type StationProcess } from '../process/index.js';
import { processCautions } from '../safety/index.js';
import { findMovingSpans, type MovingSpan } from '../span/index.js';

/** Measured geometry and process figures of one station. Millimetres, die-body frame. */
export interface StationCheck {
  readonly index: number;
  readonly positionM: number;
  readonly areaMm2: number;
  readonly perimeterMm: number;
  readonly centroid: Point;
  readonly minWallMm: number;
  readonly minWallAt: Point;
  readonly maxWallMm: number;
  readonly maxWallAt: Point;
  /** Walls thinner than the schedule's minimum, located. */
  readonly thinWalls: readonly { readonly centroid: Point; readonly areaMm2: number; readonly bbox: BoundingBox }[];
  readonly process: StationProcess;
  /** The part of the boundary the plates form; null when it cannot be told (see findings). */
  readonly movingSpan: MovingSpan | null;
}

export interface ScheduleCheck {
  readonly throughputKgPerS: number;
  readonly throughputFromFirstStation: boolean;
  readonly targetDrawDown: number;
  readonly stations: readonly StationCheck[];
  readonly findings: readonly Finding[];
  readonly cautions: readonly Caution[];
}

/**
 * The first stage of every plan and the whole of a check: measure each station (area, perimeter, walls), run the
 * process checks, split the boundaries into die body and moving span, and attach the safety cautions. Pure.
 */
export function checkSchedule(schedule: Schedule): ScheduleCheck {
  const tol = DEFAULT_TOLERANCES;
  const measured = schedule.stations.map((station) => {
    const region = station.orifice;
    const walls = measureWalls(region, tol);
    // No wall thinner than the limit measured across: skip the (slower) thin-wall search.
    const thin =
      walls.minWallMm < schedule.limits.minWallMm ? findThinWalls(region, schedule.limits.minWallMm, tol) : [];
    const box = boundingBox(region.outer);
    return {
      areaMm2: regionArea(region),
      perimeterMm: regionPerimeter(region),
      centroid: regionCentroid(region),
      minWallMm: walls.minWallMm,
      minWallAt: walls.minAt,
      maxWallMm: walls.maxWallMm,
      maxWallAt: walls.maxAt,
      extentMm: Math.max(box.maxX - box.minX, box.maxY - box.minY),
      thinWalls: thin.map((t) => ({ centroid: t.centroid, areaMm2: t.areaMm2, bbox: t.bbox })),
    };
  });
  const process = checkProcess(schedule, measured);
  const findings: Finding[] = [...process.findings];

  const spans = findMovingSpans(
    schedule.stations.map((s) => s.orifice),
    { matchToleranceMm: schedule.movingSpan.matchToleranceMm, ends: schedule.movingSpan.ends },
  );
  if (spans.status === 'unreconciled') {
    findings.push({
      code: 'SPAN_NOT_RECONCILED',
      severity: 'error',
      station: spans.station,
      positionM: schedule.stations[spans.station]?.positionM,
      at: spans.at,
      message: spans.message,
    });
  } else if (spans.status === 'found' && spans.differsOutside) {
    const { station, at } = spans.differsOutside;
    findings.push({
      code: 'SPAN_DIFFERS_OUTSIDE',
      severity: 'warning',
      station,
      positionM: schedule.stations[station]?.positionM,
      at,
      message: `Outside the given moving span, station ${station} differs from station 0 near (${round2(at[0])}, ${round2(at[1])}) mm: the die body is one shape, so the plan will not reach this station's orifice there. Move moving_span.start or end so the span covers it, if the plates should form that part.`,
    });
  } else if (spans.status === 'unknown') {
    findings.push({ code: 'SPAN_UNKNOWN', severity: 'info', message: spans.reason });
  }

  const stations = schedule.stations.map(
    (station, i): StationCheck => ({
      index: i,
      positionM: station.positionM,
      ...measured[i]!,
      process: process.stations[i]!,
      movingSpan: spans.status === 'found' ? spans.spans[i]! : null,
    }),
  );
  return {
    throughputKgPerS: process.throughputKgPerS,
    throughputFromFirstStation: process.throughputFromFirstStation,
    targetDrawDown: process.targetDrawDown,
    stations,
    findings: sortFindings(findings),
    cautions: processCautions(schedule.material, schedule.process.dieTemperatureC),
  };
}

const SEVERITY_ORDER = { error: 0, warning: 1, info: 2 } as const;

/** Errors first, then warnings, then information; within a severity, schedule order. */
function sortFindings(findings: readonly Finding[]): Finding[] {
  return [...findings].sort(
    (a, b) => SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity] || (a.station ?? -1) - (b.station ?? -1),
  );
}

function round2(x: number): number {
  return Math.round(x * 100) / 100;
}
