import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { previewPlots, writePreviewSvg } from '../../src/export/index.js';
import { planDemo } from './demo-drawings.js';

const { plan, model, schedule } = planDemo();
const plots = previewPlots(plan, schedule);
const svg = writePreviewSvg(model, plots);

type Node = Record<string, unknown>;
/** Every element named `name` anywhere in the parsed tree (fast-xml-parser 5.3.3, attributes prefixed `@_`). */
function all(node: unknown, name: string, out: Node[] = []): Node[] {
  if (Array.isArray(node)) for (const n of node) all(n, name, out);
  else if (node && typeof node === 'object') {
    for (const [key, value] of Object.entries(node as Node)) {
      if (key === name) for (const v of Array.isArray(value) ? value : [value]) out.push(v as Node);
      all(value, name, out);
    }
  }
  return out;
}
const tree = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '@_' }).parse(svg);
const paths = all(tree, 'path');
const ofClass = (c: string) => paths.filter((p) => p['@_class'] === c);
const textOf = all(tree, 'text')
  .map((t) => (typeof t === 'object' ? String(t['#text'] ?? '') : String(t)))
  .join('\n');

describe('preview.svg of the demo plan', () => {
  it('is well-formed XML (fast-xml-parser XMLValidator) with an svg root in the SVG namespace', () => {
    expect(XMLValidator.validate(svg)).toBe(true);
    expect(tree.svg['@_xmlns']).toBe('http://www.w3.org/2000/svg');
  });

  it('has one target and one achieved orifice path per station, and one path per part in each station panel', () => {
    expect(ofClass('target-orifice')).toHaveLength(4);
    expect(ofClass('achieved-orifice')).toHaveLength(4);
    const parts = ofClass('part');
    expect(parts).toHaveLength(4 * 5);
    for (const id of ['plate_1', 'plate_2', 'plate_3', 'plate_4', 'link_1']) {
      expect(parts.filter((p) => p['@_data-part'] === id)).toHaveLength(4);
    }
  });

  it('plots actuator_1, orifice area, draw-down with its limits and puller speed, labelled with units', () => {
    expect(plots.plots.map((p) => p.unit)).toEqual(['deg', 'deg/s', 'mm2', '-', 'm/min']);
    expect(textOf).toContain('limit 60.0 deg/s');
    expect(textOf).toContain('actuator_1 (rotary, joint pivot_0) (deg)');
    expect(textOf).toContain('orifice area (mm2)');
    expect(textOf).toContain('line position (m)');
    expect(textOf).toContain('max 1.3');
    expect(textOf).toContain('min 1');
    // draw-down min and max, line speed, and the actuator speed limit both ways
    expect(all(tree, 'line').filter((l) => l['@_class'] === 'limit')).toHaveLength(5);
  });

  it("the actuator curve passes through the plan's station values (cycloidal motion, rest at each station)", () => {
    const curve = plots.plots[0]!.series[0]!.points;
    const values = plan.mechanism!.actuators[0]!.stationValues;
    schedule.stations.forEach((s, i) => {
      const near = curve.find((p) => Math.abs(p[0] - s.positionM) < 1e-9);
      expect(near?.[1]).toBeCloseTo(values[i]!, 9);
    });
  });

  it('with the puller following the area, the actuator speed peaks between 2h/L·v at the slowest and fastest puller speed of the transition (cycloidal law, VDI 2143, times dx/dt)', () => {
    // cycloidal in line position: peak slope 2h/L at mid-transition (L its length); dθ/dt = dθ/dx · v(x) with v the
    // puller speed, so the peak lies between 2h/L·v_min and 2h/L·v_max over the transition
    expect(plots.plots[1]!.title).toBe('actuator_1 speed with the puller following the area');
    const speed = plots.plots[1]!.series[0]!.points;
    const values = plan.mechanism!.actuators[0]!.stationValues;
    const x = schedule.stations.map((s) => s.positionM);
    const sim = plan.simulation!;
    const puller = sim.pullerSpeedMPerS.filter((_, i) => sim.positionsM[i]! >= x[0]! && sim.positionsM[i]! <= x[1]!);
    const slope = (2 * Math.abs(values[1]! - values[0]!)) / (x[1]! - x[0]!);
    const peak = Math.max(...speed.filter((p) => p[0] >= x[0]! && p[0] <= x[1]!).map((p) => Math.abs(p[1])));
    expect(Math.min(...puller)).toBeLessThan(Math.max(...puller)); // the puller does change speed here
    expect(peak).toBeLessThanOrEqual(slope * Math.max(...puller) + 1e-9);
    expect(peak).toBeGreaterThan(0.995 * slope * Math.min(...puller));
  });

  it('at the nominal line speed the actuator speed curve peaks at 2h/T on each transition (cycloidal law, VDI 2143), below the 60 °/s limit', () => {
    // cycloidal rest-to-rest: peak speed 2h/T, h the transition's rise, T its duration at the nominal line speed
    const atLineSpeed = planDemo(false);
    const lineSpeedPlots = previewPlots(atLineSpeed.plan, atLineSpeed.schedule);
    expect(lineSpeedPlots.plots[1]!.title).toBe('actuator_1 speed at the nominal line speed');
    const speed = lineSpeedPlots.plots[1]!.series[0]!.points;
    const values = atLineSpeed.plan.mechanism!.actuators[0]!.stationValues;
    const v = schedule.process.lineSpeedMPerS;
    const x = schedule.stations.map((s) => s.positionM);
    const h = Math.abs(values[1]! - values[0]!);
    const t = (x[1]! - x[0]!) / v;
    const first = speed.filter((p) => p[0] >= x[0]! && p[0] <= x[1]!).map((p) => Math.abs(p[1]));
    // sampled every 1.5 m / 240 = 6.25 mm of line: the sampled peak is within 0.5 % of the true one
    expect(Math.max(...first)).toBeLessThanOrEqual((2 * h) / t + 1e-9);
    expect(Math.max(...first)).toBeGreaterThan(0.995 * ((2 * h) / t));
  });

  it('marks the warnings that have a line position (the demo has draw-down and wall findings)', () => {
    const marked = plan.findings.filter(
      (f) => f.severity !== 'info' && (f.positionM !== undefined || f.station !== undefined),
    );
    expect(marked.length).toBeGreaterThan(0);
    expect(all(tree, 'line').filter((l) => l['@_class'] === 'finding').length).toBeGreaterThan(0);
    for (const f of marked) expect(textOf).toContain(f.code);
  });

  it('says it is the hot geometry and carries the safety cautions', () => {
    expect(textOf).toContain('190 °C (hot)');
    expect(textOf).toContain('SAFETY CAUTIONS');
    for (const c of plan.cautions) expect(textOf).toContain(c.hazard);
  });

  it('a schedule name with markup, quotes, a line break and non-ASCII letters still gives well-formed XML', () => {
    const odd = { ...model, scheduleName: 'strip <B> & "C"\nÄ' };
    const text = writePreviewSvg(odd, plots);
    expect(XMLValidator.validate(text)).toBe(true);
    expect(text).toContain('strip &lt;B&gt; &amp; &quot;C&quot;');
  });

  it('is the same bytes when written again', () => {
    expect(writePreviewSvg(model, previewPlots(plan, schedule))).toBe(svg);
  });
});
