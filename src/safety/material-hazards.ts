import type { MaterialName } from '../domain/index.js';

/**
 * What a material's melt does to people when it is hot or overheated: the usual melt temperatures and what it gives
 * off when it degrades. Each entry names where its figures come from; "from memory" marks values recalled, not
 * looked up (typical grades; the resin supplier's safety data sheet decides). `custom` carries neutral text.
 */
export interface MaterialHazard {
  /** Usual melt temperature range at the die, °C; null when the material is not known (custom). */
  readonly meltRangeC: { readonly min: number; readonly max: number } | null;
  /** Where the melt range comes from. */
  readonly meltRangeSource: string;
  /** Code of the decomposition caution (stable, upper case). */
  readonly decompositionCode: string;
  /** The decomposition hazard in a few words. */
  readonly decompositionHazard: string;
  /** What the melt gives off when it degrades and from what temperature, with its source, in a sentence or two. */
  readonly decomposition: string;
}

const POLYOLEFIN_DECOMPOSITION =
  'Polyolefins give off no hydrogen chloride, but overheated or long-held melt smokes and releases irritating ' +
  'aldehydes (acrolein, formaldehyde) and can catch fire; purging and cleaning with open flames or burn-off are ' +
  'fire risks (from memory, not from a data sheet: the resin’s safety data sheet states the products and temperatures).';

/** Melt hazards per material preset (and neutral text for `custom`). */
export const MATERIAL_HAZARDS: Readonly<Record<MaterialName, MaterialHazard>> = Object.freeze({
  'PVC-U': {
    meltRangeC: { min: 160, max: 210 }, // docs/MODEL.md §4
    meltRangeSource: 'rigid PVC melt',
    decompositionCode: 'PVC_DECOMPOSITION',
    decompositionHazard: 'PVC decomposition',
    // docs/MODEL.md §4: HCl from about 170–180 °C, faster above 200 °C
    decomposition:
      'PVC releases hydrogen chloride when it degrades, from about 170–180 °C and faster above 200 °C; degraded melt discolours (yellow, brown, black) and corrodes steel.',
  },
  HDPE: {
    meltRangeC: { min: 180, max: 240 }, // from memory: HDPE profile and pipe extrusion
    meltRangeSource: 'HDPE melt, from memory',
    decompositionCode: 'POLYOLEFIN_OVERHEATING',
    decompositionHazard: 'polyolefin overheating',
    decomposition: POLYOLEFIN_DECOMPOSITION,
  },
  PP: {
    meltRangeC: { min: 200, max: 250 }, // from memory: PP profile extrusion
    meltRangeSource: 'PP melt, from memory',
    decompositionCode: 'POLYOLEFIN_OVERHEATING',
    decompositionHazard: 'polyolefin overheating',
    decomposition: POLYOLEFIN_DECOMPOSITION,
  },
  ABS: {
    meltRangeC: { min: 210, max: 250 }, // from memory: ABS profile extrusion
    meltRangeSource: 'ABS melt, from memory',
    decompositionCode: 'ABS_DECOMPOSITION',
    decompositionHazard: 'ABS decomposition',
    decomposition:
      'Degraded ABS gives off styrene and other irritating fumes, more of them the hotter and longer the melt is held (from memory, not from a data sheet: the resin’s safety data sheet states the products and temperatures).',
  },
  TPE: {
    meltRangeC: { min: 180, max: 230 }, // from memory: styrenic and olefinic TPE; grades differ widely
    meltRangeSource: 'TPE melt, from memory; grades differ widely',
    decompositionCode: 'TPE_DECOMPOSITION',
    decompositionHazard: 'TPE decomposition',
    decomposition:
      'What a TPE gives off when it degrades depends on its family (styrenic, olefinic, urethane, polyester); overheated melt smokes and can release irritating fumes (from memory: the grade’s safety data sheet states the products and temperatures).',
  },
  custom: {
    meltRangeC: null,
    meltRangeSource: 'no preset',
    decompositionCode: 'MELT_DECOMPOSITION',
    decompositionHazard: 'melt decomposition',
    decomposition:
      'Every polymer melt degrades when overheated or held too long and may give off harmful fumes; the resin’s safety data sheet states at what temperature and which products.',
  },
});
