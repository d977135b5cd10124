export type {
  Schedule,
  MaterialName,
  Station,
  ProcessSettings,
  Limits,
  PlateSettings,
  ActuatorSettings,
  MovingSpanSettings,
  MotionLaw,
} from './schedule.js';
export type { Finding, FindingSeverity } from './finding.js';
export type { Caution } from './caution.js';
export { type MaterialPreset, MATERIAL_PRESETS } from './material-presets.js';
