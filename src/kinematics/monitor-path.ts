import { findBranchDefects } from './find-branch-defects.js';
import { measureSingularity } from './measure-singularity.js';
import type { PathSample } from './trace-actuator-path.js';
import { type TransmissionAngle, transmissionAngles } from './transmission-angles.js';

/** Quality of one path sample. */
export interface PathQualitySample {
  readonly s: number;
  readonly actuators: readonly number[];
  readonly jacobianSign: -1 | 0 | 1;
  /** Smallest singular value of the scaled driven Jacobian (dimensionless). */
  readonly minSingularValue: number;
  /** 2-norm condition number of the scaled driven Jacobian. */
  readonly conditionNumber: number;
  readonly transmission: readonly TransmissionAngle[];
}

/** Quality monitors along a path, sample by sample, with the worst values. */
export interface PathQuality {
  readonly samples: readonly PathQualitySample[];
  /** Sample indices where the determinant sign changes (branch defects); empty for a proper trace. */
  readonly branchDefects: readonly number[];
  /** Smallest singular value met, and where. Null for an empty path. */
  readonly minSingularValue: { readonly value: number; readonly s: number } | null;
  /** Largest condition number met, and where. Null for an empty path. */
  readonly maxConditionNumber: { readonly value: number; readonly s: number } | null;
  /** The transmission angle with the largest deviation from 90° met, and where. Null without binary links. */
  readonly worstTransmission: { readonly angle: TransmissionAngle; readonly s: number } | null;
}

/**
 * Monitors a traced path (or any sequence of samples): per sample the determinant sign, the smallest singular value
 * and condition number of the driven Jacobian (exact, by SVD) and the transmission angle of every binary link; then
 * the branch defects and the worst values. Costs one SVD per sample: run it on the samples you keep, not in a loop.
 */
export function monitorPath(samples: readonly PathSample[]): PathQuality {
  const out: PathQualitySample[] = samples.map((sample) => {
    const m = measureSingularity(sample.pose);
    return {
      s: sample.s,
      actuators: sample.actuators,
      jacobianSign: m.jacobianSign,
      minSingularValue: m.minSingularValue,
      conditionNumber: m.conditionNumber,
      transmission: transmissionAngles(sample.pose),
    };
  });
  let minSingularValue: PathQuality['minSingularValue'] = null;
  let maxConditionNumber: PathQuality['maxConditionNumber'] = null;
  let worstTransmission: PathQuality['worstTransmission'] = null;
  for (const q of out) {
    if (!minSingularValue || q.minSingularValue < minSingularValue.value) {
      minSingularValue = { value: q.minSingularValue, s: q.s };
    }
    if (!maxConditionNumber || q.conditionNumber > maxConditionNumber.value) {
      maxConditionNumber = { value: q.conditionNumber, s: q.s };
    }
    for (const t of q.transmission) {
      if (!worstTransmission || t.deviation > worstTransmission.angle.deviation)
        worstTransmission = { angle: t, s: q.s };
    }
  }
  return {
    samples: out,
    branchDefects: findBranchDefects(out),
    minSingularValue,
    maxConditionNumber,
    worstTransmission,
  };
}
