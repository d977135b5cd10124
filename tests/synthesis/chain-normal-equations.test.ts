import { describe, expect, it } from 'vitest';
import type { Point } from '../../src/geometry/index.js';
import { makeChainProblem } from '../../src/synthesis/index.js';
import { closeChain, meltEdgeY, type P } from '../support/known-chain.js';

describe('the chain problem’s block normal equations', () => {
  it('equal JᵀJ and Jᵀr formed from its dense Jacobian, with a slot, a telescoping plate, weights and keep-out', () => {
    // reference: the definition JᵀJ = Σ_rows jᵀj and Jᵀr = Σ_rows j·r over the dense Jacobian (plain arithmetic)
    const lengths = [11, 9, 10, 8.5, 9.5, 10.5];
    const start: P = [-6, 14];
    const end: P = [46, 14];
    const chains = [
      [-0.55, -0.1, 0.2, 0.35],
      [-0.35, 0.15, 0.45, 0.1],
    ].map((a) => closeChain(lengths, start, end, a, false));
    const samples = chains.map((c) => Array.from({ length: 41 }, (_, k): Point => [k, meltEdgeY(c, 5, k) + 0.05]));
    const keepOut = chains.map(() => Array.from({ length: 10 }, (_, k): Point => [0, k]));
    const spec = {
      samples,
      plateCount: 6,
      edgeOffsetMm: 5,
      startKind: 'pivot' as const,
      endKind: 'slot' as const,
      startAnchor: [-5, 13] as Point,
      endAnchor: [45, 15] as Point,
      telescoping: [2],
      keepOut,
      emphasisMm: 0.1,
      sampleWeights: samples.map((s) => s.map((_, k) => 0.2 + (k % 5) / 5)),
    };
    const problem = makeChainProblem(spec);
    const { parameterCount: n, residualCount: m } = problem.layout;
    const x = new Float64Array(n);
    for (let i = 0; i < n; i++) x[i] = Math.sin(1.7 * i + 0.3);
    chains.forEach((c, i) => {
      for (let k = 0; k < 6; k++) {
        x[problem.layout.angles + i * 6 + k] = Math.atan2(c[k + 1]![1] - c[k]![1], c[k + 1]![0] - c[k]![0]) + 0.01 * k;
      }
    });
    lengths.forEach((l, k) => {
      x[problem.layout.lengths + k] = l;
    });
    x.set([-6, 14], problem.layout.start);
    x.set([46, 14, 0.1, 0.2, -0.3], problem.layout.end);
    x.set([10.2, 9.8], problem.layout.extensions);
    const r = new Float64Array(m);
    problem.residuals(x, r);
    const jac = new Float64Array(m * n);
    problem.jacobian(x, jac);
    const a = new Float64Array(n * n);
    const g = new Float64Array(n);
    problem.normalEquations(x, r, a, g);
    for (let p = 0; p < n; p++) {
      let gp = 0;
      for (let i = 0; i < m; i++) gp += jac[i * n + p]! * r[i]!;
      // same sums in another order: equal to round-off, relative to the size of the entry
      expect(Math.abs(g[p]! - gp)).toBeLessThanOrEqual(1e-10 * Math.max(1, Math.abs(gp)));
      for (let q = 0; q <= p; q++) {
        let apq = 0;
        for (let i = 0; i < m; i++) apq += jac[i * n + p]! * jac[i * n + q]!;
        expect(Math.abs(a[p * n + q]! - apq)).toBeLessThanOrEqual(1e-10 * Math.max(1, Math.abs(apq)));
      }
    }
  });
});
