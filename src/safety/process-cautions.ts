import type { Caution, MaterialName } from '../domain/index.js';
import { MATERIAL_HAZARDS } from './material-hazards.js';

const DEFER =
  'This service plans geometry and motion only: the machine builder’s instructions and risk assessment, local codes and plant practice decide.';

/**
 * The safety cautions every check, plan and export carries, the melt hazards written for the schedule's material
 * (`MATERIAL_HAZARDS`, each figure with its source or marked from memory). Facts from docs/MODEL.md §4: PVC-U melt
 * 160–210 °C, extruder zones up to about 400 °C; PVC releases HCl from about 170–180 °C, faster above 200 °C; melt
 * pressure often 70–350 bar; guards ISO 14120, unexpected start-up ISO 14118, lockout OSHA 29 CFR 1910.147, risk
 * assessment ISO 12100, extruder safety EN 1114-1, crushing gaps ISO 13854.
 *
 * @param material  the schedule's material; chooses the melt temperatures and the decomposition caution.
 * @param dieTemperatureC  die temperature, °C; named in the cautions, which grow firmer above the material's range.
 */
export function processCautions(material: MaterialName, dieTemperatureC: number): Caution[] {
  const hazard = MATERIAL_HAZARDS[material];
  const dieC = Math.round(dieTemperatureC);
  const range = hazard.meltRangeC;
  const meltText = range
    ? `${material} melt usually runs at ${range.min}–${range.max} °C (${hazard.meltRangeSource}), the die is set to ${dieC} °C`
    : `The melt runs at about the die temperature you gave, ${dieC} °C`;
  const aboveRange = range !== null && dieTemperatureC > range.max;
  return [
    {
      code: 'HOT_MELT',
      hazard: 'hot melt and die surfaces',
      message:
        `Melt, die plates and pins run hot: ${meltText}, and extruder zones can reach about 400 °C; they stay hot long after the line stops. Wear the heat protection your plant prescribes. ` +
        DEFER,
    },
    {
      code: 'MELT_PRESSURE',
      hazard: 'melt pressure',
      message:
        'Die pressure is often 70–350 bar and can be higher; closing a gap at constant output raises it steeply. Keep the pressure transducer, rupture disc and pressure interlock in service and never open a die under pressure. ' +
        DEFER,
    },
    {
      code: 'PINCH_AND_SHEAR',
      hazard: 'moving plates and actuator links',
      message:
        'Moving plates, pins and actuator links form crushing and shearing points that move on their own while the line runs. Guard them (ISO 14120); crushing gaps per ISO 13854 start at 25 mm for a finger and 100 mm for a hand, and do not cover shearing. ' +
        DEFER,
    },
    {
      code: 'STORED_ENERGY',
      hazard: 'unexpected start-up and stored energy',
      message:
        'Actuators may move when the line controller runs a setpoint table. Before any work on the die, lock out every energy source including heat, hydraulic or pneumatic pressure and trapped melt pressure (OSHA 29 CFR 1910.147; ISO 14118 against unexpected start-up). ' +
        DEFER,
    },
    {
      code: 'RISK_ASSESSMENT',
      hazard: 'machine safety',
      message:
        'A variable-geometry die changes the extrusion line: its risk assessment (ISO 12100) and the extruder safety requirements (EN 1114-1) must be revisited before first use. ' +
        DEFER,
    },
    {
      code: hazard.decompositionCode,
      hazard: hazard.decompositionHazard,
      message:
        `${hazard.decomposition} ` +
        (aboveRange
          ? `The die is set to ${dieC} °C, above the usual ${range.max} °C: lower it unless the resin supplier allows it. `
          : '') +
        'Dead spots behind moving plates hold melt longer: purge as your plant prescribes, ventilate, and stop the line if the melt discolours or smokes. ' +
        DEFER,
    },
  ];
}
