import type { Point } from '../../geometry/index.js';
import { solveSmall } from './small-linear.js';
import { placePoint, type RelativePose } from './relative-pose.js';

/** The pole of the displacement of B from station i to station j (0-based), A's frame, mm; null at infinity. */
export interface DisplacementPole {
  readonly i: number;
  readonly j: number;
  readonly pole: Point | null;
}

/**
 * The pole Pᵢⱼ: the one point of B's plane that occupies the same place in A at stations i and j, the fixed point of
 * x ↦ R(θⱼ − θᵢ)(x − dᵢ) + dⱼ (Erdman, Sandor & Kota, *Mechanism Design*; McCarthy & Soh, *Geometric Design of
 * Linkages*, ch. 3). Null for a pure translation: when |sin((θⱼ − θᵢ)/2)| ≤ `angleTolerance`.
 *
 * @param angleTolerance  radians (half-angle sine). @default 1e-9
 */
export function displacementPole(from: RelativePose, to: RelativePose, angleTolerance = 1e-9): Point | null {
  const dt = to.angleRad - from.angleRad;
  if (!(Math.abs(Math.sin(dt / 2)) > angleTolerance)) return null;
  const c = Math.cos(dt);
  const s = Math.sin(dt);
  // (I − R)·p = dⱼ − R·dᵢ, with R·dᵢ read off by placing dᵢ as if it were B's point under the rotation alone.
  const rd = placePoint({ angleRad: dt, origin: [0, 0] }, from.origin);
  const p = solveSmall(
    [
      [1 - c, s],
      [-s, 1 - c],
    ],
    [to.origin[0] - rd[0], to.origin[1] - rd[1]],
  );
  return p ? [p[0]!, p[1]!] : null;
}

/** All poles Pᵢⱼ, i < j, of a pose set, in order (0,1), (0,2), …; see `displacementPole`. */
export function displacementPoles(poses: readonly RelativePose[], angleTolerance = 1e-9): DisplacementPole[] {
  const out: DisplacementPole[] = [];
  for (let i = 0; i < poses.length; i++) {
    for (let j = i + 1; j < poses.length; j++) {
      out.push({ i, j, pole: displacementPole(poses[i]!, poses[j]!, angleTolerance) });
    }
  }
  return out;
}
