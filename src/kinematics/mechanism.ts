import type { Point } from '../geometry/index.js';

/**
 * A planar mechanism of rigid bodies joined by pins and slides, in the absolute-coordinate form of Nikravesh,
 * *Computer-Aided Analysis of Mechanical Systems*, ch. 3–4, and Haug, *Computer Aided Kinematics and Dynamics of
 * Mechanical Systems*, ch. 3. Millimetres and radians throughout; y up; every body carries its own frame, and the die
 * body's frame is the die-body frame that every other result is expressed in.
 *
 * Build one with `defineMechanism` (or a builder such as `buildFourBar`): it fills defaults, validates and freezes.
 */
export interface Mechanism {
  /** Every body, exactly one of kind `'die_body'` (ground). Order fixes the layout of `Pose.coordinates`. */
  readonly bodies: readonly Body[];
  /** Revolute and prismatic joints; ids are unique. */
  readonly joints: readonly Joint[];
  /** Drivers, one per actuator: `actuators[k]` drives `drivers[k]`. */
  readonly drivers: readonly Driver[];
}

/** What a body is in the die: the die body (ground), a moving plate, or a binary/actuator link. */
export type BodyKind = 'die_body' | 'plate' | 'link';

/** Position of a body frame in the die-body frame: origin (x, y) in mm, rotation φ in radians, counter-clockwise. */
export interface BodyPose {
  readonly x: number;
  readonly y: number;
  readonly phi: number;
}

/** A rigid body with its own frame. */
export interface Body {
  readonly id: string;
  readonly kind: BodyKind;
  /** Stacking layer of the plate in the die (0 for the die body); informational for kinematics. */
  readonly layer: number;
  /** Named points of interest in the body's own frame, mm (pivots, edge points, coupler points). */
  readonly points: Readonly<Record<string, Point>>;
  /**
   * Rough assembly pose, used as Newton's start when no warm start is given. The die body is always at the origin
   * with φ = 0, whatever is written here.
   */
  readonly initial: BodyPose;
}

/**
 * A pin joint: `pointI` of `bodyI` and `pointJ` of `bodyJ` (each in its body's frame, mm) coincide. Removes two
 * degrees of freedom. Its joint value is the relative angle φJ − φI, radians, counter-clockwise positive.
 */
export interface RevoluteJoint {
  readonly kind: 'revolute';
  readonly id: string;
  readonly bodyI: string;
  readonly pointI: Point;
  readonly bodyJ: string;
  readonly pointJ: Point;
}

/**
 * A slide: a line through `pointI` along `axisI` in `bodyI` and a line through `pointJ` along `axisJ` in `bodyJ`
 * stay collinear and point the same way, so the relative angle is fixed. Removes two degrees of freedom. Its joint
 * value, the travel, is the distance from `pointI` to `pointJ` measured along the axis of body I, mm.
 */
export interface PrismaticJoint {
  readonly kind: 'prismatic';
  readonly id: string;
  readonly bodyI: string;
  readonly pointI: Point;
  /** Direction of the axis in body I's frame; any nonzero length. */
  readonly axisI: Point;
  readonly bodyJ: string;
  readonly pointJ: Point;
  /** Direction of the axis in body J's frame; any nonzero length. */
  readonly axisJ: Point;
}

/** A revolute or prismatic joint. */
export type Joint = RevoluteJoint | PrismaticJoint;

/**
 * An actuator acting on a joint: joint value = actuator value + `offset`. For a revolute joint the value is the
 * relative angle φJ − φI in radians; for a prismatic joint it is the travel in mm.
 */
export interface Driver {
  readonly id: string;
  /** Id of the driven joint. */
  readonly joint: string;
  /** Joint value at actuator value 0, radians or mm. @default 0 */
  readonly offset: number;
}

/** Input to `defineMechanism`: a `Mechanism` whose optional fields take documented defaults. */
export interface MechanismSpec {
  readonly bodies: readonly BodySpec[];
  readonly joints: readonly Joint[];
  readonly drivers?: readonly DriverSpec[];
}

/** A body as given to `defineMechanism`. */
export interface BodySpec {
  readonly id: string;
  readonly kind: BodyKind;
  /** @default 0 */
  readonly layer?: number;
  /** @default {} */
  readonly points?: Readonly<Record<string, Point>>;
  /** @default { x: 0, y: 0, phi: 0 } */
  readonly initial?: BodyPose;
}

/** A driver as given to `defineMechanism`. */
export interface DriverSpec {
  readonly id: string;
  readonly joint: string;
  /** @default 0 */
  readonly offset?: number;
}
