import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { Matrix, solve } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import {
  type JacobianSparsity,
  type LeastSquaresProblem,
  resolveLeastSquaresOptions,
  solveLeastSquares,
} from '../../src/numeric/index.js';

/** Deterministic uniform numbers in [0, 1) (mulberry32), so the noisy fits are reproducible. */
function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Builds a problem from closures returning plain arrays; the Jacobian is given row by row. */
function denseProblem(
  n: number,
  m: number,
  residuals: (x: Float64Array) => number[],
  jacobian?: (x: Float64Array) => number[][],
): LeastSquaresProblem {
  return {
    parameterCount: n,
    residualCount: m,
    residuals: (x, r) => r.set(residuals(x)),
    ...(jacobian && {
      jacobian: (x: Float64Array, jac: Float64Array) => {
        jacobian(x).forEach((row, i) => {
          jac.set(row, i * n);
        });
      },
    }),
  };
}

// Moré, Garbow & Hillstrom, ACM TOMS 7(1) (1981) 17–41, problem 1 (Rosenbrock): minimum 0 at (1, 1).
const rosenbrock = denseProblem(
  2,
  2,
  (x) => [10 * (x[1]! - x[0]! ** 2), 1 - x[0]!],
  (x) => [
    [-20 * x[0]!, 10],
    [-1, 0],
  ],
);

// Same suite, problem 13 (Powell singular function) [problem number from memory]: minimum 0 at the origin, where J is
// singular, so convergence is only linear.
const powellSingular = denseProblem(
  4,
  4,
  (x) => [
    x[0]! + 10 * x[1]!,
    Math.sqrt(5) * (x[2]! - x[3]!),
    (x[1]! - 2 * x[2]!) ** 2,
    Math.sqrt(10) * (x[0]! - x[3]!) ** 2,
  ],
  (x) => [
    [1, 10, 0, 0],
    [0, 0, Math.sqrt(5), -Math.sqrt(5)],
    [0, 2 * (x[1]! - 2 * x[2]!), -4 * (x[1]! - 2 * x[2]!), 0],
    [2 * Math.sqrt(10) * (x[0]! - x[3]!), 0, 0, -2 * Math.sqrt(10) * (x[0]! - x[3]!)],
  ],
);

// Same suite, problem 7 (helical valley) [problem number from memory]: minimum 0 at (1, 0, 0).
const helicalValley = denseProblem(
  3,
  3,
  (x) => {
    const theta = Math.atan2(x[1]!, x[0]!) / (2 * Math.PI);
    return [10 * (x[2]! - 10 * theta), 10 * (Math.hypot(x[0]!, x[1]!) - 1), x[2]!];
  },
  (x) => {
    const rho2 = x[0]! ** 2 + x[1]! ** 2;
    const rho = Math.sqrt(rho2);
    const k = 100 / (2 * Math.PI * rho2);
    return [
      [k * x[1]!, -k * x[0]!, 10],
      [(10 * x[0]!) / rho, (10 * x[1]!) / rho, 0],
      [0, 0, 1],
    ];
  },
);

// Same suite, problem 2 (Freudenstein and Roth) [problem number and values from memory]: global minimum 0 at (5, 4),
// local minimum ‖r‖² = 48.9842… near (11.41, −0.8968), which descent methods reach from (0.5, −2).
const freudensteinRoth = denseProblem(
  2,
  2,
  (x) => [-13 + x[0]! + ((5 - x[1]!) * x[1]! - 2) * x[1]!, -29 + x[0]! + ((x[1]! + 1) * x[1]! - 14) * x[1]!],
  (x) => [
    [1, 10 * x[1]! - 3 * x[1]! ** 2 - 2],
    [1, 3 * x[1]! ** 2 + 2 * x[1]! - 14],
  ],
);

/** Geometric circle fit: r_i = ‖p_i − c‖ − R over parameters (cx, cy, R). */
function circleProblem(points: readonly (readonly [number, number])[], analytic = true): LeastSquaresProblem {
  return denseProblem(
    3,
    points.length,
    (x) => points.map(([px, py]) => Math.hypot(px - x[0]!, py - x[1]!) - x[2]!),
    analytic
      ? (x) =>
          points.map(([px, py]) => {
            const d = Math.hypot(px - x[0]!, py - x[1]!);
            return [-(px - x[0]!) / d, -(py - x[1]!) / d, -1];
          })
      : undefined,
  );
}

/** Kåsa's algebraic circle fit (IEEE Trans. Instrum. Meas. IM-25 (1976) 8–14 [mem]): linear least squares for x² + y² + Dx + Ey + F = 0. */
function kasaFit(points: readonly (readonly [number, number])[]): [number, number, number] {
  const a = new Matrix(points.map(([px, py]) => [px, py, 1]));
  const b = Matrix.columnVector(points.map(([px, py]) => -(px * px + py * py)));
  const [d, e, f] = solve(a, b).to1DArray() as [number, number, number];
  const cx = -d / 2;
  const cy = -e / 2;
  return [cx, cy, Math.sqrt(cx * cx + cy * cy - f)];
}

function pointsOnCircle(cx: number, cy: number, radius: number, count: number, noise: number, seed: number) {
  const random = seededRandom(seed);
  return Array.from({ length: count }, (_, i): [number, number] => {
    // An arc of 200°, so the fit is well posed but not trivially symmetric.
    const angle = (i / (count - 1)) * ((200 * Math.PI) / 180) + 0.3;
    const rr = radius + noise * (2 * random() - 1);
    return [cx + rr * Math.cos(angle), cy + rr * Math.sin(angle)];
  });
}

describe('solveLeastSquares on Moré–Garbow–Hillstrom problems', () => {
  it('solveLeastSquares(Rosenbrock, (−1.2, 1)) converges to (1, 1) with zero cost', () => {
    const result = solveLeastSquares(rosenbrock, [-1.2, 1]);
    expect(result.status).toBe('converged');
    expect(result.x[0]).toBeCloseTo(1, 10);
    expect(result.x[1]).toBeCloseTo(1, 10);
    expect(result.cost).toBeLessThan(1e-20);
    expect(result.iterations).toBeLessThan(50);
    // converged names the test that held: gradient, step or cost (Madsen, Nielsen & Tingleff 2004, §3.2 [mem])
    expect(result.reason).toMatch(/gradient|step|cost/);
  });

  it('solveLeastSquares(Powell singular, (3, −1, 0, 1)) converges towards the origin despite the singular Jacobian', () => {
    // F grows like ‖x‖⁴ near the origin and g like ‖x‖³, so the default gradient test leaves x near 1e-4; a tighter
    // one walks x further in.
    const loose = solveLeastSquares(powellSingular, [3, -1, 0, 1]);
    expect(loose.status).toBe('converged');
    expect(loose.cost).toBeLessThan(1e-12);
    for (const xj of loose.x) expect(Math.abs(xj)).toBeLessThan(1e-3);
    const tight = solveLeastSquares(powellSingular, [3, -1, 0, 1], { gradientTolerance: 1e-20 });
    expect(tight.status).toBe('converged');
    expect(tight.cost).toBeLessThan(1e-24);
    for (const xj of tight.x) expect(Math.abs(xj)).toBeLessThan(1e-6);
  });

  it('solveLeastSquares(helical valley, (−1, 0, 0)) converges to (1, 0, 0)', () => {
    const result = solveLeastSquares(helicalValley, [-1, 0, 0]);
    expect(result.status).toBe('converged');
    expect(result.x[0]).toBeCloseTo(1, 9);
    expect(result.x[1]).toBeCloseTo(0, 9);
    expect(result.x[2]).toBeCloseTo(0, 9);
    expect(result.cost).toBeLessThan(1e-20);
  });

  it('solveLeastSquares(Freudenstein–Roth, (0.5, −2)) stops at the known local minimum, sum of squares 48.9842', () => {
    const result = solveLeastSquares(freudensteinRoth, [0.5, -2]);
    expect(result.status).toBe('converged');
    expect(2 * result.cost).toBeCloseTo(48.9842, 3);
    expect(result.x[0]).toBeCloseTo(11.41, 2);
    expect(result.x[1]).toBeCloseTo(-0.8968, 4);
  });
});

describe('solveLeastSquares on circle fits', () => {
  it('recovers centre and radius to 1e-10 from points exactly on a circle (analytic reference)', () => {
    const points = pointsOnCircle(12.5, -7.25, 31.4, 40, 0, 1);
    const result = solveLeastSquares(circleProblem(points), [0, 0, 10]);
    expect(result.status).toBe('converged');
    expect(Math.abs(result.x[0]! - 12.5)).toBeLessThan(1e-10);
    expect(Math.abs(result.x[1]! + 7.25)).toBeLessThan(1e-10);
    expect(Math.abs(result.x[2]! - 31.4)).toBeLessThan(1e-10);
    expect(result.maxAbsResidual).toBeLessThan(1e-10);
  });

  it('on noisy points, started from the Kåsa fit, stays near it and lowers the geometric cost (sanity)', () => {
    const points = pointsOnCircle(3, 4, 25, 60, 0.2, 7);
    const kasa = kasaFit(points);
    const problem = circleProblem(points);
    const start = solveLeastSquares(problem, kasa, { maxIterations: 0 });
    const result = solveLeastSquares(problem, kasa);
    expect(start.status).toBe('max-iterations');
    expect(result.status).toBe('converged');
    expect(result.cost).toBeLessThanOrEqual(start.cost);
    for (let j = 0; j < 3; j++) expect(Math.abs(result.x[j]! - kasa[j]!)).toBeLessThan(0.1);
    // The noise is uniform in ±0.2 mm of radius, so the geometric RMS must sit near 0.2/√3.
    expect(result.rmsResidual).toBeGreaterThan(0.05);
    expect(result.rmsResidual).toBeLessThan(0.2);
  });

  it('gives the same solution with the analytic and the finite-difference Jacobian', () => {
    const points = pointsOnCircle(-40, 15, 60, 50, 0.5, 3);
    const analytic = solveLeastSquares(circleProblem(points, true), [-30, 0, 50]);
    const finiteDifference = solveLeastSquares(circleProblem(points, false), [-30, 0, 50]);
    expect(analytic.status).toBe('converged');
    expect(finiteDifference.status).toBe('converged');
    for (let j = 0; j < 3; j++) {
      expect(Math.abs(finiteDifference.x[j]! - analytic.x[j]!)).toBeLessThan(
        1e-7 * Math.max(1, Math.abs(analytic.x[j]!)),
      );
    }
    expect(finiteDifference.evaluations).toBeGreaterThan(analytic.evaluations);
  });
});

describe('solveLeastSquares against ml-levenberg-marquardt', () => {
  it('fits y = a·exp(−b·t) + c to noisy data within 1e-6 relative of the ml-levenberg-marquardt result', () => {
    const random = seededRandom(42);
    const t = Array.from({ length: 41 }, (_, i) => i * 0.25);
    const y = t.map((ti) => 5 * Math.exp(-0.7 * ti) + 1.2 + 0.05 * (2 * random() - 1));
    const model = (a: number, b: number, c: number, ti: number): number => a * Math.exp(-b * ti) + c;
    const problem = denseProblem(
      3,
      t.length,
      (x) => t.map((ti, i) => model(x[0]!, x[1]!, x[2]!, ti) - y[i]!),
      (x) => t.map((ti) => [Math.exp(-x[1]! * ti), -x[0]! * ti * Math.exp(-x[1]! * ti), 1]),
    );
    const ours = solveLeastSquares(problem, [4, 0.5, 1]);
    // The package stops only on its absolute error tolerance or its iteration cap; with a tolerance below the noise
    // floor it iterates to the cap and returns its best point.
    const reference = levenbergMarquardt(
      { x: t, y },
      ([a, b, c]) =>
        (ti) =>
          model(a!, b!, c!, ti),
      {
        initialValues: [4, 0.5, 1],
        jacobianFunction:
          ([a, b]) =>
          (ti) => [Math.exp(-b! * ti), -a! * ti * Math.exp(-b! * ti), 1],
        maxIterations: 500,
        errorTolerance: 1e-12,
      },
    );
    expect(ours.status).toBe('converged');
    reference.parameterValues.forEach((value, j) => {
      expect(Math.abs(ours.x[j]! - value)).toBeLessThan(1e-6 * Math.abs(value));
    });
    expect(Math.abs(2 * ours.cost - reference.parameterError)).toBeLessThan(1e-6 * reference.parameterError);
  });
});

describe('solveLeastSquares on a sparse linear problem', () => {
  // r = A·x − b with A sparse (4 nonzeros per row, columns near the diagonal, plus a shared last column); the
  // reference is the dense linear least-squares solution from ml-matrix.
  const n = 30;
  const m = 90;
  const random = seededRandom(11);
  const rows = Array.from({ length: m }, (_, i) => {
    const centre = Math.floor((i * (n - 1)) / m);
    const columns = [...new Set([centre, Math.min(n - 2, centre + 1), Math.min(n - 2, centre + 2), n - 1])].sort(
      (p, q) => p - q,
    );
    return { columns, values: columns.map(() => 2 * random() - 1), target: 10 * (2 * random() - 1) };
  });
  const sparsity: JacobianSparsity = {
    rowStarts: [0, ...rows.map((_, i) => rows.slice(0, i + 1).reduce((count, row) => count + row.columns.length, 0))],
    columns: rows.flatMap((row) => row.columns),
  };
  const problem = (withPattern: boolean): LeastSquaresProblem => ({
    parameterCount: n,
    residualCount: m,
    residuals: (x, r) => {
      rows.forEach((row, i) => {
        r[i] = row.columns.reduce((sum, c, k) => sum + row.values[k]! * x[c]!, -row.target);
      });
    },
    jacobian: (_x, jac) => {
      rows.forEach((row, i) => {
        row.columns.forEach((c, k) => {
          jac[i * n + c] = row.values[k]!;
        });
      });
    },
    ...(withPattern && { jacobianSparsity: sparsity }),
  });
  const dense = new Matrix(m, n);
  rows.forEach((row, i) => {
    row.columns.forEach((c, k) => {
      dense.set(i, c, row.values[k]!);
    });
  });
  const reference = solve(dense, Matrix.columnVector(rows.map((row) => row.target))).to1DArray();

  it.each([
    ['a given sparsity pattern', true],
    ['zeros detected row by row', false],
  ])('matches the dense linear least-squares solution with %s', (_label, withPattern) => {
    const result = solveLeastSquares(problem(withPattern), new Float64Array(n));
    expect(result.status).toBe('converged');
    reference.forEach((value, j) => {
      expect(Math.abs(result.x[j]! - value)).toBeLessThan(1e-8 * Math.max(1, Math.abs(value)));
    });
  });

  it('throws when the sparsity pattern is not ascending (programmer misuse)', () => {
    const bad: JacobianSparsity = { rowStarts: [0, 2], columns: [1, 0] };
    const tiny: LeastSquaresProblem = {
      parameterCount: 2,
      residualCount: 1,
      residuals: () => {},
      jacobianSparsity: bad,
    };
    expect(() => solveLeastSquares(tiny, [0, 0])).toThrow(/ascending/);
  });
});

describe('solveLeastSquares failure reporting', () => {
  it('reports diverged, with finite x and iteration count, when the residuals are NaN', () => {
    const result = solveLeastSquares(
      denseProblem(2, 3, () => [Number.NaN, Number.NaN, Number.NaN]),
      [1, 2],
    );
    expect(result.status).toBe('diverged');
    expect(result.reason).toMatch(/not finite/);
    expect(Array.from(result.x)).toEqual([1, 2]);
    expect(result.iterations).toBe(0);
    expect(result.cost).toBeNaN();
    expect(result.maxAbsResidual).toBeNaN();
  });

  it('returns a status and finite x on a rank-deficient problem (x1 + x2 twice, x3 absent)', () => {
    const problem = denseProblem(
      3,
      2,
      (x) => [x[0]! + x[1]! - 3, x[0]! + x[1]! - 1],
      () => [
        [1, 1, 0],
        [1, 1, 0],
      ],
    );
    const result = solveLeastSquares(problem, [0, 0, 7]);
    expect(['converged', 'stalled', 'max-iterations', 'singular', 'diverged']).toContain(result.status);
    expect(result.status).toBe('converged');
    for (const xj of result.x) expect(Number.isFinite(xj)).toBe(true);
    expect(result.x[0]! + result.x[1]!).toBeCloseTo(2, 10);
    expect(result.x[2]).toBe(7);
    expect(result.cost).toBeCloseTo(1, 12);
  });

  it('reports singular, with finite x, when the damped system never passes the pivot test', () => {
    // A pivot tolerance of 1 rejects every pivot, as a numerically indefinite system would at any damping.
    const result = solveLeastSquares(rosenbrock, [-1.2, 1], { pivotTolerance: 1 });
    expect(result.status).toBe('singular');
    expect(result.reason).toMatch(/cannot be factored/);
    expect(Array.from(result.x)).toEqual([-1.2, 1]);
    expect(result.iterations).toBe(1);
    expect(Number.isFinite(result.cost)).toBe(true);
  });

  it('reports max-iterations with the iteration count when the cap is hit', () => {
    const result = solveLeastSquares(rosenbrock, [-1.2, 1], { maxIterations: 3 });
    expect(result.status).toBe('max-iterations');
    expect(result.iterations).toBe(3);
    expect(result.reason).toMatch(/maxIterations 3/);
    expect(Number.isFinite(result.cost)).toBe(true);
  });

  it('treats a trial point with non-finite residuals as a rejected step, not a failure', () => {
    // r = √x − 2 is NaN for x < 0; the Gauss–Newton step from x = 100 is −160, far below zero.
    const problem = denseProblem(
      1,
      1,
      (x) => [Math.sqrt(x[0]!) - 2],
      (x) => [[0.5 / Math.sqrt(x[0]!)]],
    );
    const result = solveLeastSquares(problem, [100], { initialDamping: 1e-9 });
    expect(result.status).toBe('converged');
    expect(result.x[0]).toBeCloseTo(4, 10);
  });
});

describe('solveLeastSquares tells a stall from convergence', () => {
  // r = 1 + |x|: F = ½(1 + |x|)² has its minimum 0.5 at the kink x = 0 [derived], where no gradient vanishes, so no
  // convergence test can hold there: the honest answer is a stall at the best point, not convergence.
  const kink = (withJacobian: boolean): LeastSquaresProblem =>
    denseProblem(1, 1, (x) => [1 + Math.abs(x[0]!)], withJacobian ? (x) => [[Math.sign(x[0]!)]] : undefined);

  it('solveLeastSquares(1 + |x|, x0 = 0, forward differences) reports stalled with iterations, residual and reason', () => {
    // the forward difference at the kink is +1, so every step goes left, uphill; the damping saturates
    const result = solveLeastSquares(kink(false), [0]);
    expect(result.status).toBe('stalled');
    expect(result.reason).toMatch(/maxDamping/);
    expect(result.reason).toMatch(/do not follow their Jacobian/);
    expect(Array.from(result.x)).toEqual([0]);
    expect(result.iterations).toBe(1);
    expect(result.cost).toBeCloseTo(0.5, 14);
    expect(result.maxAbsResidual).toBeCloseTo(1, 14);
  });

  it('solveLeastSquares(1 + |x|, x0 = 0.5, one-sided Jacobian) creeps onto the kink and reports stalled, not converged', () => {
    // each accepted step overshoots less as the damping grows, until only rounding-sized falls remain
    const result = solveLeastSquares(kink(true), [0.5]);
    expect(result.status).toBe('stalled');
    expect(Math.abs(result.x[0]!)).toBeLessThan(1e-6);
    expect(result.cost).toBeCloseTo(0.5, 6);
    expect(result.iterations).toBeGreaterThan(1);
  });

  it('a wrong-signed Jacobian (r = x − 3 with J = −1) reports stalled when only the damping made the step short', () => {
    // every model step points away from x = 3, so the step test is met at λ ≈ 1e10 without any descent
    const result = solveLeastSquares(
      denseProblem(
        1,
        1,
        (x) => [x[0]! - 3],
        () => [[-1]],
      ),
      [1],
    );
    expect(result.status).toBe('stalled');
    expect(result.reason).toMatch(/^step ‖Δx‖/);
    expect(Array.from(result.x)).toEqual([1]);
    expect(result.cost).toBe(2);
  });

  // r_i = x − a_i + ε·sin(10⁷x + i) with J = 1: a smooth model evaluated with small deterministic noise, as a
  // residual computed by clipping or table look-up would be. Without the noise the minimum is the mean, 1.8 [derived].
  const noisy = (amplitude: number): LeastSquaresProblem => {
    const a = [0.3, 1.1, 1.9, 2.2, 3.5];
    return denseProblem(
      1,
      a.length,
      (x) => a.map((ai, i) => x[0]! - ai + amplitude * Math.sin(1e7 * x[0]! + i)),
      () => a.map(() => [1]),
    );
  };

  it('noise of 3e-7 the tolerances cannot resolve: converged, confirmed by the least-damped model, within 1e-6 of the mean', () => {
    // the gradient test is switched off so that the steps are damped until short; the near-Gauss–Newton model then
    // predicts a fall below costTolerance·F, so the step test is confirmed
    const result = solveLeastSquares(noisy(3e-7), [10], { gradientTolerance: 0 });
    expect(result.status).toBe('converged');
    expect(result.reason).toMatch(/, and the model at damping/);
    expect(Math.abs(result.x[0]! - 1.8)).toBeLessThan(1e-6);
  });

  it('noise of 1e-4: stalled near the mean, since the model still predicts a fall the damped steps cannot get', () => {
    const result = solveLeastSquares(noisy(1e-4), [10]);
    expect(result.status).toBe('stalled');
    expect(result.reason).toMatch(/yet the model at damping/);
    expect(Math.abs(result.x[0]! - 1.8)).toBeLessThan(1e-3);
    expect(Number.isFinite(result.rmsResidual)).toBe(true);
  });
});

describe('solveLeastSquares with bounds', () => {
  it('solveLeastSquares(Rosenbrock, x1 ≤ 0.5) stops on the bound at (0.5, 0.25)', () => {
    // With x2 = x1² the first residual vanishes, and (1 − x1)² falls until the bound [derived].
    const result = solveLeastSquares(rosenbrock, [-1.2, 1], { upperBounds: [0.5, Number.POSITIVE_INFINITY] });
    expect(result.status).toBe('converged');
    expect(result.x[0]).toBe(0.5);
    expect(result.x[1]).toBeCloseTo(0.25, 8);
    expect(result.cost).toBeCloseTo(0.125, 10);
  });
  it('takes finite differences backward at an upper bound, where the residuals stop being defined', () => {
    // r = √(1 − x) − 0.5 is NaN for x > 1; from x = 1 a forward difference would leave the domain. Minimum at 0.75.
    const problem = denseProblem(1, 1, (x) => [Math.sqrt(1 - x[0]!) - 0.5]);
    const result = solveLeastSquares(problem, [1], { upperBounds: [1] });
    expect(result.status).toBe('converged');
    expect(result.x[0]).toBeCloseTo(0.75, 8);
  });
});

describe('resolveLeastSquaresOptions', () => {
  it('fills the documented defaults', () => {
    const options = resolveLeastSquaresOptions({ maxIterations: 10 });
    expect(options.maxIterations).toBe(10);
    expect(options.initialDamping).toBe(1e-3);
    expect(options.lowerBounds).toBeUndefined();
  });

  it('throws on a negative tolerance or a non-positive damping (programmer misuse)', () => {
    expect(() => resolveLeastSquaresOptions({ gradientTolerance: -1 })).toThrow(/gradientTolerance/);
    expect(() => resolveLeastSquaresOptions({ initialDamping: 0 })).toThrow(/initialDamping/);
    expect(() => resolveLeastSquaresOptions({ maxIterations: 1.5 })).toThrow(/maxIterations/);
  });
});
