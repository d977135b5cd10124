import { describe, expect, it } from 'vitest';
import { interpolateLinear } from '../../src/numeric/index.js';

describe('interpolateLinear', () => {
  // analytic: a straight line y = 3x − 2 sampled at uneven points is reproduced exactly between them
  it('interpolateLinear on samples of y = 3x − 2 gives 3x − 2 anywhere inside', () => {
    const xs = [0, 0.1, 0.35, 1, 2.5];
    const ys = xs.map((x) => 3 * x - 2);
    for (const x of [0.05, 0.2, 0.349, 0.7, 1.9, 2.5]) expect(interpolateLinear(xs, ys, x)).toBeCloseTo(3 * x - 2, 12);
  });

  it('interpolateLinear holds the end values outside the samples and is NaN without samples', () => {
    expect(interpolateLinear([1, 2], [10, 20], -5)).toBe(10);
    expect(interpolateLinear([1, 2], [10, 20], 7)).toBe(20);
    expect(interpolateLinear([], [], 1)).toBeNaN();
  });
});
