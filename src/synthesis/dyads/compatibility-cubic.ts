import type { Point } from '../../geometry/index.js';
import { det3 } from './small-linear.js';
import { localPoint, type RelativePose } from './relative-pose.js';

/**
 * Row j of the compatibility condition at centre C, referred to station r: seen from B the centre sits at
 * Cᵢ' = R(−θᵢ)(C − dᵢ), and a circle point c exists when 2(Cⱼ' − Cᵣ')·c = |Cⱼ'|² − |Cᵣ'|² holds for every j, i.e.
 * when the rows [2(Cⱼ' − Cᵣ'), −(|Cⱼ'|² − |Cᵣ'|²)] have (c, 1) in their null space. Every entry is affine in C
 * (|Cⱼ'|² − |Cᵣ'|² = −2C·(dⱼ − dᵣ) + |dⱼ|² − |dᵣ|²), so for three rows the determinant is a cubic in C: the
 * centre-point curve of four positions (McCarthy & Soh, *Geometric Design of Linkages*, ch. 4; Sandor & Erdman,
 * *Advanced Mechanism Design* vol. 2, ch. 3).
 */
function row(poses: readonly RelativePose[], r: number, j: number, c: Point): number[] {
  const cj = localPoint(poses[j]!, c);
  const cr = localPoint(poses[r]!, c);
  return [2 * (cj[0] - cr[0]), 2 * (cj[1] - cr[1]), -(cj[0] * cj[0] + cj[1] * cj[1] - cr[0] * cr[0] - cr[1] * cr[1])];
}

/** d(row)/dt along C = base + t·u: [2R(−θⱼ)u − 2R(−θᵣ)u, 2u·(dⱼ − dᵣ)], constant because the row is affine in C. */
function rowRate(poses: readonly RelativePose[], r: number, j: number, u: Point): number[] {
  const pj = poses[j]!;
  const pr = poses[r]!;
  const uj = localPoint({ angleRad: pj.angleRad, origin: [0, 0] }, u);
  const ur = localPoint({ angleRad: pr.angleRad, origin: [0, 0] }, u);
  const dx = pj.origin[0] - pr.origin[0];
  const dy = pj.origin[1] - pr.origin[1];
  return [2 * (uj[0] - ur[0]), 2 * (uj[1] - ur[1]), 2 * (u[0] * dx + u[1] * dy)];
}

/**
 * Coefficients [k₀, k₁, k₂, k₃] of the compatibility cubic along the line C(t) = base + t·u: the determinant of the
 * rows of `stations` (three station indices, referred to station `reference`), expanded by multilinearity into the
 * powers of t. Its roots are where the line meets the centre-point curve of {reference} ∪ stations; when `base` is a
 * pole of those positions, k₀ = 0 and the other two meets are the roots of k₃t² + k₂t + k₁.
 */
export function compatibilityCubic(
  poses: readonly RelativePose[],
  reference: number,
  stations: readonly [number, number, number],
  base: Point,
  u: Point,
): [number, number, number, number] {
  const r0 = stations.map((j) => row(poses, reference, j, base));
  const r1 = stations.map((j) => rowRate(poses, reference, j, u));
  const k: [number, number, number, number] = [0, 0, 0, 0];
  for (let mask = 0; mask < 8; mask++) {
    const pick = [0, 1, 2].map((i) => ((mask >> i) & 1 ? r1[i]! : r0[i]!));
    const degree = (mask & 1) + ((mask >> 1) & 1) + ((mask >> 2) & 1);
    k[degree] = k[degree]! + det3(pick[0]!, pick[1]!, pick[2]!);
  }
  return k;
}
