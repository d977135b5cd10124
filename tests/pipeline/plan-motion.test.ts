import { describe, expect, it } from 'vitest';
import { toSchedule } from '../../src/http/to-schedule.js';
import { planMotion, planSchedule } from '../../src/pipeline/index.js';
import { scheduleForTest } from '../process/schedule-for-test.js';
import { fixture } from '../support/test-app.js';

/** The demo schedule with some process and actuator settings replaced, planned. */
function planDemo(lineSpeedMPerMin: number, maxSpeedDegPerS: number) {
  const demo = fixture('demo-edging-strip') as Record<string, Record<string, unknown>>;
  const wire = {
    ...demo,
    process: { ...demo.process, line_speed_m_per_min: lineSpeedMPerMin },
    actuators: { ...demo.actuators, max_speed_deg_per_s: maxSpeedDegPerS },
  };
  const mapping = toSchedule(wire as Parameters<typeof toSchedule>[0]);
  if (!mapping.ok) throw new Error(JSON.stringify(mapping.problems));
  return { schedule: mapping.schedule, plan: planSchedule(mapping.schedule) };
}

/** The highest line speed an ACTUATOR_LIMIT message advises, m/min. */
const advisedLineSpeed = (message: string): number => {
  const m = /run the line at ([\d.]+) m\/min or slower/.exec(message);
  if (!m) throw new Error(`no line speed in: ${message}`);
  return Number(m[1]);
};

describe('planSchedule: actuator motion and its limits', () => {
  it('the demo at 2 m/min moves its one rotary actuator by the cycloidal law within 60 °/s and 300 °/s²', () => {
    const { plan } = planDemo(2, 60);
    expect(plan.status).toBe('done');
    expect(plan.motion).not.toBeNull();
    expect(plan.motion!.law).toBe('cycloidal');
    expect(plan.motion!.timeStepS).toBe(0.05);
    expect(plan.motion!.trajectories).toHaveLength(1);
    expect(plan.motion!.trajectories[0]!.timeBase.periodic).toBe(true);
    // 4 stations, periodic: 4 transitions, the last closing back to the first over the rest of the 1.5 m repeat
    expect(plan.motion!.trajectories[0]!.transitions).toHaveLength(4);
    expect(plan.findings.filter((f) => f.code === 'ACTUATOR_LIMIT')).toEqual([]);
  });

  it('the demo at 200 m/min with 1 °/s gives ACTUATOR_LIMIT findings whose peak speed is 2h/T (VDI 2143), and their highest line speed clears them', () => {
    const { schedule, plan } = planDemo(200, 1);
    const limits = plan.findings.filter((f) => f.code === 'ACTUATOR_LIMIT');
    expect(limits.length).toBeGreaterThan(0);
    for (const f of limits) expect(f.severity).toBe('warning');

    // reference: cycloidal rest-to-rest peak velocity 2h/T (VDI 2143 Blatt 1), T = transition length / line speed
    const stationsM = schedule.stations.map((s) => s.positionM);
    const values = plan.mechanism!.actuators[0]!.stationValues; // degrees
    const v = 200 / 60; // m/s
    const repeat = schedule.repeatLengthM!;
    const peaks = stationsM.map((x, i) => {
      const next = i + 1 < stationsM.length ? i + 1 : 0;
      const length = (next === 0 ? stationsM[0]! + repeat : stationsM[next]!) - x;
      return { fromM: x, peak: (2 * Math.abs(values[next]! - values[i]!)) / (length / v) };
    });
    const speedFindings = limits.filter((f) => f.message.includes('peak speed'));
    expect(speedFindings.length).toBeGreaterThan(0);
    for (const f of speedFindings) {
      const ref = peaks.find((p) => Math.abs(p.fromM - f.positionM!) < 1e-12)!;
      expect(f.value!).toBeCloseTo(ref.peak, 6);
      expect(f.limit!).toBeCloseTo(1, 12);
      expect(f.message).toMatch(/between [\d.]+ m and [\d.]+ m of line/);
    }

    // apply the slowest line speed any finding advises: no limit is broken any more
    const slowest = Math.min(...limits.map((f) => advisedLineSpeed(f.message)));
    expect(slowest).toBeGreaterThanOrEqual(0.01);
    const again = planDemo(slowest, 1);
    expect(again.plan.findings.filter((f) => f.code === 'ACTUATOR_LIMIT')).toEqual([]);
  });
});

describe('planMotion: a linear actuator (a slotted end) checked in mm/s', () => {
  it('a 10 mm stroke over 0.05 m at 2 m/min peaks at 2h/T = 13.3 mm/s: over a 10 mm/s limit, flagged in mm/s', () => {
    // cycloidal rest-to-rest (VDI 2143 Blatt 1): peak speed 2h/T; T = 0.05 m / (2/60 m/s) = 1.5 s → 2·10/1.5 mm/s.
    // The highest line speed keeps T ≥ 2h/v_max = 2 s: 0.05 m / 2 s = 0.025 m/s = 1.5 m/min
    const base = scheduleForTest({ stations: 2 });
    const schedule = {
      ...base,
      process: { ...base.process, lineSpeedMPerS: 2 / 60 },
      actuators: { ...base.actuators, maxSpeedMmPerS: 10, maxAccelMmPerS2: 1000 },
      stations: [
        { ...base.stations[0]!, positionM: 0 },
        { ...base.stations[1]!, positionM: 0.05 },
      ],
    };
    const mechanism = {
      mobility: 1,
      bodies: [],
      joints: [],
      actuators: [{ id: 'actuator_1', joint: 'slot_end', kind: 'linear' as const, stationValues: [0, 10] }],
      findings: [],
    };
    const { findings } = planMotion(schedule, mechanism);
    const speed = findings.find((f) => f.code === 'ACTUATOR_LIMIT' && /speed/.test(f.message))!;
    expect(speed.value).toBeCloseTo((2 * 10) / 1.5, 9);
    expect(speed.limit).toBe(10);
    expect(speed.message).toMatch(/peak speed of 13\.3 mm\/s .* above its limit of 10 mm\/s/);
    expect(speed.message).toMatch(/run the line at 1\.5 m\/min or slower/);
  });
});

describe('planSchedule: actuator limits when the puller follows the area', () => {
  it('are checked at the fastest puller speed: the peak speed is 2h/T with T = transition length / fastest puller speed (VDI 2143)', () => {
    const demo = fixture('demo-edging-strip') as Record<string, Record<string, unknown>>;
    const wire = {
      ...demo,
      // 60 kg/h is more than the demo's own (about 41 kg/h from its first station at 2 m/min), so the puller runs faster
      process: { ...demo.process, puller_follows_area: true, throughput_kg_per_h: 60 },
      actuators: { ...demo.actuators, max_speed_deg_per_s: 0.5 },
    };
    const mapping = toSchedule(wire as Parameters<typeof toSchedule>[0]);
    if (!mapping.ok) throw new Error(JSON.stringify(mapping.problems));
    const plan = planSchedule(mapping.schedule);
    const fastest = Math.max(...plan.simulation!.pullerSpeedMPerS);
    expect(fastest).toBeGreaterThan(mapping.schedule.process.lineSpeedMPerS);
    const limits = plan.findings.filter((f) => f.code === 'ACTUATOR_LIMIT' && f.message.includes('peak speed'));
    expect(limits.length).toBeGreaterThan(0);
    const stationsM = mapping.schedule.stations.map((s) => s.positionM);
    const values = plan.mechanism!.actuators[0]!.stationValues; // degrees
    for (const f of limits) {
      const i = stationsM.findIndex((x) => Math.abs(x - f.positionM!) < 1e-12);
      const next = i + 1 < stationsM.length ? i + 1 : 0;
      const length = (next === 0 ? stationsM[0]! + 1.5 : stationsM[next]!) - stationsM[i]!;
      // cycloidal peak velocity 2h/T (VDI 2143 Blatt 1) at T = L / v_fastest
      expect(f.value!).toBeCloseTo((2 * Math.abs(values[next]! - values[i]!)) / (length / fastest), 6);
      expect(f.message).toMatch(/Checked at the fastest puller speed/);
    }
  });
});
