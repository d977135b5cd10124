import type { Point } from '../geometry/index.js';
import { arcChainPivots } from './arc-chain-pivots.js';
import { defineMechanism } from './define-mechanism.js';
import type { BodySpec, DriverSpec, Joint, Mechanism } from './mechanism.js';

/** Options of `buildPinnedChain`. */
export interface PinnedChainOptions {
  /** Side of the line groundA→groundB the initial assembly bulges to. @default 'left' */
  readonly bulge?: 'left' | 'right';
  /**
   * Add N − 2 drivers on pivots P0 … P(N−3) (ids `drive-P0` …; actuator k = relative angle at pivot Pk, rad), so the
   * chain is fully driven. @default false
   */
  readonly drive?: boolean;
}

/**
 * N plates pinned end to end, the first at `groundA` and the last at `groundB` on the die body (mm): Grübler
 * mobility N − 2. Plates `plate1` … `plateN` (layers alternating 1, 2) each have their origin at their start pivot
 * and x axis towards their end pivot, at (Lk, 0). Joints `P0` (die body–plate1) … `PN` (plateN–die body). The initial
 * pose has every pivot on one circular arc (an exact assembly). Throws when the chain cannot span the ground pivots.
 */
export function buildPinnedChain(
  lengths: readonly number[],
  groundA: Point,
  groundB: Point,
  options: PinnedChainOptions = {},
): Mechanism {
  const n = lengths.length;
  if (n < 2) throw new Error(`buildPinnedChain: at least 2 plates needed, got ${n}`);
  const pivots = arcChainPivots(lengths, groundA, groundB, options.bulge === 'right' ? -1 : 1);
  const bodies: BodySpec[] = [{ id: 'die_body', kind: 'die_body', points: { A: groundA, B: groundB } }];
  const joints: Joint[] = [];
  lengths.forEach((l, k) => {
    const p = pivots[k]!;
    const q = pivots[k + 1]!;
    bodies.push({
      id: `plate${k + 1}`,
      kind: 'plate',
      layer: 1 + (k % 2),
      points: { start: [0, 0], end: [l, 0] },
      initial: { x: p[0], y: p[1], phi: Math.atan2(q[1] - p[1], q[0] - p[0]) },
    });
    joints.push(
      k === 0
        ? { kind: 'revolute', id: 'P0', bodyI: 'die_body', pointI: groundA, bodyJ: 'plate1', pointJ: [0, 0] }
        : {
            kind: 'revolute',
            id: `P${k}`,
            bodyI: `plate${k}`,
            pointI: [lengths[k - 1]!, 0],
            bodyJ: `plate${k + 1}`,
            pointJ: [0, 0],
          },
    );
  });
  joints.push({
    kind: 'revolute',
    id: `P${n}`,
    bodyI: `plate${n}`,
    pointI: [lengths[n - 1]!, 0],
    bodyJ: 'die_body',
    pointJ: groundB,
  });
  const drivers: DriverSpec[] = options.drive
    ? Array.from({ length: n - 2 }, (_, k) => ({ id: `drive-P${k}`, joint: `P${k}` }))
    : [];
  return defineMechanism({ bodies, joints, drivers });
}
