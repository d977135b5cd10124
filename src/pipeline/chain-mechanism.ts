import type { Finding } from '../domain/index.js';
import type { MechanismReport } from '../mechanise/index.js';
import { type ChainEnd, type ChainFit, endPoint } from '../synthesis/index.js';

/** The mechanism as the plan reports it: the same shape the mechanisation stage returns. */
export type PlanMechanism = MechanismReport;

/**
 * The fitted chain as a mechanism: the die body, one body per plate (alternating layers 1 and 2, so neighbours
 * overlap at their pivots) and two for a telescoping pair, a slider block for a slotted end, revolute joints at every
 * pivot and prismatic joints for a slot or a telescoping pair (its station position is the pair's midpoint). The plan shows
 * this, without actuators, when mechanisation finds no way to drive the chain.
 */
export function chainMechanism(fit: ChainFit): PlanMechanism {
  const n = fit.plateCount;
  const stations = fit.chain.pivots.length;
  const bodies: PlanMechanism['bodies'][number][] = [{ id: 'die_body', kind: 'die_body', layer: 0 }];
  const joints: PlanMechanism['joints'][number][] = [];
  const pivotAt = (k: number) => fit.chain.pivots.map((p) => p[k]!);
  const telescoping = new Set(fit.chain.telescoping.map((t) => t.plate + 1));
  for (let k = 1; k <= n; k++) {
    bodies.push({ id: `plate_${k}`, kind: 'plate', layer: k % 2 === 1 ? 1 : 2 });
    if (telescoping.has(k)) {
      // a telescoping plate is a pair: plate_k carries pivot k − 1, plate_k_slide pivot k, sliding on each other
      bodies.push({ id: `plate_${k}_slide`, kind: 'plate', layer: k % 2 === 1 ? 2 : 1 });
      joints.push({
        id: `telescope_${k}`,
        type: 'prismatic',
        bodies: [`plate_${k}`, `plate_${k}_slide`],
        stationPositions: fit.chain.pivots.map((p) => [(p[k - 1]![0] + p[k]![0]) / 2, (p[k - 1]![1] + p[k]![1]) / 2]),
      });
    }
  }
  /** The body holding pivot k on the side of plate k (the slide of a telescoping pair). */
  const outgoing = (k: number) => (telescoping.has(k) ? `plate_${k}_slide` : `plate_${k}`);

  const attachEnd = (end: ChainEnd, which: 'start' | 'end', plate: string, pivotIndex: number) => {
    if (end.kind === 'pivot') {
      joints.push({
        id: `pivot_${pivotIndex}`,
        type: 'revolute',
        bodies: ['die_body', plate],
        stationPositions: pivotAt(pivotIndex),
      });
      return;
    }
    const slider = `slider_${which}`;
    bodies.push({ id: slider, kind: 'link', layer: 3 });
    joints.push({
      id: `pivot_${pivotIndex}`,
      type: 'revolute',
      bodies: [slider, plate],
      stationPositions: pivotAt(pivotIndex),
    });
    joints.push({
      id: `slot_${which}`,
      type: 'prismatic',
      bodies: ['die_body', slider],
      stationPositions: Array.from({ length: stations }, (_, i) => endPoint(end, i)),
    });
  };
  attachEnd(fit.chain.start, 'start', 'plate_1', 0);
  for (let k = 1; k < n; k++) {
    joints.push({
      id: `pivot_${k}`,
      type: 'revolute',
      bodies: [outgoing(k), `plate_${k + 1}`],
      stationPositions: pivotAt(k),
    });
  }
  attachEnd(fit.chain.end, 'end', outgoing(n), n);
  const mobility = 3 * (bodies.length - 1) - 2 * joints.length;
  const findings: Finding[] = [
    {
      code: 'CHAIN_NOT_DRIVEN',
      severity: 'info',
      value: mobility,
      message: `The mechanism shown is the fitted chain alone, with ${mobility} degree(s) of freedom and no actuators: no set of binary links and actuators passed the checks (see the other findings).`,
    },
  ];
  return { mobility, bodies, joints, actuators: [], findings };
}
