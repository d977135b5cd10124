import { describe, expect, it } from 'vitest';
import { burmesterPoints5, type RelativePose } from '../../../src/synthesis/dyads/index.js';
import { A_LOCAL, A0, B_LOCAL, B0, couplerPoses, dist, linkSpread, type PoseLike, place } from './known-four-bar.js';

const five = couplerPoses([20, 75, 140, 200, 280]);

/** The known four-bar's dyads (A0, A) and (B0, B) are among `pairs`, both pins within `tol` mm. */
function expectKnownDyads(
  pairs: readonly { centre: readonly [number, number]; circlePointLocal: readonly [number, number] }[],
  tol: number,
) {
  for (const [g, m] of [
    [A0, A_LOCAL],
    [B0, B_LOCAL],
  ] as const) {
    const hit = pairs.find((p) => dist(p.centre, g) < tol);
    expect(hit).toBeDefined();
    expect(dist(hit!.circlePointLocal, m)).toBeLessThan(tol);
  }
}

/** Spread of the centre–circle-point distance over the positions relative to its largest value (independent of src/). */
function relativeSpread(
  poses: readonly PoseLike[],
  centre: readonly [number, number],
  local: readonly [number, number],
) {
  const d = poses.map((pose) => dist(place(pose, local), centre));
  return (Math.max(...d) - Math.min(...d)) / Math.max(...d);
}

/** Five pseudo-random positions (linear congruential generator, reproducible), rotations within ±maxTurnRad. */
function randomFive(count: number, maxTurnRad: number, seed0: number): RelativePose[][] {
  let seed = seed0;
  const rnd = (): number => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
  return Array.from({ length: count }, () =>
    Array.from({ length: 5 }, () => ({
      angleRad: (rnd() - 0.5) * 2 * maxTurnRad,
      origin: [(rnd() - 0.5) * 100, (rnd() - 0.5) * 100] as const,
    })),
  );
}

describe('burmesterPoints5', () => {
  const result = burmesterPoints5(five);

  it('finds at most four pairs, each an exact dyad for all five positions (≤ 1e-8 mm, measured independently)', () => {
    // Burmester: at most four real centre/circle point pairs for five finitely separated positions
    expect(result.status).toBe('ok');
    expect(result.pairs.length).toBeLessThanOrEqual(4);
    expect(result.pairs.length % 2).toBe(0);
    for (const p of result.pairs) {
      expect(linkSpread(five, p.centre, p.circlePointLocal)).toBeLessThan(1e-8);
    }
  });

  it('the known ground pivots A0 and B0 with moving pivots A and B are among them (1e-6 mm)', () => {
    // self-consistent case (docs/MODEL.md §5): the four-bar that made the positions is a Burmester pair twice over
    expectKnownDyads(result.pairs, 1e-6);
  });

  it('a 10° crank sweep of the known four-bar is ok, not degenerate, with the known dyads within 1e-6 mm', () => {
    // small motion, as a die plate makes: two of the four pairs lie metres away and are reached from many seeds,
    // whose copies differ by more than an absolute 1e-6 mm (they were once counted as six distinct pairs)
    const poses = couplerPoses([78, 81, 83, 85.5, 88]);
    const r = burmesterPoints5(poses);
    expect(r.status).toBe('ok');
    expect([0, 2, 4]).toContain(r.pairs.length);
    expectKnownDyads(r.pairs, 1e-6);
    for (const p of r.pairs) expect(relativeSpread(poses, p.centre, p.circlePointLocal)).toBeLessThan(1e-8);
  });

  it('merges duplicates: no two pairs share a centre', () => {
    for (let i = 0; i < result.pairs.length; i++) {
      for (let j = i + 1; j < result.pairs.length; j++) {
        expect(dist(result.pairs[i]!.centre, result.pairs[j]!.centre)).toBeGreaterThan(1e-3);
      }
    }
  });

  it.each([
    ['rotations up to ±1 rad', 1, 7],
    ['rotations up to ±0.01 rad (far pairs)', 0.01, 21],
  ])(
    'pseudo-random five-position sets, %s: ok, 0, 2 or 4 pairs, each equidistant within 1e-8 relative',
    (_l, turn, seed) => {
      // real Burmester points come in pairs of roots: 0, 2 or 4 (Sandor & Erdman vol. 2); the five-position
      // constraint is |C − Pᵢ(c)| equal at all five positions, checked here by placing the pins independently
      for (const poses of randomFive(16, turn, seed)) {
        const r = burmesterPoints5(poses);
        expect(r.status).toBe('ok');
        expect([0, 2, 4]).toContain(r.pairs.length);
        expect(r.beyondExtent).toBe(0);
        for (const p of r.pairs) expect(relativeSpread(poses, p.centre, p.circlePointLocal)).toBeLessThan(1e-8);
      }
    },
  );

  it('a denser scan over more triples finds the same number of pairs', () => {
    for (const poses of [...randomFive(3, 1, 7), ...randomFive(3, 0.01, 21)]) {
      expect(burmesterPoints5(poses, { directions: 4000, triples: 4 }).pairs.length).toBe(
        burmesterPoints5(poses).pairs.length,
      );
    }
  });

  it('pairs beyond extentMm are counted, not returned', () => {
    const all = burmesterPoints5(five);
    const near = burmesterPoints5(five, { extentMm: 150 });
    expect(near.pairs.length + near.beyondExtent).toBe(all.pairs.length);
    expect(near.beyondExtent).toBeGreaterThan(0);
    expect(near.reason).toMatch(/beyond extentMm/);
  });

  it('pure translations are degenerate', () => {
    const poses: RelativePose[] = [0, 1, 2, 3, 4].map((k) => ({ angleRad: 0.1, origin: [10 * k, k * k] }));
    expect(burmesterPoints5(poses).status).toBe('degenerate');
  });

  it('two coincident positions are degenerate (only four distinct: a curve of centre points)', () => {
    const r = burmesterPoints5([five[0]!, five[1]!, five[2]!, five[3]!, five[1]!]);
    expect(r.status).toBe('degenerate');
    expect(r.reason).toMatch(/positions 2 and 5 coincide/);
  });

  it('a pure rotation about one point is degenerate (every point of B keeps its distance to it)', () => {
    const pivot: [number, number] = [30, -20];
    const poses = [0.1, 0.4, 0.9, 1.3, 2].map((a): RelativePose => {
      const p = place({ angleRad: a, origin: [0, 0] }, [5, 7]);
      return { angleRad: a, origin: [pivot[0] - p[0], pivot[1] - p[1]] };
    });
    const r = burmesterPoints5(poses);
    expect(r.status).toBe('degenerate');
    expect(r.reason).toMatch(/turns about one fixed point/);
  });

  it('throws for a pose count other than 5', () => {
    expect(() => burmesterPoints5(five.slice(0, 4))).toThrow(/expected 5 poses/);
  });
});
