/** Square millimetres per square metre. */
const MM2_PER_M2 = 1e6;

/**
 * Mass flow through a cross-section, kg/s: ṁ = ρ·A·v (mass balance).
 * @param densityKgPerM3  density of the material crossing the section (melt at the die, solid at the puller).
 * @param areaMm2  cross-section area, mm².
 * @param speedMPerS  mean speed through the section, m/s.
 */
export function massFlowKgPerS(densityKgPerM3: number, areaMm2: number, speedMPerS: number): number {
  return (densityKgPerM3 * areaMm2 * speedMPerS) / MM2_PER_M2;
}

/**
 * Cross-section area of the solid product, mm², from A = ṁ / (ρ_solid · v_line).
 * @param throughputKgPerS  mass throughput, kg/s.
 * @param solidDensityKgPerM3  solid density at the puller, kg/m³.
 * @param lineSpeedMPerS  puller speed, m/s.
 */
export function productAreaMm2(throughputKgPerS: number, solidDensityKgPerM3: number, lineSpeedMPerS: number): number {
  return (throughputKgPerS / (solidDensityKgPerM3 * lineSpeedMPerS)) * MM2_PER_M2;
}

/**
 * Mean melt speed in the orifice, m/s: v = ṁ / (ρ_melt · A_orifice).
 */
export function meltSpeedMPerS(throughputKgPerS: number, meltDensityKgPerM3: number, orificeAreaMm2: number): number {
  return (throughputKgPerS / (meltDensityKgPerM3 * orificeAreaMm2)) * MM2_PER_M2;
}
