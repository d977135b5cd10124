import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ScheduleWire } from '../../src/http/schedule-schema.js';
import { toSchedule } from '../../src/http/to-schedule.js';
import { mechaniseChain } from '../../src/mechanise/index.js';
import { checkSchedule } from '../../src/pipeline/index.js';
import { fitChain, resolveChainFitOptions } from '../../src/synthesis/index.js';

/** A fixture through the real path, as src/pipeline/plan-schedule.ts runs it: wire → schedule → check → fit. */
function load(name: string) {
  const json: unknown = JSON.parse(readFileSync(new URL(`../../fixtures/${name}.json`, import.meta.url), 'utf8'));
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
    linkLengthMinMm: schedule.links.minLengthMm,
  };
  return { schedule, fit, request };
}

describe('mechaniseChain on the demo edging strip (README; stations made by a 4-plate die with one link)', () => {
  const { schedule, fit, request } = load('demo-edging-strip');
  const result = mechaniseChain(fit, { ...request, actuatorCount: schedule.actuators.count });

  it('the periodic schedule goes back and forth: four stations, three distinct positions', () => {
    expect(schedule.actuators.count).toBe(1);
    expect(result.distinctPositions).toBe(3);
  });

  it('fits the 4 plates of the die that made the stations and drives them with 1 actuator and 1 link', () => {
    // self-consistent case (docs/MODEL.md §5): 4 plates pinned at both ends have 2 degrees of freedom
    // (Grübler–Kutzbach), one binary link takes one, the actuator the other
    expect(fit.plateCount).toBe(4);
    expect(result.status).toBe('mechanised');
    expect(result.mechanism!.actuators).toHaveLength(1);
    expect(result.links).toHaveLength(1);
    expect(result.mobility).toMatchObject({ grubler: 1, numerical: 1 });
    for (const s of result.stations) {
      expect(s.residualMm).toBeLessThan(1e-6);
      expect(s.deviationMm).toBeLessThanOrEqual(schedule.limits.fitToleranceMm);
    }
  });
});

describe('mechaniseChain on the demo: room between the parts over the whole motion', () => {
  const { schedule, fit, request } = load('demo-edging-strip');
  const result = mechaniseChain(fit, { ...request, actuatorCount: schedule.actuators.count });

  it('no two plates on one layer overlap anywhere: a plate that would, takes a layer of its own', () => {
    // plates 2 and 4 overlap at station 2 on alternating layers (measured by the clearance inspector), so one of
    // them moves up (greedy graph colouring along the chain)
    const layers = new Map(result.mechanism!.bodies.map((b) => [b.id, b.layer] as const));
    expect(layers.get('plate_2')).not.toBe(layers.get('plate_4'));
    expect(new Set([1, 2, 3].map((k) => layers.get(`plate_${k}`)))).not.toContain(layers.get('plate_4'));
    for (const c of result.clearances) expect(c.clearanceMm).toBeGreaterThanOrEqual(0);
    // every binary link lies above every plate
    const plateTop = Math.max(...result.mechanism!.bodies.filter((b) => b.kind === 'plate').map((b) => b.layer));
    for (const b of result.mechanism!.bodies.filter((x) => x.kind === 'link'))
      expect(b.layer).toBeGreaterThan(plateTop);
  });

  it('reports its tightest room with the parts and where it occurs', () => {
    const finding = result.findings.find((f) => f.code === 'CLEARANCE')!;
    const tightest = result.clearances.filter((c) => c.kind !== 'same-layer')[0]!;
    expect(finding.value).toBeCloseTo(tightest.clearanceMm, 9);
    expect(finding.message).toContain(`between ${tightest.parts[0]} and ${tightest.parts[1]}`);
  });
});

describe('mechaniseChain on the crowned edging strip (flat → crown → double crown → flat)', () => {
  const { fit, request } = load('crowned-edging-strip');
  const result = mechaniseChain(fit, { ...request, actuatorCount: 1 });

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

  it('the smallest actuator count reported does drive it through every station', () => {
    const count = result.smallestActuatorCount!;
    const r = mechaniseChain(fit, { ...request, actuatorCount: count });
    expect(r.status).toBe('mechanised');
    expect(r.mobility).toMatchObject({ grubler: count, numerical: count });
    expect(r.stations).toHaveLength(4);
    for (const s of r.stations) {
      expect(s.residualMm).toBeLessThan(1e-6);
      expect(s.deviationMm).toBeLessThanOrEqual(0.2 + 1e-3);
    }
  });
});
