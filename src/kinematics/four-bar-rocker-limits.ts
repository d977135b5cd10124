import { classifyGrashof } from './classify-grashof.js';
import type { FourBarDimensions } from './solve-four-bar-closed-form.js';

/** The two limit (toggle) positions of a crank-rocker on its open circuit (B above the ground line), radians. */
export interface RockerLimits {
  /** Rocker angle θ4 with crank and coupler extended in line (O2B = a + b). */
  readonly theta4Extended: number;
  /** Crank angle θ2 at the extended toggle. */
  readonly theta2Extended: number;
  /** Rocker angle θ4 with crank and coupler folded in line (O2B = b − a). */
  readonly theta4Folded: number;
  /** Crank angle θ2 at the folded toggle. */
  readonly theta2Folded: number;
  /** Rocker swing |θ4Folded − θ4Extended|. */
  readonly swing: number;
}

/**
 * Limit positions of a Grashof crank-rocker (O2 at the origin, O4 at (d, 0)) by the law of cosines in triangle
 * O2·O4·B with O2B = b ± a (Norton, *Design of Machinery*, "toggle positions"); `null` for any other class.
 */
export function fourBarRockerLimits(dims: FourBarDimensions): RockerLimits | null {
  if (classifyGrashof(dims).kind !== 'crank-rocker') return null;
  const { a, b, c, d } = dims;
  const toggle = (reach: number, crankSign: number) => {
    const theta4 = Math.acos((reach * reach - d * d - c * c) / (2 * d * c));
    const bx = d + c * Math.cos(theta4);
    const by = c * Math.sin(theta4);
    const theta2 = Math.atan2(crankSign * by, crankSign * bx);
    return { theta4, theta2 };
  };
  const ext = toggle(a + b, 1);
  const fold = toggle(b - a, -1);
  return {
    theta4Extended: ext.theta4,
    theta2Extended: ext.theta2,
    theta4Folded: fold.theta4,
    theta2Folded: fold.theta2,
    swing: Math.abs(fold.theta4 - ext.theta4),
  };
}
