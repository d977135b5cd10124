import { formatNumber } from '../export/index.js';
import { type ActuatorTrajectory, camTable, setpointTable } from '../motion/index.js';
import { toDegrees } from '../numeric/index.js';
import type { PlanMotion } from '../pipeline/index.js';

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

/** Rows a setpoint table of `motion` would have (to refuse a huge table before building it). */
export function setpointRowCount(motion: PlanMotion): number {
  const base = motion.trajectories[0]!.timeBase;
  return Math.floor(base.spanM / base.lineSpeedMPerS / motion.timeStepS + 1e-9) + 2;
}

/**
 * The setpoint table: `position_m,time_s,actuator_<n>_deg|_mm…`, one row per time step over one repeat (periodic)
 * or from the first to the last station, every number through `formatNumber`.
 */
export function setpointTableText(motion: PlanMotion): MotionTableText {
  const table = setpointTable(motion.trajectories, motion.timeStepS);
  const units = motion.trajectories.map(unitOf);
  const columns = ['position_m', 'time_s', ...units.map((u, k) => `actuator_${k + 1}_${u}`)];
  const rows = table.positionsM.map((x, i) => [
    formatNumber(x),
    formatNumber(table.timesS[i]!),
    ...motion.trajectories.map((t, k) => formatNumber(toWire(t, table.values[k]![i]!))),
  ]);
  return { columns, rows, units, periodic: table.periodic };
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
