import type { Point } from '../geometry/index.js';

/**
 * How one end of the chain is held by the die body: a ground pivot fixed in every station, or a pivot running in a
 * straight slot (a prismatic joint with the die body) at `origin + travel·direction`.
 */
export type ChainEnd =
  | { readonly kind: 'pivot'; readonly point: Point }
  | {
      readonly kind: 'slot';
      readonly origin: Point;
      /** Unit direction of the slot. */
      readonly direction: Point;
      /** Travel of the pin along the slot at each station, mm. */
      readonly travelMm: readonly number[];
    };

/**
 * A chain of straight plates joined by pivots. Plate k joins pivot k to pivot k + 1 (k = 0..N−1); its pivot-to-pivot
 * length is the same in every station (the plates are rigid). Millimetres, die-body frame.
 */
export interface PlateChain {
  /** Pivot-to-pivot length of each plate, mm. */
  readonly lengthsMm: readonly number[];
  readonly start: ChainEnd;
  readonly end: ChainEnd;
  /** pivots[i][k] = pivot k at station i, mm; k = 0..N. */
  readonly pivots: readonly (readonly Point[])[];
  /**
   * Telescoping plates (0-based plate index): a pair of plates joined by a prismatic joint, whose pivot-to-pivot
   * length is `stationLengthsMm[i]` at station i (`lengthsMm[plate]` is their mean). Empty for a chain of rigid plates.
   */
  readonly telescoping: readonly { readonly plate: number; readonly stationLengthsMm: readonly number[] }[];
}

/** Where an end's pin sits at station i, mm. */
export function endPoint(end: ChainEnd, station: number): Point {
  if (end.kind === 'pivot') return end.point;
  const t = end.travelMm[station]!;
  return [end.origin[0] + t * end.direction[0], end.origin[1] + t * end.direction[1]];
}
