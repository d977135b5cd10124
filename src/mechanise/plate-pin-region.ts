import type { Point } from '../geometry/index.js';
import type { PlateShape } from '../synthesis/index.js';
import type { ChainBody } from './chain-topology.js';

/** Where on a plate a link pin may go, in the plate's own frame (x toward its next pivot, y away from the melt). */
export interface PlatePinRegion {
  /** Candidate circle points: a `steps` × `steps` grid over the region, those clear of the pivot holes. */
  grid(steps: number): Point[];
  /** Whether a point (plate frame, mm) may carry a link pin. */
  contains(p: Point): boolean;
}

/**
 * The plate body behind the pivot line, never on the melt side (docs/MODEL.md §2; `plateOutline`): x within the body's
 * pin span, y from `clearanceMm` behind the pivot line to `clearanceMm` short of the back edge (the plate reaches
 * `depthMm − e` behind its pivot line), and the pin's centre at least one hole diameter plus a ligament (e + hole
 * radius) from each pivot of the body. The plate's straight side edges are not checked: plates shorter than two
 * ligaments could otherwise carry no pin (the tool maker may widen the plate there). Empty for slider blocks.
 */
export function platePinRegion(body: ChainBody, shape: PlateShape, clearanceMm: number): PlatePinRegion {
  const e = shape.edgeOffsetMm;
  const back = Math.max(shape.depthMm - e, e);
  const [x0, x1] = body.pinSpanMm;
  const y0 = clearanceMm;
  const y1 = back - clearanceMm;
  const pivots = body.pivotsLocal;
  const spacing = e + shape.holeRadiusMm;
  const empty = body.role === 'slider' || !(x1 > x0) || !(y1 >= y0);
  const contains = (p: Point): boolean =>
    !empty &&
    p[0] >= x0 - 1e-9 &&
    p[0] <= x1 + 1e-9 &&
    p[1] >= y0 - 1e-9 &&
    p[1] <= y1 + 1e-9 &&
    pivots.every((q) => Math.hypot(p[0] - q[0], p[1] - q[1]) >= spacing - 1e-9);
  return {
    contains,
    grid(steps) {
      if (empty) return [];
      const at = (k: number, a: number, b: number) => (steps === 1 ? 0.5 * (a + b) : a + ((b - a) * k) / (steps - 1));
      const out: Point[] = [];
      for (let i = 0; i < steps; i++) {
        for (let j = 0; j < steps; j++) {
          const p: Point = [at(i, x0, x1), at(j, y0, y1)];
          if (contains(p)) out.push(p);
        }
      }
      return out;
    },
  };
}
