import { formatNumber } from './format-number.js';

/**
 * Mean linear expansion of the die steel, 1/K: 11.3 µm/(m·K) for H13 hot-work tool steel between 20 and 204 °C (steel
 * makers' data sheets; docs/MODEL.md §5). Other tool steels lie near 11–12.5 µm/(m·K) (from memory).
 */
export const STEEL_EXPANSION_PER_K = 11.3e-6;

/** Temperature at which steel is cut and measured, °C. */
export const CUT_TEMPERATURE_C = 20;

/**
 * Which dimensions a drawing gives: `cold`, the sizes to cut and measure at 20 °C; `hot`, the plan's own numbers,
 * which are the die at its working temperature (the orifice the melt sees).
 */
export type DrawingDimensions = 'cold' | 'hot';

/** The scale a drawing applies to the plan's geometry, and the sentence that says so on the drawing. */
export interface ThermalScale {
  readonly dimensions: DrawingDimensions;
  /** Factor on every plan coordinate and diameter (about the die-body origin). */
  readonly factor: number;
  /** One line for the drawing, plain ASCII. */
  readonly statement: string;
}

/**
 * The plan describes the die at its working temperature: the orifice must have the schedule's shape while the steel
 * is hot. A die of one steel heated evenly grows by 1 + α·ΔT in every direction (linear thermal expansion, α =
 * `STEEL_EXPANSION_PER_K`, ΔT = die temperature − 20 °C), so the sizes to cut at 20 °C are the plan's divided by it.
 * `hot` leaves the plan's numbers as they are. Uneven heating, other materials in the die or the plant's own
 * allowances are outside this model and the statement says so.
 */
export function thermalScale(dimensions: DrawingDimensions, dieTemperatureC: number): ThermalScale {
  const growth = 1 + STEEL_EXPANSION_PER_K * (dieTemperatureC - CUT_TEMPERATURE_C);
  const die = Math.round(dieTemperatureC);
  const steel = `steel expansion ${STEEL_EXPANSION_PER_K * 1e6} um/(m K), H13 mean 20-204 deg C`;
  if (dimensions === 'hot') {
    return {
      dimensions,
      factor: 1,
      statement: `DIMENSIONS HOT: as planned, the die at ${die} deg C (cut cold at x ${growthText(1 / growth)}; ${steel}; even heating assumed)`,
    };
  }
  return {
    dimensions,
    factor: 1 / growth,
    statement: `DIMENSIONS COLD: to cut and measure at ${CUT_TEMPERATURE_C} deg C, plan geometry x ${growthText(1 / growth)} so it grows to size at ${die} deg C (${steel}; even heating assumed)`,
  };
}

function growthText(x: number): string {
  return formatNumber(x, 6);
}
