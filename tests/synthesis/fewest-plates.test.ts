import { describe, expect, it } from 'vitest';
import { findMovingSpans } from '../../src/span/index.js';
import {
  chainFromParameters,
  fitChain,
  jointArticulation,
  mergePlatesStart,
  resolveChainFitOptions,
} from '../../src/synthesis/index.js';
import { E, LENGTHS, linkedStations, WIDTH } from '../mechanise/known-linkage.js';
import { channelOrifice } from '../support/known-chain.js';

/**
 * Stations of a known 4-plate chain closed by one binary link (tests/mechanise/known-linkage.ts, computed there by the
 * law of cosines, independently of src/): the truth has 4 plates, and every interior pivot turns.
 */
const pivots = linkedStations([0.25, 0.35, 0.45, 0.55]);
const orifices = pivots.map((p) => channelOrifice(p, E, WIDTH, 0.25));
const spans = (() => {
  const r = findMovingSpans(orifices, { matchToleranceMm: 0.02, ends: null });
  if (r.status !== 'found') throw new Error(JSON.stringify(r));
  return r.spans;
})();
const options = resolveChainFitOptions({
  toleranceMm: 0.1,
  maxPlates: 24,
  pivotHoleDiameterMm: 4,
  ligamentMm: 3,
  depthMm: 25,
});

describe('fitChain: the fewest plates, shown by evidence at one plate fewer', () => {
  const fit = fitChain(orifices, spans, options);

  it('recovers the 4 plates of the known chain and their lengths within 0.05 mm', () => {
    // self-consistent case (docs/MODEL.md §5): the stations were made from plates 12, 14, 16, 16 mm long
    expect(fit.status).toBe('fitted');
    expect(fit.plateCount).toBe(4);
    fit.chain.lengthsMm.forEach((l, k) => {
      expect(Math.abs(l - LENGTHS[k]!)).toBeLessThan(0.05);
    });
    for (const s of fit.stations) expect(s.maxDeviationMm).toBeLessThanOrEqual(0.1);
  });

  it('goes below a count that already passed: a 5-plate chain passed, and 4 was found by removing a pivot', () => {
    // the marching estimate starts the scan above the truth here (a 5-plate chain meets the tolerance, one pivot of
    // it never turning); the search must not stop there
    const five = fit.attempts.filter((a) => a.plateCount === 5);
    expect(five.some((a) => a.maxDeviationMm !== null && a.maxDeviationMm <= 0.1)).toBe(true);
    expect(fit.search.lowestTried).toBeLessThan(5);
  });

  it('states its evidence: 3 plates miss by more than the tolerance from several independent starts', () => {
    const below = fit.search.belowAnswer!;
    expect(below.plateCount).toBe(3);
    expect(below.starts).toBeGreaterThanOrEqual(3);
    expect(below.bestMissMm).toBeGreaterThan(0.1);
    const finding = fit.findings.find((f) => f.code === 'PLATE_COUNT')!;
    expect(finding.message).toMatch(/with 3 the best of \d+ independent starts misses by/);
  });

  it('every interior pivot of the answer turns by more than a degree across the stations', () => {
    // the known mechanism's pivots all articulate; a phantom plate would show a pivot that does not
    for (const spread of jointArticulation(fit.chain)) expect((spread * 180) / Math.PI).toBeGreaterThan(1);
  });

  it('limits.plate_count fixes the count: 5 plates asked, 5 given, no search below', () => {
    const five = fitChain(orifices, spans, { ...options, plateCount: 5 });
    expect(five.plateCount).toBe(5);
    expect(five.search.lowestTried).toBe(5);
    expect(five.findings.find((f) => f.code === 'PLATE_COUNT')!.message).toMatch(/as limits.plate_count asks/);
  });

  it('limits.min_plates bounds the search from below', () => {
    const atLeast = fitChain(orifices, spans, { ...options, minPlates: 5 });
    expect(atLeast.plateCount).toBeGreaterThanOrEqual(5);
    expect(atLeast.search.lowestTried).toBeGreaterThanOrEqual(5);
  });
});

/** Two 10 mm plates from the origin along x, the second bent by `bend` degrees at each station (analytic pivots). */
function bentPair(...bends: number[]) {
  const d = (deg: number) => (deg * Math.PI) / 180;
  const station = (bend: number): [number, number][] => [
    [0, 0],
    [10, 0],
    [10 + 10 * Math.cos(d(bend)), 10 * Math.sin(d(bend))],
  ];
  return {
    lengthsMm: [10, 10],
    start: { kind: 'pivot' as const, point: [0, 0] as [number, number] },
    end: { kind: 'pivot' as const, point: [0, 0] as [number, number] },
    pivots: bends.map(station),
    telescoping: [],
  };
}

describe('jointArticulation', () => {
  it('gives the spread of each relative angle: a pivot bent by 10° then 30° spreads 20°', () => {
    // analytic: plate 1 along x, plate 2 at +10° and +30° in the two stations; the relative angle is 10° and 30°
    const spreads = jointArticulation(bentPair(10, 30));
    expect(spreads).toHaveLength(1);
    expect((spreads[0]! * 180) / Math.PI).toBeCloseTo(20, 10);
  });

  it('unwraps bends near ±180°: −179° and +179° are 2° apart, not 358°', () => {
    const spreads = jointArticulation(bentPair(179, -179));
    expect((spreads[0]! * 180) / Math.PI).toBeCloseTo(2, 10);
  });
});

describe('mergePlatesStart', () => {
  it('merging two collinear plates keeps every pivot but the removed one in place', () => {
    // analytic: plates 0 and 1 collinear (same angle) in both stations, so their chord is their summed length
    const spec = {
      samples: [[], []] as [number, number][][],
      plateCount: 3,
      edgeOffsetMm: 5,
      startKind: 'pivot' as const,
      endKind: 'pivot' as const,
      startAnchor: [0, 0] as [number, number],
      endAnchor: [0, 0] as [number, number],
    };
    // layout: angles (station-major), then lengths, then start (x, y), end (x, y)
    const x = Float64Array.from([0.2, 0.2, -0.3, 0.4, 0.4, -0.1, 10, 12, 8, 1, 2, 30, 3]);
    const merged = mergePlatesStart(x, spec, 1)!;
    expect(merged.spec.plateCount).toBe(2);
    const before = chainFromParameters(x, spec);
    const after = chainFromParameters(merged.x, merged.spec);
    expect(after.lengthsMm[0]).toBeCloseTo(22, 12);
    after.pivots.forEach((p, i) => {
      const b = before.pivots[i]!;
      for (const [j, k] of [
        [0, 0],
        [1, 2],
        [2, 3],
      ] as const) {
        expect(p[j]![0]).toBeCloseTo(b[k]![0], 12);
        expect(p[j]![1]).toBeCloseTo(b[k]![1], 12);
      }
    });
  });

  it('refuses an end pivot (there is nothing to merge across it)', () => {
    const spec = {
      samples: [[]] as [number, number][][],
      plateCount: 2,
      edgeOffsetMm: 5,
      startKind: 'pivot' as const,
      endKind: 'pivot' as const,
      startAnchor: [0, 0] as [number, number],
      endAnchor: [0, 0] as [number, number],
    };
    const x = Float64Array.from([0, 0, 10, 10, 0, 0, 20, 0]);
    expect(mergePlatesStart(x, spec, 0)).toBeNull();
    expect(mergePlatesStart(x, spec, 2)).toBeNull();
  });
});

describe('fitChain under a caller’s stop (time limit)', () => {
  it('stopped at once, it keeps the first count that passed and says fewer were not tried', () => {
    // the same known 4-plate chain: its first level (5 plates, from the marching estimate) already passes
    const fit = fitChain(orifices, spans, { ...options, stop: () => true });
    expect(fit.status).toBe('fitted');
    expect(fit.plateCount).toBe(5);
    expect(fit.search.stoppedEarly).toBe(true);
    expect(fit.search.belowAnswer).toBeNull();
    const codes = fit.findings.map((f) => f.code);
    expect(codes).toContain('FIT_SEARCH_STOPPED');
    expect(fit.findings.find((f) => f.code === 'PLATE_COUNT')!.message).toMatch(/fewer were not tried/);
  });

  it('never stopped, it reports a complete search', () => {
    const fit = fitChain(orifices, spans, options);
    expect(fit.search.stoppedEarly).toBe(false);
    expect(fit.findings.map((f) => f.code)).not.toContain('FIT_SEARCH_STOPPED');
  });
});
