import type { Finding } from '../domain/index.js';
import type { Point, Region } from '../geometry/index.js';
import type { Mechanism } from '../kinematics/index.js';
import type { JointTransmission, LegTrace, LinkTransmission, MotionDefect } from './drive-through-stations.js';
import type { LinkDesign } from './link-design.js';
import type { MechaniseOptions } from './mechanise-options.js';
import type { ClearanceRecord } from './motion-clearance.js';
import type { PlateSearch } from './reduced-mode.js';

/**
 * The mechanism as the plan reports it (the shape of the pipeline's `PlanMechanism`): bodies, joints with their place
 * at every station, actuators with their value at every station, the Grübler mobility and findings.
 */
export interface MechanismReport {
  /** Grübler–Kutzbach mobility M = 3(n − 1) − 2·j₁ of the mechanism, actuators not counted. */
  readonly mobility: number;
  readonly bodies: readonly {
    readonly id: string;
    readonly kind: 'die_body' | 'plate' | 'link';
    readonly layer: number;
  }[];
  readonly joints: readonly {
    readonly id: string;
    readonly type: 'revolute' | 'prismatic';
    readonly bodies: readonly [string, string];
    /** Joint point in the die-body frame at each station (schedule order), mm. */
    readonly stationPositions: readonly Point[];
  }[];
  readonly actuators: readonly {
    readonly id: string;
    readonly joint: string;
    readonly kind: 'rotary' | 'linear';
    /** Degrees (rotary: relative angle of the joint's second body to its first) or mm (linear) at each station. */
    readonly stationValues: readonly number[];
  }[];
  readonly findings: readonly Finding[];
}

/** How the mechanism does at one station (schedule order). */
export interface StationOutcome {
  readonly station: number;
  /** Distinct position the station was synthesised for. */
  readonly position: number;
  /**
   * Largest distance between a chain pivot of the mechanism driven to this station and the same pivot of the
   * assembled station, mm: round-off with exact links.
   */
  readonly residualMm: number;
  /** Largest pivot move made to close the fitted chain exactly at this station, mm (the fit closes within µm). */
  readonly closureAdjustmentMm: number;
  /** Orifice left by the plates where the mechanism puts them: opening − union(plate outlines). */
  readonly achievedOrifice: Region;
  /** Symmetric Hausdorff distance between the target and achieved orifice boundaries, mm. */
  readonly deviationMm: number;
  /** Where the deviation is largest, on the target boundary, mm. */
  readonly worstAt: Point | null;
}

/** Result of `mechaniseChain`. */
export interface MechanisationResult {
  /** `mechanised`: a mechanism with the requested actuators passes every check; else `no-mechanism` with findings. */
  readonly status: 'mechanised' | 'no-mechanism';
  /** `direct`: actuators = degrees of freedom, no links; `reduced`: binary links take up the rest. */
  readonly mode: 'direct' | 'reduced' | null;
  readonly requestedActuators: number;
  /** Degrees of freedom of the fitted chain alone (N − 2, + 1 per slotted end, + 1 per telescoping pair). */
  readonly chainDegreesOfFreedom: number;
  /** Distinct plate positions among the stations (coincident stations merged). */
  readonly distinctPositions: number;
  /** The synthesis used for the links, in words (by the number of distinct positions). */
  readonly synthesis: string;
  /** Where ground pivots may go, in words. */
  readonly groundPivotRule: string;
  /** The stacking of plates and links, in words. */
  readonly layerModel: string;
  readonly mechanism: MechanismReport | null;
  /** The kinematic model behind `mechanism`, for further analysis (motion tables, drawings). */
  readonly model: Mechanism | null;
  /** The binary links, ids as in `mechanism`. */
  readonly links: readonly LinkDesign[];
  /** Mobility by count and by the rank of the constraint Jacobian at the first station; both equal the actuators. */
  readonly mobility: { readonly grubler: number; readonly numerical: number; readonly rank: number } | null;
  readonly stations: readonly StationOutcome[];
  readonly legs: readonly LegTrace[];
  /** Defects of the mechanism returned (none when mechanised) or of the closest attempt. */
  readonly defects: readonly MotionDefect[];
  /** Transmission-angle extremes of every binary link over the whole motion, and over all links, degrees. */
  readonly transmission: {
    readonly links: readonly LinkTransmission[];
    readonly minDeg: number | null;
    readonly maxDeg: number | null;
    /** Plate–plate joints closing a dyad (the plates drive each other there), over the whole motion. */
    readonly joints: readonly JointTransmission[];
  };
  /**
   * Smallest room per pair of parts over the whole motion (die-body pins against plate sweeps, link pins against the
   * layers they pass, plates sharing a layer, links over the opening), smallest first; empty without a mechanism.
   */
  readonly clearances: readonly ClearanceRecord[];
  /** Largest condition estimate of the driven Jacobian along the motion (dimensionless). */
  readonly maxCondition: number | null;
  /** What the link search learnt about each plate that could take a link (reduced mode). */
  readonly plates: readonly PlateSearch[];
  /**
   * On failure, the smallest actuator count found to work: searched upward from the request (from 1 when more
   * actuators were asked for than the chain has degrees of freedom) up to the degrees of freedom, where direct mode
   * works whenever its continuation does; null when none works or `findSmallestActuatorCount` is off. On success, 1
   * when one actuator was asked for, else null (smaller counts are not searched).
   */
  readonly smallestActuatorCount: number | null;
  readonly search: {
    readonly assemblies: number;
    readonly partialTraces: number;
    readonly budgetExhausted: boolean;
  };
  readonly findings: readonly Finding[];
  readonly options: MechaniseOptions;
}
