import type { MaterialName } from './schedule.js';

/**
 * Process values a material brings when the request does not override them. Every number says where it comes from;
 * "[mem]" marks a value recalled from memory (typical grade, verify against the resin supplier's data sheet), and
 * "common practice" a rule of thumb with no single source. Users override any of them per schedule.
 */
export interface MaterialPreset {
  readonly name: Exclude<MaterialName, 'custom'>;
  /** Solid density at the puller, g/cm³. */
  readonly solidDensityGPerCm3: number;
  /** Melt density at die temperature, g/cm³. */
  readonly meltDensityGPerCm3: number;
  /** Power-law flow index n. */
  readonly powerLawN: number;
  /** Power-law consistency m at the preset die temperature, Pa·sⁿ. */
  readonly powerLawMPaSn: number;
  /** Linear die swell ratio. */
  readonly dieSwell: number;
  /** Typical die temperature, °C. */
  readonly dieTemperatureC: number;
  /** Usual area draw-down range for profiles. */
  readonly drawDown: { readonly min: number; readonly max: number };
  /** Wall tolerance as a fraction of the nominal wall (used in advice). */
  readonly wallTolerance: number;
  /** Handbook range of the solid density, g/cm³, for sanity findings on overrides. */
  readonly solidDensityRange: { readonly min: number; readonly max: number };
}

export const MATERIAL_PRESETS: Readonly<Record<Exclude<MaterialName, 'custom'>, MaterialPreset>> = Object.freeze({
  'PVC-U': {
    name: 'PVC-U',
    solidDensityGPerCm3: 1.4, // polymer handbooks: 1.30–1.45 (docs/MODEL.md §5)
    meltDensityGPerCm3: 1.25, // [mem] rigid PVC melt near 190 °C
    powerLawN: 0.26, // Osswald, Polymer Processing Fundamentals [mem]
    powerLawMPaSn: 170_000, // [mem] rigid PVC compound near 190 °C
    dieSwell: 1.05, // [mem] rigid PVC swells little
    dieTemperatureC: 190, // PVC-U melt 160–210 °C (docs/MODEL.md §4)
    drawDown: { min: 1.0, max: 1.2 }, // rigid PVC profiles about 1.0–1.2 [mem]
    wallTolerance: 0.08, // ±8 % rigid PVC: published extrusion tolerance charts (common practice)
    solidDensityRange: { min: 1.3, max: 1.45 },
  },
  HDPE: {
    name: 'HDPE',
    solidDensityGPerCm3: 0.95, // polymer handbooks: 0.94–0.965
    meltDensityGPerCm3: 0.76, // [mem] (docs/MODEL.md §5)
    powerLawN: 0.41, // Osswald [mem]
    powerLawMPaSn: 20_000, // [mem] extrusion grade near 200 °C
    dieSwell: 1.2, // [mem] polyolefins swell more than PVC
    dieTemperatureC: 200, // [mem]
    drawDown: { min: 1.1, max: 1.5 }, // polyolefins 1.1–1.5 [mem]
    wallTolerance: 0.1, // ±10 % PE (common practice)
    solidDensityRange: { min: 0.94, max: 0.965 },
  },
  PP: {
    name: 'PP',
    solidDensityGPerCm3: 0.905, // polymer handbooks: 0.90–0.915
    meltDensityGPerCm3: 0.75, // [mem]
    powerLawN: 0.38, // Osswald [mem]
    powerLawMPaSn: 7_500, // [mem] near 220 °C
    dieSwell: 1.15, // [mem]
    dieTemperatureC: 220, // [mem]
    drawDown: { min: 1.1, max: 1.5 }, // polyolefins 1.1–1.5 [mem]
    wallTolerance: 0.08, // ±8 % PP (common practice)
    solidDensityRange: { min: 0.9, max: 0.915 },
  },
  ABS: {
    name: 'ABS',
    solidDensityGPerCm3: 1.05, // polymer handbooks: 1.02–1.08
    meltDensityGPerCm3: 0.95, // [mem]
    powerLawN: 0.29, // [mem] close to PS 0.28 (Osswald)
    powerLawMPaSn: 30_000, // [mem] near 230 °C
    dieSwell: 1.1, // [mem]
    dieTemperatureC: 230, // [mem]
    drawDown: { min: 1.0, max: 1.3 }, // [mem] rigid profiles
    wallTolerance: 0.08, // ±8 % ABS (common practice)
    solidDensityRange: { min: 1.02, max: 1.08 },
  },
  TPE: {
    name: 'TPE',
    solidDensityGPerCm3: 0.95, // [mem] grades span about 0.89–1.25
    meltDensityGPerCm3: 0.82, // [mem]
    powerLawN: 0.3, // [mem]
    powerLawMPaSn: 15_000, // [mem]
    dieSwell: 1.2, // [mem] elastomeric melts swell strongly
    dieTemperatureC: 200, // [mem]
    drawDown: { min: 1.1, max: 1.5 }, // polyolefins/TPE 1.1–1.5 [mem]
    wallTolerance: 0.1, // ±10 % flexible profiles (common practice)
    solidDensityRange: { min: 0.85, max: 1.3 },
  },
});
