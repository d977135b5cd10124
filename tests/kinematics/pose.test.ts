import { describe, expect, it } from 'vitest';
import {
  bodyPose,
  buildBracedChain,
  buildSliderCrank,
  createPositionSolver,
  initialPose,
  jointPoint,
  jointValue,
  pointOnBody,
  solvePosition,
} from '../../src/kinematics/index.js';
import { toRadians } from '../../src/numeric/index.js';

describe('pose queries', () => {
  it('initialPose(braced chain) tags the drawn configuration with its own actuator value', () => {
    // Reference: buildFromPins frames: plate1's x axis points P0→P1, so the driven angle at P0 is φ(plate1)
    const m = buildBracedChain(6);
    const pose = initialPose(m);
    expect(pose.actuators[0]).toBeCloseTo(bodyPose(pose, 'plate1').phi, 15);
    expect(solvePosition(m, pose.actuators, { start: pose }).iterations).toBe(0);
  });

  it('pointOnBody, jointPoint and jointValue read a solved slider-crank in the die-body frame', () => {
    // Reference: slider-crank geometry at θ = 90°: A = (0, 40), B = (√(120² − 40²), 0)
    const m = buildSliderCrank({ r: 40, l: 120, e: 0 });
    const r = solvePosition(m, [toRadians(90)]);
    const a = jointPoint(r.pose, 'A');
    expect(a[0]).toBeCloseTo(0, 12);
    expect(a[1]).toBeCloseTo(40, 12);
    const b = pointOnBody(r.pose, 'rod', [120, 0]);
    expect(b[0]).toBeCloseTo(Math.sqrt(120 ** 2 - 40 ** 2), 10);
    expect(b[1]).toBeCloseTo(0, 10);
    expect(jointValue(r.pose, 'slide')).toBeCloseTo(b[0], 10);
    expect(jointValue(r.pose, 'O2')).toBeCloseTo(toRadians(90), 12);
    expect(() => jointPoint(r.pose, 'nope')).toThrow(/unknown joint 'nope'/);
    expect(() => bodyPose(r.pose, 'ghost')).toThrow(/unknown body 'ghost'/);
  });

  it('createPositionSolver().solve chained from its own results equals independent cold solves', () => {
    // Reference: self-consistency: reusing the previous factors (first-order predictor) must not change the answer
    const m = buildBracedChain(11);
    const solver = createPositionSolver(m);
    let pose = initialPose(m);
    const a0 = pose.actuators[0]!;
    for (let i = 1; i <= 20; i++) {
      const target = [a0 + 0.002 * i];
      const chained = solver.solve(target, pose);
      const cold = solvePosition(m, target, { start: pose });
      expect(chained.status).toBe('converged');
      expect(chained.jacobianSign).toBe(cold.jacobianSign);
      // Both stop once the residual is below 1e-10 mm, so they agree to about that.
      for (let k = 0; k < pose.coordinates.length; k++) {
        expect(Math.abs(chained.pose.coordinates[k]! - cold.pose.coordinates[k]!)).toBeLessThan(1e-9);
      }
      pose = chained.pose;
    }
  });
});
