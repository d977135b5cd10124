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

  it('says per plate why one actuator does not drive the fitted chain, and the smallest count that does', () => {
    expect(result.status).toBe('no-mechanism');
    const codes = result.findings.map((f) => f.code);
    expect(codes[0]).toBe('NO_MECHANISM');
    expect(codes).toContain('PLATE_HAS_NO_LINK');
    for (const f of result.findings.filter((x) => x.code === 'PLATE_HAS_NO_LINK')) {
      expect(f.message).toMatch(/^plate_\d+/);
      expect(f.severity).toBe('warning');
    }
    expect(result.smallestActuatorCount).toBeGreaterThan(1);
    expect(codes).toContain('SMALLEST_ACTUATOR_COUNT');
  });

  it('the smallest actuator count reported does drive the demo through every station', () => {
    const count = result.smallestActuatorCount!;
    const r = mechaniseChain(fit, { ...request, actuatorCount: count });
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
