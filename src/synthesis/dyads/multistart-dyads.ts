import type { Point } from '../../geometry/index.js';
import { type DyadFit, type DyadFitOptions, fitDyadLeastSquares } from './fit-dyad-least-squares.js';
import { checkPoint, checkPoses, type RelativePose } from './relative-pose.js';

/** Settings of `multistartDyads`; `resolveMultistartOptions` fills the defaults. */
export interface MultistartOptions {
  /** Corners of the box of start circle points, B's frame, mm (the plate region a pin may take). */
  readonly circlePointMin: Point;
  readonly circlePointMax: Point;
  /** Grid points per axis over the box (steps² starts). @default 7 */
  readonly steps: number;
  /** Most candidates returned. @default 8 */
  readonly keep: number;
  /** Two fits whose centres and circle points agree within this are one candidate (the better is kept), mm. @default 0.01 */
  readonly mergeMm: number;
  /** Settings of every fit. @default {} (the defaults of `resolveDyadFitOptions`) */
  readonly fit: Partial<DyadFitOptions>;
}

export function resolveMultistartOptions(
  partial: Pick<MultistartOptions, 'circlePointMin' | 'circlePointMax'> & Partial<MultistartOptions>,
): MultistartOptions {
  const o = { steps: 7, keep: 8, mergeMm: 0.01, fit: {}, ...partial };
  checkPoint(o.circlePointMin, 'multistartDyads', 'circlePointMin');
  checkPoint(o.circlePointMax, 'multistartDyads', 'circlePointMax');
  if (!Number.isInteger(o.steps) || o.steps < 1) throw new Error('multistartDyads: steps must be an integer ≥ 1');
  if (!Number.isInteger(o.keep) || o.keep < 1) throw new Error('multistartDyads: keep must be an integer ≥ 1');
  if (!(o.mergeMm > 0)) throw new Error('multistartDyads: mergeMm must be > 0');
  return o;
}

export interface MultistartDyads {
  /**
   * Distinct fits ranked by `residualRmsMm`, best first: `converged`, `stalled` and `max-iterations` fits, whose pins
   * are the best found and whose residuals say how good they are; the caller judges them by residual.
   */
  readonly candidates: readonly DyadFit[];
  /** Fits started. */
  readonly starts: number;
  /** Fits that ended `singular` or `diverged`. */
  readonly failed: number;
}

/**
 * Least-squares dyads (`fitDyadLeastSquares`) started from a grid of circle points over a box of B, merged and ranked
 * by RMS residual: the least-squares error has several local minima, one near each pin a near-rigid link could use
 * (Sandor & Erdman, *Advanced Mechanism Design* vol. 2). The grid includes the box corners; one start at the box
 * centre when `steps` is 1.
 */
export function multistartDyads(
  poses: readonly RelativePose[],
  partialOptions: Pick<MultistartOptions, 'circlePointMin' | 'circlePointMax'> & Partial<MultistartOptions>,
): MultistartDyads {
  checkPoses(poses, 'multistartDyads', 3, Number.POSITIVE_INFINITY);
  const options = resolveMultistartOptions(partialOptions);
  const { circlePointMin: lo, circlePointMax: hi, steps } = options;
  const at = (k: number, a: number, b: number): number =>
    steps === 1 ? 0.5 * (a + b) : a + ((b - a) * k) / (steps - 1);
  const kept: DyadFit[] = [];
  let failed = 0;
  for (let i = 0; i < steps; i++) {
    for (let j = 0; j < steps; j++) {
      const fit = fitDyadLeastSquares(
        poses,
        { circlePointLocal: [at(i, lo[0], hi[0]), at(j, lo[1], hi[1])] },
        options.fit,
      );
      if (fit.status === 'singular' || fit.status === 'diverged' || !Number.isFinite(fit.residualRmsMm)) {
        failed++;
        continue;
      }
      const same = kept.findIndex(
        (k) =>
          Math.hypot(k.centre[0] - fit.centre[0], k.centre[1] - fit.centre[1]) <= options.mergeMm &&
          Math.hypot(
            k.circlePointLocal[0] - fit.circlePointLocal[0],
            k.circlePointLocal[1] - fit.circlePointLocal[1],
          ) <= options.mergeMm,
      );
      if (same < 0) kept.push(fit);
      else if (fit.residualRmsMm < kept[same]!.residualRmsMm) kept[same] = fit;
    }
  }
  kept.sort((a, b) => a.residualRmsMm - b.residualRmsMm);
  return { candidates: kept.slice(0, options.keep), starts: steps * steps, failed };
}
