import { describe, expect, it } from 'vitest';
import { toSchedule } from '../../src/http/to-schedule.js';
import { planSchedule } from '../../src/pipeline/index.js';
import { E, linkedStations, WIDTH } from '../mechanise/known-linkage.js';
import { channelOrifice } from '../support/known-chain.js';

/** The schedule a line controller would post for stations made by a known 4-plate chain closed by one binary link. */
function knownLinkageSchedule(extra: Record<string, unknown> = {}) {
  const pivots = linkedStations([0.25, 0.35, 0.45, 0.55]);
  return {
    stations: pivots.map((p, i) => ({ position_m: i * 0.1, orifice: channelOrifice(p, E, WIDTH, 0.25) })),
    limits: { fit_tolerance_mm: 0.1 },
    plates: { pivot_hole_diameter_mm: 4, ligament_mm: 3, depth_mm: 25 },
    actuators: { count: 1 },
    ...extra,
  };
}

function plan(wire: unknown) {
  const mapping = toSchedule(wire as Parameters<typeof toSchedule>[0]);
  if (!mapping.ok) throw new Error(JSON.stringify(mapping.problems));
  return planSchedule(mapping.schedule);
}

describe('planSchedule: fit and mechanisation as one search', () => {
  it('a known 4-plate chain with one link plans as 4 plates driven by 1 actuator, and says the request is met', () => {
    // self-consistent case (docs/MODEL.md §5): the truth is a 1-degree-of-freedom mechanism of 4 plates and 1 link
    // (Grübler–Kutzbach: 4 − 2 − 1 = 1), built by the law of cosines in tests/mechanise/known-linkage.ts
    const p = plan(knownLinkageSchedule());
    expect(p.status).toBe('done');
    expect(p.outcome).toEqual({ meetsRequest: true, shortfalls: [] });
    expect(p.fit!.plateCount).toBe(4);
    expect(p.mechanisation!.status).toBe('mechanised');
    expect(p.mechanism!.actuators).toHaveLength(1);
    expect(p.mechanisation!.links).toHaveLength(1);
    for (const s of p.mechanisation!.stations) expect(s.deviationMm).toBeLessThanOrEqual(0.1);
    expect(p.chainsTried).toHaveLength(1);
    expect(p.chainsTried[0]!.verdict).toBe('chosen');
  });

  it('more actuators than the fewest-plate chain has freedoms: a chain with one plate more takes them, and says so', () => {
    // 4 plates pinned at both ends have 2 degrees of freedom, 5 plates 3 (Grübler–Kutzbach, N − 2): 3 actuators drive
    // a 5-plate chain directly
    const p = plan(knownLinkageSchedule({ actuators: { count: 3 } }));
    expect(p.status).toBe('done');
    expect(p.chainsTried[0]).toMatchObject({ variant: 'as asked', plateCount: 4, mechanised: false });
    expect(p.fit!.plateCount).toBe(5);
    expect(p.mechanism!.actuators).toHaveLength(3);
    expect(p.mechanisation!.mode).toBe('direct');
    expect(p.findings.map((f) => f.code)).toContain('CHAIN_CHANGED_FOR_ACTUATORS');
  });
});

describe('toSchedule: plate-count limits', () => {
  it('refuses min_plates above max_plates with the field path', () => {
    const m = toSchedule(knownLinkageSchedule({ limits: { min_plates: 6, max_plates: 5 } }) as never);
    expect(m.ok).toBe(false);
    if (!m.ok) expect(m.problems[0]).toMatchObject({ path: 'limits.min_plates' });
  });

  it('refuses a plate_count outside min_plates–max_plates', () => {
    const m = toSchedule(knownLinkageSchedule({ limits: { plate_count: 9, max_plates: 8 } }) as never);
    expect(m.ok).toBe(false);
    if (!m.ok) expect(m.problems[0]).toMatchObject({ path: 'limits.plate_count' });
  });
});

describe('toSchedule: link limits', () => {
  it('defaults the shortest link to two pin holes and a ligament: 4 + 3 = 7 mm', () => {
    // the same rule as the shortest plate (docs/MODEL.md §2: hole and ligament round every pin)
    const m = toSchedule(knownLinkageSchedule() as never);
    expect(m.ok && m.schedule.links).toEqual({ minLengthMm: 7, maxLengthMm: 200 });
  });

  it('refuses a shortest link at or above the longest, with the field path', () => {
    const m = toSchedule(knownLinkageSchedule({ links: { min_length_mm: 250 } }) as never);
    expect(m.ok).toBe(false);
    if (!m.ok) expect(m.problems[0]).toMatchObject({ path: 'links.min_length_mm' });
  });
});
