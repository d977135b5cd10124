import type { Point } from '../geometry/index.js';

/** How a binary link's pins were found (Burmester theory for finitely separated positions). */
export type LinkSynthesis =
  | 'any-centre'
  | 'circumcentre'
  | 'centre-point-curve'
  | 'burmester-point'
  | 'circle-fit'
  | 'least-squares';

/**
 * A binary link (RR dyad) between body A (the die body or a plate) and plate B: one pin fixed in each, a constant
 * distance apart at every station (Erdman, Sandor & Kota, *Mechanism Design*).
 */
export interface LinkDesign {
  /** `link_1`, `link_2`, … once placed in a mechanism; `candidate` before. */
  readonly id: string;
  /** `die_body` or a plate body id. */
  readonly bodyA: string;
  /** Pin in A's frame, mm (the ground pivot, die-body frame, when A is the die body). */
  readonly pinA: Point;
  /** The plate body the link drives or guides. */
  readonly bodyB: string;
  /** Pin in B's frame, mm (the circle point). */
  readonly pinB: Point;
  /** Pin-to-pin length, mm. */
  readonly lengthMm: number;
  /** Largest change of the pin distance over the distinct stations, mm: 0 up to round-off for an exact dyad. */
  readonly residualMm: number;
  readonly synthesis: LinkSynthesis;
}
