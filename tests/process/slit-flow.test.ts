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
    // docs/MODEL.md §5: q ∝ H^(2+1/n) at equal ΔP/L [derived from Tadmor & Gogos' slit formula]
    expect(slitFlowRatioAtEqualPressure(2, 1, 1)).toBeCloseTo(8.0, 10);
    expect(slitFlowRatioAtEqualPressure(2, 1, 0.26)).toBeCloseTo(57.53, 2);
    // the same ratio straight from the full formula at equal pressure
    const slit = (gapMm: number) => ({ gapMm, landMm: 20, n: 0.26, mPaSn: 170_000 });
    expect(slitFlowPerWidth(slit(2), 1e7) / slitFlowPerWidth(slit(1), 1e7)).toBeCloseTo(57.53, 2);
  });

  it('slitPressureRatioAtEqualFlow(halving a gap) is 8 for n 1 and 2.868 for n 0.26', () => {
    // docs/MODEL.md §5: ΔP ∝ H^−(1+2n) at constant q [derived]
    expect(slitPressureRatioAtEqualFlow(2, 1, 1)).toBeCloseTo(8, 10);
    expect(slitPressureRatioAtEqualFlow(2, 1, 0.26)).toBeCloseTo(2.868, 3);
  });

  it('slitPressureDropPa inverts slitFlowPerWidth', () => {
    // algebraic inverse of the slit formula
    const slit = { gapMm: 1.7, landMm: 15, n: 0.41, mPaSn: 20_000 };
    const q = slitFlowPerWidth(slit, 12.5e6);
    expect(slitPressureDropPa(slit, q)).toBeCloseTo(12.5e6, 2);
  });

  it('slitPressureDropPa with n = 1 is 6.0e5 Pa for μ 1000 Pa·s, H 2 mm, L 20 mm, Q/W = 1 cm³/s over 50 mm', () => {
    // Newtonian slit (Bird, Stewart & Lightfoot, Transport Phenomena): ΔP = 12 μ L Q / (W H³)
    // = 12 · 1000 · 0.020 · 1e-6 / (0.050 · 8e-9) = 2.4e-4 / 4e-10 = 6.0e5 Pa, worked by hand
    expect(slitPressureDropPa({ gapMm: 2, landMm: 20, n: 1, mPaSn: 1000 }, 2e-5)).toBeCloseTo(6.0e5, 3);
  });

  it('slitFlowPerWidth agrees with the velocity profile integrated numerically (n 0.26, m 170 000 Pa·s^n)', () => {
    // Independent of the closed form: from the momentum balance the shear stress is τ(y) = G·y (G = ΔP/L, y from
    // the midplane); the power law gives γ̇ = (τ/m)^(1/n); integrating twice, q = 2 ∫₀^{H/2} y·γ̇(y) dy
    // (by parts, no-slip walls). Composite Simpson's rule with 2000 panels.
    const n = 0.26;
    const m = 170_000;
    const h = 0.002;
    const dp = 1e7;
    const g = dp / 0.02;
    const b = h / 2;
    const panels = 2000;
    const step = b / panels;
    const f = (y: number) => y * ((g * y) / m) ** (1 / n);
    let sum = f(0) + f(b);
    for (let i = 1; i < panels; i++) sum += (i % 2 === 1 ? 4 : 2) * f(i * step);
    const qNumeric = (2 * (sum * step)) / 3;
    const q = slitFlowPerWidth({ gapMm: 2, landMm: 20, n, mPaSn: m }, dp);
    expect(q / qNumeric).toBeCloseTo(1, 6);
  });
});
