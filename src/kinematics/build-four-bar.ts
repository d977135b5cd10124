import { defineMechanism } from './define-mechanism.js';
import type { DriverSpec, Mechanism } from './mechanism.js';
import { type FourBarCircuit, type FourBarDimensions, solveFourBarClosedForm } from './solve-four-bar-closed-form.js';

/** Options of `buildFourBar`. */
export interface FourBarOptions {
  /** Crank angle of the initial assembly, radians. @default 0 */
  readonly theta2?: number;
  /** Circuit of the initial assembly. @default 'open' */
  readonly circuit?: FourBarCircuit;
  /** Which grounded joint carries the actuator: the crank's O2, the rocker's O4, or none. @default 'crank' */
  readonly drive?: 'crank' | 'rocker' | 'none';
}

/**
 * A four-bar: die body with O2 at the origin and O4 at (d, 0); links `crank` (O2→A, length a), `coupler` (A→B, b)
 * and `rocker` (O4→B, c), each with its x axis along the link, so φ(crank) = θ2, φ(coupler) = θ3, φ(rocker) = θ4.
 * Joints `O2`, `A`, `B`, `O4`. The driver (id `crank` or `rocker`) acts on O2 or O4 with offset 0: actuator = θ2 or
 * θ4 in radians. The initial pose is the closed-form assembly at `theta2` (the nearest toggle when the links cannot
 * close, so the solver can report it). Lengths in mm.
 */
export function buildFourBar(dims: FourBarDimensions, options: FourBarOptions = {}): Mechanism {
  const { a, b, c, d } = dims;
  const theta2 = options.theta2 ?? 0;
  const { theta3, theta4 } = solveFourBarClosedForm(dims, theta2, options.circuit ?? 'open');
  const ax = a * Math.cos(theta2);
  const ay = a * Math.sin(theta2);
  const drive = options.drive ?? 'crank';
  const drivers: DriverSpec[] =
    drive === 'crank' ? [{ id: 'crank', joint: 'O2' }] : drive === 'rocker' ? [{ id: 'rocker', joint: 'O4' }] : [];
  return defineMechanism({
    bodies: [
      { id: 'die_body', kind: 'die_body', points: { O2: [0, 0], O4: [d, 0] } },
      { id: 'crank', kind: 'link', layer: 1, points: { O2: [0, 0], A: [a, 0] }, initial: { x: 0, y: 0, phi: theta2 } },
      {
        id: 'coupler',
        kind: 'link',
        layer: 2,
        points: { A: [0, 0], B: [b, 0] },
        initial: { x: ax, y: ay, phi: theta3 },
      },
      { id: 'rocker', kind: 'link', layer: 1, points: { O4: [0, 0], B: [c, 0] }, initial: { x: d, y: 0, phi: theta4 } },
    ],
    joints: [
      { kind: 'revolute', id: 'O2', bodyI: 'die_body', pointI: [0, 0], bodyJ: 'crank', pointJ: [0, 0] },
      { kind: 'revolute', id: 'A', bodyI: 'crank', pointI: [a, 0], bodyJ: 'coupler', pointJ: [0, 0] },
      { kind: 'revolute', id: 'B', bodyI: 'coupler', pointI: [b, 0], bodyJ: 'rocker', pointJ: [c, 0] },
      { kind: 'revolute', id: 'O4', bodyI: 'die_body', pointI: [d, 0], bodyJ: 'rocker', pointJ: [0, 0] },
    ],
    drivers,
  });
}
