import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ScheduleWire } from '../../src/http/schedule-schema.js';
import { toSchedule } from '../../src/http/to-schedule.js';
import { mechaniseChain } from '../../src/mechanise/index.js';
import { checkSchedule } from '../../src/pipeline/index.js';
import { fitChain, resolveChainFitOptions } from '../../src/synthesis/index.js';

/** The demo schedule through the real path, as src/pipeline/plan-schedule.ts runs it: wire → schedule → check → fit. */
function demo() {
  const json: unknown = JSON.parse(
    readFileSync(new URL('../../fixtures/demo-edging-strip.json', import.meta.url), 'utf8'),
  );
  const mapping = toSchedule(ScheduleWire.parse(json));
  if (!mapping.ok) throw new Error(JSON.stringify(mapping.problems));
  const schedule = mapping.schedule;
  const check = checkSchedule(schedule);
  const fit = fitChain(
    schedule.stations.map((s) => s.orifice),
    check.stations.map((s) => s.movingSpan!),
    resolveChainFitOptions({
      toleranceMm: schedule.limits.fitToleranceMm,
      maxPlates: schedule.limits.maxPlates,
      pivotHoleDiameterMm: schedule.plates.pivotHoleDiameterMm,
      ligamentMm: schedule.plates.ligamentMm,
      depthMm: schedule.plates.depthMm,
    }),
  );
  const request = {
    periodic: schedule.repeatLengthM !== null,
    fitToleranceMm: schedule.limits.fitToleranceMm,
  };
  return { schedule, fit, request };
}

describe('mechaniseChain on the demo edging strip (DOMAIN.md §6)', () => {
  const { schedule, fit, request } = demo();
  const result = mechaniseChain(fit, { ...request, actuatorCount: schedule.actuators.count });

  it('the periodic schedule repeats its flat profile: four stations, three distinct positions, legs both ways', () => {
    expect(schedule.actuators.count).toBe(1);
    expect(result.distinctPositions).toBe(3);
    expect(result.chainDegreesOfFreedom).toBe(
      fit.plateCount -
        2 +
        (fit.chain.end.kind === 'slot' ? 1 : 0) +
        (fit.chain.start.kind === 'slot' ? 1 : 0) +
        fit.chain.telescoping.length,
    );
  });

  it('one actuator drives the fitted chain, with one binary link per remaining degree of freedom', () => {
    // Grübler–Kutzbach (DOMAIN.md §3): each binary link removes one degree of freedom, the actuator the last
    expect(result.status).toBe('mechanised');
    expect(result.mechanism!.actuators).toHaveLength(1);
    expect(result.links).toHaveLength(result.chainDegreesOfFreedom - 1);
    expect(result.mobility).toMatchObject({ grubler: 1, numerical: 1 });
    // every link is at least two pin holes and a ligament long (4 + 3 mm), the shortest the plates allow
    for (const link of result.links) expect(link.lengthMm).toBeGreaterThanOrEqual(7);
    for (const s of result.stations) {
      expect(s.residualMm).toBeLessThan(1e-6);
      expect(s.deviationMm).toBeLessThanOrEqual(schedule.limits.fitToleranceMm + 1e-3);
    }
  });

  it('with links no shorter than 10 mm one actuator does not do, and the finding names the short links', () => {
    const strict = mechaniseChain(fit, { ...request, actuatorCount: 1, linkLengthMinMm: 10 });
    expect(strict.status).toBe('no-mechanism');
    const codes = strict.findings.map((f) => f.code);
    expect(codes[0]).toBe('NO_MECHANISM');
    expect(
      strict.findings.filter((f) => f.code === 'PLATE_HAS_NO_LINK').some((f) => /shorter than 10 mm/.test(f.message)),
    ).toBe(true);
    expect(strict.smallestActuatorCount).toBeGreaterThan(1);
  });

  it('the smallest actuator count reported with 10 mm links does drive the demo through every station', () => {
    const strict = { ...request, linkLengthMinMm: 10 };
    const count = mechaniseChain(fit, { ...strict, actuatorCount: 1 }).smallestActuatorCount!;
    const r = mechaniseChain(fit, { ...strict, actuatorCount: count });
    expect(r.status).toBe('mechanised');
    expect(r.mobility).toMatchObject({ grubler: count, numerical: count });
    expect(r.stations).toHaveLength(4);
    for (const s of r.stations) {
      expect(s.residualMm).toBeLessThan(1e-6);
      // the plates where the mechanism puts them leave the fitted orifice: within the schedule's fit tolerance
      expect(s.deviationMm).toBeLessThanOrEqual(schedule.limits.fitToleranceMm + 1e-3);
    }
  });
});
