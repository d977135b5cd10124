import { describe, expect, it } from 'vitest';
import { MATERIAL_PRESETS, type MaterialName } from '../../src/domain/index.js';
import { MATERIAL_HAZARDS, processCautions } from '../../src/safety/index.js';

const MATERIALS: readonly MaterialName[] = ['PVC-U', 'HDPE', 'PP', 'ABS', 'TPE', 'custom'];
const byCode = (material: MaterialName, dieC: number) =>
  new Map(processCautions(material, dieC).map((c) => [c.code, c]));

describe('processCautions', () => {
  it.each(MATERIALS)(
    '%s: every caution is { code, hazard, message } and defers to local codes and plant practice',
    (m) => {
      for (const c of processCautions(m, 200)) {
        expect(Object.keys(c).sort()).toEqual(['code', 'hazard', 'message']);
        expect(c.code).toMatch(/^[A-Z_]+$/);
        expect(c.message).toMatch(
          /machine builder’s instructions and risk assessment, local codes and plant practice decide/,
        );
      }
    },
  );

  it('PVC-U: melt 160–210 °C and HCl from about 170–180 °C, faster above 200 °C (docs/MODEL.md §4)', () => {
    const c = byCode('PVC-U', 190);
    expect(c.get('HOT_MELT')?.message).toContain('160–210 °C');
    expect(c.get('HOT_MELT')?.message).toContain('set to 190 °C');
    expect(c.get('PVC_DECOMPOSITION')?.message).toMatch(/hydrogen chloride.*170–180 °C.*above 200 °C/);
  });

  it('HDPE: no PVC temperatures and no HCl, but aldehydes and fire risk, marked from memory', () => {
    const all = processCautions('HDPE', 200);
    const text = all.map((c) => c.message).join(' ');
    expect(text).not.toContain('PVC');
    expect(text).not.toContain('160–210');
    expect(all.map((c) => c.code)).not.toContain('PVC_DECOMPOSITION');
    const decomposition = byCode('HDPE', 200).get('POLYOLEFIN_OVERHEATING')?.message ?? '';
    expect(decomposition).toMatch(/no hydrogen chloride/);
    expect(decomposition).toMatch(/acrolein/);
    expect(decomposition).toMatch(/fire/);
    expect(decomposition).toMatch(/from memory/);
    expect(byCode('HDPE', 200).get('HOT_MELT')?.message).toContain('HDPE melt usually runs at 180–240 °C');
  });

  it('PP shares the polyolefin caution; ABS names styrene; TPE defers to its family’s data sheet', () => {
    expect(byCode('PP', 220).get('POLYOLEFIN_OVERHEATING')).toBeDefined();
    expect(byCode('ABS', 230).get('ABS_DECOMPOSITION')?.message).toMatch(/styrene.*from memory/);
    expect(byCode('TPE', 200).get('TPE_DECOMPOSITION')?.message).toMatch(/family.*safety data sheet/);
  });

  it('custom: neutral text with the die temperature given and the resin’s safety data sheet', () => {
    const c = byCode('custom', 215);
    expect(c.get('HOT_MELT')?.message).toContain('die temperature you gave, 215 °C');
    expect(c.get('MELT_DECOMPOSITION')?.message).toMatch(/safety data sheet/);
    const text = processCautions('custom', 215)
      .map((x) => x.message)
      .join(' ');
    expect(text).not.toMatch(/PVC|HDPE|styrene|hydrogen chloride/);
  });

  it('grows firmer when the die is set above the material’s usual range (PP above 250 °C)', () => {
    expect(byCode('PP', 270).get('POLYOLEFIN_OVERHEATING')?.message).toContain('set to 270 °C, above the usual 250 °C');
    expect(byCode('PP', 230).get('POLYOLEFIN_OVERHEATING')?.message).not.toContain('above the usual');
  });

  it('every preset’s own die temperature lies inside its material’s melt range (presets and hazards agree)', () => {
    for (const preset of Object.values(MATERIAL_PRESETS)) {
      const range = MATERIAL_HAZARDS[preset.name].meltRangeC;
      expect(range, preset.name).not.toBeNull();
      expect(preset.dieTemperatureC, preset.name).toBeGreaterThanOrEqual(range!.min);
      expect(preset.dieTemperatureC, preset.name).toBeLessThanOrEqual(range!.max);
    }
  });
});
