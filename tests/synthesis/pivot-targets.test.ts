import { describe, expect, it } from 'vitest';
import type { Point } from '../../src/geometry/index.js';
import type { MovingSpan } from '../../src/span/index.js';
import { preparePivotTargets } from '../../src/synthesis/index.js';

/** A span on a circle of radius r round the origin, walked clockwise over the top (melt inside, plates outside). */
function arcSpan(r: number): MovingSpan {
  const path: Point[] = [];
  for (let k = 0; k <= 2000; k++) {
    const a = (3 * Math.PI) / 4 - (k * Math.PI) / 2 / 2000;
    path.push([r * Math.cos(a), r * Math.sin(a)]);
  }
  return {
    path,
    start: path[0]!,
    end: path[200]!,
    lengthMm: (r * Math.PI) / 2,
    fixed: [],
    slideMm: { start: 0, end: 0 },
  };
}

describe('preparePivotTargets', () => {
  it('puts the pivot line of an arc of radius R on the concentric circle R + e', () => {
    // analytic: the offset of a circle by e away from its centre is the circle of radius R + e
    const [target] = preparePivotTargets([arcSpan(30)], 5, 9, 0.5);
    const inner = target!.pivotLine.slice(1, -1);
    for (const p of inner) expect(Math.hypot(p[0], p[1])).toBeCloseTo(35, 2);
  });

  it('gives the span a curvature of −1/R (a clockwise walk turns right)', () => {
    // circle through three points of a circle of radius R has curvature 1/R (standard geometry)
    const [target] = preparePivotTargets([arcSpan(30)], 5, 9, 0.5);
    const inner = target!.curvature.slice(1, -1);
    // resampled points sit on the chords of a 2000-piece polygon (sagitta 2e-6 mm), so allow 1 %
    for (const k of inner) expect(Math.abs(k + 1 / 30)).toBeLessThan(0.01 / 30);
  });

  it('extends the pivot line straight past both span ends by the extension', () => {
    const [target] = preparePivotTargets([arcSpan(30)], 5, 9, 0.5);
    const line = target!.pivotLine;
    const a = line[0]!;
    const b = line[1]!;
    expect(Math.hypot(b[0] - a[0], b[1] - a[1])).toBeCloseTo(9, 6);
  });
});
