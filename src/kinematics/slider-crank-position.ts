/** Slider-crank lengths, mm: crank r, connecting rod l, offset e of the slide line above the crank pivot. */
export interface SliderCrankDimensions {
  readonly r: number;
  readonly l: number;
  readonly e: number;
}

/**
 * Closed-form slider position x = r·cos θ + √(l² − (r·sin θ − e)²), mm, for crank angle θ (radians) with the crank
 * pivot at the origin and the slide along y = e, slider to the right of the crank (standard result, e.g. Norton,
 * *Design of Machinery*). NaN when the rod cannot reach the slide line.
 */
export function sliderCrankPosition(dims: SliderCrankDimensions, theta: number): number {
  const { r, l, e } = dims;
  const h = r * Math.sin(theta) - e;
  const under = l * l - h * h;
  return under < 0 ? Number.NaN : r * Math.cos(theta) + Math.sqrt(under);
}
