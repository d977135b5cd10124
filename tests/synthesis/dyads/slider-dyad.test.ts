import { describe, expect, it } from 'vitest';
import { invertedSliderDyad, type RelativePose, sliderDyad } from '../../../src/synthesis/dyads/index.js';

/** Connecting-rod poses of a slider-crank r 40, l 120, e 0, slider on the x-axis; rod frame at the crank pin. */
function rodPoses(deg: readonly number[]): RelativePose[] {
  return deg.map((d) => {
    const t = (d * Math.PI) / 180;
    const a: [number, number] = [40 * Math.cos(t), 40 * Math.sin(t)];
    const bx = a[0] + Math.sqrt(120 * 120 - a[1] * a[1]);
    return { angleRad: Math.atan2(-a[1], bx - a[0]), origin: a };
  });
}

describe('sliderDyad', () => {
  const stations = [10, 40, 70, 100, 130];
  const poses = rodPoses(stations);

  it('the slider pin of a slider-crank runs on the x-axis; at θ 40° it sits at x = 147.8549', () => {
    // slider-crank r 40, l 120, e 0, θ 40° → slider x 147.8549 (docs/MODEL.md §5, closed form)
    const s = sliderDyad(poses, [120, 0]);
    expect(s.status).toBe('ok');
    expect(s.residualMaxMm).toBeLessThan(1e-9);
    expect(Math.abs(s.direction[1])).toBeLessThan(1e-12);
    expect(s.direction[0]).toBeCloseTo(-1, 12); // the slider moves in as the crank turns from 10° to 130°
    expect(s.linePoint[1]).toBeCloseTo(0, 12);
    const x40 = s.linePoint[0] + s.travelMm[1]! * s.direction[0];
    expect(x40).toBeCloseTo(147.8549, 4);
  });

  it('a point that moves on a circle gets a non-zero line residual', () => {
    const s = sliderDyad(poses, [0, 0]);
    expect(s.status).toBe('ok');
    expect(s.residualMaxMm).toBeGreaterThan(1);
    expect(s.residualRmsMm).toBeLessThanOrEqual(s.residualMaxMm);
  });

  it('a point that does not move is coincident', () => {
    const still: RelativePose[] = [0, 0.5, 1].map((a) => ({ angleRad: a, origin: [0, 0] }));
    expect(sliderDyad(still, [0, 0]).status).toBe('coincident');
  });
});

describe('invertedSliderDyad', () => {
  it('a die-body pin running in a straight slot of the plate (y = 6 in its frame) is recovered exactly', () => {
    // PR inversion (Erdman, Sandor & Kota): seen from the plate, the pin moves along the slot
    const pin: [number, number] = [30, 20];
    const poses: RelativePose[] = [
      [0.1, -5],
      [0.35, 3],
      [0.5, 12],
      [0.9, 20],
      [1.2, 31],
    ].map(([angle, slide]) => {
      const c = Math.cos(angle!);
      const s = Math.sin(angle!);
      return { angleRad: angle!, origin: [pin[0] - (c * slide! - s * 6), pin[1] - (s * slide! + c * 6)] };
    });
    const r = invertedSliderDyad(poses, pin);
    expect(r.status).toBe('ok');
    expect(r.residualMaxMm).toBeLessThan(1e-9);
    expect(r.direction[0]).toBeCloseTo(1, 12);
    expect(r.linePoint[1]).toBeCloseTo(6, 10);
    expect(r.travelMm[4]! - r.travelMm[0]!).toBeCloseTo(36, 10);
    expect(sliderDyad(poses, [0, 6]).residualMaxMm).toBeGreaterThan(1);
  });
});
