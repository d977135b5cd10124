/**
 * Settings for the wall-thickness measurements (`maxInscribedCircle`, `measureMinWall`, `measureWalls` by medial discs
 * and normal chords; `findThinWalls` by morphological opening); every field has a default fitted to extrusion profiles
 * of 1–500 mm with walls of 0.3 mm and up.
 */
export interface WallOptions {
  /** Chord-to-arc gap allowed on the round joins of the inward offsets that bracket the largest inscribed circle, mm.
   * Clipper may take up to 2.25× this on a short arc, so those offsets err by at most about 2.25 × this plus the
   * clipper grid (1e-4 mm). @default 0.0005 */
  readonly arcToleranceMm: number;
  /** Chord-to-arc gap allowed on the round joins of the morphological opening used to find thin walls, mm; coarser
   * than `arcToleranceMm` because the opening's outward offset dominates the cost of the thin-wall search, and its
   * error is absorbed by `noiseMarginMm`. @default 0.002 */
  readonly openingArcToleranceMm: number;
  /** The opening is grown by this much before it is taken away from the region, so that arc chords and grid rounding
   * leave no hairline residue along walls that are thick enough. Must be at least 2.25 × `openingArcToleranceMm` +
   * 2e-4 mm; it shrinks each residue piece by about this much, which can delay the flag on a gently narrowing neck by
   * a negligible amount. @default 0.005 */
  readonly noiseMarginMm: number;
  /** Residue pieces smaller than this are negligible and never reported as thin walls, mm². @default 0.001 */
  readonly minPieceAreaMm2: number;
  /** Slack ε on the corner-sliver test: a piece within r·cot(α/2) + ε of a single convex corner is a sharp corner,
   * not a thin wall, mm. @default 0.01 */
  readonly cornerSlackMm: number;
  /** Fillets and chamfers: a run of convex vertices joined by edges no longer than this counts as one rounded corner
   * (its residue is ignored like a sharp corner's); a longer edge inside the run is an end face, so the residue round
   * it is a real thin wall. Covers fillets of a few mm radius drawn with 10–15° segments and chamfers up to this size.
   * @default 1 */
  readonly cornerDetailMm: number;
  /** Boundary samples for the wall measurement (`measureWalls`) are about this far apart along every segment (each
   * segment at least once), mm. @default 0.25 */
  readonly sampleSpacingMm: number;
  /** At most about this many boundary samples: on longer perimeters the spacing grows to perimeter / this, so the
   * cost stays bounded (the refinement keeps the result exact on straight and circular walls). @default 20000 */
  readonly maxSamples: number;
  /** Two faces are the two sides of one wall when their inward normals are at least π − this apart, radians: walls
   * tapering by up to this much are measured across, while faces meeting at a wider convex corner (a 90° corner, the
   * end face of a strip) never count as a wall. @default π/4 */
  readonly facingAngleRad: number;
  /** A medial disc is computed at a boundary sample only when half its chord (a bound on the disc) exceeds the largest
   * disc found by more than this, so the thickest wall is within twice this of the exact one, mm. @default 1e-5 */
  readonly radiusResolutionMm: number;
  /** The golden-section refinement of the thinnest and thickest samples stops when its bracket along the boundary is
   * below this, mm. @default 1e-6 */
  readonly refineResolutionMm: number;
}

/** Default wall settings, documented on `WallOptions`. */
export const DEFAULT_WALL_OPTIONS: WallOptions = Object.freeze({
  arcToleranceMm: 0.0005,
  openingArcToleranceMm: 0.002,
  noiseMarginMm: 0.005,
  minPieceAreaMm2: 0.001,
  cornerSlackMm: 0.01,
  cornerDetailMm: 1,
  sampleSpacingMm: 0.25,
  maxSamples: 20000,
  facingAngleRad: Math.PI / 4,
  radiusResolutionMm: 1e-5,
  refineResolutionMm: 1e-6,
});

/**
 * Fills in defaults and checks a partial set of wall options once, so the algorithms can trust what they receive.
 *
 * @throws RangeError when a setting is not a positive finite number, or `noiseMarginMm` is too small for
 *   `openingArcToleranceMm`.
 */
export function resolveWallOptions(partial: Partial<WallOptions> = {}): WallOptions {
  const o: WallOptions = { ...DEFAULT_WALL_OPTIONS, ...partial };
  for (const [key, value] of Object.entries(o)) {
    if (!(Number.isFinite(value) && value > 0)) throw new RangeError(`wall options: ${key} must be a positive number`);
  }
  if (o.noiseMarginMm < 2.25 * o.openingArcToleranceMm + 2e-4) {
    throw new RangeError('wall options: noiseMarginMm must be at least 2.25 × openingArcToleranceMm + 2e-4 mm');
  }
  if (!(o.facingAngleRad < Math.PI / 2)) throw new RangeError('wall options: facingAngleRad must be below π/2');
  return o;
}
