import { describe, expect, it } from 'vitest';
import {
  slitFlowPerWidth,
  slitFlowRatioAtEqualPressure,
  slitPressureDropPa,
  slitPressureRatioAtEqualFlow,
} from '../../src/process/index.js';

describe('power-law slit flow', () => {
  it('slitFlowPerWidth with n = 1 is plane Poiseuille flow H³ΔP/(12μL)', () => {
    // Newtonian slit between parallel plates (Bird, Stewart & Lightfoot, Transport Phenomena): q = H³ΔP/(12μL)
    const h = 0.002;
    const l = 0.02;
    const mu = 1000;
    const dp = 5e6;
    const q = slitFlowPerWidth({ gapMm: 2, landMm: 20, n: 1, mPaSn: mu }, dp);
    expect(q).toBeCloseTo((h ** 3 * dp) / (12 * mu * l), 15);
  });

  it('slitFlowRatioAtEqualPressure(2 mm vs 1 mm) is 8.0 for n 1 and 57.53 for n 0.26', () => {
    // DOMAIN.md §5: q ∝ H^(2+1/n) at equal ΔP/L [derived from Tadmor & Gogos' slit formula]
    expect(slitFlowRatioAtEqualPressure(2, 1, 1)).toBeCloseTo(8.0, 10);
    expect(slitFlowRatioAtEqualPressure(2, 1, 0.26)).toBeCloseTo(57.53, 2);
    // the same ratio straight from the full formula at equal pressure
    const slit = (gapMm: number) => ({ gapMm, landMm: 20, n: 0.26, mPaSn: 170_000 });
    expect(slitFlowPerWidth(slit(2), 1e7) / slitFlowPerWidth(slit(1), 1e7)).toBeCloseTo(57.53, 2);
  });

  it('slitPressureRatioAtEqualFlow(halving a gap) is 8 for n 1 and 2.868 for n 0.26', () => {
    // DOMAIN.md §5: ΔP ∝ H^−(1+2n) at constant q [derived]
    expect(slitPressureRatioAtEqualFlow(2, 1, 1)).toBeCloseTo(8, 10);
    expect(slitPressureRatioAtEqualFlow(2, 1, 0.26)).toBeCloseTo(2.868, 3);
  });

  it('slitPressureDropPa inverts slitFlowPerWidth', () => {
    // algebraic inverse of the slit formula
    const slit = { gapMm: 1.7, landMm: 15, n: 0.41, mPaSn: 20_000 };
    const q = slitFlowPerWidth(slit, 12.5e6);
    expect(slitPressureDropPa(slit, q)).toBeCloseTo(12.5e6, 2);
  });
});
