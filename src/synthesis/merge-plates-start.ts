import { type ChainProblemSpec, chainFromParameters, chainLayout } from './chain-problem.js';

/**
 * A start vector for N − 1 plates from a solved N-plate chain with interior pivot `pivot` (1 … N − 1) removed: plates
 * `pivot − 1` and `pivot` become one plate along the chord between their outer pivots, whose length is the chord's
 * mean over the stations. When the removed pivot hardly turned, the start is the N-plate chain itself to within the
 * chord's spread, so the refinement starts next to an answer (the reverse of continuation by splitting). Null when
 * one of the two plates telescopes or the pivot is not interior.
 */
export function mergePlatesStart(
  x: Float64Array,
  spec: ChainProblemSpec,
  pivot: number,
): { x: Float64Array; spec: ChainProblemSpec } | null {
  const layout = chainLayout(spec);
  const n = layout.plateCount;
  if (pivot < 1 || pivot > n - 1) return null;
  if (layout.telescoping.includes(pivot - 1) || layout.telescoping.includes(pivot)) return null;
  const chain = chainFromParameters(x, spec);
  const next: ChainProblemSpec = {
    ...spec,
    plateCount: n - 1,
    telescoping: layout.telescoping.map((k) => (k > pivot ? k - 1 : k)),
  };
  const nl = chainLayout(next);
  const y = new Float64Array(nl.parameterCount);
  y.set(x.subarray(layout.start, layout.start + layout.startSize), nl.start);
  y.set(x.subarray(layout.end, layout.end + layout.endSize), nl.end);
  y.set(x.subarray(layout.extensions, layout.parameterCount), nl.extensions);
  let chordSum = 0;
  for (let i = 0; i < layout.stationCount; i++) {
    const a = chain.pivots[i]![pivot - 1]!;
    const c = chain.pivots[i]![pivot + 1]!;
    chordSum += Math.hypot(c[0] - a[0], c[1] - a[1]);
    for (let k = 0, j = 0; k < n; k++) {
      if (k === pivot) continue;
      y[nl.angles + i * (n - 1) + j] =
        k === pivot - 1 ? Math.atan2(c[1] - a[1], c[0] - a[0]) : x[layout.angles + i * n + k]!;
      j++;
    }
  }
  for (let k = 0, j = 0; k < n; k++) {
    if (k === pivot) continue;
    y[nl.lengths + j] = k === pivot - 1 ? chordSum / layout.stationCount : x[layout.lengths + k]!;
    j++;
  }
  return { x: y, spec: next };
}
