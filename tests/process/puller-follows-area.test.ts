import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Finding } from '../../src/domain/index.js';
import { ScheduleWire } from '../../src/http/schedule-schema.js';
import { toSchedule } from '../../src/http/to-schedule.js';
import { checkSchedule } from '../../src/pipeline/index.js';
import { checkProcess, massFlowKgPerS, type StationMeasures } from '../../src/process/index.js';
import { scheduleForTest } from './schedule-for-test.js';

function measures(over: Pick<StationMeasures, 'areaMm2' | 'perimeterMm'>): StationMeasures {
  return { minWallMm: 2, maxWallMm: 2, minWallAt: [0, 0], extentMm: 50, thinWalls: [], ...over };
}
const codes = (findings: readonly Finding[]) => findings.map((f) => f.code);

describe('checkProcess with the puller following the area, against a hand-worked example', () => {
  // docs/MODEL.md §5: PVC-U ρ 1400 kg/m³, 400 mm² product at 3 m/min → ṁ = 0.028 kg/s (100.8 kg/h). Orifices 460 and
  // 920 mm², draw-down 1.0–1.3 (target 1.15). Held at 1.15, the product is 400 and 800 mm², and ṁ = ρ·A·v gives the
  // puller 3 m/min and 1.5 m/min (docs/MODEL.md §3, mass balance). All worked by hand.
  const process = {
    solidDensityKgPerM3: 1400,
    meltDensityKgPerM3: 1250,
    lineSpeedMPerS: 0.05,
    throughputKgPerS: 0.028,
  };
  const stations = [measures({ areaMm2: 460, perimeterMm: 240 }), measures({ areaMm2: 920, perimeterMm: 480 })];
  const limits = { drawDownMin: 1.0, drawDownMax: 1.3 };
  const following = checkProcess(
    scheduleForTest({ stations: 2, process: { ...process, pullerFollowsArea: true }, limits }),
    stations,
  );
  const atLineSpeed = checkProcess(
    scheduleForTest({ stations: 2, process: { ...process, pullerFollowsArea: false }, limits }),
    stations,
  );

  it('evaluates every station at the puller speed that holds 1.15: 3 and 1.5 m/min, products 400 and 800 mm²', () => {
    expect(following.pullerFollowsArea).toBe(true);
    expect(following.stations.map((s) => s.pullerSpeedMPerS * 60)).toEqual([
      expect.closeTo(3.0, 9),
      expect.closeTo(1.5, 9),
    ]);
    expect(following.stations.map((s) => s.productAreaMm2)).toEqual([expect.closeTo(400, 9), expect.closeTo(800, 9)]);
    for (const s of following.stations) {
      expect(s.drawDownRatio).toBeCloseTo(1.15, 12);
      expect(s.pullerSpeedMPerS).toBeCloseTo(s.pullerSpeedForTargetMPerS, 15);
      // velocity draw ratio = ADR·ρ_melt/ρ_solid = 1.15·1250/1400 = 1.02679 (docs/MODEL.md §3)
      expect(s.velocityDrawRatio).toBeCloseTo(1.026786, 6);
    }
    expect(codes(following.findings).filter((c) => c.startsWith('DRAW_DOWN_'))).toEqual([]);
  });

  it('conserves mass: ρ_solid·A_product·v is 0.028 kg/s at every station', () => {
    for (const s of following.stations) {
      expect(massFlowKgPerS(1400, s.productAreaMm2, s.pullerSpeedMPerS)).toBeCloseTo(0.028, 12);
    }
  });

  it('without it, the same stations run at the 3 m/min line speed and the larger one is DRAW_DOWN_HIGH at 2.3', () => {
    expect(atLineSpeed.pullerFollowsArea).toBe(false);
    expect(atLineSpeed.stations.map((s) => s.pullerSpeedMPerS * 60)).toEqual([3, 3]);
    expect(atLineSpeed.stations[1]!.drawDownRatio).toBeCloseTo(2.3, 9);
    const high = atLineSpeed.findings.filter((f) => f.code === 'DRAW_DOWN_HIGH');
    expect(high.map((f) => f.station)).toEqual([1]);
    expect(high[0]!.message).toContain('running at 1.5 m/min');
  });

  it('leaves the land pressure as it is: the throughput, not the puller, pushes the melt through the die', () => {
    following.stations.forEach((s, i) => {
      expect(s.landPressureBar).toBeCloseTo(atLineSpeed.stations[i]!.landPressureBar, 12);
    });
  });
});

describe('checkProcess: the following puller speed against its plausible range (0.01–200 m/min)', () => {
  const follows = (throughputKgPerS: number, pullerFollowsArea: boolean) =>
    scheduleForTest({
      process: { solidDensityKgPerM3: 1400, lineSpeedMPerS: 0.05, throughputKgPerS, pullerFollowsArea },
      limits: { drawDownMin: 1.0, drawDownMax: 1.3 },
    });

  it('flags a 5 mm² orifice at 100.8 kg/h: holding 1.15 needs 276 m/min', () => {
    // product 5/1.15 = 4.3478 mm²; v = ṁ/(ρA) = 0.028/(1400·4.3478e-6) = 4.6 m/s = 276 m/min (ṁ = ρ·A·v, by hand)
    const check = checkProcess(follows(0.028, true), [measures({ areaMm2: 5, perimeterMm: 12 })]);
    const f = check.findings.find((x) => x.code === 'PULLER_SPEED_OUT_OF_RANGE');
    expect(f?.station).toBe(0);
    expect(f?.value).toBeCloseTo(276, 9);
    expect(f?.limit).toBe(200);
    expect(f?.message).toContain('276 m/min, above the 200 m/min');
  });

  it('flags a 460 mm² orifice at 0.252 kg/h: holding 1.15 needs 0.0075 m/min', () => {
    // 0.028/400 kg/s (0.252 kg/h) through the 400 mm² product of the example above: 3 m/min / 400 = 0.0075 m/min (by hand)
    const check = checkProcess(follows(0.028 / 400, true), [measures({ areaMm2: 460, perimeterMm: 240 })]);
    const f = check.findings.find((x) => x.code === 'PULLER_SPEED_OUT_OF_RANGE');
    expect(f?.value).toBeCloseTo(0.0075, 12);
    expect(f?.limit).toBe(0.01);
  });

  it('says nothing of the puller speed when the puller runs at the line speed (the draw-down is flagged instead)', () => {
    const check = checkProcess(follows(0.028, false), [measures({ areaMm2: 5, perimeterMm: 12 })]);
    expect(codes(check.findings)).not.toContain('PULLER_SPEED_OUT_OF_RANGE');
    expect(codes(check.findings)).toContain('DRAW_DOWN_LOW');
  });
});

describe('checkSchedule on the demo (fixtures/demo-edging-strip.json, process.puller_follows_area true)', () => {
  const wire = JSON.parse(readFileSync(new URL('../../fixtures/demo-edging-strip.json', import.meta.url), 'utf8'));
  const schedule = (pullerFollowsArea: boolean) => {
    const mapped = toSchedule({ ...wire, process: { ...wire.process, puller_follows_area: pullerFollowsArea } });
    if (!mapped.ok) throw new Error(JSON.stringify(mapped.problems));
    return mapped.schedule;
  };
  const following = checkSchedule(schedule(true));
  const constant = checkSchedule(schedule(false));

  it('holds the target draw-down 1.15 (middle of 1.0–1.3) at every station with the puller slowing as the area grows', () => {
    expect(wire.process.puller_follows_area).toBe(true);
    expect(following.targetDrawDown).toBeCloseTo(1.15, 12);
    for (const s of following.stations) expect(s.process.drawDownRatio).toBeCloseTo(1.15, 12);
    // throughput from the first station at 2 m/min, so the puller runs there at the line speed; then v ∝ 1/A
    // (ṁ = ρ·A·v at constant ṁ and draw-down, docs/MODEL.md §3)
    const first = following.stations[0]!;
    expect(first.process.pullerSpeedMPerS * 60).toBeCloseTo(2, 12);
    for (const s of following.stations) {
      expect(s.process.pullerSpeedMPerS * s.areaMm2).toBeCloseTo(first.process.pullerSpeedMPerS * first.areaMm2, 12);
    }
    const codesFound = codes(following.findings);
    expect(codesFound.filter((c) => c.startsWith('DRAW_DOWN_') || c === 'PULLER_SPEED_OUT_OF_RANGE')).toEqual([]);
  });

  it('conserves mass at every station: ρ_solid·A_product·v equals the throughput', () => {
    const rho = schedule(true).process.solidDensityKgPerM3;
    for (const s of following.stations) {
      const kgPerS = massFlowKgPerS(rho, s.process.productAreaMm2, s.process.pullerSpeedMPerS);
      expect(kgPerS).toBeCloseTo(following.throughputKgPerS, 12);
    }
  });

  it('at the constant line speed, the same schedule still breaks 1.3 at stations 1–3 (1.46 at the largest orifice)', () => {
    // area draw-down A_orifice / A_product with the product fixed by the first station at 1.15: 1.15 · A_i / A_0
    const high = constant.findings.filter((f) => f.code === 'DRAW_DOWN_HIGH');
    expect(high.map((f) => f.station)).toEqual([1, 2, 3]);
    const a = constant.stations.map((s) => s.areaMm2);
    expect(high[1]!.value).toBeCloseTo((1.15 * a[2]!) / a[0]!, 9);
    expect(high[1]!.value).toBeCloseTo(1.46, 2);
    for (const s of constant.stations) expect(s.process.pullerSpeedMPerS * 60).toBeCloseTo(2, 12);
  });

  it('changes nothing else: geometry, pressure and the other findings are the same either way', () => {
    const others = (findings: readonly Finding[]) => findings.filter((f) => !f.code.startsWith('DRAW_DOWN_'));
    expect(others(following.findings)).toEqual(others(constant.findings));
    following.stations.forEach((s, i) => {
      expect(s.areaMm2).toBe(constant.stations[i]!.areaMm2);
      expect(s.process.landPressureBar).toBe(constant.stations[i]!.process.landPressureBar);
      expect(s.process.pullerSpeedForTargetMPerS).toBe(constant.stations[i]!.process.pullerSpeedForTargetMPerS);
    });
  });
});

describe('checkSchedule on the demo against the puller’s own range (limits.puller_speed_m_per_min)', () => {
  const wire = JSON.parse(readFileSync(new URL('../../fixtures/demo-edging-strip.json', import.meta.url), 'utf8'));
  const check = (process: Record<string, unknown>, range: { min: number; max: number }) => {
    const mapped = toSchedule({
      ...wire,
      process: { ...wire.process, ...process },
      limits: { ...wire.limits, puller_speed_m_per_min: range },
    });
    if (!mapped.ok) throw new Error(JSON.stringify(mapped.problems));
    return checkSchedule(mapped.schedule);
  };

  it('a puller that runs 1.8–2.5 m/min cannot hold 1.15 at the three larger orifices (1.75, 1.58, 1.75 m/min)', () => {
    // v_i = 2 m/min · A_0 / A_i at constant ṁ and draw-down (ṁ = ρ·A·v, docs/MODEL.md §3): 280/320.6 → 1.75,
    // 280/355.7 → 1.58 m/min, below the 1.8 m/min given
    const c = check({ puller_follows_area: true }, { min: 1.8, max: 2.5 });
    const slow = c.findings.filter((f) => f.code === 'PULLER_SPEED_OUT_OF_RANGE');
    expect(slow.map((f) => f.station)).toEqual([1, 2, 3]);
    for (const f of slow) {
      expect(f.limit).toBeCloseTo(1.8, 12);
      expect(f.value).toBeCloseTo(c.stations[f.station!]!.process.pullerSpeedMPerS * 60, 12);
      expect(f.message).toContain('(limits.puller_speed_m_per_min)');
    }
    expect(slow[1]!.value).toBeCloseTo((2 * c.stations[0]!.areaMm2) / c.stations[2]!.areaMm2, 9);
    // the range 1.5–2.5 holds them all
    const wide = check({ puller_follows_area: true }, { min: 1.5, max: 2.5 });
    expect(codes(wide.findings)).not.toContain('PULLER_SPEED_OUT_OF_RANGE');
  });

  it('with the puller at the line speed, the 2 m/min line speed is checked once against the range', () => {
    const c = check({ puller_follows_area: false }, { min: 2.5, max: 10 });
    const slow = c.findings.filter((f) => f.code === 'PULLER_SPEED_OUT_OF_RANGE');
    expect(slow).toHaveLength(1);
    expect(slow[0]).toMatchObject({ value: 2, limit: 2.5 });
    expect(slow[0]!.station).toBeUndefined();
    expect(codes(check({ puller_follows_area: false }, { min: 1, max: 10 }).findings)).not.toContain(
      'PULLER_SPEED_OUT_OF_RANGE',
    );
  });

  it('refuses a range whose min exceeds its max, naming the field', () => {
    const mapped = { ...wire, limits: { ...wire.limits, puller_speed_m_per_min: { min: 5, max: 1 } } };
    const parsed = ScheduleWire.safeParse(mapped);
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues[0]?.path.join('.')).toBe('limits.puller_speed_m_per_min');
  });
});
