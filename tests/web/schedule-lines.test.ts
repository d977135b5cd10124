import { describe, expect, it } from 'vitest';
import { pathParts, placeErrors, scheduleLines, visibleLines } from '../../src/web/lib/schedule-lines.js';

const schedule = {
  name: 'x',
  process: { line_speed_m_per_min: -2 },
  stations: [
    {
      position_m: 0,
      orifice: {
        outer: [
          [0, 0],
          [1, 0],
        ],
      },
    },
  ],
};

describe('schedule lines and field errors', () => {
  it('scheduleLines writes every field on its own line with the path the service uses, a point on one line', () => {
    const lines = scheduleLines(schedule);
    const byText = (t: string) => lines.find((l) => l.text.startsWith(t) && !l.closing)!;
    expect(lines[0]).toMatchObject({ path: '(body)', text: '{', depth: 0 });
    expect(byText('"line_speed_m_per_min"')).toMatchObject({
      path: 'process.line_speed_m_per_min',
      text: '"line_speed_m_per_min": -2',
      depth: 2,
    });
    expect(byText('"outer"').path).toBe('stations[0].orifice.outer');
    expect(lines.filter((l) => l.path === 'stations[0].orifice.outer[1]').map((l) => l.text)).toEqual(['[1,0]']);
    expect(JSON.parse(lines.map((l) => l.text).join('\n'))).toEqual(schedule);
  });

  it('pathParts reads dotted and indexed paths; (body) is the root', () => {
    expect(pathParts('stations[2].orifice.outer[10]')).toEqual(['stations', 2, 'orifice', 'outer', 10]);
    expect(pathParts('(body)')).toEqual([]);
  });

  it('placeErrors puts an error under its field, a missing field under its object, an unknown path at the top', () => {
    const lines = scheduleLines(schedule);
    const lineOf = (path: string) => lines.findIndex((l) => l.path === path && !l.closing);
    const placed = placeErrors(lines, [
      { path: 'stations[0].orifice.outer', message: 'a ring needs at least 3 points' },
      { path: 'process.line_speed_m_per_min', message: 'must be positive' },
      { path: 'process.throughput_kg_per_h', message: 'required here' },
      { path: '(body)', message: 'whole' },
    ]);
    expect(placed.get(lineOf('stations[0].orifice.outer'))?.[0]?.message).toBe('a ring needs at least 3 points');
    expect(placed.get(lineOf('process.line_speed_m_per_min'))?.[0]?.message).toBe('must be positive');
    expect(placed.get(lineOf('process'))?.[0]?.message).toBe('required here');
    expect(placed.get(0)?.[0]?.message).toBe('whole');
  });

  it('visibleLines shows a short document whole and only the neighbourhood of errors in a long one', () => {
    expect(visibleLines(5, [2]).every(Boolean)).toBe(true);
    const shown = visibleLines(100, [50], 20, 2);
    expect(shown.filter(Boolean).length).toBe(5);
    expect(shown[48] && shown[52] && !shown[47] && !shown[53]).toBe(true);
  });
});
