import type { Point } from '../../geometry/index.js';
import { type LeastSquaresStatus, solveLeastSquares } from '../../numeric/index.js';
import { kasaCircleFit } from './kasa-circle-fit.js';
import { checkPoint, checkPoses, localPoint, placePoint, type RelativePose } from './relative-pose.js';

/** Settings of `fitDyadLeastSquares`; `resolveDyadFitOptions` fills the defaults. */
export interface DyadFitOptions {
  /** Most Kåsa alternations (centre fit, then circle-point fit). @default 200 */
  readonly maxAlternations: number;
  /** Alternation stops when a round moves the pins by at most this, mm. @default 1e-10 */
  readonly alternationStepMm: number;
  /** Polish by Levenberg–Marquardt on the geometric residuals after alternating. @default true */
  readonly polish: boolean;
  /** Iteration cap of the polish. @default 100 */
  readonly maxPolishIterations: number;
  /** A link longer than this is reported `diverged`: the motion wants a slider (see `sliderDyad`), mm. @default 100000 */
  readonly maxRadiusMm: number;
  /** Relative eigenvalue threshold of the Kåsa fits (see `kasaCircleFit`). @default 1e-12 */
  readonly collinearTolerance: number;
}

export function resolveDyadFitOptions(partial: Partial<DyadFitOptions> = {}): DyadFitOptions {
  const o = {
    maxAlternations: 200,
    alternationStepMm: 1e-10,
    polish: true,
    maxPolishIterations: 100,
    maxRadiusMm: 100_000,
    collinearTolerance: 1e-12,
    ...partial,
  };
  if (!Number.isInteger(o.maxAlternations) || o.maxAlternations < 1) {
    throw new Error('fitDyadLeastSquares: maxAlternations must be an integer ≥ 1');
  }
  if (!Number.isInteger(o.maxPolishIterations) || o.maxPolishIterations < 1) {
    throw new Error('fitDyadLeastSquares: maxPolishIterations must be an integer ≥ 1');
  }
  if (!(o.alternationStepMm > 0) || !(o.maxRadiusMm > 0) || !(o.collinearTolerance > 0)) {
    throw new Error('fitDyadLeastSquares: alternationStepMm, maxRadiusMm and collinearTolerance must be > 0');
  }
  return o;
}

/** Where the fit starts: a circle point in B (required) and optionally a centre in A (else Kåsa-fitted to it). */
export interface DyadFitStart {
  readonly circlePointLocal: Point;
  readonly centre?: Point;
}

/** A least-squares dyad, reported on success and failure alike. */
export interface DyadFit {
  /**
   * `converged` (the stopping test in `reason` was met), `stalled` (the polish could not lower the geometric error
   * though its model says it should; the pins are the best found), `max-iterations`, `singular` (the circle point's
   * positions, or the centre's positions seen from B, lie on a line: no finite circle), `diverged` (the link grew past
   * `maxRadiusMm` or the numbers stopped being finite).
   */
  readonly status: LeastSquaresStatus;
  readonly reason: string;
  /** Kåsa alternations plus polishing iterations. */
  readonly iterations: number;
  readonly alternations: number;
  /** Pin fixed in A, A's frame, mm. */
  readonly centre: Point;
  /** Pin fixed in B, B's frame, mm. */
  readonly circlePointLocal: Point;
  /** Fitted link length r, mm. */
  readonly radiusMm: number;
  /** √(mean (|C − Pᵢ(c)| − r)²) over the stations, mm. */
  readonly residualRmsMm: number;
  /** max |(|C − Pᵢ(c)| − r)| over the stations, mm. */
  readonly residualMaxMm: number;
}

/**
 * A least-squares binary link for any number of stations (meant for more than five, where no exact dyad exists
 * generally): minimises Σ(|C − Pᵢ(c)| − r)² over the centre C (in A), circle point c (in B) and length r (Sandor &
 * Erdman, *Advanced Mechanism Design* vol. 2, approximate synthesis for more than five positions; McCarthy & Soh,
 * *Geometric Design of Linkages*, ch. 4).
 *
 * Method: first alternate two Kåsa circle fits (`kasaCircleFit`) on the algebraic error Σ(|C − Pᵢ(c)|² − r²)²: for
 * fixed c, fit C and r to the circle point's positions Pᵢ(c); for fixed C, fit c and r to the centre's positions seen
 * from B, Cᵢ' = R(−θᵢ)(C − dᵢ), since |C − Pᵢ(c)| = |Cᵢ' − c|. Each half-step minimises the same error exactly, so it
 * never rises. Then polish (C, c, r) on the geometric residuals by Levenberg–Marquardt (`solveLeastSquares`,
 * analytic Jacobian), whose status and reason are reported. Throws for fewer than 3 poses or a non-finite start.
 */
export function fitDyadLeastSquares(
  poses: readonly RelativePose[],
  start: DyadFitStart,
  partialOptions: Partial<DyadFitOptions> = {},
): DyadFit {
  checkPoses(poses, 'fitDyadLeastSquares', 3, Number.POSITIVE_INFINITY);
  checkPoint(start.circlePointLocal, 'fitDyadLeastSquares', 'start.circlePointLocal');
  if (start.centre) checkPoint(start.centre, 'fitDyadLeastSquares', 'start.centre');
  const options = resolveDyadFitOptions(partialOptions);
  let c: Point = start.circlePointLocal;
  let centre: Point | null = start.centre ?? null;
  let radius = Number.NaN;
  let alternations = 0;
  let settled = false;
  const finish = (status: LeastSquaresStatus, reason: string, iterations: number): DyadFit => ({
    status,
    reason,
    iterations,
    alternations,
    ...geometricResiduals(poses, centre ?? [Number.NaN, Number.NaN], c, radius),
    centre: centre ?? [Number.NaN, Number.NaN],
    circlePointLocal: c,
    radiusMm: radius,
  });

  if (!centre) {
    const fit = kasaCircleFit(
      poses.map((p) => placePoint(p, c)),
      options.collinearTolerance,
    );
    if (fit.status !== 'ok') {
      return finish('singular', "the start circle point's positions are collinear: a slider fits it, not a pin", 0);
    }
    centre = fit.centre;
    radius = fit.radiusMm;
  }
  while (alternations < options.maxAlternations) {
    alternations++;
    const inB = kasaCircleFit(
      poses.map((p) => localPoint(p, centre!)),
      options.collinearTolerance,
    );
    if (inB.status !== 'ok') {
      return finish(
        'singular',
        "the centre's positions seen from B are collinear: no finite circle point",
        alternations,
      );
    }
    const inA = kasaCircleFit(
      poses.map((p) => placePoint(p, inB.centre)),
      options.collinearTolerance,
    );
    if (inA.status !== 'ok') {
      return finish(
        'singular',
        "the circle point's positions are collinear: a slider fits it, not a pin",
        alternations,
      );
    }
    const move = Math.hypot(
      inB.centre[0] - c[0],
      inB.centre[1] - c[1],
      inA.centre[0] - centre[0],
      inA.centre[1] - centre[1],
    );
    c = inB.centre;
    centre = inA.centre;
    radius = inA.radiusMm;
    if (!(radius <= options.maxRadiusMm)) {
      return finish('diverged', `the link length ${radius} mm passed maxRadiusMm ${options.maxRadiusMm}`, alternations);
    }
    if (move <= options.alternationStepMm) {
      settled = true;
      break;
    }
  }
  if (!options.polish) {
    return settled
      ? finish('converged', `Kåsa alternation moved the pins by ≤ ${options.alternationStepMm} mm`, alternations)
      : finish('max-iterations', `Kåsa alternation still moving after ${alternations} rounds`, alternations);
  }
  const polished = solveLeastSquares(
    {
      parameterCount: 5,
      residualCount: poses.length,
      residuals: (x, r) => {
        poses.forEach((pose, i) => {
          const p = placePoint(pose, [x[2]!, x[3]!]);
          r[i] = Math.hypot(x[0]! - p[0], x[1]! - p[1]) - x[4]!;
        });
      },
      jacobian: (x, jac) => {
        poses.forEach((pose, i) => {
          const p = placePoint(pose, [x[2]!, x[3]!]);
          const vx = x[0]! - p[0];
          const vy = x[1]! - p[1];
          const d = Math.hypot(vx, vy);
          const wx = d > 0 ? vx / d : 0;
          const wy = d > 0 ? vy / d : 0;
          // ∂|C − Pᵢ|/∂c = −wᵀRᵢ, i.e. −(Rᵢᵀw)ᵀ
          const rw = localPoint({ angleRad: pose.angleRad, origin: [0, 0] }, [wx, wy]);
          jac.set([wx, wy, -rw[0], -rw[1], -1], 5 * i);
        });
      },
    },
    [centre[0], centre[1], c[0], c[1], radius],
    { maxIterations: options.maxPolishIterations },
  );
  const x = polished.x;
  centre = [x[0]!, x[1]!];
  c = [x[2]!, x[3]!];
  radius = x[4]!;
  const total = alternations + polished.iterations;
  if (!(Math.abs(radius) <= options.maxRadiusMm)) {
    return finish('diverged', `the link length ${radius} mm passed maxRadiusMm ${options.maxRadiusMm}`, total);
  }
  return finish(polished.status, `after ${alternations} Kåsa alternations: ${polished.reason}`, total);
}

function geometricResiduals(
  poses: readonly RelativePose[],
  centre: Point,
  c: Point,
  radius: number,
): { residualRmsMm: number; residualMaxMm: number } {
  let sum = 0;
  let max = 0;
  for (const pose of poses) {
    const p = placePoint(pose, c);
    const e = Math.abs(Math.hypot(centre[0] - p[0], centre[1] - p[1]) - radius);
    sum += e * e;
    // NaN must win over any finite maximum.
    if (!(e <= max)) max = e;
  }
  return { residualRmsMm: Math.sqrt(sum / poses.length), residualMaxMm: max };
}
