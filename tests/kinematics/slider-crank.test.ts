import { describe, expect, it } from 'vitest';
import {
  bodyPose,
  buildSliderCrank,
  initialPose,
  jointPoint,
  jointValue,
  sliderCrankPosition,
  solvePosition,
  traceActuatorPath,
  transmissionAngles,
} from '../../src/kinematics/index.js';
import { toDegrees, toRadians } from '../../src/numeric/index.js';

const DIMS = { r: 40, l: 120, e: 0 };

describe('slider-crank r 40, l 120', () => {
  it('solvePosition(slider-crank r 40, l 120, e 0, θ = 40°) puts the slider at x = 147.8549', () => {
    // Reference: closed form x = r·cos θ + √(l² − (r·sin θ − e)²) [derived] (docs/MODEL.md §5)
    expect(sliderCrankPosition(DIMS, toRadians(40))).toBeCloseTo(147.8549, 4);
    const r = solvePosition(buildSliderCrank(DIMS, { theta: toRadians(10) }), [toRadians(40)]);
    expect(r.status).toBe('converged');
    expect(bodyPose(r.pose, 'slider').x).toBeCloseTo(147.8549, 4);
    expect(jointValue(r.pose, 'slide')).toBeCloseTo(sliderCrankPosition(DIMS, toRadians(40)), 10);
    expect(jointPoint(r.pose, 'B')[1]).toBeCloseTo(0, 10);
  });

  it('solvePosition(offset slider-crank e 15) matches the closed form over a full crank turn', () => {
    // Reference: closed form with offset, x = r·cos θ + √(l² − (r·sin θ − e)²) [derived]
    const dims = { r: 40, l: 120, e: 15 };
    const m = buildSliderCrank(dims);
    const trace = traceActuatorPath(initialPose(m, [0]), [2 * Math.PI]);
    expect(trace.status).toBe('completed');
    for (const s of trace.samples) {
      expect(jointValue(s.pose, 'slide')).toBeCloseTo(sliderCrankPosition(dims, s.actuators[0]!), 9);
      expect(jointPoint(s.pose, 'B')[1]).toBeCloseTo(15, 9);
    }
  });

  it('solvePosition(slider driven to x = 147.8549) turns the crank to 40°', () => {
    // Reference: the same closed form read backwards (prismatic driver on the slide)
    const m = buildSliderCrank(DIMS, { theta: toRadians(30), drive: 'slider' });
    const r = solvePosition(m, [sliderCrankPosition(DIMS, toRadians(40))]);
    expect(r.status).toBe('converged');
    expect(toDegrees(bodyPose(r.pose, 'crank').phi)).toBeCloseTo(40, 8);
  });

  it('transmissionAngles(slider-crank, θ = 90°) measures the rod against the slide normal: μ = 90° − asin(r/l)', () => {
    // Reference: slider-crank geometry; at θ = 90° the rod leans asin(r/l) = 19.47° off the slide line
    const r = solvePosition(buildSliderCrank(DIMS, { theta: toRadians(80) }), [toRadians(90)]);
    const [t] = transmissionAngles(r.pose);
    expect(t?.linkId).toBe('rod');
    expect(t?.jointId).toBe('B');
    expect(toDegrees(t!.deviation)).toBeCloseTo(toDegrees(Math.asin(40 / 120)), 9);
  });
});
