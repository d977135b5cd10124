import {
  type BoundingBox,
  boundingBox,
  type Point,
  pointInRegion,
  pointToRingDistance,
  type Region,
} from '../geometry/index.js';
import { DEFAULT_TOLERANCES } from '../numeric/index.js';

/** Why a point cannot be a ground pivot. */
export type GroundPivotRejection = 'GROUND_OUTSIDE_FRAME' | 'GROUND_IN_OPENING' | 'GROUND_IN_MELT';

/** Where ground pivots (centre points on the die body) may go. */
export interface GroundPivotRegion {
  /** The die-body frame: the die opening's bounding box grown by the frame margin, mm. */
  readonly frame: BoundingBox;
  /** Steel kept round a ground pivot's hole centre, mm. */
  readonly clearanceMm: number;
  /** The rule in words, for the result. */
  readonly rule: string;
  /** Null when `p` may carry a ground pivot, else why not. */
  check(p: Point): GroundPivotRejection | null;
  /** The allowed points of a `steps` × `steps` grid over the frame. */
  grid(steps: number): Point[];
}

/**
 * The die body outside the melt channel (docs/MODEL.md §2): a ground pivot lies inside the frame (the opening's
 * bounding box grown by `frameMarginMm`), outside the die opening and outside every station's orifice, with at least
 * `clearanceMm` of steel between its centre and the edge of each (its hole and ligament).
 */
export function groundPivotRegion(
  opening: Region,
  orifices: readonly Region[],
  frameMarginMm: number,
  clearanceMm: number,
): GroundPivotRegion {
  const box = boundingBox(opening.outer);
  const frame: BoundingBox = {
    minX: box.minX - frameMarginMm,
    minY: box.minY - frameMarginMm,
    maxX: box.maxX + frameMarginMm,
    maxY: box.maxY + frameMarginMm,
  };
  const tol = DEFAULT_TOLERANCES;
  const blocked = (p: Point, region: Region) =>
    pointInRegion(p, region, tol) !== 'outside' || regionEdgeDistance(p, region) < clearanceMm;
  const check = (p: Point): GroundPivotRejection | null => {
    if (p[0] < frame.minX || p[0] > frame.maxX || p[1] < frame.minY || p[1] > frame.maxY) {
      return 'GROUND_OUTSIDE_FRAME';
    }
    if (blocked(p, opening)) return 'GROUND_IN_OPENING';
    for (const orifice of orifices) if (blocked(p, orifice)) return 'GROUND_IN_MELT';
    return null;
  };
  return {
    frame,
    clearanceMm,
    rule:
      `a ground pivot lies in the die body: inside the frame x ${fmt(frame.minX)}…${fmt(frame.maxX)} mm, ` +
      `y ${fmt(frame.minY)}…${fmt(frame.maxY)} mm (the die opening's bounding box grown by ${fmt(frameMarginMm)} mm), ` +
      `outside the die opening and every station's orifice, its centre at least ${fmt(clearanceMm)} mm from their edges`,
    check,
    grid(steps) {
      const out: Point[] = [];
      for (let i = 0; i < steps; i++) {
        for (let j = 0; j < steps; j++) {
          const p: Point = [
            frame.minX + ((frame.maxX - frame.minX) * (i + 0.5)) / steps,
            frame.minY + ((frame.maxY - frame.minY) * (j + 0.5)) / steps,
          ];
          if (check(p) === null) out.push(p);
        }
      }
      return out;
    },
  };
}

/** Distance from `p` to the nearest edge of the region's rings, mm. */
export function regionEdgeDistance(p: Point, region: Region): number {
  let best = Number.POSITIVE_INFINITY;
  for (const ring of [region.outer, ...region.holes]) best = Math.min(best, pointToRingDistance(p, ring));
  return best;
}

function fmt(x: number): string {
  return String(Math.round(x * 10) / 10);
}
