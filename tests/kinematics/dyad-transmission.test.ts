import { describe, expect, it } from 'vitest';
import {
  buildPinnedChain,
  dyadTransmissionAngles,
  initialPose,
  solvePosition,
  traceActuatorPath,
} from '../../src/kinematics/index.js';
import { toDegrees, toRadians } from '../../src/numeric/index.js';

/**
 * A four-bar made of three plates pinned to the die body 100 mm apart (crank a 40, coupler b 120, rocker c 80, ground
 * d 100), driven at its first ground pivot: the plate–plate joint between coupler and rocker is the dyad's middle joint.
 */
const a = 40;
const b = 120;
const c = 80;
const d = 100;

/** cos μ = (b² + c² − a² − d² + 2ad·cos θ2)/(2bc) (four-bar geometry, law of cosines; Norton, *Design of Machinery*). */
const muClosedForm = (theta2: number) =>
  Math.acos((b * b + c * c - a * a - d * d + 2 * a * d * Math.cos(theta2)) / (2 * b * c));

describe('dyadTransmissionAngles', () => {
  const chain = buildPinnedChain([a, b, c], [0, 0], [d, 0], { drive: true });

  it('a three-plate chain driven at θ2 = 40° has μ 37.03° at its coupler–rocker pivot (cosine rule)', () => {
    // Reference: docs/MODEL.md §5 (Freudenstein/cos μ closed form [derived]; Norton Ex. 4-1 [mem]):
    // μ = 37.03° at θ2 = 40°
    const r = solvePosition(chain, [toRadians(40)], { start: initialPose(chain) });
    expect(r.status).toBe('converged');
    const mus = dyadTransmissionAngles(r.pose);
    expect(mus.map((t) => t.jointId)).toEqual(['P2']);
    const mu = mus[0]!.mu;
    // the open and crossed assemblies see the coupler and rocker at μ or 180° − μ
    const folded = Math.min(mu, Math.PI - mu);
    expect(toDegrees(folded)).toBeCloseTo(37.03, 2);
    expect(folded).toBeCloseTo(Math.min(muClosedForm(toRadians(40)), Math.PI - muClosedForm(toRadians(40))), 10);
  });

  it('follows the cosine rule along a swing of the crank', () => {
    const start = solvePosition(chain, [toRadians(20)], { start: initialPose(chain) });
    const trace = traceActuatorPath(start.pose, [toRadians(80)]);
    expect(trace.status).toBe('completed');
    for (const s of trace.samples) {
      const theta2 = s.pose.actuators[0]!;
      const mu = dyadTransmissionAngles(s.pose)[0]!.mu;
      const ref = muClosedForm(theta2);
      expect(Math.min(mu, Math.PI - mu)).toBeCloseTo(Math.min(ref, Math.PI - ref), 9);
    }
  });

  it('a fully driven chain (every degree of freedom on a joint) still has its last two plates as a dyad', () => {
    // 5 plates, N − 2 = 3 drivers on P0…P2: plates 4 and 5 close onto the far ground pivot as one RRR dyad
    const five = buildPinnedChain([20, 20, 20, 20, 20], [0, 0], [70, 0], { drive: true });
    const pose = initialPose(five);
    expect(dyadTransmissionAngles(pose).map((t) => t.jointId)).toEqual(['P4']);
  });
});
