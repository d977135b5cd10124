export { processCautions } from './process-cautions.js';
export { type MaterialHazard, MATERIAL_HAZARDS } from './material-hazards.js';
