import type { Point, Region } from '../geometry/index.js';

/**
 * The validated schedule in domain units: millimetres for geometry, metres and seconds for line position and time,
 * kilograms, kg/m³ and pascals for the process, radians for angles. Built once from the wire request by the HTTP
 * layer's mapper (`toSchedule`); the core trusts it.
 */
export interface Schedule {
  readonly name: string;
  readonly material: MaterialName;
  readonly process: ProcessSettings;
  readonly limits: Limits;
  readonly plates: PlateSettings;
  readonly links: LinkSettings;
  readonly actuators: ActuatorSettings;
  /** Time step of the setpoint table, s. */
  readonly timeStepS: number;
  /** Length of one repeat of a periodic schedule, m; null when the schedule is not periodic. */
  readonly repeatLengthM: number | null;
  /**
   * Motion law of the actuators between stations (docs/MODEL.md §3 "Motion"): `cycloidal` or `polynomial-345`
   * (rest at every station, VDI 2143 Blatt 1) or `monotone-cubic` (Fritsch & Carlson 1980 through all station
   * values). @default 'cycloidal' when absent
   */
  readonly motionLaw?: MotionLaw;
  readonly movingSpan: MovingSpanSettings;
  /** Stations in strictly increasing line position. */
  readonly stations: readonly Station[];
}

/** The motion laws a plan may use between stations (wire: `cycloidal`, `polynomial_345`, `monotone_cubic`). */
export type MotionLaw = 'cycloidal' | 'polynomial-345' | 'monotone-cubic';

/** Material presets the service knows, or `custom` (then every process value comes from the request). */
export type MaterialName = 'PVC-U' | 'HDPE' | 'PP' | 'ABS' | 'TPE' | 'custom';

/** One orifice profile at one line position. */
export interface Station {
  /** Index in schedule order, from 0. */
  readonly index: number;
  /** Line position along the product, m. */
  readonly positionM: number;
  /** Orifice in the die-body frame, mm: outer ring CCW, holes CW (normalised). */
  readonly orifice: Region;
}

export interface ProcessSettings {
  /** Nominal line (puller) speed, m/s. */
  readonly lineSpeedMPerS: number;
  /** Mass throughput, kg/s; null when the first station sets it at the target draw-down. */
  readonly throughputKgPerS: number | null;
  /** Melt density at the die, kg/m³. */
  readonly meltDensityKgPerM3: number;
  /** Solid density at the puller, kg/m³. */
  readonly solidDensityKgPerM3: number;
  /** Linear die swell ratio (extrudate thickness / die gap), dimensionless, ≥ 1. */
  readonly dieSwell: number;
  /** Power-law flow index n, dimensionless, 0 < n ≤ 1. */
  readonly powerLawN: number;
  /** Power-law consistency m, Pa·sⁿ. */
  readonly powerLawMPaSn: number;
  /** Die temperature, °C. */
  readonly dieTemperatureC: number;
  /** Die land length used for the slit-flow pressure estimate, mm. */
  readonly dieLandLengthMm: number;
  /**
   * True: the puller speed follows the orifice area along the motion so that the draw-down stays at the target
   * (middle of the draw-down range) at constant throughput (ṁ = ρ·A·v), and line position is re-timed by that speed.
   * False: the puller runs at the nominal line speed. @default false when absent
   */
  readonly pullerFollowsArea?: boolean;
}

export interface Limits {
  /** Area draw-down ratio range (orifice area / product area). */
  readonly drawDownMin: number;
  readonly drawDownMax: number;
  /** Thinnest allowed wall, mm. */
  readonly minWallMm: number;
  /** Largest allowed thickest/thinnest wall ratio. */
  readonly maxWallRatio: number;
  /** Largest allowed deviation between target and achieved orifice boundaries, mm. */
  readonly fitToleranceMm: number;
  /** Largest plate count the fit may use. */
  readonly maxPlates: number;
  /** Fewest plates the fit may use (the search goes no lower). */
  readonly minPlates: number;
  /** Fit exactly this many plates instead of searching for the fewest; null to search. */
  readonly plateCount: number | null;
  /**
   * Speeds the puller can run at, m/s: the puller speed that holds the target draw-down is checked against it when the
   * puller follows the area, and the nominal line speed when it does not. @default 0.01–200 m/min when absent (the
   * range `line_speed_m_per_min` accepts; `PLAUSIBLE` in process/)
   */
  readonly pullerSpeedMPerS?: { readonly min: number; readonly max: number };
}

export interface PlateSettings {
  readonly pivotHoleDiameterMm: number;
  /** Steel left between a pivot hole and the orifice edge, mm. */
  readonly ligamentMm: number;
  /** Plate thickness along the extrusion direction, mm. */
  readonly thicknessMm: number;
  /** Plate body depth away from the melt, mm. */
  readonly depthMm: number;
}

/** Binary links the mechanisation may add. */
export interface LinkSettings {
  /** Shortest link, pin centre to pin centre, mm. */
  readonly minLengthMm: number;
  /** Longest link, mm. */
  readonly maxLengthMm: number;
}

export interface ActuatorSettings {
  readonly count: number;
  /** Largest actuator speed, rad/s for rotary actuators. */
  readonly maxSpeedRadPerS: number;
  /** Largest actuator acceleration, rad/s². */
  readonly maxAccelRadPerS2: number;
  /** Largest linear actuator speed, mm/s. */
  readonly maxSpeedMmPerS: number;
  /** Largest linear actuator acceleration, mm/s². */
  readonly maxAccelMmPerS2: number;
}

export interface MovingSpanSettings {
  /** Explicit ends of the moving part of the boundary, mm; null to find it automatically. */
  readonly ends: { readonly start: Point; readonly end: Point } | null;
  /** Two station boundaries closer than this are the same die-body wall, mm. */
  readonly matchToleranceMm: number;
}
