import { LuDecomposition, Matrix, SingularValueDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { BandLu, reverseCuthillMcKee } from '../../src/numeric/index.js';

/** Deterministic pseudo-random numbers in [−1, 1) (a linear congruential generator). */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s / 2 ** 32) * 2 - 1;
  };
}

function randomBand(n: number, lower: number, upper: number, seed: number): number[][] {
  const rnd = lcg(seed);
  return Array.from({ length: n }, (_, r) =>
    Array.from({ length: n }, (_, c) => (c >= r - lower && c <= r + upper ? rnd() : 0)),
  );
}

function load(lu: BandLu, m: number[][]): void {
  lu.clear();
  m.forEach((row, r) => {
    row.forEach((v, c) => {
      if (v !== 0) lu.a[lu.index(r, c)] = v;
    });
  });
}

describe('BandLu', () => {
  for (const [n, lower, upper] of [
    [1, 0, 0],
    [7, 2, 3],
    [30, 3, 7],
    [12, 11, 11],
  ] as const) {
    it(`BandLu(${n}, ${lower}, ${upper}) solves A·x = b and Aᵀ·x = b like ml-matrix's dense LU`, () => {
      // Reference: ml-matrix LuDecomposition (dense partial pivoting) on the same matrix
      const m = randomBand(n, lower, upper, 7 + n);
      const lu = new BandLu(n, lower, upper);
      load(lu, m);
      expect(lu.factor(1e-14)).toBe(-1);
      const b = Array.from({ length: n }, (_, i) => Math.cos(i));
      const x = Float64Array.from(b);
      lu.solve(x);
      const dense = new LuDecomposition(new Matrix(m));
      const ref = dense.solve(Matrix.columnVector(b)).to1DArray();
      for (const [i, v] of x.entries()) expect(v).toBeCloseTo(ref[i]!, 10);
      const xt = Float64Array.from(b);
      lu.solveTransposed(xt);
      const refT = new LuDecomposition(new Matrix(m).transpose()).solve(Matrix.columnVector(b)).to1DArray();
      for (const [i, v] of xt.entries()) expect(v).toBeCloseTo(refT[i]!, 10);
      expect(lu.determinantSign).toBe(Math.sign(dense.determinant));
      expect(lu.logAbsDeterminant).toBeCloseTo(Math.log(Math.abs(dense.determinant)), 9);
    });
  }

  it('BandLu.conditionEstimate is a lower bound of the exact 1-norm condition number, within a factor 10', () => {
    // Reference: exact κ₁ = ‖A‖₁·‖A⁻¹‖₁ from the dense inverse (ml-matrix); Hager/Higham estimates never exceed it
    for (const seed of [1, 2, 3, 4, 5]) {
      const m = randomBand(25, 3, 5, seed);
      const lu = new BandLu(25, 3, 5);
      load(lu, m);
      lu.factor(1e-14);
      const a = new Matrix(m);
      const inv = new SingularValueDecomposition(a).inverse();
      const norm1 = (x: Matrix) => Math.max(...x.abs().sum('column'));
      const exact = norm1(a) * norm1(inv);
      for (const effort of ['quick', 'full'] as const) {
        const est = lu.conditionEstimate(effort);
        expect(est).toBeLessThanOrEqual(exact * (1 + 1e-9));
        expect(est).toBeGreaterThan(exact / 10);
      }
    }
  });

  it('BandLu.factor(rank-deficient matrix) reports the failing step instead of dividing by a tiny pivot', () => {
    // Reference: a repeated row makes the matrix singular; the pivot test is relative, never === 0. Rows 3 and 4
    // share their nonzeros in columns 2…5, inside both rows' bands.
    const m = randomBand(6, 2, 2, 9);
    m[3] = [0, 0, 0.3, -0.7, 0.2, 0];
    m[4] = [0, 0, 0.3, -0.7, 0.2, 0];
    const lu = new BandLu(6, 2, 2);
    load(lu, m);
    expect(lu.factor(1e-12)).toBeGreaterThanOrEqual(0);
    expect(lu.determinantSign).toBe(0);
    expect(lu.conditionEstimate()).toBe(Number.POSITIVE_INFINITY);
  });

  it('reverseCuthillMcKee(path graph given out of order) returns a band-narrowing order', () => {
    // Reference: Cuthill & McKee 1969: a path ordered along itself has bandwidth 1
    const adjacency = [[3], [2, 4], [1], [0, 4], [3, 1]];
    const order = reverseCuthillMcKee(adjacency);
    expect([...order].sort()).toEqual([0, 1, 2, 3, 4]);
    const pos = new Map(order.map((v, i) => [v, i]));
    adjacency.forEach((nbrs, u) => {
      for (const v of nbrs) expect(Math.abs(pos.get(u)! - pos.get(v)!)).toBe(1);
    });
  });
});
