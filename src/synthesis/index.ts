export { type PivotTarget, preparePivotTargets } from './pivot-targets.js';
export { type ChainEnd, type PlateChain, endPoint } from './plate-chain.js';
export { type PlateShape, pivotFans, plateOutline } from './plate-outline.js';
export { achievedOrifice, type PlateOpening, plateOpening, stationEnvelope } from './achieved-orifice.js';
export { type EdgeProfile, type EdgeShapeOptions, shapePlateEdges } from './shape-plate-edges.js';
export { type MarchResult, marchChain, equalArcPivots } from './march-chain.js';
export {
  type ChainProblemSpec,
  type ChainLayout,
  type EndKind,
  chainLayout,
  extensionIndex,
  plateLength,
  makeChainProblem,
  chainFromParameters,
} from './chain-problem.js';
export {
  type ChainFitOptions,
  type StationFit,
  type FitAttempt,
  type ChainFit,
  type ChainForm,
  type PlateCountSearch,
  resolveChainFitOptions,
  fitChain,
  initialChain,
} from './fit-chain.js';
export { jointArticulation } from './joint-articulation.js';
export { mergePlatesStart } from './merge-plates-start.js';
export * from './dyads/index.js';
