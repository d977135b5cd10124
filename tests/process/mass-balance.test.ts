import { describe, expect, it } from 'vitest';
import {
  areaDrawDownRatio,
  massFlowKgPerS,
  productAreaMm2,
  pullerSpeedForDrawDown,
  throughputForDrawDown,
  velocityDrawRatio,
} from '../../src/process/index.js';

describe('mass balance', () => {
  it('massFlowKgPerS(PVC-U 1400 kg/m³, 400 mm², 3 m/min) is 100.8 kg/h', () => {
    // DOMAIN.md §5: ṁ = ρAv = 1400 · 400e-6 · 0.05 kg/s = 0.028 kg/s = 100.8 kg/h [derived]
    expect(massFlowKgPerS(1400, 400, 3 / 60) * 3600).toBeCloseTo(100.8, 9);
  });

  it('productAreaMm2 inverts the mass balance', () => {
    // ṁ = ρAv solved for A (mass balance)
    expect(productAreaMm2(0.028, 1400, 0.05)).toBeCloseTo(400, 9);
  });
});

describe('draw ratios', () => {
  it('velocityDrawRatio(HDPE ADR 1.25, ρ 0.76 melt, 0.95 solid) is 1.00', () => {
    // DOMAIN.md §5: velocity draw = ADR·ρ_melt/ρ_solid = 1.25·0.76/0.95 = 1.00 [derived]; densities [mem]
    expect(velocityDrawRatio(1.25, 760, 950)).toBeCloseTo(1.0, 12);
  });

  it('areaDrawDownRatio is orifice over product area', () => {
    // definition of the area draw-down ratio (DOMAIN.md §3)
    expect(areaDrawDownRatio(500, 400)).toBeCloseTo(1.25, 12);
  });

  it('pullerSpeedForDrawDown gives back the line speed that throughputForDrawDown assumed', () => {
    // mass balance both ways: ṁ = ρ_s (A/ADR) v
    const q = throughputForDrawDown(320, 1.1, 1400, 2 / 60);
    expect(q * 3600).toBeCloseTo(((1400 * 320e-6) / 1.1) * (2 / 60) * 3600, 12);
    expect(pullerSpeedForDrawDown(q, 1400, 320, 1.1)).toBeCloseTo(2 / 60, 12);
    // at constant output, twice the orifice area keeps the draw-down only with half the puller speed
    expect(pullerSpeedForDrawDown(q, 1400, 640, 1.1)).toBeCloseTo(1 / 60, 12);
  });
});
