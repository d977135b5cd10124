/**
 * The one place where millimetre regions become clipper-lib's integer paths and back (internal to the geometry folder;
 * `CLIPPER_SCALE` is public).
 */
import ClipperLib from 'clipper-lib';
import { signedRingArea } from './signed-ring-area.js';
import type { Point, Region, Ring } from './types.js';

/**
 * Integer clipper units per millimetre: clipper-lib works on integer coordinates, so every boolean and offset rounds
 * its input and output to a grid of 1/CLIPPER_SCALE mm = 0.1 µm. Within ±4.7 m (clipper-lib's loRange, 47 453 132
 * units) it runs on plain doubles; beyond that it switches to slower 128-bit arithmetic, and beyond ±4.5·10^11 mm
 * (hiRange) it throws.
 */
export const CLIPPER_SCALE = 1e4;

// clipper-lib reports internal errors through alert(), which Node lacks: make them ordinary exceptions, once.
(ClipperLib as unknown as { Error: (message: string) => never }).Error = (message: string) => {
  throw new Error(`clipper: ${message}`);
};

/**
 * The ring as a clipper path, rounded to the integer grid.
 *
 * @throws RangeError when a coordinate is not finite (clipper would silently produce garbage).
 */
export function toClipperPath(ring: Ring): ClipperLib.Path {
  return ring.map(([x, y]) => {
    if (!Number.isFinite(x) || !Number.isFinite(y)) throw new RangeError('clipper: a coordinate is not finite');
    return { X: Math.round(x * CLIPPER_SCALE), Y: Math.round(y * CLIPPER_SCALE) };
  });
}

/**
 * Every ring of the regions as clipper paths, outer rings counter-clockwise and holes clockwise (clipper's offset and
 * non-zero filling rely on it), rings of fewer than three points left out.
 */
export function toClipperPaths(regions: readonly Region[]): ClipperLib.Paths {
  const paths: ClipperLib.Paths = [];
  for (const region of regions) {
    if (region.outer.length >= 3) paths.push(oriented(toClipperPath(region.outer), true));
    for (const hole of region.holes) if (hole.length >= 3) paths.push(oriented(toClipperPath(hole), false));
  }
  return paths;
}

function oriented(path: ClipperLib.Path, ccw: boolean): ClipperLib.Path {
  return ClipperLib.Clipper.Area(path) > 0 === ccw ? path : path.reverse();
}

function fromClipperPath(path: ClipperLib.Path): Point[] {
  return path.map((p) => [p.X / CLIPPER_SCALE, p.Y / CLIPPER_SCALE] as const);
}

/** Orients a finished ring: clipper already returns outer rings CCW and holes CW; this only guards that promise. */
function orientedRing(ring: Point[], ccw: boolean): Point[] {
  return signedRingArea(ring) > 0 === ccw ? ring : ring.reverse();
}

/**
 * The regions of a clipper result tree, mm, outer rings counter-clockwise and holes clockwise; islands inside holes
 * come back as regions of their own. Rings of fewer than three points are dropped.
 */
export function regionsFromPolyTree(tree: ClipperLib.PolyTree): Region[] {
  const regions: Region[] = [];
  for (const ex of ClipperLib.JS.PolyTreeToExPolygons(tree)) {
    if (ex.outer.length < 3) continue;
    regions.push({
      outer: orientedRing(fromClipperPath(ex.outer), true),
      holes: ex.holes.filter((h) => h.length >= 3).map((h) => orientedRing(fromClipperPath(h), false)),
    });
  }
  return regions;
}

/** The kinds of boolean operation clipper performs. */
export type BooleanOperation = 'union' | 'difference' | 'intersection' | 'xor';

const CLIP_TYPE: Record<BooleanOperation, ClipperLib.ClipType> = {
  union: ClipperLib.ClipType.ctUnion,
  difference: ClipperLib.ClipType.ctDifference,
  intersection: ClipperLib.ClipType.ctIntersection,
  xor: ClipperLib.ClipType.ctXor,
};

/**
 * A boolean operation between two sets of regions, mm, with non-zero filling on both sides (so regions within a set
 * may overlap and count once).
 */
export function booleanRegions(
  operation: BooleanOperation,
  subject: readonly Region[],
  clip: readonly Region[],
): Region[] {
  const clipper = new ClipperLib.Clipper();
  clipper.AddPaths(toClipperPaths(subject), ClipperLib.PolyType.ptSubject, true);
  clipper.AddPaths(toClipperPaths(clip), ClipperLib.PolyType.ptClip, true);
  const tree = new ClipperLib.PolyTree();
  const fill = ClipperLib.PolyFillType.pftNonZero;
  clipper.Execute(CLIP_TYPE[operation], tree, fill, fill);
  return regionsFromPolyTree(tree);
}
