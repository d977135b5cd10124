import { describe, expect, it } from 'vitest';
import { findOrderDefect } from '../../src/kinematics/index.js';
import { toRadians } from '../../src/numeric/index.js';

describe('findOrderDefect', () => {
  it('findOrderDefect([10, 30, 50, 40]) flags the reversal at station 3', () => {
    // Reference: Chase & Mirth, J. Mech. Des. 115(2) 1993: stations must be reached with a monotonic input
    expect(findOrderDefect([10, 30, 50, 40])).toEqual({ defect: true, direction: 1, reversals: [3], sweep: 30 });
  });

  it('findOrderDefect(decreasing values with a dwell) is no defect', () => {
    // Reference: a dwell (equal neighbours) keeps the order
    expect(findOrderDefect([5, 3, 3, -2])).toMatchObject({ defect: false, direction: -1, reversals: [] });
  });

  it('findOrderDefect(crank angles 350°, 10°, 30°, cyclic) wraps the steps and finds no defect', () => {
    // Reference: a fully rotating crank reaches 10° after 350° by turning +20°
    const r = findOrderDefect([350, 10, 30].map(toRadians), { cyclic: true });
    expect(r.defect).toBe(false);
    expect(r.direction).toBe(1);
    expect(r.sweep).toBeCloseTo(toRadians(40), 12);
    expect(findOrderDefect([350, 10, 30].map(toRadians)).defect).toBe(true);
  });

  it('findOrderDefect(steps within the tolerance) treats them as dwells', () => {
    // Reference: round-off in fitted station values must not count as a reversal
    expect(findOrderDefect([1, 2, 2 - 1e-12, 3], { tolerance: 1e-9 }).defect).toBe(false);
  });
});
