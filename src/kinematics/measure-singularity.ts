import { LuDecomposition, SingularValueDecomposition } from 'ml-matrix';
import { evaluateConstraints } from './evaluate-constraints.js';
import type { Pose } from './pose.js';

/** How close a configuration is to a singular one. */
export interface SingularityMeasure {
  /** Smallest singular value of the scaled driven Jacobian (dimensionless; 0 at a singular configuration). */
  readonly minSingularValue: number;
  /** Largest singular value of the scaled driven Jacobian. */
  readonly maxSingularValue: number;
  /** 2-norm condition number σmax/σmin (Infinity when singular). */
  readonly conditionNumber: number;
  /** Sign of the driven-Jacobian determinant, ±1, or 0 when singular or not square (see `PositionResult`). */
  readonly jacobianSign: -1 | 0 | 1;
}

/**
 * Singular values and determinant sign of the driven Jacobian [Φq; drivers] at `pose`, with x, y and Lc·φ as unknowns
 * so the values are dimensionless (Haug). Exact but allocating (ml-matrix SVD): for monitoring and reports;
 * the continuation uses the cheaper condition estimate of its LU.
 */
export function measureSingularity(pose: Pose): SingularityMeasure {
  const { jacobian } = evaluateConstraints(pose, pose.actuators);
  if (jacobian.rows === 0 || jacobian.columns === 0) {
    return { minSingularValue: 0, maxSingularValue: 0, conditionNumber: Number.POSITIVE_INFINITY, jacobianSign: 0 };
  }
  const sigma = new SingularValueDecomposition(jacobian, { autoTranspose: true }).diagonal;
  const maxSingularValue = Math.max(...sigma);
  const minSingularValue = Math.min(jacobian.rows, jacobian.columns) > sigma.length ? 0 : Math.min(...sigma);
  const singular = !(minSingularValue > 1e-14 * maxSingularValue);
  let jacobianSign: -1 | 0 | 1 = 0;
  if (!singular && jacobian.isSquare()) {
    const det = new LuDecomposition(jacobian).determinant;
    jacobianSign = det > 0 ? 1 : det < 0 ? -1 : 0;
  }
  return {
    minSingularValue,
    maxSingularValue,
    conditionNumber: singular ? Number.POSITIVE_INFINITY : maxSingularValue / minSingularValue,
    jacobianSign,
  };
}
