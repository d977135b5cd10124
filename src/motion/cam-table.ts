import type { ActuatorTrajectory } from './actuator-trajectory.js';
import { sampleTrajectory } from './sample-trajectory.js';
import { sharedTimeBase } from './setpoint-table.js';

/** An electronic cam in internal units: master line position against each actuator's value and slope. */
export interface CamTable {
  /** Master positions, m, evenly spaced and strictly increasing over one repeat (or the stations' span). */
  readonly positionsM: readonly number[];
  /** `values[k][i]`: actuator k at master position i, rad (rotary) or mm (linear). */
  readonly values: readonly (readonly number[])[];
  /** `slopes[k][i]`: d(value)/d(position), rad/m or mm/m (the cam's velocity per unit of master travel). */
  readonly slopesPerM: readonly (readonly number[])[];
  /** True when the table covers one repeat and its last row is its first one repeat on. */
  readonly periodic: boolean;
}

/**
 * `points` master positions (≥ 2) evenly spaced from the first station over the trajectories' shared span (one repeat
 * when periodic, else first to last station), each actuator's value and slope there. The slope is velocity / line
 * speed, since dx/dt is the line speed (PLCopen MC_CamIn runs such a table against the master axis). A periodic
 * table's last row repeats the first exactly, so it closes on itself. Throws on fewer than 2 points.
 */
export function camTable(trajectories: readonly ActuatorTrajectory[], points: number): CamTable {
  if (!Number.isInteger(points) || points < 2) throw new Error(`camTable: needs at least 2 points, got ${points}`);
  const base = sharedTimeBase(trajectories);
  const positionsM = Array.from({ length: points }, (_, i) =>
    i === points - 1 ? base.originM + base.spanM : base.originM + (base.spanM * i) / (points - 1),
  );
  const values: number[][] = [];
  const slopesPerM: number[][] = [];
  for (const t of trajectories) {
    const samples = positionsM.map((x) => sampleTrajectory(t, x));
    const value = samples.map((s) => s.value);
    const slope = samples.map((s) => s.velocityPerS / base.lineSpeedMPerS);
    if (base.periodic) {
      value[points - 1] = value[0]!;
      slope[points - 1] = slope[0]!;
    }
    values.push(value);
    slopesPerM.push(slope);
  }
  return { positionsM, values, slopesPerM, periodic: base.periodic };
}
