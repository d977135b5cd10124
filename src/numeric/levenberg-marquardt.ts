import { forwardDifferenceJacobian, type ParameterBox } from './least-squares-forward-difference.js';
import { LeastSquaresNormalEquations } from './least-squares-normal-equations.js';
import { type LeastSquaresOptions, resolveLeastSquaresOptions } from './least-squares-options.js';
import type { LeastSquaresProblem, LeastSquaresResult, LeastSquaresStatus } from './least-squares-problem.js';

export {
  DEFAULT_LEAST_SQUARES_OPTIONS,
  type LeastSquaresOptions,
  resolveLeastSquaresOptions,
} from './least-squares-options.js';
export type {
  JacobianSparsity,
  LeastSquaresProblem,
  LeastSquaresResult,
  LeastSquaresStatus,
} from './least-squares-problem.js';

/**
 * A problem that sums JᵀJ and Jᵀr itself instead of handing over the m×n Jacobian: worth it when the Jacobian has
 * structure that a product of its rows cannot use (many residuals through a few intermediate quantities).
 */
export interface NormalEquationsProblem extends LeastSquaresProblem {
  /**
   * Adds JᵀJ at `x` into `normalMatrix` (n×n row-major, lower triangle: entry (p, q), q ≤ p, at p·n + q) and Jᵀr into
   * `gradient`; both arrive zeroed, and `r` holds the residuals at `x`. The solver calls it at the x of its last
   * `residuals` call, so work shared with the residuals can be kept from there. Must not keep or modify `x` or `r`.
   */
  normalEquations(x: Float64Array, r: Float64Array, normalMatrix: Float64Array, gradient: Float64Array): void;
}

/**
 * Minimises ½‖r(x)‖² from `x0` by Levenberg–Marquardt for m residuals in n parameters, optionally inside a box.
 *
 * Method (Madsen, Nielsen & Tingleff, *Methods for non-linear least squares problems*, 2nd ed., IMM, DTU, 2004,
 * §3.2 and Algorithm 3.16 [numbering from memory]): each iteration solves (JᵀJ + λ·D)·h = −Jᵀr with Marquardt's
 * scale D = diag(JᵀJ) (running maximum, Moré 1978) by Cholesky, projects x + h onto the box, and judges the step by
 * the gain ratio ϱ = (F(x) − F(x + h)) / (L(0) − L(h)). An accepted step (ϱ > 0) lowers λ by Nielsen's factor
 * max(1/3, 1 − (2ϱ − 1)³) and resets ν = 2; a rejected one raises λ by ν and doubles ν. A damped system that cannot
 * be factored raises λ the same way. Bounds are handled by projection (projected LM, Kanzow, Yamashita & Fukushima,
 * J. Comput. Appl. Math. 172 (2004) 375–397): parameters pressing against a bound are held out of the step, the
 * rest are clipped to the box, and the gradient test uses the projected gradient.
 *
 * Stopping (Madsen, Nielsen & Tingleff 2004, §3.2 [mem]; the relative cost test of MINPACK, Moré, Garbow & Hillstrom,
 * ANL-80-74, 1980): `converged` only when a convergence test holds, either the projected gradient ‖g‖∞ ≤
 * `gradientTolerance`, or a step ‖h‖ ≤ `stepTolerance`·(‖x‖ + `stepTolerance`), or an accepted step whose actual and
 * predicted falls are both ≤ `costTolerance`·F. A damped step is short, and predicts little, merely because λ is large
 * (h ≈ −D⁻¹g/λ), so the step and cost tests are trusted as they stand only for a step damped no harder than
 * `initialDamping` (a model close to Gauss–Newton). Otherwise they are confirmed on that least-damped model at the same
 * x: its step must pass the step test, or its predicted fall L(0) − L(h) must be ≤ `costTolerance`·F (the model says
 * nothing more is to be had). When λ passes `maxDamping` with no step lowering the cost, the same confirmation decides.
 * A test that the least-damped model does not confirm ends the solve as `stalled`: the solver cannot make progress,
 * yet the model still predicts a fall, so the residuals do not follow their Jacobian near x (a kink, noise, a wrong
 * Jacobian). `max-iterations` at the cap; `singular` when the damped system cannot be factored at `maxDamping`;
 * `diverged` when the residuals at the start or the Jacobian at an iterate are not finite (a non-finite trial point is
 * only a rejected step). The result always carries status, reason (the test and the values compared), iterations and
 * residual. `partialOptions` is completed by `resolveLeastSquaresOptions`, which documents every default.
 *
 * Cost per iteration: the Jacobian (analytic, or n residual evaluations by forward differences), O(m·n) to clear it
 * (and to scan it for zeros without a `jacobianSparsity`), O(Σᵢ kᵢ²) ≈ O(m·k²) to form JᵀJ from k nonzeros per row,
 * and O(Σⱼ wⱼ²) ≤ n³/6 per factorisation for envelope widths wⱼ of JᵀJ; a `NormalEquationsProblem` replaces the first
 * three by its own `normalEquations`. Memory: m·n + 2·n² doubles (2·n² for a `NormalEquationsProblem`), allocated
 * once per call. Throws on programmer misuse: bad counts, `x0` of the wrong length or not finite, bounds of the wrong
 * length or crossed, invalid options.
 */
export function solveLeastSquares(
  problem: LeastSquaresProblem | NormalEquationsProblem,
  x0: Float64Array | readonly number[],
  partialOptions: Partial<LeastSquaresOptions> = {},
): LeastSquaresResult {
  const options = resolveLeastSquaresOptions(partialOptions);
  const n = problem.parameterCount;
  const m = problem.residualCount;
  const box: ParameterBox = { lower: options.lowerBounds, upper: options.upperBounds };
  checkArguments(n, m, x0, box);
  const normal = new LeastSquaresNormalEquations(n, m, problem.jacobianSparsity);
  const summed = 'normalEquations' in problem ? problem : null;
  const jacobian = new Float64Array(summed ? 0 : m * n);
  const work = problem.jacobian || summed ? new Float64Array(0) : new Float64Array(m);
  const step = new Float64Array(n);
  const referenceStep = new Float64Array(n);
  let x = Float64Array.from(x0);
  project(x, box);
  let xTrial = new Float64Array(n);
  let r = new Float64Array(m);
  let rTrial = new Float64Array(m);
  let iterations = 0;
  let evaluations = 0;
  let jacobianEvaluations = 0;

  const finish = (status: LeastSquaresStatus, reason: string): LeastSquaresResult => {
    let sumSquares = 0;
    let maxAbs = 0;
    for (let i = 0; i < m; i++) {
      const ri = r[i]!;
      sumSquares += ri * ri;
      // NaN must win over any finite maximum.
      if (!(Math.abs(ri) <= maxAbs)) maxAbs = Math.abs(ri);
    }
    return {
      status,
      reason,
      x,
      cost: 0.5 * sumSquares,
      rmsResidual: Math.sqrt(sumSquares / m),
      maxAbsResidual: maxAbs,
      iterations,
      evaluations,
      jacobianEvaluations,
    };
  };
  const jacobianAtX = (): boolean => {
    jacobianEvaluations++;
    if (summed) return normal.formBy((a, g) => summed.normalEquations(x, r, a, g));
    jacobian.fill(0);
    if (problem.jacobian) problem.jacobian(x, jacobian);
    else evaluations += forwardDifferenceJacobian(problem, x, r, options.finiteDifferenceStep, box, jacobian, work);
    return normal.form(jacobian, r);
  };

  problem.residuals(x, r);
  evaluations++;
  let cost = halfSquaredNorm(r);
  if (!Number.isFinite(cost)) return finish('diverged', 'the residuals are not finite at the starting point');
  if (!jacobianAtX()) return finish('diverged', 'the Jacobian is not finite at the starting point');

  const { maxIterations, gradientTolerance, stepTolerance, costTolerance, maxDamping, pivotTolerance } = options;
  const trustedDamping = options.initialDamping;
  /**
   * The least-damped model at x (the normal equations formed there, the active bounds marked): its step, at λ =
   * `trustedDamping` or the least multiple of it that factors, passes the step test, or its predicted fall is
   * ≤ costTolerance·F. Overwrites the factor and `referenceStep`.
   */
  const confirm = (): { holds: boolean; detail: string } => {
    let lambda = trustedDamping;
    while (!normal.factorDamped(lambda, pivotTolerance)) {
      if (lambda >= maxDamping) return { holds: false, detail: 'the least-damped model cannot be factored' };
      lambda = Math.min(maxDamping, lambda * 10);
    }
    normal.solveStep(referenceStep);
    let stepSquared = 0;
    let xSquared = 0;
    for (let j = 0; j < n; j++) {
      const xj = x[j]!;
      referenceStep[j] = clamp(xj + referenceStep[j]!, box.lower?.[j], box.upper?.[j]) - xj;
      stepSquared += referenceStep[j]! * referenceStep[j]!;
      xSquared += xj * xj;
    }
    const stepNorm = Math.sqrt(stepSquared);
    const stepLimit = stepTolerance * (Math.sqrt(xSquared) + stepTolerance);
    const predicted = normal.predictedReduction(referenceStep);
    const detail =
      `the model at damping λ = ${fmt(lambda)} steps ‖Δx‖ = ${fmt(stepNorm)} (step test ${fmt(stepLimit)}) ` +
      `and predicts a fall of ${fmt(predicted)} (cost test ${fmt(costTolerance * cost)})`;
    return { holds: stepNorm <= stepLimit || predicted <= costTolerance * cost, detail };
  };
  const stalled = (what: string, detail: string): LeastSquaresResult =>
    finish(
      'stalled',
      `${what}, yet ${detail}: the damping, not the problem, made the step short, so the residuals do not follow ` +
        'their Jacobian here (a kink, noise or a wrong Jacobian) and x is the best point found, not a certified minimum',
    );
  let damping = options.initialDamping;
  let growth = 2;
  /** Set when the last accepted step passed the cost test: how much it gained, and at which damping. */
  let costTest: { relativeFall: number; damping: number } | null = null;
  for (;;) {
    const gradientNorm = fixActiveBounds(x, normal.gradient, box, normal.fixed);
    if (gradientNorm <= gradientTolerance) {
      return finish(
        'converged',
        `gradient ‖Jᵀr‖∞ = ${fmt(gradientNorm)} ≤ gradientTolerance ${fmt(gradientTolerance)}`,
      );
    }
    if (costTest) {
      const what = `the cost fell by ${fmt(costTest.relativeFall)} of itself ≤ costTolerance ${fmt(costTolerance)} at damping λ = ${fmt(costTest.damping)}`;
      if (costTest.damping <= trustedDamping) return finish('converged', what);
      const check = confirm();
      return check.holds ? finish('converged', `${what}, and ${check.detail}`) : stalled(what, check.detail);
    }
    if (iterations >= maxIterations) {
      return finish(
        'max-iterations',
        `stopped at maxIterations ${maxIterations} with gradient ‖Jᵀr‖∞ = ${fmt(gradientNorm)} > ${fmt(gradientTolerance)}`,
      );
    }
    iterations++;
    for (;;) {
      while (!normal.factorDamped(damping, pivotTolerance)) {
        if (damping >= maxDamping) {
          return finish('singular', `JᵀJ + λ·D cannot be factored even at damping λ = ${fmt(damping)} (maxDamping)`);
        }
        damping = Math.min(maxDamping, damping * growth);
        growth *= 2;
      }
      normal.solveStep(step);
      let stepSquared = 0;
      let xSquared = 0;
      for (let j = 0; j < n; j++) {
        const xj = x[j]!;
        xTrial[j] = clamp(xj + step[j]!, box.lower?.[j], box.upper?.[j]);
        step[j] = xTrial[j]! - xj;
        stepSquared += step[j]! * step[j]!;
        xSquared += xj * xj;
      }
      const stepNorm = Math.sqrt(stepSquared);
      const stepLimit = stepTolerance * (Math.sqrt(xSquared) + stepTolerance);
      if (stepNorm <= stepLimit) {
        const what = `step ‖Δx‖ = ${fmt(stepNorm)} ≤ stepTolerance·(‖x‖ + stepTolerance) = ${fmt(stepLimit)} at damping λ = ${fmt(damping)}`;
        if (damping <= trustedDamping) return finish('converged', what);
        const check = confirm();
        return check.holds ? finish('converged', `${what}, and ${check.detail}`) : stalled(what, check.detail);
      }
      const predicted = normal.predictedReduction(step);
      problem.residuals(xTrial, rTrial);
      evaluations++;
      const trialCost = halfSquaredNorm(rTrial);
      const actual = cost - trialCost;
      if (actual > 0) {
        const gain = predicted > 0 ? actual / predicted : 0;
        if (actual <= costTolerance * cost && predicted <= costTolerance * cost) {
          costTest = { relativeFall: actual / cost, damping };
        }
        damping = Math.max(Number.MIN_VALUE, damping * Math.max(1 / 3, 1 - (2 * gain - 1) ** 3));
        growth = 2;
        const xPrevious = x;
        x = xTrial;
        xTrial = xPrevious;
        const rPrevious = r;
        r = rTrial;
        rTrial = rPrevious;
        cost = trialCost;
        if (!jacobianAtX()) return finish('diverged', `the Jacobian is not finite at iteration ${iterations}`);
        break;
      }
      // A rejected step, including one to a point where the residuals are not finite: damp harder, same Jacobian.
      if (damping >= maxDamping) {
        if (!Number.isFinite(trialCost)) {
          return finish(
            'diverged',
            `the residuals are not finite at any trial point, even at damping λ = ${fmt(damping)}`,
          );
        }
        const what = `no step lowers the cost even at damping λ = ${fmt(damping)} (maxDamping)`;
        const check = confirm();
        return check.holds ? finish('converged', `${what}, and ${check.detail}`) : stalled(what, check.detail);
      }
      damping = Math.min(maxDamping, damping * growth);
      growth *= 2;
    }
  }
}

function checkArguments(n: number, m: number, x0: Float64Array | readonly number[], box: ParameterBox): void {
  if (!Number.isInteger(n) || n < 1) throw new Error(`solveLeastSquares: parameterCount must be ≥ 1, got ${n}`);
  if (!Number.isInteger(m) || m < 1) throw new Error(`solveLeastSquares: residualCount must be ≥ 1, got ${m}`);
  if (x0.length !== n) throw new Error(`solveLeastSquares: x0 has length ${x0.length}, expected ${n}`);
  if (!x0.every(Number.isFinite)) throw new Error('solveLeastSquares: x0 must be finite');
  const { lower, upper } = box;
  if (lower && lower.length !== n) throw new Error(`solveLeastSquares: lowerBounds must have length ${n}`);
  if (upper && upper.length !== n) throw new Error(`solveLeastSquares: upperBounds must have length ${n}`);
  for (let j = 0; j < n; j++) {
    const lo = lower?.[j] ?? Number.NEGATIVE_INFINITY;
    const hi = upper?.[j] ?? Number.POSITIVE_INFINITY;
    if (!(lo <= hi)) throw new Error(`solveLeastSquares: bounds of parameter ${j} are crossed or NaN`);
  }
}

function project(x: Float64Array, box: ParameterBox): void {
  for (let j = 0; j < x.length; j++) x[j] = clamp(x[j]!, box.lower?.[j], box.upper?.[j]);
}

function clamp(value: number, lower: number | undefined, upper: number | undefined): number {
  if (lower !== undefined && value < lower) return lower;
  if (upper !== undefined && value > upper) return upper;
  return value;
}

/**
 * Marks in `fixed` the parameters sitting on a bound that descent (−g) would push through, and returns ‖g‖∞ over the
 * others: the norm of the projected gradient. Holding those parameters keeps the step from being spent against the
 * bound (Bertsekas, SIAM J. Control Optim. 20(2) 1982, projected Newton with the active set held fixed).
 */
function fixActiveBounds(x: Float64Array, g: Float64Array, box: ParameterBox, fixed: Uint8Array): number {
  let norm = 0;
  for (let j = 0; j < x.length; j++) {
    const gj = g[j]!;
    const lower = box.lower?.[j];
    const upper = box.upper?.[j];
    const pressesLower = lower !== undefined && x[j]! <= lower && gj > 0;
    const pressesUpper = upper !== undefined && x[j]! >= upper && gj < 0;
    fixed[j] = pressesLower || pressesUpper ? 1 : 0;
    if (fixed[j] === 0) norm = Math.max(norm, Math.abs(gj));
  }
  return norm;
}

function halfSquaredNorm(r: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < r.length; i++) sum += r[i]! * r[i]!;
  return 0.5 * sum;
}

function fmt(value: number): string {
  return value.toExponential(3);
}
