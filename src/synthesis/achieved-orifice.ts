import {
  differenceRegions,
  intersectRegions,
  type Region,
  regionArea,
  regionsArea,
  unionRegions,
} from '../geometry/index.js';

/**
 * The die opening as the envelope of every station: the union of their outer boundaries (a mandrel's holes are not
 * part of the die body's cut). Whatever of it the plates leave uncovered is orifice.
 */
export function stationEnvelope(orifices: readonly Region[]): Region {
  const union = unionRegions(orifices.map((o) => ({ outer: o.outer, holes: [] })));
  return union.reduce((a, b) => (regionsArea([b]) > regionsArea([a]) ? b : a));
}

/** What a set of plates leaves open: the piece forming the orifice, and any other piece (melt would leak there). */
export interface PlateOpening {
  readonly orifice: Region;
  /** Pieces of the opening the plates leave uncovered apart from the orifice, mm. */
  readonly strays: readonly Region[];
}

/**
 * What a set of plates leaves of the opening: opening − union(plates). The piece that overlaps the target most is the
 * orifice (less the station's holes, a mandrel); any other piece larger than `strayAreaMm2` is opening the plates
 * fail to cover, where melt would leak. Empty orifice ring when the plates close the opening completely.
 */
export function plateOpening(
  opening: Region,
  plates: readonly Region[],
  target: Region,
  strayAreaMm2 = 1e-3,
): PlateOpening {
  const open = differenceRegions([opening], unionRegions(plates));
  let bestIndex = -1;
  let bestArea = 0;
  open.forEach((piece, i) => {
    const overlap = regionsArea(intersectRegions([piece], [{ outer: target.outer, holes: [] }]));
    if (overlap > bestArea) {
      bestArea = overlap;
      bestIndex = i;
    }
  });
  const strays = open.filter((piece, i) => i !== bestIndex && regionArea(piece) > strayAreaMm2);
  const best = open[bestIndex];
  if (!best) return { orifice: { outer: [], holes: [] }, strays };
  if (target.holes.length === 0) return { orifice: best, strays };
  const withHoles = differenceRegions(
    [best],
    target.holes.map((h) => ({ outer: [...h].reverse(), holes: [] })),
  );
  const orifice = withHoles.reduce((a, b) => (regionArea(b) > regionArea(a) ? b : a), withHoles[0] ?? best);
  return { orifice, strays };
}

/** The orifice alone (see `plateOpening`). */
export function achievedOrifice(opening: Region, plates: readonly Region[], target: Region): Region {
  return plateOpening(opening, plates, target).orifice;
}
