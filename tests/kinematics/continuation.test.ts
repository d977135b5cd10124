import { describe, expect, it } from 'vitest';
import {
  bodyPose,
  buildBracedChain,
  buildFourBar,
  checkCircuit,
  findBranchDefects,
  fourBarRockerLimits,
  initialPose,
  monitorPath,
  solvePosition,
  traceActuatorPath,
} from '../../src/kinematics/index.js';
import { toDegrees, toRadians } from '../../src/numeric/index.js';

const DIMS = { a: 40, b: 120, c: 80, d: 100 };

describe('traceActuatorPath', () => {
  it('traceActuatorPath(rocker of 40/120/80/100 driven 90° → 140°) stops singular at the 128.6822° limit', () => {
    // Reference: rocker limit by the law of cosines (fourBarRockerLimits; Norton, Design of Machinery, toggle
    // positions): driving the rocker past it is impossible, so the trace must stop there, not jump branch
    const limits = fourBarRockerLimits(DIMS)!;
    const m = buildFourBar(DIMS, { theta2: toRadians(90), drive: 'rocker' });
    const start = initialPose(m, [bodyPose(initialPose(m), 'rocker').phi]);
    const trace = traceActuatorPath(start, [toRadians(140)]);
    expect(trace.status).toBe('singular');
    expect(toDegrees(trace.stoppedAt.actuators[0]!)).toBeCloseTo(toDegrees(limits.theta4Folded), 6);
    expect(toDegrees(trace.singularityEstimate!.actuators[0]!)).toBeCloseTo(toDegrees(limits.theta4Folded), 6);
    expect(findBranchDefects(trace.samples)).toEqual([]);
    const last = trace.samples.at(-1)!;
    // At the folded toggle the crank points away from B: θ2 = θ2Folded.
    const crank = bodyPose(last.pose, 'crank').phi;
    expect(Math.abs(Math.sin((crank - limits.theta2Folded) / 2))).toBeLessThan(1e-3);
    expect(last.conditionEstimate).toBeGreaterThan(1e3 * trace.samples[0]!.conditionEstimate);
  });

  it('traceActuatorPath(rocker driven 90° → 40°) stops singular at the 54.9004° limit', () => {
    // Reference: extended toggle, cos θ4 = (160² − 100² − 80²)/(2·100·80) = 0.575 [derived]
    const m = buildFourBar(DIMS, { theta2: toRadians(90), drive: 'rocker' });
    const start = initialPose(m, [bodyPose(initialPose(m), 'rocker').phi]);
    const trace = traceActuatorPath(start, [toRadians(40)]);
    expect(trace.status).toBe('singular');
    expect(toDegrees(trace.stoppedAt.actuators[0]!)).toBeCloseTo(54.9004, 4);
    expect(trace.reason).toMatch(/singular configuration/);
  });

  it('traceActuatorPath(parallelogram 40/100/40/100 driven 30° → −30°) stops singular at the 0° change point', () => {
    // Reference: change-point linkage (s + l = p + q): all pivots collinear at θ2 = 0, where the branches cross
    const m = buildFourBar({ a: 40, b: 100, c: 40, d: 100 }, { theta2: toRadians(30) });
    const start = solvePosition(m, [toRadians(30)]);
    expect(toDegrees(bodyPose(start.pose, 'rocker').phi)).toBeCloseTo(30, 8); // parallelogram branch
    const trace = traceActuatorPath(start.pose, [toRadians(-30)]);
    expect(trace.status).toBe('singular');
    expect(Math.abs(toDegrees(trace.stoppedAt.actuators[0]!))).toBeLessThan(1e-3);
    expect(findBranchDefects(trace.samples)).toEqual([]);
    for (const s of trace.samples) expect(bodyPose(s.pose, 'coupler').phi).toBeCloseTo(0, 8);
  });

  it('solvePosition(four-bar with links too short, 40/20/30/100) does not converge', () => {
    // Reference: b + c = 50 < d − a = 60: the coupler and rocker cannot reach, at any crank angle
    const m = buildFourBar({ a: 40, b: 20, c: 30, d: 100 });
    const r = solvePosition(m, [0]);
    expect(r.status).not.toBe('converged');
    expect(['diverged', 'singular', 'max-iterations']).toContain(r.status);
    expect(r.residual).toBeGreaterThan(1);
    const trace = traceActuatorPath(initialPose(m, [0]), [1]);
    expect(trace.status).not.toBe('completed');
    expect(trace.samples).toHaveLength(0);
    expect(trace.reason).toMatch(/start configuration/);
  });

  it('checkCircuit(traced to θ2 = 100°) agrees with the open-circuit solve and flags the crossed one', () => {
    // Reference: Chase & Mirth, J. Mech. Des. 115(2) 1993 (circuit defect: traced ≠ expected configuration)
    const m = buildFourBar(DIMS);
    const trace = traceActuatorPath(initialPose(m, [0]), [toRadians(100)]);
    const traced = trace.samples.at(-1)!.pose;
    // Same mechanism, started from the closed-form assembly of each circuit (same body order, so same layout).
    const startOn = (circuit: 'open' | 'crossed') => ({
      ...initialPose(buildFourBar(DIMS, { theta2: toRadians(100), circuit }), [toRadians(100)]),
      mechanism: m,
    });
    const open = solvePosition(m, [toRadians(100)], { start: startOn('open') });
    const crossed = solvePosition(m, [toRadians(100)], { start: startOn('crossed') });
    const same = checkCircuit(traced, open.pose, 1e-6);
    expect(same.defect).toBe(false);
    expect(same.maxDeviationMm).toBeLessThan(1e-9);
    const defect = checkCircuit(traced, crossed.pose, 1e-6);
    expect(defect.defect).toBe(true);
    expect(defect.maxDeviationMm).toBeGreaterThan(10);
  });

  it('monitorPath(four-bar full turn) finds no branch defect, μmin 26.38° at θ2 = 0 and a bounded condition', () => {
    // Reference: cos μ formula (docs/MODEL.md §5); a Grashof crank-rocker driven by its crank has no singular position
    const m = buildFourBar(DIMS);
    const trace = traceActuatorPath(initialPose(m, [0]), [2 * Math.PI]);
    const q = monitorPath(trace.samples);
    expect(q.branchDefects).toEqual([]);
    expect(q.samples).toHaveLength(trace.samples.length);
    expect(toDegrees(Math.PI / 2 - q.worstTransmission!.angle.deviation)).toBeCloseTo(26.38, 2);
    expect(q.minSingularValue!.value).toBeGreaterThan(0.05);
    expect(q.maxConditionNumber!.value).toBeLessThan(1e3);
    // The cheap LU estimate tracks the SVD condition number within the factor √n·n that norms allow.
    for (const [i, s] of trace.samples.entries()) {
      const exact = q.samples[i]!.conditionNumber;
      expect(s.conditionEstimate).toBeGreaterThan(exact / 30);
      expect(s.conditionEstimate).toBeLessThan(exact * 30);
    }
  });

  it('traceActuatorPath(20-body braced chain, ±0.04 rad) completes with 2 or fewer Newton iterations per step', () => {
    // Reference: predictor from the velocity equations (Haug; Nikravesh): a good tangent leaves little to correct
    const m = buildBracedChain(11);
    const a0 = bodyPose(initialPose(m), 'plate1').phi;
    const trace = traceActuatorPath(initialPose(m, [a0]), [a0 + 0.04]);
    expect(trace.status).toBe('completed');
    expect(trace.stoppedAt.s).toBe(1);
    expect(trace.newtonIterations / trace.acceptedSteps).toBeLessThanOrEqual(2);
    expect(trace.samples.at(-1)!.residual).toBeLessThan(1e-10);
    expect(trace.samples.at(-1)!.actuators[0]).toBe(a0 + 0.04);
  });

  it('traceActuatorPath throws for a mechanism with fewer drivers than degrees of freedom', () => {
    // Reference: continuation needs a square driven system (drivers = mobility)
    const m = buildFourBar(DIMS, { drive: 'none' });
    expect(() => traceActuatorPath(initialPose(m, []), [])).toThrow(/square/);
  });
});
