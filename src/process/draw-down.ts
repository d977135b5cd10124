/** Square millimetres per square metre. */
const MM2_PER_M2 = 1e6;

/**
 * Area draw-down ratio ADR = A_orifice / A_product (the trade's "draw-down ratio" for profiles). Geometry only: it
 * ignores the density change from melt to solid.
 */
export function areaDrawDownRatio(orificeAreaMm2: number, productAreaMm2: number): number {
  return orificeAreaMm2 / productAreaMm2;
}

/**
 * Velocity draw ratio = v_puller / v_melt = ADR · ρ_melt / ρ_solid: the speed-up the puller imposes on the melt
 * leaving the die (mass balance ρ_melt·A_orifice·v_melt = ρ_solid·A_product·v_puller).
 */
export function velocityDrawRatio(
  areaDrawDown: number,
  meltDensityKgPerM3: number,
  solidDensityKgPerM3: number,
): number {
  return (areaDrawDown * meltDensityKgPerM3) / solidDensityKgPerM3;
}

/**
 * Puller speed that holds a target area draw-down for a given orifice, m/s: the product area must be A_orifice/ADR,
 * and the mass balance gives v = ṁ / (ρ_solid · A_product). Holding screw speed and varying puller speed this way is
 * the usual way to keep draw-down steady as the orifice changes (docs/MODEL.md §3).
 */
export function pullerSpeedForDrawDown(
  throughputKgPerS: number,
  solidDensityKgPerM3: number,
  orificeAreaMm2: number,
  targetDrawDown: number,
): number {
  const wantedProductAreaMm2 = orificeAreaMm2 / targetDrawDown;
  return (throughputKgPerS / (solidDensityKgPerM3 * wantedProductAreaMm2)) * MM2_PER_M2;
}

/**
 * Throughput that gives the target area draw-down for an orifice at a line speed, kg/s: ṁ = ρ_solid · (A/ADR) · v.
 */
export function throughputForDrawDown(
  orificeAreaMm2: number,
  targetDrawDown: number,
  solidDensityKgPerM3: number,
  lineSpeedMPerS: number,
): number {
  return (solidDensityKgPerM3 * (orificeAreaMm2 / targetDrawDown) * lineSpeedMPerS) / MM2_PER_M2;
}
