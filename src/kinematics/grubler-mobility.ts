import type { Mechanism } from './mechanism.js';

/**
 * Grübler–Kutzbach mobility M = 3(n − 1) − 2·j1 − j2 of a planar mechanism, drivers not counted: n bodies including
 * the die body, j1 full joints (revolute and prismatic), j2 half joints (none in this model). A count from topology
 * only; special geometry can make the true mobility larger (compare `analyseMobility`).
 */
export function grublerMobility(mechanism: Mechanism): number {
  return 3 * (mechanism.bodies.length - 1) - 2 * mechanism.joints.length;
}
