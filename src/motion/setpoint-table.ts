import type { ActuatorTrajectory } from './actuator-trajectory.js';
import { sampleTrajectory } from './sample-trajectory.js';
import { stepGrid } from './step-grid.js';

/** Rows of a setpoint table in internal units: one per time step, one value column per actuator. */
export interface SetpointTable {
  /** Line positions, m, strictly increasing (not wrapped: a periodic table's last row is origin + repeat). */
  readonly positionsM: readonly number[];
  /** Times since the first station, s. */
  readonly timesS: readonly number[];
  /** `values[k][i]`: actuator k at row i, rad (rotary) or mm (linear). */
  readonly values: readonly (readonly number[])[];
  /** True when the table covers one repeat and its last row is its first one repeat on. */
  readonly periodic: boolean;
}

/**
 * Samples every trajectory on the `stepGrid` of the first one's time base every `timeStepS` (s): over one repeat when
 * periodic, else from the first to the last station. A periodic table's last row repeats the first row's values
 * exactly, so it closes on itself. All trajectories must share one time base (the same stations, speed and repeat);
 * throws when there are none or they differ.
 */
export function setpointTable(trajectories: readonly ActuatorTrajectory[], timeStepS: number): SetpointTable {
  const base = sharedTimeBase(trajectories);
  const grid = stepGrid(base, timeStepS);
  const values = trajectories.map((t) => {
    const column = grid.positionsM.map((x) => sampleTrajectory(t, x).value);
    if (grid.closes) column[column.length - 1] = column[0]!;
    return column;
  });
  return { positionsM: grid.positionsM, timesS: grid.timesS, values, periodic: grid.closes };
}

/** The time base all `trajectories` share; throws when there are none or they differ. */
export function sharedTimeBase(trajectories: readonly ActuatorTrajectory[]): ActuatorTrajectory['timeBase'] {
  const first = trajectories[0];
  if (!first) throw new Error('setpoint table: no trajectories');
  const b = first.timeBase;
  for (const t of trajectories) {
    const o = t.timeBase;
    if (o.originM !== b.originM || o.spanM !== b.spanM || o.lineSpeedMPerS !== b.lineSpeedMPerS) {
      throw new Error('setpoint table: trajectories with different time bases');
    }
  }
  return b;
}
