/**
 * Kinematics: planar mechanisms of plates, pins and slides in absolute coordinates (Nikravesh, *Computer-Aided
 * Analysis of Mechanical Systems*; Haug, *Computer Aided Kinematics and Dynamics of Mechanical Systems*). The only
 * door of this folder.
 */
export type {
  Body,
  BodyKind,
  BodyPose,
  BodySpec,
  Driver,
  DriverSpec,
  Joint,
  Mechanism,
  MechanismSpec,
  PrismaticJoint,
  RevoluteJoint,
} from './mechanism.js';
export { type MechanismProblem, validateMechanism } from './validate-mechanism.js';
export { defineMechanism } from './define-mechanism.js';
export {
  buildFromPins,
  type PinnedBodySpec,
  type PinnedMechanismSpec,
  type PinnedSlideSpec,
} from './build-from-pins.js';
export { buildFourBar, type FourBarOptions } from './build-four-bar.js';
export { buildSliderCrank, type SliderCrankOptions } from './build-slider-crank.js';
export { buildPinnedChain, type PinnedChainOptions } from './build-pinned-chain.js';
export { buildBracedChain, type BracedChainOptions } from './build-braced-chain.js';
export { buildSixBar, type SixBarChain } from './build-six-bar.js';
export {
  type FourBarAngles,
  type FourBarCircuit,
  type FourBarDimensions,
  solveFourBarClosedForm,
} from './solve-four-bar-closed-form.js';
export { classifyGrashof, type GrashofClass, type GrashofClassification } from './classify-grashof.js';
export { fourBarRockerLimits, type RockerLimits } from './four-bar-rocker-limits.js';
export { type SliderCrankDimensions, sliderCrankPosition } from './slider-crank-position.js';
export { bodyPose, initialPose, jointPoint, jointValue, type Pose, pointOnBody } from './pose.js';
export { grublerMobility } from './grubler-mobility.js';
export { analyseMobility, type MobilityAnalysis } from './analyse-mobility.js';
export { resolveSolveOptions, type SolveOptions, type SolveStatus } from './solve-options.js';
export {
  createPositionSolver,
  type PositionResult,
  type PositionSolver,
  solvePosition,
} from './position-solver.js';
export { type ConstraintEvaluation, evaluateConstraints } from './evaluate-constraints.js';
export {
  type PathSample,
  type PathStatus,
  type PathTrace,
  resolveTraceOptions,
  type TraceOptions,
  traceActuatorPath,
} from './trace-actuator-path.js';
export { pointVelocity, solveVelocities, type VelocityAnalysis } from './solve-velocities.js';
export { type TransmissionAngle, transmissionAngles } from './transmission-angles.js';
export { type DyadTransmissionAngle, dyadTransmissionAngles } from './dyad-transmission-angles.js';
export { findBranchDefects } from './find-branch-defects.js';
export { type CircuitCheck, checkCircuit } from './check-circuit.js';
export { findOrderDefect, type OrderCheck } from './find-order-defect.js';
export { measureSingularity, type SingularityMeasure } from './measure-singularity.js';
export { monitorPath, type PathQuality, type PathQualitySample } from './monitor-path.js';
