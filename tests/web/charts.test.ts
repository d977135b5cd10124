import { describe, expect, it } from 'vitest';
import {
  buildCharts,
  type Finding,
  findingMarker,
  findingPosition,
  findingsAt,
  limitsFor,
} from '../../src/web/lib/charts.js';
import type { MotionModel } from '../../src/web/lib/motion-model.js';

/** Three samples over 1 m, one rotary actuator, area and draw-down rising linearly. */
function model(): MotionModel {
  const positions = [0, 0.5, 1];
  return {
    source: 'motion',
    positions,
    clock: null,
    stationPositions: [0, 0.5],
    joints: [],
    plates: [],
    links: [],
    actuators: [
      { id: 'actuator_1', kind: 'rotary', unit: 'deg', joint: 'pivot_0', curve: { positions, values: [10, 20, 10] } },
    ],
    series: {
      area_mm2: { positions, values: [300, 340, 300], atStations: false },
      draw_down_ratio: { positions, values: [1.1, 1.32, 1.1], atStations: false },
    },
    fraction: null,
    limits: {},
  };
}

const drawDownHigh: Finding = {
  code: 'DRAW_DOWN_HIGH',
  severity: 'warning',
  station: 1,
  position_m: 0.5,
  value: 1.32,
  limit: 1.3,
  message: 'draw-down above the limit',
};

describe('plot series', () => {
  it('buildCharts gives an actuator chart in degrees, then area and draw-down, each with its samples', () => {
    const charts = buildCharts(model(), []);
    expect(charts.map((c) => c.key)).toEqual(['actuators_deg', 'area_mm2', 'draw_down_ratio']);
    expect(charts[0]).toMatchObject({
      unit: '°',
      x: [0, 0.5, 1],
      lines: [{ label: 'actuator_1', values: [10, 20, 10] }],
    });
    expect(charts[1]).toMatchObject({ unit: 'mm²', lines: [{ values: [300, 340, 300] }], atStations: false });
  });

  it('a finding that states a limit draws it on its chart once, on its side', () => {
    const charts = buildCharts(model(), [drawDownHigh, { ...drawDownHigh, station: 0, position_m: 0 }]);
    expect(charts.find((c) => c.key === 'draw_down_ratio')!.limits).toEqual([
      { label: 'highest draw-down', value: 1.3, side: 'max' },
    ]);
    expect(limitsFor('draw_down_ratio', [], { min: 1, max: 1.3 })).toEqual([
      { label: 'lowest allowed', value: 1, side: 'min' },
      { label: 'highest allowed', value: 1.3, side: 'max' },
    ]);
    expect(charts.find((c) => c.key === 'area_mm2')!.limits).toEqual([]);
  });
});

describe('finding → marker', () => {
  it('a draw-down finding sits on the draw-down chart at its line position and its own value', () => {
    const charts = buildCharts(model(), [drawDownHigh]);
    expect(charts.find((c) => c.key === 'draw_down_ratio')!.markers).toEqual([
      { x: 0.5, y: 1.32, severity: 'warning', code: 'DRAW_DOWN_HIGH', finding: 0 },
    ]);
  });

  it('a finding with a station only is placed at that station’s line position, on the curve there', () => {
    const wall: Finding = { code: 'WALL_RATIO', severity: 'warning', station: 1, value: 4.2, message: 'walls' };
    expect(findingPosition(wall, [0, 0.5])).toBe(0.5);
    const placed = findingMarker(wall, 3, buildCharts(model(), []), [0, 0.5]);
    expect(placed).toEqual({
      chart: 'area_mm2',
      marker: { x: 0.5, y: 340, severity: 'warning', code: 'WALL_RATIO', finding: 3 },
    });
  });

  it('an actuator finding between samples goes on the actuator chart, interpolated: 0.25 m → 15°', () => {
    const limit: Finding = {
      code: 'ACTUATOR_LIMIT',
      severity: 'warning',
      position_m: 0.25,
      value: 80,
      message: 'fast',
    };
    const placed = findingMarker(limit, 0, buildCharts(model(), []), [0, 0.5]);
    expect(placed?.chart).toBe('actuators_deg');
    expect(placed?.marker.y).toBeCloseTo(15, 12);
  });

  it('a finding about the whole plan is not marked', () => {
    const whole: Finding = { code: 'PLATE_COUNT', severity: 'info', message: '4 plates' };
    expect(findingPosition(whole, [0, 0.5])).toBeNull();
    const charts = buildCharts(model(), [whole]);
    expect(charts.every((c) => c.markers.length === 0)).toBe(true);
  });
});

describe('findings over a range of line positions', () => {
  it('a motion draw-down finding is marked on the draw-down chart from where its range starts, on the curve, with its range and limit', () => {
    const motionHigh: Finding = {
      code: 'MOTION_DRAW_DOWN_HIGH',
      severity: 'warning',
      position_m: 0.25,
      to_position_m: 0.75,
      value: 1.32,
      limit: 1.3,
      message: 'draw-down above the limit over a range',
    };
    const chart = buildCharts(model(), [motionHigh]).find((c) => c.key === 'draw_down_ratio')!;
    expect(chart.markers).toHaveLength(1);
    expect(chart.markers[0]).toMatchObject({ x: 0.25, to: 0.75, code: 'MOTION_DRAW_DOWN_HIGH' });
    expect(chart.markers[0]!.y).toBeCloseTo(1.21, 12); // halfway from 1.1 (0 m) to 1.32 (0.5 m)
    expect(chart.limits).toEqual([{ label: 'highest draw-down', value: 1.3, side: 'max' }]);
  });
});

describe('a plan with nothing to plot', () => {
  it('buildCharts draws no chart for a series without samples (a failed plan has no stations)', () => {
    const empty = {
      ...model(),
      positions: [],
      stationPositions: [],
      actuators: [],
      series: { area_mm2: { positions: [], values: [], atStations: true } },
    };
    expect(buildCharts(empty, [])).toEqual([]);
  });
});

describe('findings in the drawing', () => {
  it('findingsAt gives the findings with a place in the die that hold at a line position: over their range, or near their station', () => {
    const findings: Finding[] = [
      { code: 'THIN_WALL', severity: 'error', station: 1, at_mm: [20, 4], message: 'thin' },
      {
        code: 'MOTION_THIN_WALL',
        severity: 'warning',
        position_m: 0.6,
        to_position_m: 0.8,
        at_mm: [21, 5],
        message: 'thin along',
      },
      { code: 'WALL_RATIO', severity: 'warning', station: 1, message: 'no place' },
    ];
    const stations = [0, 0.5];
    expect(findingsAt(findings, stations, 0.502, 0.005).map((f) => f.code)).toEqual(['THIN_WALL']);
    expect(findingsAt(findings, stations, 0.51, 0.005)).toEqual([]);
    expect(findingsAt(findings, stations, 0.7, 0.005)).toEqual([
      { finding: 1, at: [21, 5], severity: 'warning', code: 'MOTION_THIN_WALL' },
    ]);
  });
});
