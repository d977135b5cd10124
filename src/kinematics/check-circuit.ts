import { constraintSystemOf } from './constraint-system.js';
import { type Pose, pointOnBody } from './pose.js';

/** Result of comparing a traced configuration with the expected one. */
export interface CircuitCheck {
  /** True when some point deviates by more than the tolerance: the trace reached another circuit or branch. */
  readonly defect: boolean;
  /** Largest distance between corresponding points, mm. */
  readonly maxDeviationMm: number;
  /** Body carrying the worst point ('' for a mechanism without moving bodies). */
  readonly worstBodyId: string;
}

/**
 * Circuit-defect check (Chase & Mirth, J. Mech. Des. 115(2) 1993): compares a configuration reached by driving the
 * mechanism (`traced`) with the one it should have (`expected`, e.g. a fitted station), point by point in the die-body
 * frame: every body's origin, its joint points and its named points. A deviation above `toleranceMm` is a defect.
 * Both poses must be of the same mechanism (throws otherwise).
 */
export function checkCircuit(traced: Pose, expected: Pose, toleranceMm: number): CircuitCheck {
  if (traced.mechanism !== expected.mechanism) throw new Error('checkCircuit: poses of different mechanisms');
  const m = traced.mechanism;
  const sys = constraintSystemOf(m);
  let maxDeviationMm = 0;
  let worstBodyId = '';
  const visit = (bodyId: string, local: readonly [number, number]) => {
    const a = pointOnBody(traced, bodyId, local);
    const b = pointOnBody(expected, bodyId, local);
    const d = Math.hypot(a[0] - b[0], a[1] - b[1]);
    if (d > maxDeviationMm || worstBodyId === '') {
      maxDeviationMm = Math.max(maxDeviationMm, d);
      worstBodyId = bodyId;
    }
  };
  m.bodies.forEach((body, b) => {
    if (b === sys.ground) return;
    visit(body.id, [0, 0]);
    for (const p of Object.values(body.points)) visit(body.id, p);
  });
  for (const j of m.joints) {
    if (j.bodyI !== m.bodies[sys.ground]!.id) visit(j.bodyI, j.pointI);
    if (j.bodyJ !== m.bodies[sys.ground]!.id) visit(j.bodyJ, j.pointJ);
  }
  return { defect: !(maxDeviationMm <= toleranceMm), maxDeviationMm, worstBodyId };
}
