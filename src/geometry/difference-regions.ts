import { booleanRegions } from './clipper-edge.js';
import type { Region } from './types.js';

/**
 * The parts of `subject` not covered by `clip`, mm, as disjoint regions (outer rings CCW, holes CW); for example the
 * orifice is `differenceRegions([opening], plates)`. Coordinates are rounded to clipper's grid of 1/CLIPPER_SCALE mm.
 */
export function differenceRegions(subject: readonly Region[], clip: readonly Region[]): Region[] {
  return booleanRegions('difference', subject, clip);
}
