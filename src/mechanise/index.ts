/**
 * Mechanisation: the fitted plate chain driven by the number of actuators the plant asks for, with binary links by
 * Burmester theory and every claim proved with the kinematics engine (docs/MODEL.md §3). The only door of this folder.
 */
export { type MechaniseOptions, type MechaniseRequest, resolveMechaniseOptions } from './mechanise-options.js';
export { type ChainBody, type ChainTopology, chainTopology, type MechanisableChain } from './chain-topology.js';
export { type AssembledStations, assembleStations, pivotPoints } from './assemble-stations.js';
export type { LinkDesign, LinkSynthesis } from './link-design.js';
export { buildMechanism, FIRST_LINK_LAYER, linkJointIds, posesAt } from './build-mechanism.js';
export {
  type DriveSettings,
  driveThroughStations,
  type LegTrace,
  type JointTransmission,
  type LinkTransmission,
  type MotionCheck,
  type MotionDefect,
  type MotionPlace,
} from './drive-through-stations.js';
export {
  type ClearanceInspector,
  type ClearanceKind,
  type ClearanceParts,
  type ClearanceRecord,
  clearancePartsOf,
  collisionDefects,
  describeClearance,
  linkLayerOrder,
  makeClearanceInspector,
} from './motion-clearance.js';
export { type GroundPivotRegion, type GroundPivotRejection, groundPivotRegion } from './ground-pivot-region.js';
export { type PlatePinRegion, platePinRegion } from './plate-pin-region.js';
export type { PlateSearch } from './reduced-mode.js';
export type { MechanisationResult, MechanismReport, StationOutcome } from './mechanisation-result.js';
export { mechaniseChain } from './mechanise-chain.js';
