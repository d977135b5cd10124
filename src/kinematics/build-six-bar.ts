import type { Point } from '../geometry/index.js';
import { buildFromPins } from './build-from-pins.js';
import type { Mechanism } from './mechanism.js';

/** The two six-bar chains (Norton, *Design of Machinery*; Erdman, Sandor & Kota, *Mechanism Design*). */
export type SixBarChain = 'watt' | 'stephenson';

const WATT_PINS: Readonly<Record<string, Point>> = {
  O2: [0, 0],
  A: [20, 34.64101615137755],
  B: [110, 80],
  O4: [100, 0],
  C: [150, 60],
  D: [200, 75],
  O6: [190, -10],
};

const STEPHENSON_PINS: Readonly<Record<string, Point>> = {
  O2: [0, 0],
  A: [20, 34.64101615137755],
  B: [110, 80],
  O4: [100, 0],
  C: [70, 110],
  D: [20, 150],
  O6: [-40, 90],
};

/**
 * A one-degree-of-freedom six-bar (7 revolute joints, Grübler mobility 1) drawn in an assembled configuration, for
 * tests and examples; `pins` overrides any drawn pin position (die-body frame, mm).
 * - `'watt'`: two four-bars in series. Crank O2–A, coupler A–B, ternary rocker O4–B–C, coupler2 C–D, output D–O6. The
 *   two ternary bodies (die body and rocker) share joint O4.
 * - `'stephenson'`: a dyad hung on a four-bar's coupler point. Crank O2–A, ternary coupler A–B–C, rocker O4–B, link5
 *   C–D, link6 D–O6. The ternary bodies (die body and coupler) share no joint.
 * Driver `crank` on O2 (actuator = φ of the crank, whose x axis points O2→A, rad).
 */
export function buildSixBar(chain: SixBarChain, pins: Readonly<Record<string, Point>> = {}): Mechanism {
  if (chain === 'watt') {
    return buildFromPins({
      pins: { ...WATT_PINS, ...pins },
      bodies: [
        { id: 'die_body', kind: 'die_body', pins: ['O2', 'O4', 'O6'] },
        { id: 'crank', kind: 'link', layer: 1, pins: ['O2', 'A'] },
        { id: 'coupler', kind: 'link', layer: 2, pins: ['A', 'B'] },
        { id: 'rocker', kind: 'plate', layer: 1, pins: ['O4', 'B', 'C'] },
        { id: 'coupler2', kind: 'link', layer: 2, pins: ['C', 'D'] },
        { id: 'output', kind: 'link', layer: 1, pins: ['O6', 'D'] },
      ],
      drivers: [{ id: 'crank', joint: 'O2' }],
    });
  }
  return buildFromPins({
    pins: { ...STEPHENSON_PINS, ...pins },
    bodies: [
      { id: 'die_body', kind: 'die_body', pins: ['O2', 'O4', 'O6'] },
      { id: 'crank', kind: 'link', layer: 1, pins: ['O2', 'A'] },
      { id: 'coupler', kind: 'plate', layer: 2, pins: ['A', 'B', 'C'] },
      { id: 'rocker', kind: 'link', layer: 1, pins: ['O4', 'B'] },
      { id: 'link5', kind: 'link', layer: 3, pins: ['C', 'D'] },
      { id: 'link6', kind: 'link', layer: 1, pins: ['O6', 'D'] },
    ],
    drivers: [{ id: 'crank', joint: 'O2' }],
  });
}
