import type { Point } from '../geometry/index.js';
import { arcChainPivots } from './arc-chain-pivots.js';
import { buildFromPins, type PinnedBodySpec } from './build-from-pins.js';
import type { Mechanism } from './mechanism.js';

/** Options of `buildBracedChain`. */
export interface BracedChainOptions {
  /** Pivot-to-pivot length of every plate, mm. @default 30 */
  readonly plateLength?: number;
  /** Distance between the ground pivots as a fraction of the chain length. @default 0.75 */
  readonly spanRatio?: number;
  /** Length of every bracing link, mm. @default 1.6 × plateLength */
  readonly linkLength?: number;
}

/**
 * A chain of N ≥ 3 plates pinned to the die body at both ends (N − 2 degrees of freedom) braced by N − 3 binary links
 * from the die body to plates 2 … N−2, leaving one degree of freedom: 2N − 2 bodies in all (N = 3 is a four-bar). The
 * shape of a die's plate chain held by guide links. Pivots `P0` … `PN` lie on one arc from (0, 0) to (span, 0),
 * bulging up; link k runs from ground pivot `Gk` to pin `Qk` on plate k (mid-plate, offset outwards). Bodies
 * `plate1` … `plateN`, `link2` … `link(N−2)`; driver `input` on `P0` (actuator = φ of plate1, rad). The initial pose
 * is the drawn, exactly assembled configuration. For tests and benchmarks of large mechanisms.
 */
export function buildBracedChain(plateCount: number, options: BracedChainOptions = {}): Mechanism {
  if (!Number.isInteger(plateCount) || plateCount < 3) {
    throw new Error(`buildBracedChain: at least 3 plates needed, got ${plateCount}`);
  }
  const length = options.plateLength ?? 30;
  const span = (options.spanRatio ?? 0.75) * plateCount * length;
  const linkLength = options.linkLength ?? 1.6 * length;
  const pivots = arcChainPivots(
    Array.from({ length: plateCount }, () => length),
    [0, 0],
    [span, 0],
    1,
  );
  const pins: Record<string, Point> = {};
  pivots.forEach((p, k) => {
    pins[`P${k}`] = p;
  });
  const bodies: PinnedBodySpec[] = [];
  const groundPins = ['P0', `P${plateCount}`];
  for (let k = 1; k <= plateCount; k++) {
    const plate: string[] = [`P${k - 1}`, `P${k}`];
    if (k >= 2 && k <= plateCount - 2) {
      const p = pivots[k - 1]!;
      const q = pivots[k]!;
      const ux = (q[0] - p[0]) / length;
      const uy = (q[1] - p[1]) / length;
      // Outwards is the left normal: the chain turns clockwise about its arc centre.
      const pin: Point = [0.5 * (p[0] + q[0]) - 0.35 * length * uy, 0.5 * (p[1] + q[1]) + 0.35 * length * ux];
      const tilt = (25 * Math.PI) / 180;
      const ox = -uy * Math.cos(tilt) - ux * Math.sin(tilt);
      const oy = ux * Math.cos(tilt) - uy * Math.sin(tilt);
      pins[`Q${k}`] = pin;
      pins[`G${k}`] = [pin[0] + linkLength * ox, pin[1] + linkLength * oy];
      plate.push(`Q${k}`);
      groundPins.push(`G${k}`);
      bodies.push({ id: `link${k}`, kind: 'link', layer: 3, pins: [`G${k}`, `Q${k}`] });
    }
    bodies.push({ id: `plate${k}`, kind: 'plate', layer: 1 + ((k + 1) % 2), pins: plate });
  }
  bodies.unshift({ id: 'die_body', kind: 'die_body', pins: groundPins });
  return buildFromPins({ pins, bodies, drivers: [{ id: 'input', joint: 'P0' }] });
}
