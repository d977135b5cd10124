/**
 * Plain geometric data shared by every module. Millimetres, die-body frame, y up (as in DXF).
 */

/** A point in millimetres: `[x, y]`, y up. */
export type Point = readonly [x: number, y: number];

/** A closed ring of points; the closing edge from the last point back to the first is implied (no repeated point). */
export type Ring = readonly Point[];

/** An open chain of points. */
export type Polyline = readonly Point[];

/**
 * A planar region: one outer ring, counter-clockwise once normalised, and zero or more holes, clockwise once
 * normalised. Holes lie strictly inside the outer ring.
 */
export interface Region {
  readonly outer: Ring;
  readonly holes: readonly Ring[];
}
