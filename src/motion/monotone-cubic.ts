import type { LawSample } from './law-sample.js';

/**
 * How the monotone cubic ends: `secant` takes each end's slope from its neighbouring interval, `rest` starts and
 * ends with zero slope (the actuator is at rest before the first and after the last knot), `periodic` closes the
 * curve on itself over `period` (same unit as the knots): the first knot comes back at knot₀ + period and the slope
 * there equals the slope at the first knot.
 */
export type MonotoneCubicEnds =
  | { readonly kind: 'secant' }
  | { readonly kind: 'rest' }
  | { readonly kind: 'periodic'; readonly period: number };

/**
 * A monotone piecewise-cubic Hermite interpolant (Fritsch & Carlson, "Monotone piecewise cubic interpolation",
 * SIAM J. Numer. Anal. 17(2), 1980, 238–246). Plain data: knots, values and the slopes at the knots. It passes
 * through every value, is C¹ (value and first derivative continuous; the second derivative jumps at the knots), and
 * is monotone on every interval where the data are: it never overshoots a flat or monotone run. When periodic, the
 * closing knot (first knot + period, first value) is included at the end.
 */
export interface MonotoneCubic {
  /** Abscissae, strictly increasing (here: line position, m). */
  readonly knots: readonly number[];
  /** Values at the knots (radians or millimetres). */
  readonly values: readonly number[];
  /** Slopes d(value)/d(knot) at the knots, value unit per knot unit. */
  readonly slopes: readonly number[];
  /** True when the last knot is the first one again, one period on. */
  readonly periodic: boolean;
  /** Continuity at the knots. */
  readonly continuity: 'C1';
}

/**
 * Builds the Fritsch–Carlson monotone cubic through `(knots[i], values[i])`. Steps of the paper: secants Δₖ; initial
 * slopes by the three-point (parabola) formula (h_k·Δ_{k−1} + h_{k−1}·Δ_k)/(h_{k−1} + h_k), set to zero where the
 * secants change sign or an interval is flat; then on each interval with α = d_k/Δ_k, β = d_{k+1}/Δ_k outside the
 * circle α² + β² ≤ 9, both slopes are scaled by τ = 3/√(α² + β²). Two values closer than `flatTolerance` (value unit)
 * make a flat interval. Throws on misuse: fewer than two knots, knots not strictly increasing, lengths that differ,
 * non-finite numbers, or a period not longer than the knots' span.
 */
export function monotoneCubic(
  knots: readonly number[],
  values: readonly number[],
  ends: MonotoneCubicEnds,
  flatTolerance: number,
): MonotoneCubic {
  if (knots.length < 2) throw new Error(`monotoneCubic: needs at least 2 knots, got ${knots.length}`);
  if (values.length !== knots.length) throw new Error('monotoneCubic: knots and values differ in length');
  for (let i = 0; i < knots.length; i++) {
    if (!Number.isFinite(knots[i]) || !Number.isFinite(values[i])) throw new Error('monotoneCubic: non-finite input');
    if (i > 0 && !(knots[i]! > knots[i - 1]!)) throw new Error('monotoneCubic: knots must be strictly increasing');
  }
  if (!(flatTolerance >= 0)) throw new Error('monotoneCubic: flatTolerance must be ≥ 0');
  const xs = [...knots];
  const ys = [...values];
  if (ends.kind === 'periodic') {
    if (!(ends.period > xs[xs.length - 1]! - xs[0]!)) {
      throw new Error('monotoneCubic: the period must be longer than the span of the knots');
    }
    xs.push(xs[0]! + ends.period);
    ys.push(ys[0]!);
  }
  const n = xs.length - 1;
  const widths: number[] = [];
  const secants: number[] = [];
  const flat: boolean[] = [];
  for (let k = 0; k < n; k++) {
    widths.push(xs[k + 1]! - xs[k]!);
    secants.push((ys[k + 1]! - ys[k]!) / widths[k]!);
    flat.push(Math.abs(ys[k + 1]! - ys[k]!) <= flatTolerance);
  }
  const threePoint = (before: number, after: number): number => {
    if (flat[before] || flat[after] || Math.sign(secants[before]!) !== Math.sign(secants[after]!)) return 0;
    const hb = widths[before]!;
    const ha = widths[after]!;
    return (ha * secants[before]! + hb * secants[after]!) / (hb + ha);
  };
  const slopes: number[] = new Array(n + 1).fill(0);
  for (let k = 1; k < n; k++) slopes[k] = threePoint(k - 1, k);
  if (ends.kind === 'secant') {
    slopes[0] = flat[0] ? 0 : secants[0]!;
    slopes[n] = flat[n - 1] ? 0 : secants[n - 1]!;
  } else if (ends.kind === 'periodic') {
    slopes[0] = threePoint(n - 1, 0);
    slopes[n] = slopes[0];
  }
  for (let k = 0; k < n; k++) {
    if (flat[k]) continue;
    const alpha = slopes[k]! / secants[k]!;
    const beta = slopes[k + 1]! / secants[k]!;
    const radiusSquared = alpha * alpha + beta * beta;
    if (radiusSquared > 9) {
      const tau = 3 / Math.sqrt(radiusSquared);
      slopes[k] = tau * alpha * secants[k]!;
      slopes[k + 1] = tau * beta * secants[k]!;
    }
  }
  if (ends.kind === 'periodic') {
    // Scaling a slope down keeps (α, β) inside the circle, so the smaller of the two end slopes suits both intervals.
    const closing = Math.abs(slopes[0]!) <= Math.abs(slopes[n]!) ? slopes[0]! : slopes[n]!;
    slopes[0] = closing;
    slopes[n] = closing;
  }
  return { knots: xs, values: ys, slopes, periodic: ends.kind === 'periodic', continuity: 'C1' };
}

/**
 * The cubic's value and its first and second derivatives with respect to the abscissa at `x` (cubic Hermite basis on
 * the interval holding x). A periodic cubic wraps x into one period; otherwise x outside the knots gives the end
 * value with zero derivatives (the actuator holds).
 */
export function sampleMonotoneCubic(cubic: MonotoneCubic, x: number): LawSample {
  const { knots, values, slopes } = cubic;
  const first = knots[0]!;
  const last = knots[knots.length - 1]!;
  let at = x;
  if (cubic.periodic) {
    const period = last - first;
    at = first + ((((x - first) % period) + period) % period);
  } else if (x <= first) {
    return { value: values[0]!, firstDerivative: 0, secondDerivative: 0 };
  } else if (x >= last) {
    return { value: values[values.length - 1]!, firstDerivative: 0, secondDerivative: 0 };
  }
  const k = intervalOf(knots, at);
  const h = knots[k + 1]! - knots[k]!;
  const t = (at - knots[k]!) / h;
  const y0 = values[k]!;
  const y1 = values[k + 1]!;
  const m0 = slopes[k]! * h;
  const m1 = slopes[k + 1]! * h;
  const t2 = t * t;
  const t3 = t2 * t;
  return {
    value: y0 * (2 * t3 - 3 * t2 + 1) + m0 * (t3 - 2 * t2 + t) + y1 * (3 * t2 - 2 * t3) + m1 * (t3 - t2),
    firstDerivative:
      (y0 * (6 * t2 - 6 * t) + m0 * (3 * t2 - 4 * t + 1) + y1 * (6 * t - 6 * t2) + m1 * (3 * t2 - 2 * t)) / h,
    secondDerivative: (y0 * (12 * t - 6) + m0 * (6 * t - 4) + y1 * (6 - 12 * t) + m1 * (6 * t - 2)) / (h * h),
  };
}

/** Index k of the interval [knots[k], knots[k+1]] holding x (x within the knots), by bisection. */
function intervalOf(knots: readonly number[], x: number): number {
  let lo = 0;
  let hi = knots.length - 2;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (knots[mid]! <= x) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/** The largest |first| and |second derivative| of a cubic on one interval, per knot unit and per knot unit². */
export interface CubicIntervalPeaks {
  readonly peakFirstDerivative: number;
  readonly peakSecondDerivative: number;
}

/**
 * Exact peaks of |dvalue/dx| and |d²value/dx²| on interval `k` of the cubic (between knots k and k + 1): the first
 * derivative is a quadratic in the local parameter (peak at an end or at its vertex), the second a line (peak at an
 * end).
 */
export function monotoneCubicIntervalPeaks(cubic: MonotoneCubic, k: number): CubicIntervalPeaks {
  const h = cubic.knots[k + 1]! - cubic.knots[k]!;
  const y0 = cubic.values[k]!;
  const y1 = cubic.values[k + 1]!;
  const m0 = cubic.slopes[k]! * h;
  const m1 = cubic.slopes[k + 1]! * h;
  // dp/dt = a + b·t + c·t² on t ∈ [0, 1], from the derivative of the Hermite basis.
  const a = m0;
  const b = -6 * y0 - 4 * m0 + 6 * y1 - 2 * m1;
  const c = 6 * y0 + 3 * m0 - 6 * y1 + 3 * m1;
  let peak = Math.max(Math.abs(a), Math.abs(a + b + c));
  const vertex = -b / (2 * c);
  if (Number.isFinite(vertex) && vertex > 0 && vertex < 1)
    peak = Math.max(peak, Math.abs(a + b * vertex + c * vertex * vertex));
  return {
    peakFirstDerivative: peak / h,
    peakSecondDerivative: Math.max(Math.abs(b), Math.abs(b + 2 * c)) / (h * h),
  };
}
