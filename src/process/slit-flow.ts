/**
 * Isothermal flow of a power-law melt (τ = m·γ̇ⁿ) through a wide slit, the standard result (e.g. Tadmor & Gogos,
 * *Principles of Polymer Processing*; docs/MODEL.md §3):
 *
 *   q = n/(2n+1) · (H²/2) · (H·ΔP / (2·m·L))^(1/n)      (flow per unit width)
 *
 * SI inside: gap and land in metres, pressure in pascals, q in m²/s.
 */
export interface SlitFlowInput {
  /** Gap height H, mm. */
  readonly gapMm: number;
  /** Land length L along the flow, mm. */
  readonly landMm: number;
  /** Power-law index n, 0 < n ≤ 1. */
  readonly n: number;
  /** Power-law consistency m, Pa·sⁿ. */
  readonly mPaSn: number;
}

/** Volumetric flow per unit width through the slit, m²/s, at pressure drop `pressurePa` across the land. */
export function slitFlowPerWidth(slit: SlitFlowInput, pressurePa: number): number {
  const h = slit.gapMm / 1000;
  const l = slit.landMm / 1000;
  return (slit.n / (2 * slit.n + 1)) * (h * h * 0.5) * ((h * pressurePa) / (2 * slit.mPaSn * l)) ** (1 / slit.n);
}

/** Pressure drop across the land, Pa, for a flow per unit width `qM2PerS` (the formula above solved for ΔP). */
export function slitPressureDropPa(slit: SlitFlowInput, qM2PerS: number): number {
  const h = slit.gapMm / 1000;
  const l = slit.landMm / 1000;
  const n = slit.n;
  return ((2 * slit.mPaSn * l) / h) * ((qM2PerS * (2 * n + 1) * 2) / (n * h * h)) ** n;
}

/**
 * Ratio of flows per width through two gaps at the same pressure drop and land: q₁/q₂ = (H₁/H₂)^(2+1/n). Thick walls
 * run fast, which is why a profile with mixed walls balances poorly.
 */
export function slitFlowRatioAtEqualPressure(gap1Mm: number, gap2Mm: number, n: number): number {
  return (gap1Mm / gap2Mm) ** (2 + 1 / n);
}

/**
 * Ratio of pressure drops when a gap changes from `fromGapMm` to `toGapMm` at constant flow per width and land:
 * ΔP_to/ΔP_from = (H_from/H_to)^(1+2n). Halving a gap raises pressure 2^(1+2n)-fold.
 */
export function slitPressureRatioAtEqualFlow(fromGapMm: number, toGapMm: number, n: number): number {
  return (fromGapMm / toGapMm) ** (1 + 2 * n);
}
