import { describe, expect, it } from 'vitest';
import { checkSchedule } from '../../src/pipeline/index.js';
import { scheduleForTest } from './schedule-for-test.js';

describe('checkSchedule: scale mistakes through the whole check', () => {
  it('a 40 × 8 mm strip drawn in metres (0.04 × 0.008) gets ORIFICE_TOO_SMALL, not a pressure or a wall', () => {
    const base = scheduleForTest({ process: { throughputKgPerS: 0.0056 } });
    const outer = [
      [0, 0],
      [0.04, 0],
      [0.04, 0.008],
      [0, 0.008],
    ] as const;
    const schedule = { ...base, stations: [{ index: 0, positionM: 0, orifice: { outer, holes: [] } }] };
    const check = checkSchedule(schedule);
    const codes = check.findings.map((f) => f.code);
    expect(codes).toContain('ORIFICE_TOO_SMALL');
    expect(codes).not.toContain('THIN_WALL');
    expect(codes).not.toContain('HIGH_LAND_PRESSURE');
    expect(codes).not.toContain('LAND_PRESSURE_OUT_OF_RANGE');
    // 0.04 × 0.008 = 0.00032 mm², 0.04 mm across (the bounding box's longer side)
    expect(check.findings.find((f) => f.code === 'ORIFICE_TOO_SMALL')?.message).toContain('0.00032 mm² and 0.04 mm');
  });

  it('the same strip in millimetres raises no scale finding', () => {
    const base = scheduleForTest({ process: { throughputKgPerS: 0.0056 } });
    const outer = [
      [0, 0],
      [40, 0],
      [40, 8],
      [0, 8],
    ] as const;
    const check = checkSchedule({ ...base, stations: [{ index: 0, positionM: 0, orifice: { outer, holes: [] } }] });
    expect(check.findings.map((f) => f.code)).not.toContain('ORIFICE_TOO_SMALL');
  });
});
