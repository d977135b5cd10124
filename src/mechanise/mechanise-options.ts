import { resolveTraceOptions, type TraceOptions } from '../kinematics/index.js';

/** What the plant asks for: how many actuators, and any setting to change from its documented default. */
export interface MechaniseRequest extends Partial<Omit<MechaniseOptions, 'actuatorCount' | 'trace'>> {
  /** Actuators the plant wants to drive the plate chain with (1 is the usual request). */
  readonly actuatorCount: number;
  readonly trace?: Partial<TraceOptions>;
}

/** Settings of `mechaniseChain`, resolved once by `resolveMechaniseOptions`; the algorithm trusts them. */
export interface MechaniseOptions {
  readonly actuatorCount: number;
  /**
   * The schedule repeats: after the last station the die returns to the first, so that leg is checked too.
   * @default false
   */
  readonly periodic: boolean;
  /**
   * Shortest binary link, pin centre to pin centre, mm: a link, like the shortest plate, needs two pin holes and the
   * ligament between them. @default pivot hole diameter + ligament of the fitted plates (`mechaniseChain`); 10 where
   * no plates are known (common practice, no source)
   */
  readonly linkLengthMinMm: number;
  /** Longest binary link, mm. @default 200 (common practice, no source) */
  readonly linkLengthMaxMm: number;
  /**
   * The die-body frame a ground pivot may use: the die opening's bounding box grown by this on every side, mm.
   * @default 80
   */
  readonly frameMarginMm: number;
  /**
   * Steel round a pin hole: a ground pivot keeps this distance from the die opening and from every station's orifice;
   * a link pin keeps it from a plate's melt edge and back edge, mm. @default hole radius + ligament of the plates (e)
   */
  readonly pinClearanceMm: number | null;
  /** Grid of candidate circle points over each plate's body, points per axis. @default 8 */
  readonly circlePointSteps: number;
  /**
   * Grid of candidate ground pivots over the die-body frame, points per axis; used with up to three distinct positions,
   * where any centre has its circle point (kinematic inversion). @default 40
   */
  readonly groundPivotSteps: number;
  /**
   * Transmission angle band that passes without comment, degrees (40°–140° is the usual rule; Norton, *Design of
   * Machinery*). @default [40, 140]
   */
  readonly transmissionGoodDeg: readonly [min: number, max: number];
  /** Beyond this band a transmission angle rejects the mechanism; between the bands it is a warning, degrees. @default [30, 150] */
  readonly transmissionLimitDeg: readonly [min: number, max: number];
  /** Stations whose plate poses agree within this are one position for the synthesis, mm. @default 1e-3 */
  readonly mergeToleranceMm: number;
  /** The chain fit's tolerance, mm; scales the residual allowed to least-squares links. @default 0.1 */
  readonly fitToleranceMm: number;
  /**
   * Largest `dyadResidual` of a link synthesised by least squares (more than five distinct stations), mm.
   * @default fitToleranceMm / 4
   */
  readonly linkResidualLimitMm: number | null;
  /**
   * A traced station may differ from the fitted one by this much, mm (circuit-defect test). With exact links only
   * (≤ 3 distinct stations) only round-off remains. @default 1e-6 for ≤ 3 distinct stations, else fitToleranceMm / 2
   */
  readonly arrivalToleranceMm: number | null;
  /**
   * Links between two plates join plates at most this many places apart along the chain (2: next but one; adjacent
   * plates share a pivot and cannot take one). Keeps the synthesis linear in the plate count. @default 3
   */
  readonly plateLinkSpan: number;
  /** Candidate links kept per plate after ranking. @default 16 */
  readonly candidatesPerPlate: number;
  /** Complete mechanisms driven through the stations before giving up, per actuator count. @default 40 */
  readonly maxAssemblies: number;
  /** Partial mechanisms (one plate more at a time) driven through the stations, per actuator count. @default 600 */
  readonly maxPartialTraces: number;
  /** When the request fails, try more actuators to report the smallest count that works. @default true */
  readonly findSmallestActuatorCount: boolean;
  /** Continuation settings (`traceActuatorPath`). @default resolveTraceOptions() */
  readonly trace: TraceOptions;
}

/**
 * Fills every missing setting with its documented default. `plateEdgeOffsetMm` (e of the fitted plates) gives the
 * default pin clearance. Throws for an actuator count that is not a positive integer (programmer misuse: the wire
 * layer validates it).
 */
export function resolveMechaniseOptions(request: MechaniseRequest): MechaniseOptions {
  if (!Number.isInteger(request.actuatorCount) || request.actuatorCount < 1) {
    throw new Error(`mechaniseChain: actuatorCount must be a positive integer, got ${request.actuatorCount}`);
  }
  const fitToleranceMm = request.fitToleranceMm ?? 0.1;
  const o: MechaniseOptions = {
    actuatorCount: request.actuatorCount,
    periodic: request.periodic ?? false,
    linkLengthMinMm: request.linkLengthMinMm ?? 10,
    linkLengthMaxMm: request.linkLengthMaxMm ?? 200,
    frameMarginMm: request.frameMarginMm ?? 80,
    pinClearanceMm: request.pinClearanceMm ?? null,
    circlePointSteps: request.circlePointSteps ?? 8,
    groundPivotSteps: request.groundPivotSteps ?? 40,
    transmissionGoodDeg: request.transmissionGoodDeg ?? [40, 140],
    transmissionLimitDeg: request.transmissionLimitDeg ?? [30, 150],
    mergeToleranceMm: request.mergeToleranceMm ?? 1e-3,
    fitToleranceMm,
    linkResidualLimitMm: request.linkResidualLimitMm ?? null,
    arrivalToleranceMm: request.arrivalToleranceMm ?? null,
    plateLinkSpan: request.plateLinkSpan ?? 3,
    candidatesPerPlate: request.candidatesPerPlate ?? 16,
    maxAssemblies: request.maxAssemblies ?? 40,
    maxPartialTraces: request.maxPartialTraces ?? 600,
    findSmallestActuatorCount: request.findSmallestActuatorCount ?? true,
    trace: resolveTraceOptions(request.trace),
  };
  const [gMin, gMax] = o.transmissionGoodDeg;
  const [lMin, lMax] = o.transmissionLimitDeg;
  if (!(lMin <= gMin && gMin < gMax && gMax <= lMax && lMin >= 0 && lMax <= 180)) {
    throw new Error(
      'mechaniseChain: transmission bands must satisfy 0 ≤ limit min ≤ good min < good max ≤ limit max ≤ 180',
    );
  }
  if (!(o.linkLengthMinMm > 0 && o.linkLengthMaxMm > o.linkLengthMinMm)) {
    throw new Error('mechaniseChain: link length limits must satisfy 0 < min < max');
  }
  if (!Number.isInteger(o.circlePointSteps) || o.circlePointSteps < 1) {
    throw new Error('mechaniseChain: circlePointSteps must be an integer ≥ 1');
  }
  return o;
}
