import type { GcsWrapper } from '@salusoft89/planegcs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  bodyPose,
  buildBracedChain,
  buildFourBar,
  buildSixBar,
  initialPose,
  type Mechanism,
  solvePosition,
} from '../../src/kinematics/index.js';
import { toRadians } from '../../src/numeric/index.js';
import { assembleWithPlanegcs, createGcs, maxJointDeviation } from './planegcs-sketch.js';

let gcs: GcsWrapper;
beforeAll(async () => {
  gcs = await createGcs();
});
afterAll(() => {
  gcs.destroy_gcs_module();
});

/** Solves the mechanism at `drivenBody`'s start angle + `delta` with both solvers from the same drawn start. */
function compare(m: Mechanism, drivenBody: string, delta: number): number {
  const a0 = bodyPose(initialPose(m), drivenBody).phi;
  const start = initialPose(m, [a0]);
  const ours = solvePosition(m, [a0 + delta], { start });
  expect(ours.status).toBe('converged');
  const theirs = assembleWithPlanegcs(gcs, start, [a0 + delta]);
  expect(theirs.status).toBe(0); // SolveStatus.Success
  return maxJointDeviation(ours.pose, theirs);
}

describe('agreement with @salusoft89/planegcs (FreeCAD PlaneGCS, an independent constraint solver)', () => {
  it('solvePosition(four-bar 40/120/80/100, θ2 30° → 75°) puts every pin within 1e-9 mm of planegcs', () => {
    // Reference: @salusoft89/planegcs 1.3.0, DogLeg, same drawn start, pins as points, links as distances
    const m = buildFourBar({ a: 40, b: 120, c: 80, d: 100 }, { theta2: toRadians(30) });
    expect(compare(m, 'crank', toRadians(45))).toBeLessThan(1e-9);
  });

  for (const chain of ['watt', 'stephenson'] as const) {
    it(`solvePosition(${chain} six-bar, crank +0.3 rad) puts every pin within 1e-9 mm of planegcs`, () => {
      // Reference: @salusoft89/planegcs 1.3.0; ternary bodies kept rigid by a triangle of distances
      expect(compare(buildSixBar(chain), 'crank', 0.3)).toBeLessThan(1e-9);
    });
  }

  it('solvePosition(10-plate chain braced by 7 links to 1 DOF, input +0.05 rad) is within 1e-9 mm of planegcs', () => {
    // Reference: @salusoft89/planegcs 1.3.0 on the same 18-body, 25-joint mechanism
    const m = buildBracedChain(10);
    expect(m.bodies).toHaveLength(18);
    expect(compare(m, 'plate1', 0.05)).toBeLessThan(1e-9);
  });
});
