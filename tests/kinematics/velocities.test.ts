import { describe, expect, it } from 'vitest';
import {
  bodyPose,
  buildBracedChain,
  buildFourBar,
  buildSixBar,
  buildSliderCrank,
  createPositionSolver,
  initialPose,
  type Mechanism,
  type Pose,
  pointOnBody,
  pointVelocity,
  solvePosition,
  solveVelocities,
} from '../../src/kinematics/index.js';
import { toRadians } from '../../src/numeric/index.js';

/** Central finite difference of every body point of interest with respect to actuator 0, mm per actuator unit. */
function finiteDifference(m: Mechanism, pose: Pose, h: number) {
  const solver = createPositionSolver(m);
  const plus = solver.solve([pose.actuators[0]! + h], pose);
  const minus = solver.solve([pose.actuators[0]! - h], pose);
  expect(plus.status).toBe('converged');
  expect(minus.status).toBe('converged');
  return (bodyId: string, local: readonly [number, number]) => {
    const p = pointOnBody(plus.pose, bodyId, local);
    const q = pointOnBody(minus.pose, bodyId, local);
    return [(p[0] - q[0]) / (2 * h), (p[1] - q[1]) / (2 * h)] as const;
  };
}

function expectVelocitiesMatch(m: Mechanism, pose: Pose, h = 1e-5, tol = 1e-5): number {
  const analysis = solveVelocities(pose);
  expect(analysis.status).toBe('ok');
  const fd = finiteDifference(m, pose, h);
  let checked = 0;
  for (const body of m.bodies) {
    for (const local of [[0, 0] as const, ...Object.values(body.points)]) {
      const v = pointVelocity(analysis, body.id, local);
      const w = fd(body.id, local);
      const scale = Math.max(1, Math.hypot(w[0], w[1]));
      expect(Math.abs(v[0] - w[0]) / scale).toBeLessThan(tol);
      expect(Math.abs(v[1] - w[1]) / scale).toBeLessThan(tol);
      checked++;
    }
  }
  return checked;
}

describe('solveVelocities', () => {
  it('solveVelocities(four-bar 40/120/80/100, θ2 = 40°) matches central differences at every point', () => {
    // Reference: central finite differences of the position solution, step 1e-5 rad (error O(h²))
    const m = buildFourBar({ a: 40, b: 120, c: 80, d: 100 }, { theta2: toRadians(40) });
    const pose = solvePosition(m, [toRadians(40)]).pose;
    expect(expectVelocitiesMatch(m, pose)).toBeGreaterThan(8);
  });

  it('solveVelocities(four-bar) gives ω3, ω4 of the loop-closure velocity equations', () => {
    // Reference: differentiated loop closure a·e^{iθ2} + b·e^{iθ3} = d + c·e^{iθ4}, solved for ω3, ω4 per unit ω2:
    // ω3 = a·sin(θ4 − θ2)/(b·sin(θ3 − θ4)), ω4 = a·sin(θ2 − θ3)/(c·sin(θ4 − θ3)) [derived]
    const m = buildFourBar({ a: 40, b: 120, c: 80, d: 100 }, { theta2: toRadians(40) });
    const pose = solvePosition(m, [toRadians(40)]).pose;
    const t2 = bodyPose(pose, 'crank').phi;
    const t3 = bodyPose(pose, 'coupler').phi;
    const t4 = bodyPose(pose, 'rocker').phi;
    const rates = solveVelocities(pose).rates[0]!;
    const phiDot = (i: number) => rates[3 * i + 2]!;
    expect(phiDot(1)).toBeCloseTo(1, 12);
    expect(phiDot(2)).toBeCloseTo((40 * Math.sin(t4 - t2)) / (120 * Math.sin(t3 - t4)), 12);
    expect(phiDot(3)).toBeCloseTo((40 * Math.sin(t2 - t3)) / (80 * Math.sin(t4 - t3)), 12);
  });

  it('solveVelocities(slider-crank driven by the slider) matches central differences', () => {
    // Reference: central finite differences, step 1e-5 mm
    const dims = { r: 40, l: 120, e: 10 };
    const m = buildSliderCrank(dims, { theta: toRadians(50), drive: 'slider' });
    const start = initialPose(m);
    const pose = solvePosition(m, [bodyPose(start, 'slider').x + 1], { start }).pose;
    expectVelocitiesMatch(m, pose);
  });

  for (const chain of ['watt', 'stephenson'] as const) {
    it(`solveVelocities(${chain} six-bar) matches central differences at every pin`, () => {
      // Reference: central finite differences, step 1e-5 rad
      const m = buildSixBar(chain);
      const a0 = bodyPose(initialPose(m), 'crank').phi;
      const pose = solvePosition(m, [a0 + 0.1], { start: initialPose(m, [a0]) }).pose;
      expectVelocitiesMatch(m, pose);
    });
  }

  it('solveVelocities(10-plate braced chain) gives plate point velocities matching central differences', () => {
    // Reference: central finite differences, step 1e-5 rad
    const m = buildBracedChain(10);
    const a0 = bodyPose(initialPose(m), 'plate1').phi;
    const pose = solvePosition(m, [a0 + 0.02], { start: initialPose(m, [a0]) }).pose;
    expect(expectVelocitiesMatch(m, pose)).toBeGreaterThan(40);
  });
});
