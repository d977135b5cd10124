import { describe, expect, it } from 'vitest';
import { MATERIAL_PRESETS } from '../../src/domain/index.js';

// The reference table, written out here (not read from the code). Solid densities, g/cm³: polymer handbooks as
// quoted in docs/MODEL.md §5. Power-law index n: Osswald, Polymer Processing Fundamentals, as quoted in
// docs/MODEL.md §5 [mem]. Draw-down ranges: docs/MODEL.md §5, about 1.0–1.2 rigid PVC, 1.1–1.5 polyolefins and TPE
// [mem]. Wall tolerance: published extrusion tolerance charts, ±8 % rigid PVC, PS, ABS, PP, ±10 % flexible PVC and PE
// (common practice). PVC-U melt 160–210 °C: docs/MODEL.md §4.
const HANDBOOK = {
  'PVC-U': { density: [1.3, 1.45], n: 0.26, drawDown: [1.0, 1.2], wallTolerance: 0.08 },
  HDPE: { density: [0.94, 0.965], n: 0.41, drawDown: [1.1, 1.5], wallTolerance: 0.1 },
  PP: { density: [0.9, 0.915], n: 0.38, drawDown: [1.1, 1.5], wallTolerance: 0.08 },
  ABS: { density: [1.02, 1.08], n: null, drawDown: null, wallTolerance: 0.08 },
  TPE: { density: null, n: null, drawDown: [1.1, 1.5], wallTolerance: 0.1 },
} as const;

describe('MATERIAL_PRESETS against the handbook table', () => {
  it.each(Object.entries(HANDBOOK))(
    '%s: solid density inside the handbook range, and the range is the handbook’s',
    (name, ref) => {
      const preset = MATERIAL_PRESETS[name as keyof typeof MATERIAL_PRESETS];
      if (ref.density) {
        expect(preset.solidDensityGPerCm3).toBeGreaterThanOrEqual(ref.density[0]);
        expect(preset.solidDensityGPerCm3).toBeLessThanOrEqual(ref.density[1]);
        expect(preset.solidDensityRange.min).toBeCloseTo(ref.density[0], 12);
        expect(preset.solidDensityRange.max).toBeCloseTo(ref.density[1], 12);
      }
    },
  );

  it.each(Object.entries(HANDBOOK))(
    '%s: power-law index, draw-down range and wall tolerance as tabled',
    (name, ref) => {
      const preset = MATERIAL_PRESETS[name as keyof typeof MATERIAL_PRESETS];
      if (ref.n !== null) expect(preset.powerLawN).toBeCloseTo(ref.n, 12);
      if (ref.drawDown) {
        expect(preset.drawDown.min).toBeCloseTo(ref.drawDown[0], 12);
        expect(preset.drawDown.max).toBeCloseTo(ref.drawDown[1], 12);
      }
      expect(preset.wallTolerance).toBeCloseTo(ref.wallTolerance, 12);
    },
  );

  it('ABS n 0.29 sits near PS 0.28 (Osswald [mem]), and every n is shear-thinning (0 < n < 1)', () => {
    expect(Math.abs(MATERIAL_PRESETS.ABS.powerLawN - 0.28)).toBeLessThan(0.05);
    for (const p of Object.values(MATERIAL_PRESETS)) {
      expect(p.powerLawN, p.name).toBeGreaterThan(0);
      expect(p.powerLawN, p.name).toBeLessThan(1);
    }
  });

  it('every melt is lighter than its solid (polymers expand when they melt); HDPE 0.76 vs 0.95 (docs/MODEL.md §5 [mem])', () => {
    for (const p of Object.values(MATERIAL_PRESETS))
      expect(p.meltDensityGPerCm3, p.name).toBeLessThan(p.solidDensityGPerCm3);
    expect(MATERIAL_PRESETS.HDPE.meltDensityGPerCm3).toBeCloseTo(0.76, 12);
  });

  it('PVC-U’s die temperature lies in the 160–210 °C melt range (docs/MODEL.md §4)', () => {
    expect(MATERIAL_PRESETS['PVC-U'].dieTemperatureC).toBeGreaterThanOrEqual(160);
    expect(MATERIAL_PRESETS['PVC-U'].dieTemperatureC).toBeLessThanOrEqual(210);
  });
});
