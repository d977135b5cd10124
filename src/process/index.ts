export { massFlowKgPerS, productAreaMm2, meltSpeedMPerS } from './mass-balance.js';
export { areaDrawDownRatio, velocityDrawRatio, pullerSpeedForDrawDown, throughputForDrawDown } from './draw-down.js';
export {
  type SlitFlowInput,
  slitFlowPerWidth,
  slitPressureDropPa,
  slitFlowRatioAtEqualPressure,
  slitPressureRatioAtEqualFlow,
} from './slit-flow.js';
export { type StationMeasures, type StationProcess, type ProcessCheck, checkProcess } from './check-process.js';
