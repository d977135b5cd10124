import { describe, expect, it } from 'vitest';
import type { Point, Region } from '../../src/geometry/index.js';
import { findMovingSpans, type MovingSpan } from '../../src/span/index.js';
import { type ChainFitOptions, fitChain, resolveChainFitOptions } from '../../src/synthesis/index.js';
import { channelOrifice, closeChain, type P } from '../support/known-chain.js';

function spansOf(orifices: Region[], ends: { start: Point; end: Point } | null = null): MovingSpan[] {
  const result = findMovingSpans(orifices, { matchToleranceMm: 0.02, ends });
  if (result.status !== 'found') throw new Error(`spans: ${JSON.stringify(result)}`);
  return [...result.spans];
}

const plates = { pivotHoleDiameterMm: 4, ligamentMm: 3, depthMm: 25 };

/** A channel 2R wide whose top is an arc of radius R over `sweepDeg`, centred on (0, 0); walls at x = ±R·sin(sweep/2). */
function arcOrifice(r: number, sweepDeg: number, step = 0.05): Region {
  const half = (sweepDeg * Math.PI) / 360;
  const xw = r * Math.sin(half);
  const top: Point[] = [];
  const n = Math.ceil((2 * half * r) / step);
  for (let k = 0; k <= n; k++) {
    const a = Math.PI / 2 - half + (2 * half * k) / n;
    top.push([r * Math.cos(a), r * Math.sin(a)]);
  }
  return { outer: [[-xw, -20], [xw, -20], ...top], holes: [] };
}

describe('fitChain', () => {
  it('an arc of radius R over θ needs the plate count the sagitta formula predicts', () => {
    // standard geometry (docs/MODEL.md §5): chords of a pivot circle R + e deviate from the arc by their sagitta
    // (R + e)(1 − cos(Δ/2)). Pivots on the circle (inscribed polygon) need Δ ≤ 2·acos(1 − tol/(R + e)); a least-squares
    // fit that sets the pivots just outside the circle splits the sagitta into ±tol, i.e. allows 2·tol. So the count
    // lies between ceil(θ/Δ(2·tol)) and ceil(θ/Δ(tol)), plus at most one plate at each end where the chain crosses
    // the die-body wall
    const r = 50;
    const sweep = 100;
    const tol = 0.1;
    const orifice = arcOrifice(r, sweep);
    const half = (sweep * Math.PI) / 360;
    const ends = {
      start: [-r * Math.sin(half), r * Math.cos(half)] as Point,
      end: [r * Math.sin(half), r * Math.cos(half)] as Point,
    };
    const fit = fitChain(
      [orifice],
      spansOf([orifice], ends),
      resolveChainFitOptions({ toleranceMm: tol, maxPlates: 40, ...plates, shapedEdges: false }),
    );
    const e = 5;
    const theta = (sweep * Math.PI) / 180;
    const count = (allowed: number) => Math.ceil(theta / (2 * Math.acos(1 - allowed / (r + e))));
    expect(fit.status).toBe('fitted');
    expect(fit.plateCount).toBeGreaterThanOrEqual(count(2 * tol));
    expect(fit.plateCount).toBeLessThanOrEqual(count(tol) + 2);
    expect(fit.stations[0]!.maxDeviationMm).toBeLessThanOrEqual(tol);
  });

  it('the error of straight plates falls as 1/n² (sagitta law)', () => {
    // sagitta s ≈ L²/(8R) (docs/MODEL.md §5): doubling the plate count quarters the deviation; the two end plates,
    // which cross the die-body walls and are not chords of the arc, hold it a little above a quarter
    // (ratio > 2.5, not 4), while a first-order (1/n) law would give 2
    const r = 40;
    const orifice = arcOrifice(r, 90);
    const half = Math.PI / 4;
    const ends = {
      start: [-r * Math.sin(half), r * Math.cos(half)] as Point,
      end: [r * Math.sin(half), r * Math.cos(half)] as Point,
    };
    const spans = spansOf([orifice], ends);
    const at = (n: number) =>
      fitChain(
        [orifice],
        spans,
        resolveChainFitOptions({
          toleranceMm: 10,
          maxPlates: 40,
          plateCount: n,
          ...plates,
          shapedEdges: false,
        } as ChainFitOptions),
      ).stations[0]!.maxDeviationMm;
    const coarse = at(6);
    const fine = at(12);
    expect(coarse / fine).toBeGreaterThan(2.5);
    expect(coarse / fine).toBeLessThan(5.5);
  });

  it('stations made from a known chain are fitted back to its plate count and lengths', () => {
    // self-consistent case (docs/MODEL.md §5): the die model computed independently in tests/support/known-chain.ts
    const lengths = [11, 9, 10, 8.5, 9.5, 10.5];
    const start: P = [-6, 14];
    const end: P = [46, 14];
    const bends = [
      [-0.55, -0.1, 0.2, 0.35],
      [-0.35, 0.15, 0.45, 0.1],
      [-0.7, 0.05, 0.05, 0.5],
    ];
    const chains = bends.map((angles) => closeChain(lengths, start, end, angles, false));
    const orifices = chains.map((c) => channelOrifice(c, 5, 40, 0.01));
    const spans = spansOf(orifices);
    const fit = fitChain(
      orifices,
      spans,
      resolveChainFitOptions({ toleranceMm: 0.05, maxPlates: 12, ...plates, maxIterations: 400 }),
    );
    expect(fit.plateCount).toBe(lengths.length);
    // the outline is a polygon sampled every 0.01 mm and the span ends carry the 0.02 mm match tolerance, so the
    // lengths come back to 1e-3 mm here; exact recovery (1e-6 mm) from exact samples is checked below
    for (const [k, l] of fit.chain.lengthsMm.entries()) expect(Math.abs(l - lengths[k]!)).toBeLessThan(1e-3);
    for (const s of fit.stations) expect(s.maxDeviationMm).toBeLessThan(0.01);
    // rigidity: every station's pivots are exactly the common lengths apart
    expect(fit.chain.telescoping).toHaveLength(0);
    for (const pivots of fit.chain.pivots) {
      for (let k = 0; k < lengths.length; k++) {
        const a = pivots[k]!;
        const b = pivots[k + 1]!;
        expect(Math.hypot(b[0] - a[0], b[1] - a[1])).toBeCloseTo(fit.chain.lengthsMm[k]!, 12);
      }
    }
  });
});

describe('movable chains', () => {
  it('never returns a chain that cannot move when the stations differ (a raised flat top needs ≥ 1 freedom)', () => {
    // Grübler–Kutzbach for a chain pinned at its start: M = N − 2 + (slotted ends) + (telescoping pairs); one plate
    // with a slotted end has M = 0 and could only reach both stations by being taken apart (docs/MODEL.md §3)
    const rect = (h: number): Region => ({
      outer: [
        [0, 0],
        [40, 0],
        [40, h],
        [0, h],
      ],
      holes: [],
    });
    const orifices = [rect(8), rect(12)];
    const fit = fitChain(
      orifices,
      spansOf(orifices),
      resolveChainFitOptions({ toleranceMm: 0.1, maxPlates: 8, ...plates }),
    );
    const slots = [fit.chain.start, fit.chain.end].filter((end) => end.kind === 'slot').length;
    expect(fit.status).toBe('fitted');
    expect(fit.plateCount - 2 + slots + fit.chain.telescoping.length).toBeGreaterThanOrEqual(1);
  });
});

describe('shaped edges', () => {
  it('beat straight edges when the stations share curvature', () => {
    // two stations with the same crown y = 8 + 4·sin²(πx/40): every plate meets the same curve, so an edge shaped to
    // the mean of the stations' pieces follows it between the round ends, while a straight edge misses by its
    // sagitta ≈ L²/(8R) (docs/MODEL.md §2 and §5); what shaped edges leave is the round ends' own departure near pivots
    const crown: Point[] = [];
    for (let k = 400; k >= 0; k--) {
      const x = k / 10;
      crown.push([x, 8 + 4 * Math.sin((Math.PI * x) / 40) ** 2]);
    }
    const orifice: Region = { outer: [[0, 0], [40, 0], ...crown], holes: [] };
    const ends = { start: [0, 8] as Point, end: [40, 8] as Point };
    const spans = spansOf([orifice, orifice], ends);
    const base = { toleranceMm: 0.02, maxPlates: 10, plateCount: 5, ...plates } as const;
    const straight = fitChain([orifice, orifice], spans, resolveChainFitOptions({ ...base, shapedEdges: false }));
    const shaped = fitChain([orifice, orifice], spans, resolveChainFitOptions({ ...base, shapedEdges: true }));
    const worst = (f: typeof straight) => Math.max(...f.stations.map((st) => st.maxDeviationMm));
    expect(worst(straight)).toBeGreaterThan(0.1);
    expect(shaped.edgeProfiles.some((p) => p !== null)).toBe(true);
    expect(worst(shaped)).toBeLessThan(0.7 * worst(straight));
  });
});

describe('telescoping plates', () => {
  it('a chain whose middle plate changes length gets a telescoping plate and meets the tolerance', () => {
    // self-consistent case: stations from a known chain whose middle plate is 11, 13 and 15 mm long (a telescoping
    // pair, Shamsudin et al. 2013); the ends are pinned and slots are not allowed, so rigid plates cannot follow
    const start: P = [-6, 16];
    const end: P = [46, 16];
    const stations = [
      { lengths: [12, 11, 11, 11, 12], bends: [-0.45, 0.0, 0.35] },
      { lengths: [12, 11, 13, 11, 12], bends: [-0.55, -0.05, 0.45] },
      { lengths: [12, 11, 15, 11, 12], bends: [-0.65, -0.1, 0.5] },
    ];
    const chains = stations.map((s) => closeChain(s.lengths, start, end, s.bends, false));
    const orifices = chains.map((c) => channelOrifice(c, 5, 40, 0.01));
    const spans = spansOf(orifices);
    const options = { toleranceMm: 0.05, maxPlates: 8, ...plates, allowSlots: false };
    const fit = fitChain(orifices, spans, resolveChainFitOptions(options));
    expect(fit.status).toBe('fitted');
    expect(fit.chain.telescoping).toHaveLength(1);
    const tele = fit.chain.telescoping[0]!;
    // the known pair: plate 3, stroke 4 mm (15 − 11)
    expect(tele.plate).toBe(2);
    expect(Math.max(...tele.stationLengthsMm) - Math.min(...tele.stationLengthsMm)).toBeCloseTo(4, 2);
    const rigidOnly = fitChain(orifices, spans, resolveChainFitOptions({ ...options, allowTelescoping: false }));
    expect(rigidOnly.status === 'best-effort' || rigidOnly.plateCount > fit.plateCount).toBe(true);
  });
});

describe('the chain least-squares problem', () => {
  it('recovers a known chain to 1e-6 mm from samples exactly on its swollen melt edge', async () => {
    // samples placed analytically at distance e from the known pivot polyline (docs/MODEL.md §2 die model)
    const { makeChainProblem } = await import('../../src/synthesis/index.js');
    const { solveLeastSquares } = await import('../../src/numeric/index.js');
    const { meltEdgeY } = await import('../support/known-chain.js');
    const lengths = [11, 9, 10, 8.5, 9.5, 10.5];
    const start: P = [-6, 14];
    const end: P = [46, 14];
    const chains = [
      [-0.55, -0.1, 0.2, 0.35],
      [-0.35, 0.15, 0.45, 0.1],
      [-0.7, 0.05, 0.05, 0.5],
    ].map((a) => closeChain(lengths, start, end, a, false));
    const samples = chains.map((c) =>
      Array.from({ length: 161 }, (_, k): Point => [k * 0.25, meltEdgeY(c, 5, k * 0.25)]),
    );
    const spec = {
      samples,
      plateCount: 6,
      edgeOffsetMm: 5,
      startKind: 'pivot' as const,
      endKind: 'pivot' as const,
      startAnchor: [-5, 13] as Point,
      endAnchor: [45, 15] as Point,
      anchorWeight: 0,
    };
    const problem = makeChainProblem(spec);
    const x = new Float64Array(problem.layout.parameterCount);
    // start 0.5 mm and a few degrees away from the truth
    x.set([-5.5, 13.6], problem.layout.start);
    x.set([46.4, 14.3], problem.layout.end);
    lengths.forEach((l, k) => {
      x[problem.layout.lengths + k] = l + 0.3 * Math.sin(k + 1);
    });
    chains.forEach((c, i) => {
      for (let k = 0; k < 6; k++) {
        const a = Math.atan2(c[k + 1]![1] - c[k]![1], c[k + 1]![0] - c[k]![0]);
        x[problem.layout.angles + i * 6 + k] = a + 0.04 * Math.cos(3 * k + i);
      }
    });
    const result = solveLeastSquares(
      {
        parameterCount: problem.layout.parameterCount,
        residualCount: problem.layout.residualCount,
        residuals: problem.residuals,
        jacobian: problem.jacobian,
      },
      x,
      { maxIterations: 200 },
    );
    expect(result.status).toBe('converged');
    for (const [k, l] of lengths.entries())
      expect(Math.abs(result.x[problem.layout.lengths + k]! - l)).toBeLessThan(1e-6);
    expect(Math.abs(result.x[problem.layout.start]! - start[0])).toBeLessThan(1e-6);
    expect(Math.abs(result.x[problem.layout.end + 1]! - end[1])).toBeLessThan(1e-6);
  });
});
