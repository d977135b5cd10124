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
    // docs/MODEL.md §5: ṁ = ρAv = 1400 · 400e-6 · 0.05 kg/s = 0.028 kg/s = 100.8 kg/h [derived]
    expect(massFlowKgPerS(1400, 400, 3 / 60) * 3600).toBeCloseTo(100.8, 9);
  });

  it('productAreaMm2 inverts the mass balance', () => {
    // ṁ = ρAv solved for A (mass balance)
    expect(productAreaMm2(0.028, 1400, 0.05)).toBeCloseTo(400, 9);
  });
});

describe('draw ratios', () => {
  it('velocityDrawRatio(HDPE ADR 1.25, ρ 0.76 melt, 0.95 solid) is 1.00', () => {
    // docs/MODEL.md §5: velocity draw = ADR·ρ_melt/ρ_solid = 1.25·0.76/0.95 = 1.00 [derived]; densities [mem]
    expect(velocityDrawRatio(1.25, 760, 950)).toBeCloseTo(1.0, 12);
  });

  it('areaDrawDownRatio is orifice over product area', () => {
    // definition of the area draw-down ratio (docs/MODEL.md §3)
    expect(areaDrawDownRatio(500, 400)).toBeCloseTo(1.25, 12);
  });

  it('throughputForDrawDown(460 mm², ADR 1.15, PVC-U 1400 kg/m³, 3 m/min) is 100.8 kg/h', () => {
    // worked by hand from docs/MODEL.md §5: product area 460/1.15 = 400 mm²; ṁ = 1400 · 400e-6 · 0.05 = 0.028 kg/s
    expect(throughputForDrawDown(460, 1.15, 1400, 0.05) * 3600).toBeCloseTo(100.8, 9);
  });

  it('pullerSpeedForDrawDown(100.8 kg/h, 1400 kg/m³, 460 mm², ADR 1.15) is 3 m/min; 920 mm² needs 1.5 m/min', () => {
    // worked by hand: v = ṁ/(ρ·A/ADR) = 0.028/(1400 · 400e-6) = 0.05 m/s = 3 m/min; twice the orifice at the same
    // output needs half the speed (0.028/(1400 · 800e-6) = 0.025 m/s)
    expect(pullerSpeedForDrawDown(0.028, 1400, 460, 1.15) * 60).toBeCloseTo(3.0, 9);
    expect(pullerSpeedForDrawDown(0.028, 1400, 920, 1.15) * 60).toBeCloseTo(1.5, 9);
  });
});
