import { wrapAngle } from '../numeric/index.js';

/** Link lengths of a four-bar, mm: crank a (O2A), coupler b (AB), rocker c (O4B), ground d (O2O4). */
export interface FourBarDimensions {
  readonly a: number;
  readonly b: number;
  readonly c: number;
  readonly d: number;
}

/** The two assembly circuits of a four-bar at a given crank angle. */
export type FourBarCircuit = 'open' | 'crossed';

/** Coupler and rocker angles of a four-bar, radians in (−π, π] from the ground line O2→O4, counter-clockwise. */
export interface FourBarAngles {
  readonly theta3: number;
  readonly theta4: number;
  /** False when the links cannot close at this crank angle; the angles are then those of the nearest toggle. */
  readonly assemblable: boolean;
}

/**
 * Closed-form position of a four-bar with O2 at the origin and O4 at (d, 0): θ3 and θ4 for crank angle `theta2`
 * (radians) on the chosen circuit, by the half-angle substitution in Freudenstein's equation (Freudenstein, Trans.
 * ASME 77, 1955; the K1…K5 form of Norton, *Design of Machinery*). A reference for tests and a seed for
 * synthesis, not used by the general solver.
 */
export function solveFourBarClosedForm(
  dims: FourBarDimensions,
  theta2: number,
  circuit: FourBarCircuit,
): FourBarAngles {
  const { a, b, c, d } = dims;
  const k1 = d / a;
  const k2 = d / c;
  const k3 = (a * a - b * b + c * c + d * d) / (2 * a * c);
  const k4 = d / b;
  const k5 = (c * c - d * d - a * a - b * b) / (2 * a * b);
  const cos2 = Math.cos(theta2);
  const sin2 = Math.sin(theta2);
  const A = cos2 - k1 - k2 * cos2 + k3;
  const B = -2 * sin2;
  const C = k1 - (k2 + 1) * cos2 + k3;
  const D = cos2 - k1 + k4 * cos2 + k5;
  const E = -2 * sin2;
  const F = k1 + (k4 - 1) * cos2 + k5;
  const disc4 = B * B - 4 * A * C;
  const disc3 = E * E - 4 * D * F;
  const sign = circuit === 'open' ? -1 : 1;
  const theta4 = wrapAngle(2 * Math.atan2(-B + sign * Math.sqrt(Math.max(0, disc4)), 2 * A));
  const theta3 = wrapAngle(2 * Math.atan2(-E + sign * Math.sqrt(Math.max(0, disc3)), 2 * D));
  return { theta3, theta4, assemblable: disc4 >= 0 && disc3 >= 0 };
}
