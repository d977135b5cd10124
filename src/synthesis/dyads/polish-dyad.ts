import type { Point } from '../../geometry/index.js';
import { solveSmall } from './small-linear.js';
import { placePoint, type RelativePose } from './relative-pose.js';

/** Outcome of `polishDyad`: the polished pins and whether the equations were met. */
export interface PolishedDyad {
  readonly centre: Point;
  readonly circlePointLocal: Point;
  readonly converged: boolean;
  readonly iterations: number;
}

/**
 * Newton's method on the equal-distance equations Fᵢ = |C − Pᵢ(c)|² − |C − P₁(c)|² = 0, i = 2…n, in the four unknowns
 * (C, c), with ∂Fᵢ/∂C = 2(P₁ − Pᵢ) and ∂Fᵢ/∂c = 2R₁ᵀ(C − P₁) − 2Rᵢᵀ(C − Pᵢ). With 4 positions (3 equations) each step
 * is the minimum-norm one, Δ = Jᵀ(JJᵀ)⁻¹(−F), which converges quadratically onto the nearest point of the solution
 * curve (Ben-Israel, J. Math. Anal. Appl. 15, 1966); with 5 the system is square; with more, Gauss–Newton.
 * `converged` when max|Fᵢ| is at rounding level or the step ≤ 1e-14·max(scale, M); false when a step is singular or
 * not finite (the last finite iterate is returned) or the iterations run out. Rounding level is 1e-15·V·max(V, M),
 * V = max|C − Pᵢ| and M the largest coordinate magnitude taking part (|C|, |c| + |dᵢ|): C − Pᵢ is a difference of
 * coordinates of size M, so a pair far from the origin (M ≫ V) cannot meet a test scaled by V² alone.
 */
export function polishDyad(
  poses: readonly RelativePose[],
  centre: Point,
  circlePointLocal: Point,
  scaleMm: number,
  maxIterations = 30,
): PolishedDyad {
  let x = [centre[0], centre[1], circlePointLocal[0], circlePointLocal[1]];
  const m = poses.length - 1;
  const pose0 = poses[0]!;
  for (let it = 0; it < maxIterations; it++) {
    const C: Point = [x[0]!, x[1]!];
    const c: Point = [x[2]!, x[3]!];
    const p1 = placePoint(pose0, c);
    const v1 = [C[0] - p1[0], C[1] - p1[1]] as const;
    const g1 = rotateBack(pose0.angleRad, v1);
    const f: number[] = [];
    const jac: number[][] = [];
    let fMax = 0;
    let vMax = v1[0] * v1[0] + v1[1] * v1[1];
    let magnitude = Math.max(
      Math.hypot(C[0], C[1]),
      Math.hypot(c[0], c[1]) + Math.hypot(pose0.origin[0], pose0.origin[1]),
    );
    for (let i = 1; i <= m; i++) {
      const pose = poses[i]!;
      const pi = placePoint(pose, c);
      const vi = [C[0] - pi[0], C[1] - pi[1]] as const;
      const gi = rotateBack(pose.angleRad, vi);
      const fi = vi[0] * vi[0] + vi[1] * vi[1] - v1[0] * v1[0] - v1[1] * v1[1];
      f.push(fi);
      fMax = Math.max(fMax, Math.abs(fi));
      vMax = Math.max(vMax, vi[0] * vi[0] + vi[1] * vi[1]);
      magnitude = Math.max(magnitude, Math.hypot(c[0], c[1]) + Math.hypot(pose.origin[0], pose.origin[1]));
      jac.push([2 * (p1[0] - pi[0]), 2 * (p1[1] - pi[1]), 2 * (g1[0] - gi[0]), 2 * (g1[1] - gi[1])]);
    }
    if (!Number.isFinite(fMax)) return { centre: C, circlePointLocal: c, converged: false, iterations: it };
    const v = Math.sqrt(vMax);
    if (fMax <= 1e-15 * v * Math.max(v, magnitude)) {
      return { centre: C, circlePointLocal: c, converged: true, iterations: it };
    }
    const step = newtonStep(jac, f);
    if (!step) return { centre: C, circlePointLocal: c, converged: false, iterations: it };
    x = x.map((v, k) => v + step[k]!);
    if (!x.every(Number.isFinite)) return { centre: C, circlePointLocal: c, converged: false, iterations: it + 1 };
    if (Math.hypot(...step) <= 1e-14 * Math.max(scaleMm, magnitude)) {
      return { centre: [x[0]!, x[1]!], circlePointLocal: [x[2]!, x[3]!], converged: true, iterations: it + 1 };
    }
  }
  return { centre: [x[0]!, x[1]!], circlePointLocal: [x[2]!, x[3]!], converged: false, iterations: maxIterations };
}

/** Rᵀ(angle)·v. */
function rotateBack(angle: number, v: readonly [number, number]): [number, number] {
  const c = Math.cos(angle);
  const s = Math.sin(angle);
  return [c * v[0] + s * v[1], -s * v[0] + c * v[1]];
}

function newtonStep(jac: number[][], f: number[]): number[] | null {
  const m = f.length;
  const neg = f.map((v) => -v);
  if (m === 4) return solveSmall(jac, neg);
  if (m < 4) {
    const jjt = jac.map((ri) => jac.map((rj) => ri.reduce((s, v, k) => s + v * rj[k]!, 0)));
    const y = solveSmall(jjt, neg);
    if (!y) return null;
    return [0, 1, 2, 3].map((k) => jac.reduce((s, row, i) => s + row[k]! * y[i]!, 0));
  }
  const jtj = [0, 1, 2, 3].map((a) => [0, 1, 2, 3].map((b) => jac.reduce((s, row) => s + row[a]! * row[b]!, 0)));
  const jtf = [0, 1, 2, 3].map((a) => jac.reduce((s, row, i) => s + row[a]! * neg[i]!, 0));
  return solveSmall(jtj, jtf);
}
