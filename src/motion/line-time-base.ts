/** Seconds in a minute: line speeds are m/min at the boundary and m/s inside. */
export const SECONDS_PER_MINUTE = 60;

/**
 * Line position ↔ time at a constant line speed. Time 0 is at `originM`; the base covers `spanM` of line (from the
 * first to the last station, or one repeat of a periodic schedule). When periodic, positions and times wrap into one
 * repeat, so a table built over it closes on itself.
 */
export interface LineTimeBase {
  /** Line position at time 0, m. */
  readonly originM: number;
  /** Length of line the base covers: the stations' span, or the repeat length when periodic, m. */
  readonly spanM: number;
  /** Line speed, m/s (> 0). */
  readonly lineSpeedMPerS: number;
  /** True when the schedule repeats every `spanM`. */
  readonly periodic: boolean;
}

/**
 * Builds a time base from the first station position `originM` (m), the last station position `endM` (m), the line
 * speed in m/s and the repeat length in m (null when not periodic; then it must be longer than endM − originM).
 * Throws on misuse: a line speed that is not positive, an end before the origin, a repeat length too short.
 */
export function lineTimeBase(
  originM: number,
  endM: number,
  lineSpeedMPerS: number,
  repeatLengthM: number | null,
): LineTimeBase {
  if (!(lineSpeedMPerS > 0) || !Number.isFinite(lineSpeedMPerS)) {
    throw new Error(`lineTimeBase: line speed must be positive and finite, got ${lineSpeedMPerS} m/s`);
  }
  if (!Number.isFinite(originM) || !(endM >= originM)) throw new Error('lineTimeBase: end before origin');
  if (repeatLengthM === null) return { originM, spanM: endM - originM, lineSpeedMPerS, periodic: false };
  if (!(repeatLengthM > endM - originM) || !Number.isFinite(repeatLengthM)) {
    throw new Error(
      `lineTimeBase: repeat length ${repeatLengthM} m must exceed the stations' span ${endM - originM} m`,
    );
  }
  return { originM, spanM: repeatLengthM, lineSpeedMPerS, periodic: true };
}

/** m/min (wire) → m/s (inside). */
export function metresPerSecond(lineSpeedMPerMin: number): number {
  return lineSpeedMPerMin / SECONDS_PER_MINUTE;
}

/** m/s (inside) → m/min (wire). */
export function metresPerMinute(lineSpeedMPerS: number): number {
  return lineSpeedMPerS * SECONDS_PER_MINUTE;
}

/** Time at line position `positionM`, s: (x − origin)/v; wrapped into [0, one repeat) when periodic. */
export function timeAtPosition(base: LineTimeBase, positionM: number): number {
  return (wrapPosition(base, positionM) - base.originM) / base.lineSpeedMPerS;
}

/** Line position at time `timeS`, m: origin + v·t; wrapped into [origin, origin + repeat) when periodic. */
export function positionAtTime(base: LineTimeBase, timeS: number): number {
  return wrapPosition(base, base.originM + base.lineSpeedMPerS * timeS);
}

/** A periodic base maps `positionM` into [origin, origin + repeat), m; otherwise the position is returned as is. */
export function wrapPosition(base: LineTimeBase, positionM: number): number {
  if (!base.periodic) return positionM;
  const offset = (((positionM - base.originM) % base.spanM) + base.spanM) % base.spanM;
  return base.originM + offset;
}
