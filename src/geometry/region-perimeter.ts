import { ringPerimeter } from './ring-perimeter.js';
import type { Region } from './types.js';

/** Total boundary length of a region, mm: the outer ring plus every hole (the whole length the melt wets). */
export function regionPerimeter(region: Region): number {
  let length = ringPerimeter(region.outer);
  for (const hole of region.holes) length += ringPerimeter(hole);
  return length;
}
