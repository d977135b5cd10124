import type { Point, Region } from '../geometry/index.js';
import type { BodyPose } from '../kinematics/index.js';
import type { PlateShape } from '../synthesis/index.js';
import type { AssembledStations } from './assemble-stations.js';
import type { ChainTopology } from './chain-topology.js';
import type { GroundPivotRegion } from './ground-pivot-region.js';
import type { MechaniseOptions } from './mechanise-options.js';
import type { PlatePinRegion } from './plate-pin-region.js';

/** Everything the mechanisation stages share, prepared once by `mechaniseChain`. */
export interface MechaniseContext {
  readonly options: MechaniseOptions;
  readonly topology: ChainTopology;
  readonly stations: AssembledStations;
  readonly shape: PlateShape;
  readonly opening: Region;
  /** Target orifice per station, schedule order. */
  readonly orifices: readonly Region[];
  readonly groundRegion: GroundPivotRegion;
  /** Allowed ground pivots on the frame grid (`groundPivotSteps`), computed once. */
  readonly groundGrid: readonly Point[];
  /** Pin region of every chain body, by id. */
  readonly pinRegions: ReadonlyMap<string, PlatePinRegion>;
  /** Steel round a pin, mm (resolved `pinClearanceMm`). */
  readonly clearanceMm: number;
  /** Largest least-squares link residual, mm (resolved). */
  readonly residualLimitMm: number;
  /** Circuit-defect tolerance, mm (resolved). */
  readonly arrivalToleranceMm: number;
  /**
   * Outer rings of the plates at each distinct position, die-body frame, drawn coarsely: a ground pivot inside one
   * would be swept by that plate.
   */
  readonly platesAt: readonly (readonly (readonly Point[])[])[];
  /** Legs driven, as pairs of distinct positions in schedule order (zero-length legs left out). */
  readonly legs: readonly (readonly [from: number, to: number])[];
}

/** Pose of a chain body (or the die body) at a distinct position. */
export function bodyPoseAt(context: MechaniseContext, distinct: number, body: string): BodyPose {
  if (body === 'die_body') return { x: 0, y: 0, phi: 0 };
  const m = context.topology.bodies.findIndex((b) => b.id === body);
  return context.stations.poses[context.stations.representatives[distinct]!]![m]!;
}

/** A point of a body's frame in the die-body frame, mm. */
export function placeOn(pose: BodyPose, local: Point): Point {
  const c = Math.cos(pose.phi);
  const s = Math.sin(pose.phi);
  return [pose.x + c * local[0] - s * local[1], pose.y + s * local[0] + c * local[1]];
}
