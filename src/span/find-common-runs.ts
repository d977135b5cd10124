import type { BoundaryRun } from './boundary-run.js';
import { pointAtArc, type RingWalk, sampleArcs, wrapArc } from './ring-walk.js';
import { isNearBoundary, type SegmentGrid } from './segment-grid.js';

/**
 * Splits one station's outer boundary into runs that lie within `tolMm` of every other station's boundary (common)
 * and runs that do not (differing), in counter-clockwise order. The boundary is sampled every
 * max(tol, min(0.1 mm, perimeter/1000)), so a differing run of 0.2 mm is seen twice, and each change of kind is
 * bisected to tol/20, mm. Cost: samples × stations grid look-ups, so it grows linearly with the number of stations.
 *
 * @param others one grid per other station, built for a query radius of at least `tolMm`.
 */
export function findCommonRuns(walk: RingWalk, others: readonly SegmentGrid[], tolMm: number): BoundaryRun[] {
  // the station that was last too far is asked first: neighbouring samples tend to fail on the same one
  let lastFar = 0;
  const isCommon = (s: number): boolean => {
    const p = pointAtArc(walk, s);
    if (others.length > 0 && !isNearBoundary(others[lastFar]!, p, tolMm)) return false;
    for (let j = 0; j < others.length; j++) {
      if (j !== lastFar && !isNearBoundary(others[j]!, p, tolMm)) {
        lastFar = j;
        return false;
      }
    }
    return true;
  };
  const samples = sampleArcs(walk, Math.max(tolMm, Math.min(0.1, walk.perimeterMm / 1000)));
  const flags = samples.map(isCommon);
  const n = samples.length;
  const changesAt = (k: number) => flags[k] !== flags[(k + n - 1) % n];
  const first = flags.findIndex((_, k) => changesAt(k));
  if (first < 0) return [{ from: 0, length: walk.perimeterMm, common: flags[0]! }];
  // the arc length where the kind changes between sample k − 1 and sample k
  const transition = (k: number): number => {
    let lo = samples[(k + n - 1) % n]!;
    let hi = samples[k]!;
    if (hi < lo) hi += walk.perimeterMm;
    const kindAtLo = flags[(k + n - 1) % n]!;
    for (let i = 0; i < 40 && hi - lo > tolMm / 20; i++) {
      const mid = (lo + hi) / 2;
      if (isCommon(mid) === kindAtLo) lo = mid;
      else hi = mid;
    }
    return wrapArc(walk, (lo + hi) / 2);
  };
  const runs: BoundaryRun[] = [];
  const start = transition(first);
  let from = start;
  for (let offset = 1; offset <= n; offset++) {
    const k = (first + offset) % n;
    if (!changesAt(k)) continue;
    const to = k === first ? start : transition(k);
    const length = wrapArc(walk, to - from);
    if (length > 0) runs.push({ from, length, common: flags[(k + n - 1) % n]! });
    from = to;
  }
  return runs;
}
