import { describe, expect, it } from 'vitest';
import { STEEL_EXPANSION_PER_K, thermalScale } from '../../src/export/index.js';

describe('thermalScale', () => {
  it('H13 at 11.3 µm/(m·K): 200 mm of steel heated from 20 to 200 °C grows 0.407 mm, so cold sizes are hot / (1 + αΔT)', () => {
    // docs/MODEL.md §5 "tool-steel growth": H13 mean CTE 11.3 µm/m·K (20–204 °C), 200 mm, 20→200 °C → 0.407 mm
    // (steel data sheets)
    expect(STEEL_EXPANSION_PER_K).toBe(11.3e-6);
    const cold = thermalScale('cold', 200);
    const hotLengthMm = 200 / cold.factor;
    expect(hotLengthMm - 200).toBeCloseTo(0.407, 3);
  });

  it("hot dimensions are the plan's own numbers, and both say which they are", () => {
    const hot = thermalScale('hot', 190);
    expect(hot.factor).toBe(1);
    expect(hot.statement).toMatch(/^DIMENSIONS HOT/);
    const cold = thermalScale('cold', 190);
    expect(cold.statement).toMatch(/^DIMENSIONS COLD: to cut and measure at 20 deg C/);
    // 1 / (1 + 11.3e-6 · 170) = 0.998083 (linear expansion, [derived])
    expect(cold.statement).toContain('x 0.998083');
  });

  it('a die at 20 °C needs no scaling', () => {
    expect(thermalScale('cold', 20).factor).toBe(1);
  });
});
