import { wrapAngle } from '../numeric/index.js';

/** Result of the order check on one actuator's station values. */
export interface OrderCheck {
  /** True when the values do not move one way only. */
  readonly defect: boolean;
  /** +1 increasing, −1 decreasing, 0 when all equal (judged by the net change, else the first nonzero step). */
  readonly direction: 1 | -1 | 0;
  /** Indices i ≥ 1 where the step from value i − 1 to i goes against `direction`. */
  readonly reversals: readonly number[];
  /** Net change from first to last value (sum of wrapped steps when cyclic), radians or mm. */
  readonly sweep: number;
}

/**
 * Order-defect check (Chase & Mirth, J. Mech. Des. 115(2) 1993): a one-input mechanism reaches its stations in
 * schedule order only if the actuator moves one way through the station values. Equal neighbours (a dwell) are not
 * reversals; steps within `tolerance` of zero count as dwells. With `cyclic` (a fully rotating crank, radians) each
 * step is wrapped into (−π, π] first, so 350° → 10° is a +20° step.
 */
export function findOrderDefect(
  values: readonly number[],
  options: { readonly cyclic?: boolean; readonly tolerance?: number } = {},
): OrderCheck {
  const tol = options.tolerance ?? 0;
  const steps = values.slice(1).map((v, i) => (options.cyclic ? wrapAngle(v - values[i]!) : v - values[i]!));
  const sweep = steps.reduce((s, d) => s + d, 0);
  let direction: 1 | -1 | 0 = sweep > tol ? 1 : sweep < -tol ? -1 : 0;
  if (direction === 0) {
    const firstMove = steps.find((d) => Math.abs(d) > tol);
    direction = firstMove === undefined ? 0 : firstMove > 0 ? 1 : -1;
  }
  const reversals: number[] = [];
  steps.forEach((d, i) => {
    if (direction !== 0 && d * direction < -tol) reversals.push(i + 1);
  });
  return { defect: reversals.length > 0, direction, reversals, sweep };
}
