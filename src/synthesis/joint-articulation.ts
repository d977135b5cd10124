import type { PlateChain } from './plate-chain.js';

/**
 * How far each interior pivot turns across the stations: for pivot k (k = 1 … N − 1, between plates k − 1 and k),
 * the spread (largest − smallest) of the relative angle θ_k − θ_{k−1} over the stations, radians, unwrapped about the
 * first station's value. Entry k − 1 of the result is pivot k. A pivot that hardly turns adds a degree of freedom no
 * binary link can take up (docs/MODEL.md §3, "Fit and links as one problem"): its two plates are one plate.
 */
export function jointArticulation(chain: PlateChain): number[] {
  const n = chain.lengthsMm.length;
  const spreads: number[] = [];
  for (let k = 1; k < n; k++) {
    let lo = 0;
    let hi = 0;
    let reference = Number.NaN;
    for (const pivots of chain.pivots) {
      const a = pivots[k - 1]!;
      const b = pivots[k]!;
      const c = pivots[k + 1]!;
      const rel = Math.atan2(c[1] - b[1], c[0] - b[0]) - Math.atan2(b[1] - a[1], b[0] - a[0]);
      if (Number.isNaN(reference)) reference = rel;
      // unwrap about the first station so a bend near ±π does not look like a full turn
      const d = Math.atan2(Math.sin(rel - reference), Math.cos(rel - reference));
      lo = Math.min(lo, d);
      hi = Math.max(hi, d);
    }
    spreads.push(hi - lo);
  }
  return spreads;
}
