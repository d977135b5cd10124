// @ts-expect-error fmin 0.0.2 ships no typings (the same baseline scripts/bench-fit.ts uses)
import fmin from 'fmin';
import { describe, expect, it } from 'vitest';
import { toSchedule } from '../../src/http/to-schedule.js';
import { pointOnBody, solvePosition } from '../../src/kinematics/index.js';
import { chainTopology } from '../../src/mechanise/index.js';
import { sampleTrajectory } from '../../src/motion/index.js';
import { planSchedule } from '../../src/pipeline/index.js';
import { E, freeStations, WIDTH } from '../mechanise/known-linkage.js';
import { channelOrifice } from '../support/known-chain.js';

/** Stations of a known 4-plate chain with two free plate angles each: 2 degrees of freedom, driven directly by 2. */
function directPlan() {
  const pivots = freeStations([
    [0.35, 0.0],
    [0.2, -0.1],
    [0.45, 0.1],
  ]);
  const mapping = toSchedule({
    stations: pivots.map((p, i) => ({ position_m: i * 0.2, orifice: channelOrifice(p, E, WIDTH, 0.25) })),
    limits: { fit_tolerance_mm: 0.1 },
    plates: { pivot_hole_diameter_mm: 4, ligament_mm: 3, depth_mm: 25 },
    actuators: { count: 2 },
    time_step_s: 0.1,
  } as Parameters<typeof toSchedule>[0]);
  if (!mapping.ok) throw new Error(JSON.stringify(mapping.problems));
  return planSchedule(mapping.schedule);
}

describe('trackMorph: direct mode follows the morph between station shapes', () => {
  const plan = directPlan();
  const sim = plan.simulation!;
  const tracking = sim.tracking!;

  it('a chain of 4 plates with 2 actuators is driven directly, and the plan tracks the morph at every step', () => {
    // Grübler–Kutzbach: 4 plates pinned at both ends have 4 − 2 = 2 degrees of freedom (docs/MODEL.md §3)
    expect(plan.mechanisation!.mode).toBe('direct');
    expect(tracking).not.toBeNull();
    expect(tracking.residualMm).toHaveLength(sim.positionsM.length);
    expect(plan.findings.some((f) => f.code === 'MOTION_TRACKED')).toBe(true);
  });

  it('the tracked residual is never above the law’s, and both vanish at the stations', () => {
    tracking.residualMm.forEach((r, j) => {
      expect(r).toBeLessThanOrEqual(tracking.lawResidualMm[j]! + 1e-12);
    });
    for (const j of sim.stationSteps) {
      expect(tracking.residualMm[j]!).toBeLessThan(1e-2);
      expect(tracking.lawResidualMm[j]!).toBeLessThan(1e-2);
    }
  });

  it('where the law strays most, Nelder–Mead (fmin 0.0.2) on the same misfit finds nothing better than the tracked values', () => {
    const worst = tracking.lawResidualMm.indexOf(Math.max(...tracking.lawResidualMm));
    expect(tracking.lawResidualMm[worst]!).toBeGreaterThan(tracking.residualMm[worst]!);
    const x = sim.positionsM[worst]!;
    // the morph computed here by hand: each pivot blended between its neighbouring stations (0, 0.2, 0.4 m) with the
    // cycloidal weight s(u)/h = u − sin(2πu)/2π (VDI 2143 Blatt 1)
    const i = Math.min(1, Math.floor(x / 0.2));
    const u = (x - 0.2 * i) / 0.2;
    const w = u - Math.sin(2 * Math.PI * u) / (2 * Math.PI);
    const stations = plan.fit!.chain.pivots;
    const target = stations[i]!.map((p, k) => [
      p[0] + w * (stations[i + 1]![k]![0] - p[0]),
      p[1] + w * (stations[i + 1]![k]![1] - p[1]),
    ]);
    const model = plan.mechanisation!.model!;
    const pivots = chainTopology(plan.fit!).pivots;
    const law = plan.motion!.trajectories.map((t) => sampleTrajectory(t, x).value);
    const start = solvePosition(model, law).pose;
    const misfit = (a: number[]): number => {
      const r = solvePosition(model, a, { start });
      if (r.status !== 'converged') return 1e9;
      const sq = pivots.reduce((s, q, k) => {
        const p = pointOnBody(r.pose, q.body, q.local);
        return s + (p[0] - target[k]![0]!) ** 2 + (p[1] - target[k]![1]!) ** 2;
      }, 0);
      return Math.sqrt(sq / pivots.length);
    };
    expect(misfit(law)).toBeCloseTo(tracking.lawResidualMm[worst]!, 6);
    const best = fmin.nelderMead(misfit, law, { maxIterations: 2000 });
    expect(tracking.residualMm[worst]!).toBeLessThanOrEqual(best.fx + 1e-4);
  });
});
