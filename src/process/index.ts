export { massFlowKgPerS, productAreaMm2, meltSpeedMPerS } from './mass-balance.js';
export { areaDrawDownRatio, velocityDrawRatio, pullerSpeedForDrawDown, throughputForDrawDown } from './draw-down.js';
export {
  type SlitFlowInput,
  slitFlowPerWidth,
  slitPressureDropPa,
  slitFlowRatioAtEqualPressure,
  slitPressureRatioAtEqualFlow,
} from './slit-flow.js';
export {
  type StationMeasures,
  type StationProcess,
  type ProcessCheck,
  checkProcess,
  FLOW_IMBALANCE_LIMIT,
} from './check-process.js';
export { messageNumber, ratioText, RATIO_TEXT_CEILING } from './message-number.js';
export {
  PLAUSIBLE,
  type StationScale,
  scaleFindings,
  fitToleranceFinding,
  pullerSpeedRangeMPerMin,
} from './plausibility-findings.js';
