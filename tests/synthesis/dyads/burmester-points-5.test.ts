import { describe, expect, it } from 'vitest';
import { burmesterPoints5, type RelativePose } from '../../../src/synthesis/dyads/index.js';
import { A_LOCAL, A0, B_LOCAL, B0, couplerPoses, dist, linkSpread } from './known-four-bar.js';

const five = couplerPoses([20, 75, 140, 200, 280]);

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

  it('the known ground pivots A0 and B0 with moving pivots A and B are among them', () => {
    // self-consistent case (DOMAIN.md §5): the four-bar that made the positions is a Burmester pair twice over
    for (const [g, m] of [
      [A0, A_LOCAL],
      [B0, B_LOCAL],
    ] as const) {
      const hit = result.pairs.find((p) => dist(p.centre, g) < 1e-6);
      expect(hit).toBeDefined();
      expect(dist(hit!.circlePointLocal, m)).toBeLessThan(1e-6);
    }
  });

  it('merges duplicates: no two pairs share a centre', () => {
    for (let i = 0; i < result.pairs.length; i++) {
      for (let j = i + 1; j < result.pairs.length; j++) {
        expect(dist(result.pairs[i]!.centre, result.pairs[j]!.centre)).toBeGreaterThan(1e-3);
      }
    }
  });

  it('pseudo-random five-position sets give 0, 2 or 4 verified pairs, the same with a denser scan', () => {
    // real Burmester points come in conjugate-free pairs: 0, 2 or 4 (Sandor & Erdman vol. 2)
    let seed = 7;
    const rnd = (): number => {
      seed = (seed * 1103515245 + 12345) % 2147483648;
      return seed / 2147483648;
    };
    for (let k = 0; k < 12; k++) {
      const poses: RelativePose[] = Array.from({ length: 5 }, () => ({
        angleRad: (rnd() - 0.5) * 2,
        origin: [(rnd() - 0.5) * 100, (rnd() - 0.5) * 100],
      }));
      const r = burmesterPoints5(poses);
      expect(r.status).toBe('ok');
      expect([0, 2, 4]).toContain(r.pairs.length);
      for (const p of r.pairs) expect(linkSpread(poses, p.centre, p.circlePointLocal)).toBeLessThan(1e-8);
      expect(burmesterPoints5(poses, { directions: 4000, triples: 4 }).pairs.length).toBe(r.pairs.length);
    }
  });

  it('pure translations are degenerate', () => {
    const poses: RelativePose[] = [0, 1, 2, 3, 4].map((k) => ({ angleRad: 0.1, origin: [10 * k, k * k] }));
    expect(burmesterPoints5(poses).status).toBe('degenerate');
  });

  it('throws for a pose count other than 5', () => {
    expect(() => burmesterPoints5(five.slice(0, 4))).toThrow(/expected 5 poses/);
  });
});
