import { type RingWalk, wrapArc } from './ring-walk.js';

/**
 * A stretch of one station's outer boundary, counter-clockwise from `from` for `length`, mm: either common (every
 * station's boundary lies within the match tolerance of it) or differing.
 */
export interface BoundaryRun {
  /** Arc length where the run starts, in [0, perimeter), mm. */
  readonly from: number;
  /** Arc length the run covers, > 0, mm; the runs of one ring add up to its perimeter. */
  readonly length: number;
  readonly common: boolean;
}

/**
 * Turns every run that `flip` selects into the other kind and joins neighbours of the same kind, cyclically, so the
 * runs alternate again. A ring that ends as one run gives one run of the whole perimeter.
 */
export function relabelRuns(
  walk: RingWalk,
  runs: readonly BoundaryRun[],
  flip: (run: BoundaryRun) => boolean,
): BoundaryRun[] {
  const out: BoundaryRun[] = [];
  for (const run of runs) {
    const r = flip(run) ? { ...run, common: !run.common } : run;
    const last = out[out.length - 1];
    if (last && last.common === r.common) out[out.length - 1] = { ...last, length: last.length + r.length };
    else out.push(r);
  }
  if (out.length > 1 && out[0]!.common === out[out.length - 1]!.common) {
    const last = out.pop()!;
    out[0] = { from: last.from, length: last.length + out[0]!.length, common: last.common };
  }
  if (out.length === 1)
    return [{ from: wrapArc(walk, out[0]!.from), length: walk.perimeterMm, common: out[0]!.common }];
  return out;
}
