import ClipperLib from 'clipper-lib';
import { CLIPPER_SCALE, regionsFromPolyTree, toClipperPaths } from './clipper-edge.js';
import type { Region } from './types.js';

/** How corners are treated when a region grows or shrinks. */
export type OffsetJoin = 'round' | 'miter' | 'square';

/** Options for `offsetRegions`; every field has a default. */
export interface OffsetOptions {
  /** Corner treatment: `round` keeps every boundary point exactly `delta` from the input (the Minkowski sum with a
   * disc, the physical offset); `miter` keeps sharp corners; `square` cuts them flat at `delta`. @default 'round' */
  readonly join: OffsetJoin;
  /** For `miter`: the largest distance a mitred corner may reach, in multiples of |delta|; sharper corners are
   * squared off there. Clipper's own default. @default 2 */
  readonly miterLimit: number;
  /** For `round`: the largest gap allowed between a true arc and its chords, mm. Arcs get vertices on the true
   * circle, so the polygon lies inside the exact offset by at most about this much (up to 2.25× where clipper rounds
   * a short arc down to fewer steps). @default 0.005 */
  readonly arcToleranceMm: number;
}

/** Default offset options, documented on `OffsetOptions`. */
export const DEFAULT_OFFSET_OPTIONS: OffsetOptions = Object.freeze({
  join: 'round',
  miterLimit: 2,
  arcToleranceMm: 0.005,
});

const JOIN: Record<OffsetJoin, ClipperLib.JoinType> = {
  round: ClipperLib.JoinType.jtRound,
  miter: ClipperLib.JoinType.jtMiter,
  square: ClipperLib.JoinType.jtSquare,
};

/**
 * Regions grown (`deltaMm` > 0) or shrunk (`deltaMm` < 0) by a distance, mm, by clipper-lib's polygon offset; overlaps
 * merge and parts that vanish are dropped, so a region shrunk by more than its largest inscribed radius gives `[]`.
 * Outer rings come back counter-clockwise, holes clockwise; coordinates carry clipper's 1/CLIPPER_SCALE mm rounding.
 * Input orientation does not matter, but rings must be simple (see `validateRegion`).
 *
 * @param options Partial options; see `OffsetOptions` for each default.
 * @throws RangeError when `deltaMm` is not finite or an option is out of range.
 */
export function offsetRegions(
  regions: readonly Region[],
  deltaMm: number,
  options: Partial<OffsetOptions> = {},
): Region[] {
  const o: OffsetOptions = { ...DEFAULT_OFFSET_OPTIONS, ...options };
  if (!Number.isFinite(deltaMm)) throw new RangeError('offsetRegions: deltaMm must be finite');
  if (!(o.arcToleranceMm > 0)) throw new RangeError('offsetRegions: arcToleranceMm must be positive');
  if (!(o.miterLimit >= 1)) throw new RangeError('offsetRegions: miterLimit must be at least 1');
  const offset = new ClipperLib.ClipperOffset(o.miterLimit, o.arcToleranceMm * CLIPPER_SCALE);
  offset.AddPaths(toClipperPaths(regions), JOIN[o.join], ClipperLib.EndType.etClosedPolygon);
  const tree = new ClipperLib.PolyTree();
  offset.Execute(tree, deltaMm * CLIPPER_SCALE);
  return regionsFromPolyTree(tree);
}
