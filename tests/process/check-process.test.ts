import { describe, expect, it } from 'vitest';
import type { Finding } from '../../src/domain/index.js';
import { checkProcess, type StationMeasures } from '../../src/process/index.js';
import { scheduleForTest } from './schedule-for-test.js';

/** A station's measures with the walls and outline given; `extentMm` defaults to a 50 mm wide strip. */
function measures(over: Partial<StationMeasures> & Pick<StationMeasures, 'areaMm2' | 'perimeterMm'>): StationMeasures {
  return { minWallMm: 2, maxWallMm: 2, minWallAt: [0, 0], extentMm: 50, thinWalls: [], ...over };
}
const codes = (findings: readonly Finding[]) => findings.map((f) => f.code);

describe('checkProcess: land pressure against worked examples', () => {
  it('a Newtonian 50 × 2 mm slit, μ 1000 Pa·s, Q 1 cm³/s, land 20 mm needs 6 bar', () => {
    // Plane Poiseuille flow between parallel plates (Bird, Stewart & Lightfoot, Transport Phenomena, §2.5 / any fluid
    // mechanics text): ΔP = 12 μ L Q / (W H³) = 12 · 1000 · 0.020 · 1e-6 / (0.050 · 0.002³) = 6.0e5 Pa = 6.00 bar.
    // Orifice 100 mm², perimeter 100 mm → equivalent gap 2A/P = 2 mm, width P/2 = 50 mm; 1 g/s at 1000 kg/m³ = 1 cm³/s.
    const schedule = scheduleForTest({
      process: { powerLawN: 1, powerLawMPaSn: 1000, meltDensityKgPerM3: 1000, throughputKgPerS: 0.001 },
    });
    const check = checkProcess(schedule, [measures({ areaMm2: 100, perimeterMm: 100 })]);
    expect(check.stations[0]!.equivalentGapMm).toBeCloseTo(2, 12);
    expect(check.stations[0]!.landPressureBar).toBeCloseTo(6.0, 9);
  });

  it('a power-law melt (n 0.5, m 10 000 Pa·s^0.5) through the same slit needs 12.6 bar', () => {
    // Power-law slit (Tadmor & Gogos; docs/MODEL.md §3) solved for ΔP, worked by hand:
    // q = Q/W = 1e-6/0.05 = 2e-5 m²/s; ΔP = (2mL/H)·(2(2n+1)q/(nH²))^n
    //   = (2·10 000·0.02/0.002) · (2·2·2e-5/(0.5·4e-6))^0.5 = 200 000 · 40^0.5 = 200 000 · 6.32456 = 1.26491e6 Pa
    //   = 12.649 bar. (With n = 1 the same formula reduces to 12μLq/H³, the case above.)
    const schedule = scheduleForTest({
      process: { powerLawN: 0.5, powerLawMPaSn: 10_000, meltDensityKgPerM3: 1000, throughputKgPerS: 0.001 },
    });
    const check = checkProcess(schedule, [measures({ areaMm2: 100, perimeterMm: 100 })]);
    expect(check.stations[0]!.landPressureBar).toBeCloseTo(12.6491, 3);
  });
});

describe('checkProcess: draw-down and puller speed against a hand-worked example', () => {
  // docs/MODEL.md §5: PVC-U ρ 1400 kg/m³, 400 mm² product at 3 m/min →
  // ṁ = 1400 · 400e-6 · 0.05 = 0.028 kg/s = 100.8 kg/h.
  // An orifice of 460 mm² then has ADR 460/400 = 1.15; twice that orifice (920 mm²) at the same output holds 1.15
  // only at half the puller speed, 1.5 m/min. Melt ρ 1250: melt speed 0.028/(1250 · 460e-6) = 0.04870 m/s;
  // velocity draw 1.15 · 1250/1400 = 1.0268. All worked by hand.
  const schedule = scheduleForTest({
    stations: 2,
    process: { solidDensityKgPerM3: 1400, meltDensityKgPerM3: 1250, lineSpeedMPerS: 0.05, throughputKgPerS: 0.028 },
    limits: { drawDownMin: 1.0, drawDownMax: 1.3 },
  });
  const check = checkProcess(schedule, [
    measures({ areaMm2: 460, perimeterMm: 240 }),
    measures({ areaMm2: 920, perimeterMm: 480 }),
  ]);

  it('gives 400 mm² of product, ADR 1.15 and the 3 m/min line speed at the target', () => {
    expect(check.targetDrawDown).toBeCloseTo(1.15, 12);
    expect(check.stations[0]!.productAreaMm2).toBeCloseTo(400, 9);
    expect(check.stations[0]!.drawDownRatio).toBeCloseTo(1.15, 9);
    expect(check.stations[0]!.pullerSpeedForTargetMPerS * 60).toBeCloseTo(3.0, 9);
    expect(check.stations[0]!.meltSpeedMPerS).toBeCloseTo(0.0487, 4);
    expect(check.stations[0]!.velocityDrawRatio).toBeCloseTo(1.0268, 4);
  });

  it('halves the puller speed for twice the orifice and flags ADR 2.3 with the speed that holds 1.15', () => {
    expect(check.stations[1]!.drawDownRatio).toBeCloseTo(2.3, 9);
    expect(check.stations[1]!.pullerSpeedForTargetMPerS * 60).toBeCloseTo(1.5, 9);
    const high = check.findings.find((f) => f.code === 'DRAW_DOWN_HIGH');
    expect(high?.station).toBe(1);
    expect(high?.message).toContain('ratio is 2.3,');
    expect(high?.message).toContain('running at 1.5 m/min');
  });

  it('takes the throughput from the first station when none is given: 100.8 kg/h for ADR 1.15', () => {
    const fromFirst = checkProcess(scheduleForTest({ process: { solidDensityKgPerM3: 1400, lineSpeedMPerS: 0.05 } }), [
      measures({ areaMm2: 460, perimeterMm: 240 }),
    ]);
    expect(fromFirst.throughputFromFirstStation).toBe(true);
    expect(fromFirst.throughputKgPerS * 3600).toBeCloseTo(100.8, 9);
  });
});

describe('checkProcess: wall ratio and flow imbalance', () => {
  const pvc = scheduleForTest({ process: { powerLawN: 0.26, powerLawMPaSn: 170_000, throughputKgPerS: 0.005 } });

  it('flags walls 2 mm vs 1 mm at n 0.26 as FLOW_IMBALANCE about 57.5× (docs/MODEL.md §5: 2^(2+1/n) = 57.53)', () => {
    const check = checkProcess(pvc, [measures({ areaMm2: 100, perimeterMm: 100, minWallMm: 1, maxWallMm: 2 })]);
    const f = check.findings.find((x) => x.code === 'FLOW_IMBALANCE');
    expect(f?.value).toBeCloseTo(57.53, 2);
    expect(f?.limit).toBe(5);
    expect(f?.message).toContain('about 57.5× faster');
    // land ratio that balances it: 2^(1+2n) = 2^1.52 = 2.868 (docs/MODEL.md §5, halving a gap at constant Q)
    expect(f?.message).toContain('about 2.87× longer');
    expect(codes(check.findings)).not.toContain('WALL_RATIO'); // ratio 2 is within the 2.5 default
  });

  it('writes a 6.05 wall ratio at n 0.26 (about 37 000×) as "more than 1000×" and flags WALL_RATIO', () => {
    const check = checkProcess(pvc, [measures({ areaMm2: 246, perimeterMm: 100, minWallMm: 1, maxWallMm: 6.05 })]);
    const f = check.findings.find((x) => x.code === 'FLOW_IMBALANCE');
    expect(f?.message).toContain('more than 1000× faster');
    const ratio = check.findings.find((x) => x.code === 'WALL_RATIO');
    expect(ratio?.message).toContain('is 6.05× the thinnest 1 mm, above the 2.5 limit');
  });

  it('raises nothing for walls 1.2 mm vs 1 mm of a Newtonian melt: 1.2³ = 1.728 < 5', () => {
    const check = checkProcess(scheduleForTest({ process: { throughputKgPerS: 0.001 } }), [
      measures({ areaMm2: 100, perimeterMm: 100, minWallMm: 1, maxWallMm: 1.2 }),
    ]);
    expect(check.stations[0]!.flowImbalanceRatio).toBeCloseTo(1.728, 9);
    expect(codes(check.findings)).not.toContain('FLOW_IMBALANCE');
  });
});

describe('checkProcess: plausibility guards', () => {
  it('flags a 40 × 8 mm strip drawn in metres as ORIFICE_TOO_SMALL and holds back its other checks', () => {
    // 0.04 × 0.008 "mm" = 0.00032 mm², 0.04 mm across
    const schedule = scheduleForTest({ process: { powerLawN: 0.41, powerLawMPaSn: 20_000, throughputKgPerS: 0.0056 } });
    const check = checkProcess(schedule, [
      measures({ areaMm2: 0.00032, perimeterMm: 0.096, minWallMm: 0.0043, maxWallMm: 0.0079, extentMm: 0.04 }),
    ]);
    expect(codes(check.findings)).toEqual(['ORIFICE_TOO_SMALL']);
    expect(check.findings[0]!.severity).toBe('error');
    expect(check.findings[0]!.message).toMatch(/metres or inches\? They are read as millimetres/);
  });

  it('flags the same strip drawn in inches (1.575 × 0.315 in → 0.496 mm²) as ORIFICE_TOO_SMALL', () => {
    const check = checkProcess(scheduleForTest(), [measures({ areaMm2: 0.496, perimeterMm: 3.78, extentMm: 1.575 })]);
    expect(codes(check.findings)).toContain('ORIFICE_TOO_SMALL');
  });

  it('flags an orifice 2000 mm across as ORIFICE_TOO_LARGE', () => {
    const check = checkProcess(scheduleForTest(), [measures({ areaMm2: 4000, perimeterMm: 4004, extentMm: 2000 })]);
    expect(check.findings.find((f) => f.code === 'ORIFICE_TOO_LARGE')?.limit).toBe(1000);
  });

  it('flags a 2 mm fit tolerance against a 2.048 mm thinnest wall (limit a quarter: 0.512 mm)', () => {
    const check = checkProcess(scheduleForTest({ limits: { fitToleranceMm: 2 } }), [
      measures({ areaMm2: 100, perimeterMm: 100, minWallMm: 2.048, maxWallMm: 2.048 }),
    ]);
    const f = check.findings.find((x) => x.code === 'FIT_TOLERANCE_COARSE');
    expect(f?.limit).toBeCloseTo(0.512, 12);
    expect(f?.message).toContain('at most 0.512 mm');
    const fine = checkProcess(scheduleForTest({ limits: { fitToleranceMm: 0.5 } }), [
      measures({ areaMm2: 100, perimeterMm: 100, minWallMm: 2.048, maxWallMm: 2.048 }),
    ]);
    expect(codes(fine.findings)).not.toContain('FIT_TOLERANCE_COARSE');
  });

  it('says a land pressure above 1000 bar is outside the estimate’s range instead of quoting it', () => {
    // 0.2 mm equivalent gap (10 mm², 100 mm perimeter) at 1 g/s, Newtonian μ 1000: 12μLQ/(WH³) =
    // 12·1000·0.02·1e-6/(0.05·8e-12) = 6.0e8 Pa = 6000 bar, by hand
    const check = checkProcess(scheduleForTest({ process: { throughputKgPerS: 0.001 } }), [
      measures({ areaMm2: 10, perimeterMm: 100, minWallMm: 0.2, maxWallMm: 0.2 }),
    ]);
    expect(check.stations[0]!.landPressureBar).toBeCloseTo(6000, 6);
    const f = check.findings.find((x) => x.code === 'LAND_PRESSURE_OUT_OF_RANGE');
    expect(f?.limit).toBe(1000);
    expect(f?.message).not.toMatch(/6000|6 000/);
    expect(codes(check.findings)).not.toContain('HIGH_LAND_PRESSURE');
  });

  it('quotes a land pressure between 350 and 1000 bar to three significant figures as HIGH_LAND_PRESSURE', () => {
    // 0.5 mm gap (25 mm², 100 mm): 12·1000·0.02·1e-6/(0.05·1.25e-10) = 3.84e7 Pa = 384 bar, by hand
    const check = checkProcess(scheduleForTest({ process: { throughputKgPerS: 0.001 } }), [
      measures({ areaMm2: 25, perimeterMm: 100, minWallMm: 0.5, maxWallMm: 0.5 }),
    ]);
    const f = check.findings.find((x) => x.code === 'HIGH_LAND_PRESSURE');
    expect(f?.message).toContain('about 384 bar');
  });
});

describe('checkProcess: message precision', () => {
  it('writes no number with more than three significant figures in any message', () => {
    const schedule = scheduleForTest({
      stations: 2,
      material: 'PVC-U',
      process: { powerLawN: 0.26, powerLawMPaSn: 170_000, throughputKgPerS: 0.00987654, dieTemperatureC: 213.456 },
      limits: { fitToleranceMm: 1.234567 },
    });
    const check = checkProcess(schedule, [
      measures({ areaMm2: 246.123, perimeterMm: 97.654, minWallMm: 0.998123, maxWallMm: 6.041234 }),
      measures({ areaMm2: 529.5, perimeterMm: 120.3, minWallMm: 1.23456, maxWallMm: 3.14162 }),
    ]);
    expect(check.findings.length).toBeGreaterThan(4);
    for (const f of check.findings) {
      for (const token of f.message.match(/\d[\d.]*/g) ?? []) {
        // significant digits: leading zeros and the point dropped, trailing zeros of a whole number ambiguous
        const digits = token.replace(/\.$/, '').replace('.', '').replace(/^0+/, '').replace(/0+$/, '');
        expect(digits.length, `${f.code}: ${token} in "${f.message}"`).toBeLessThanOrEqual(3);
      }
    }
  });
});
