import { formatNumber } from '../export/index.js';
import { type ActuatorTrajectory, camTable, metresPerMinute } from '../motion/index.js';
import { toDegrees } from '../numeric/index.js';
import type { Caution, Finding, Limits } from '../domain/index.js';
import type { MotionView } from './download-schema.js';
import { toCautionWire, toFindingWire } from './to-check-report.js';
import { mm, pointMm, roundTo, sig } from './wire-format.js';
import {
  MOTION_PRESSURE_RISE_RATIO,
  type PlanFrameParts,
  planFrames,
  type PlanMotion,
  type PlanSimulation,
  setpointRowCount as planSetpointRowCount,
  planSetpoints,
  pullerTable,
} from '../pipeline/index.js';

/** Most rows a setpoint table may have; a finer time step over a longer repeat is refused (`table_too_large`). */
export const MAX_SETPOINT_ROWS = 200_000;

/** A download's table: column names and rows of formatted numbers (the CSV's fields, the JSON's numbers). */
export interface MotionTableText {
  readonly columns: readonly string[];
  readonly rows: readonly (readonly string[])[];
  /** Unit of each actuator's values: `deg` (rotary) or `mm` (linear), in actuator order. */
  readonly units: readonly ('deg' | 'mm')[];
  readonly periodic: boolean;
}

/** Wire unit of an actuator's values; rotary trajectories hold radians, linear ones millimetres. */
const unitOf = (t: ActuatorTrajectory): 'deg' | 'mm' => (t.kind === 'rotary' ? 'deg' : 'mm');
/** Radians → degrees for rotary actuators (the one conversion back to wire units); mm stay mm. */
const toWire = (t: ActuatorTrajectory, v: number): number => (t.kind === 'rotary' ? toDegrees(v) : v);

/** Rows a setpoint table of the plan would have (to refuse a huge table before building it). */
export function setpointRowCount(motion: PlanMotion, simulation: PlanSimulation | null): number {
  return planSetpointRowCount(motion, simulation);
}

/**
 * The setpoint table: `position_m,time_s,actuator_<n>_deg|_mm…`, then, when the plan was simulated,
 * `puller_speed_m_per_min,orifice_area_mm2,draw_down_ratio`; one row per time step over one repeat (periodic) or from
 * the first to the last station (`planSetpoints`), every number through `formatNumber`. `tracked`: the direct-mode
 * values that follow the morph between station shapes instead of the motion law's.
 */
export function setpointTableText(
  motion: PlanMotion,
  simulation: PlanSimulation | null,
  tracked = false,
): MotionTableText {
  const table = planSetpoints(motion, simulation, { tracked });
  const units = motion.trajectories.map(unitOf);
  const process = table.process;
  const columns = [
    'position_m',
    'time_s',
    ...units.map((u, k) => `actuator_${k + 1}_${u}`),
    ...(process ? SETPOINT_PROCESS_COLUMNS : []),
  ];
  const rows = table.positionsM.map((x, i) => [
    formatNumber(x),
    formatNumber(table.timesS[i]!),
    ...motion.trajectories.map((t, k) => formatNumber(toWire(t, table.values[k]![i]!))),
    ...(process
      ? [
          formatNumber(metresPerMinute(process.pullerSpeedMPerS[i]!)),
          formatNumber(process.areaMm2[i]!),
          formatNumber(process.drawDownRatio[i]!),
        ]
      : []),
  ]);
  return { columns, rows, units, periodic: table.periodic };
}

/** The process columns of the setpoint table, after the actuators. */
export const SETPOINT_PROCESS_COLUMNS = ['puller_speed_m_per_min', 'orifice_area_mm2', 'draw_down_ratio'] as const;

/**
 * The puller-speed table: `position_m,time_s,puller_speed_m_per_min,orifice_area_mm2,product_area_mm2,draw_down_ratio`
 * at `points` evenly spaced master positions (`pullerTable`).
 */
export function pullerTableText(simulation: PlanSimulation, points: number): MotionTableText {
  const table = pullerTable(simulation, points);
  const columns = [
    'position_m',
    'time_s',
    'puller_speed_m_per_min',
    'orifice_area_mm2',
    'product_area_mm2',
    'draw_down_ratio',
  ];
  const rows = table.positionsM.map((x, i) => [
    formatNumber(x),
    formatNumber(table.timesS[i]!),
    formatNumber(metresPerMinute(table.pullerSpeedMPerS[i]!)),
    formatNumber(table.areaMm2[i]!),
    formatNumber(table.productAreaMm2[i]!),
    formatNumber(table.drawDownRatio[i]!),
  ]);
  return { columns, rows, units: [], periodic: table.periodic };
}

/** Unit of a table column, from its name. */
export function columnUnit(column: string): string {
  if (column === 'position_m') return 'm';
  if (column === 'time_s') return 's';
  if (column === 'puller_speed_m_per_min') return 'm/min';
  if (column.endsWith('_mm2')) return 'mm²';
  if (column.endsWith('_ratio')) return 'ratio';
  if (column.endsWith('_deg_per_m')) return 'deg/m';
  if (column.endsWith('_mm_per_m')) return 'mm/m';
  return column.endsWith('_deg') ? 'deg' : 'mm';
}

/**
 * The cam table: `position_m` (master, strictly increasing), then per actuator its value `actuator_<n>_deg|_mm`
 * and its slope against the master `actuator_<n>_deg_per_m|_mm_per_m`, at `points` evenly spaced master positions.
 */
export function camTableText(motion: PlanMotion, points: number): MotionTableText {
  const table = camTable(motion.trajectories, points);
  const units = motion.trajectories.map(unitOf);
  const columns = [
    'position_m',
    ...units.flatMap((u, k) => [`actuator_${k + 1}_${u}`, `actuator_${k + 1}_${u}_per_m`]),
  ];
  const rows = table.positionsM.map((x, i) => [
    formatNumber(x),
    ...motion.trajectories.flatMap((t, k) => [
      formatNumber(toWire(t, table.values[k]![i]!)),
      formatNumber(toWire(t, table.slopesPerM[k]![i]!)),
    ]),
  ]);
  return { columns, rows, units, periodic: table.periodic };
}

/** The station values every actuator passes through, at the stations' line positions, in wire units and formatted. */
export function stationSetpoints(motion: PlanMotion): { position_m: number; values: number[] }[] {
  const first = motion.trajectories[0]!;
  return first.stationsM.map((x, i) => ({
    position_m: Number(formatNumber(x)),
    values: motion.trajectories.map((t) => Number(formatNumber(toWire(t, t.values[i]!)))),
  }));
}

/** A plan name as a file name: letters, digits, '.', '_' and '-' kept, anything else '_' (at most 100 characters). */
export function downloadName(name: string, suffix: string): string {
  const safe = name.replace(/[^A-Za-z0-9._-]/g, '_').slice(0, 100) || 'plan';
  return `${safe}-${suffix}`;
}

/** The wire numbers of the motion view: lengths 0.1 µm, positions and times 1 µm and 1 µs, others 6 significant. */
const micro = (x: number): number => roundTo(x, 6);
/** A series for the wire: a value that is not finite (a closed orifice's pressure ratio) is null. */
const finiteOr = (values: readonly number[], round: (x: number) => number): (number | null)[] =>
  values.map((v) => (Number.isFinite(v) ? round(v) : null));

/**
 * `GET /v1/plans/{id}/motion.json`: the simulated motion as frames for a review page (`planFrames`): line position and
 * time per frame, each actuator's value (degrees or mm), every joint's point, the plates' outlines in their own frames
 * with the joints at their pivots, the links with the joints at their pins, and the process series; the plan's findings
 * and cautions. snake_case, units in the names.
 */
export function motionView(
  planId: string,
  parts: PlanFrameParts,
  findings: readonly Finding[],
  cautions: readonly Caution[],
  limits: Pick<Limits, 'drawDownMin' | 'drawDownMax'>,
): MotionView {
  const frames = planFrames(parts);
  return {
    plan_id: planId,
    position_m: frames.positionsM.map(micro),
    time_s: frames.timesS.map(micro),
    actuators: frames.actuators.map((a) => ({
      id: a.id,
      kind: a.kind,
      unit: a.kind === 'rotary' ? ('deg' as const) : ('mm' as const),
      values: a.values.map((v) => (a.kind === 'rotary' ? micro(toDegrees(v)) : mm(v))),
    })),
    joints: frames.joints.map((j) => ({ id: j.id, positions_mm: j.positionsMm.map(pointMm) })),
    plates: frames.plates.map((p) => ({
      id: p.id,
      pivots: [p.pivots[0], p.pivots[1]],
      outline_local_mm: p.outlineLocalMm.map(pointMm),
    })),
    links: frames.links.map((l) => ({ id: l.id, pins: [l.pins[0], l.pins[1]] })),
    area_mm2: finiteOr(frames.areaMm2, mm),
    draw_down_ratio: finiteOr(frames.drawDownRatio, (x) => sig(x)),
    puller_speed_m_per_min: finiteOr(frames.pullerSpeedMPerS.map(metresPerMinute), (x) => sig(x)),
    die_pressure_ratio: finiteOr(frames.diePressureRatio, (x) => sig(x)),
    limits: {
      draw_down_ratio: { min: sig(limits.drawDownMin), max: sig(limits.drawDownMax) },
      die_pressure_ratio: { max: MOTION_PRESSURE_RISE_RATIO },
    },
    findings: findings.map(toFindingWire),
    cautions: cautions.map(toCautionWire),
  };
}
