import { describe, expect, it } from 'vitest';
import {
  bodyPose,
  buildFourBar,
  classifyGrashof,
  findBranchDefects,
  fourBarRockerLimits,
  initialPose,
  type Pose,
  solveFourBarClosedForm,
  solvePosition,
  traceActuatorPath,
  transmissionAngles,
} from '../../src/kinematics/index.js';
import { toDegrees, toRadians, wrapAngle } from '../../src/numeric/index.js';

const DIMS = { a: 40, b: 120, c: 80, d: 100 };
const { a, b, c, d } = DIMS;

function angles(pose: Pose): { theta2: number; theta3: number; theta4: number } {
  return {
    theta2: bodyPose(pose, 'crank').phi,
    theta3: bodyPose(pose, 'coupler').phi,
    theta4: bodyPose(pose, 'rocker').phi,
  };
}

/** Freudenstein's equation K1·cos θ4 − K2·cos θ2 + K3 = cos(θ2 − θ4) (Trans. ASME 77, 1955), as a residual. */
function freudenstein(theta2: number, theta4: number): number {
  const k1 = d / a;
  const k2 = d / c;
  const k3 = (a * a - b * b + c * c + d * d) / (2 * a * c);
  return k1 * Math.cos(theta4) - k2 * Math.cos(theta2) + k3 - Math.cos(theta2 - theta4);
}

/** Transmission angle from cos μ = (b² + c² − a² − d² + 2ad·cos θ2)/(2bc) (four-bar geometry, law of cosines). */
function muClosedForm(theta2: number): number {
  return Math.acos((b * b + c * c - a * a - d * d + 2 * a * d * Math.cos(theta2)) / (2 * b * c));
}

describe('four-bar 40/120/80/100', () => {
  it('solveFourBarClosedForm(θ2 = 40°) gives θ3 20.2979°, θ4 57.3249° open and −60.9780°, −98.0050° crossed', () => {
    // Reference: Freudenstein closed form [derived]; Norton, Design of Machinery, Ex. 4-1 [from memory]
    // (docs/MODEL.md §5)
    const open = solveFourBarClosedForm(DIMS, toRadians(40), 'open');
    const crossed = solveFourBarClosedForm(DIMS, toRadians(40), 'crossed');
    expect(toDegrees(open.theta3)).toBeCloseTo(20.2979, 4);
    expect(toDegrees(open.theta4)).toBeCloseTo(57.3249, 4);
    expect(toDegrees(crossed.theta3)).toBeCloseTo(-60.978, 4);
    expect(toDegrees(crossed.theta4)).toBeCloseTo(-98.005, 4);
  });

  it('solvePosition(four-bar 40/120/80/100, θ2=40°) gives θ3 20.2979°, θ4 57.3249° on the open circuit', () => {
    // Reference: docs/MODEL.md §5 (Freudenstein closed form; Norton Ex. 4-1 [from memory]); start 10° away
    const r = solvePosition(buildFourBar(DIMS, { theta2: toRadians(30) }), [toRadians(40)]);
    expect(r.status).toBe('converged');
    expect(r.residual).toBeLessThan(1e-10);
    const { theta3, theta4 } = angles(r.pose);
    expect(toDegrees(theta3)).toBeCloseTo(20.2979, 4);
    expect(toDegrees(theta4)).toBeCloseTo(57.3249, 4);
  });

  it('solvePosition(four-bar 40/120/80/100, θ2=40°) gives θ3 −60.9780°, θ4 −98.0050° on the crossed circuit', () => {
    // Reference: docs/MODEL.md §5 (Freudenstein closed form; Norton Ex. 4-1 [from memory])
    const r = solvePosition(buildFourBar(DIMS, { theta2: toRadians(30), circuit: 'crossed' }), [toRadians(40)]);
    expect(r.status).toBe('converged');
    const { theta3, theta4 } = angles(r.pose);
    expect(toDegrees(theta3)).toBeCloseTo(-60.978, 4);
    expect(toDegrees(theta4)).toBeCloseTo(-98.005, 4);
  });

  for (const circuit of ['open', 'crossed'] as const) {
    it(`traceActuatorPath(θ2 0° → 360°, ${circuit}) satisfies Freudenstein's equation within 1e-10 at every sample`, () => {
      // Reference: Freudenstein, Trans. ASME 77 (1955); closed form of the same circuit (Norton's K1…K5 form)
      const m = buildFourBar(DIMS, { theta2: 0, circuit });
      const trace = traceActuatorPath(initialPose(m, [0]), [2 * Math.PI]);
      expect(trace.status).toBe('completed');
      expect(trace.samples.length).toBeGreaterThan(36);
      expect(findBranchDefects(trace.samples)).toEqual([]);
      for (const s of trace.samples) {
        const { theta2, theta3, theta4 } = angles(s.pose);
        expect(Math.abs(freudenstein(theta2, theta4))).toBeLessThan(1e-10);
        const closed = solveFourBarClosedForm(DIMS, theta2, circuit);
        expect(Math.abs(wrapAngle(theta4 - closed.theta4))).toBeLessThan(1e-10);
        expect(Math.abs(wrapAngle(theta3 - closed.theta3))).toBeLessThan(1e-10);
      }
      // A full crank turn brings the rocker back to where it started (a crank-rocker has no net rocker rotation).
      const first = angles(trace.samples[0]!.pose);
      const last = angles(trace.samples.at(-1)!.pose);
      expect(last.theta4 - first.theta4).toBeCloseTo(0, 9);
    });
  }

  it('classifyGrashof(40/120/80/100) is a Grashof crank-rocker', () => {
    // Reference: Grashof criterion s + l < p + q: 40 + 120 < 80 + 100; shortest link is the crank (Barker class)
    const g = classifyGrashof(DIMS);
    expect(g.grashof).toBe(true);
    expect(g.kind).toBe('crank-rocker');
    expect(g.margin).toBeCloseTo(-20, 12);
    expect(classifyGrashof({ a: 40, b: 100, c: 40, d: 100 }).kind).toBe('change-point');
    expect(classifyGrashof({ a: 60, b: 70, c: 80, d: 40 }).kind).toBe('double-crank');
    expect(classifyGrashof({ a: 80, b: 70, c: 40, d: 60 }).kind).toBe('rocker-crank');
    expect(classifyGrashof({ a: 100, b: 30, c: 90, d: 80 }).kind).toBe('double-rocker');
    expect(classifyGrashof({ a: 90, b: 120, c: 80, d: 100 }).kind).toBe('triple-rocker');
  });

  it('fourBarRockerLimits(40/120/80/100) gives θ4 54.9004° (extended) and 128.6822° (folded)', () => {
    // Reference: law of cosines with O2B = b ± a: cos θ4 = (O2B² − d² − c²)/(2dc) → 0.575 and −0.625 [derived]
    const lim = fourBarRockerLimits(DIMS)!;
    expect(toDegrees(lim.theta4Extended)).toBeCloseTo(toDegrees(Math.acos(0.575)), 10);
    expect(toDegrees(lim.theta4Extended)).toBeCloseTo(54.9004, 4);
    expect(toDegrees(lim.theta4Folded)).toBeCloseTo(128.6822, 4);
    // At the limits the solver's rocker angle is the extreme of the traced motion.
    const m = buildFourBar(DIMS);
    const trace = traceActuatorPath(initialPose(m, [0]), [2 * Math.PI], { maxStep: 0.002 });
    const theta4s = trace.samples.map((s) => angles(s.pose).theta4);
    expect(toDegrees(Math.min(...theta4s))).toBeCloseTo(54.9004, 2);
    expect(toDegrees(Math.max(...theta4s))).toBeCloseTo(128.6822, 2);
    expect(fourBarRockerLimits({ a: 90, b: 120, c: 80, d: 100 })).toBeNull();
  });

  it('transmissionAngles(θ2 = 40°) gives μ 37.03° for coupler and rocker', () => {
    // Reference: cos μ = (b² + c² − a² − d² + 2ad·cos θ2)/(2bc) = 0.79835 [derived] (docs/MODEL.md §5)
    const r = solvePosition(buildFourBar(DIMS, { theta2: toRadians(40) }), [toRadians(40)]);
    const mus = transmissionAngles(r.pose);
    expect(mus.map((t) => t.linkId).sort()).toEqual(['coupler', 'rocker']);
    for (const t of mus) {
      expect(t.jointId).toBe('B');
      expect(toDegrees(t.mu)).toBeCloseTo(37.03, 2);
      expect(t.mu).toBeCloseTo(muClosedForm(toRadians(40)), 12);
      expect(t.deviation).toBeCloseTo(Math.PI / 2 - t.mu, 12);
    }
  });

  it('transmission angle along a full crank turn is smallest, 26.38°, at θ2 = 0°', () => {
    // Reference: cos μ formula at θ2 = 0: (9200 + 8000)/19200 = 0.8958 → 26.38° (docs/MODEL.md §5)
    const m = buildFourBar(DIMS);
    const trace = traceActuatorPath(initialPose(m, [0]), [2 * Math.PI]);
    let worst = { mu: Math.PI, theta2: Number.NaN };
    for (const s of trace.samples) {
      const t = transmissionAngles(s.pose).find((x) => x.linkId === 'coupler')!;
      const theta2 = angles(s.pose).theta2;
      expect(t.mu).toBeCloseTo(muClosedForm(theta2), 10);
      const folded = Math.min(t.mu, Math.PI - t.mu);
      if (folded < worst.mu) worst = { mu: folded, theta2 };
    }
    expect(toDegrees(worst.mu)).toBeCloseTo(26.38, 2);
    expect(Math.abs(wrapAngle(worst.theta2))).toBeLessThan(1e-9);
  });

  it('findBranchDefects(open then crossed station) flags the second station', () => {
    // Reference: Chase & Mirth, J. Mech. Des. 115(2) 1993: the circuits have opposite determinant signs
    const open = solvePosition(buildFourBar(DIMS, { theta2: toRadians(40) }), [toRadians(40)]);
    const crossed = solvePosition(buildFourBar(DIMS, { theta2: toRadians(40), circuit: 'crossed' }), [toRadians(40)]);
    expect(open.jacobianSign).not.toBe(0);
    expect(crossed.jacobianSign).toBe(-open.jacobianSign);
    expect(findBranchDefects([open, crossed, crossed])).toEqual([1]);
  });
});
