import { defineMechanism } from './define-mechanism.js';
import type { DriverSpec, Mechanism } from './mechanism.js';
import { type SliderCrankDimensions, sliderCrankPosition } from './slider-crank-position.js';

/** Options of `buildSliderCrank`. */
export interface SliderCrankOptions {
  /** Crank angle of the initial assembly, radians. @default 0 */
  readonly theta?: number;
  /** The actuated joint: crank pivot O2 (angle, rad), the slide (travel, mm), or none. @default 'crank' */
  readonly drive?: 'crank' | 'slider' | 'none';
}

/**
 * An offset slider-crank: die body with crank pivot O2 at the origin and a slide along +x through (0, e); links
 * `crank` (O2→A, r) and `rod` (A→B, l); plate `slider` with its origin at pin B, sliding on the die body. Joints `O2`,
 * `A`, `B` (revolute) and `slide` (prismatic; travel = x of B, mm). Driver `crank` (actuator = θ, rad) or `slider`
 * (actuator = x of B, mm). The initial pose is the closed-form assembly at `theta` with the slider right of the crank.
 */
export function buildSliderCrank(dims: SliderCrankDimensions, options: SliderCrankOptions = {}): Mechanism {
  const { r, l, e } = dims;
  const theta = options.theta ?? 0;
  const ax = r * Math.cos(theta);
  const ay = r * Math.sin(theta);
  let bx = sliderCrankPosition(dims, theta);
  if (Number.isNaN(bx)) bx = ax + l; // not assemblable: a start the solver can report on
  const drive = options.drive ?? 'crank';
  const drivers: DriverSpec[] =
    drive === 'crank' ? [{ id: 'crank', joint: 'O2' }] : drive === 'slider' ? [{ id: 'slider', joint: 'slide' }] : [];
  return defineMechanism({
    bodies: [
      { id: 'die_body', kind: 'die_body', points: { O2: [0, 0], slide: [0, e] } },
      { id: 'crank', kind: 'link', layer: 1, points: { O2: [0, 0], A: [r, 0] }, initial: { x: 0, y: 0, phi: theta } },
      {
        id: 'rod',
        kind: 'link',
        layer: 2,
        points: { A: [0, 0], B: [l, 0] },
        initial: { x: ax, y: ay, phi: Math.atan2(e - ay, bx - ax) },
      },
      { id: 'slider', kind: 'plate', layer: 1, points: { B: [0, 0] }, initial: { x: bx, y: e, phi: 0 } },
    ],
    joints: [
      { kind: 'revolute', id: 'O2', bodyI: 'die_body', pointI: [0, 0], bodyJ: 'crank', pointJ: [0, 0] },
      { kind: 'revolute', id: 'A', bodyI: 'crank', pointI: [r, 0], bodyJ: 'rod', pointJ: [0, 0] },
      { kind: 'revolute', id: 'B', bodyI: 'rod', pointI: [l, 0], bodyJ: 'slider', pointJ: [0, 0] },
      {
        kind: 'prismatic',
        id: 'slide',
        bodyI: 'die_body',
        pointI: [0, e],
        axisI: [1, 0],
        bodyJ: 'slider',
        pointJ: [0, 0],
        axisJ: [1, 0],
      },
    ],
    drivers,
  });
}
