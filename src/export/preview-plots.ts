import type { Schedule } from '../domain/index.js';
import { regionArea } from '../geometry/index.js';
import { sampleTrajectory } from '../motion/index.js';
import { interpolateLinear, toDegrees } from '../numeric/index.js';
import type { Plan } from '../pipeline/index.js';
import { formatNumber } from './format-number.js';

/** One curve of a plot: points (line position m, value). */
export interface PlotSeries {
  readonly label: string;
  readonly points: readonly (readonly [positionM: number, value: number])[];
  /** Draw dots at the points (station values) rather than a line through them. */
  readonly dots: boolean;
}

/** A plot against line position. */
export interface LinePlot {
  readonly title: string;
  /** Unit of the vertical axis, plain words (`deg`, `mm2`, `m/min`, `-`). */
  readonly unit: string;
  readonly series: readonly PlotSeries[];
  /** Horizontal limit lines with their labels. */
  readonly limits: readonly { readonly label: string; readonly value: number }[];
}

/** What the preview plots, against line position. */
export interface PreviewPlots {
  /** Range of line position shown, m. */
  readonly fromM: number;
  readonly toM: number;
  readonly plots: readonly LinePlot[];
  /** Findings that have a line position, marked on every plot. */
  readonly marks: readonly {
    readonly positionM: number;
    /** End of the line-position range the finding covers, m, when it has one. */
    readonly toPositionM: number | null;
    readonly code: string;
    readonly severity: string;
  }[];
}

/** Samples of each actuator's motion drawn per plot. */
export const PREVIEW_SAMPLES = 241;

/**
 * The station values and motion of a plan as plots against line position: each actuator's value (its trajectory
 * between stations, sampled, with the station values as dots), target and achieved orifice area, draw-down ratio
 * (area, orifice over product) with the schedule's limits, and the puller speed that holds the target draw-down with
 * the nominal line speed. One repeat when the schedule repeats, else first to last station.
 */
export function previewPlots(plan: Plan, schedule: Schedule): PreviewPlots {
  const stations = schedule.stations;
  const x = stations.map((s) => s.positionM);
  const fromM = x[0]!;
  const toM = schedule.repeatLengthM !== null ? fromM + schedule.repeatLengthM : x[x.length - 1]!;
  const checks = plan.check.stations;
  const achievedArea = stations.map((_, i) => {
    const driven = plan.mechanisation?.status === 'mechanised' ? plan.mechanisation.stations[i] : undefined;
    const region = driven?.achievedOrifice ?? plan.fit?.stations[i]?.achievedOrifice;
    return region && region.outer.length >= 3 ? regionArea(region) : null;
  });
  const plots: LinePlot[] = [];
  const actuators = plan.mechanism?.actuators ?? [];
  actuators.forEach((a, k) => {
    const unit = a.kind === 'rotary' ? 'deg' : 'mm';
    const trajectory = plan.motion?.trajectories[k];
    const series: PlotSeries[] = [];
    if (trajectory) {
      const points = Array.from({ length: PREVIEW_SAMPLES }, (_, j): [number, number] => {
        const at = fromM + ((toM - fromM) * j) / (PREVIEW_SAMPLES - 1);
        const v = sampleTrajectory(trajectory, at).value;
        return [at, a.kind === 'rotary' ? toDegrees(v) : v];
      });
      series.push({ label: `${plan.motion!.law} motion`, points, dots: false });
    }
    series.push({ label: 'station values', points: a.stationValues.map((v, i) => [x[i]!, v]), dots: true });
    plots.push({ title: `${a.id} (${a.kind}, joint ${a.joint})`, unit, series, limits: [] });
    if (trajectory) {
      // speed against the schedule's actuator speed limit (both directions): the trajectory is timed by the nominal
      // line speed; when the puller follows the area the line runs at the puller's speed, so the actuator's speed
      // scales with it (dθ/dt = dθ/dx · v)
      const rotary = a.kind === 'rotary';
      const limit = rotary ? toDegrees(schedule.actuators.maxSpeedRadPerS) : schedule.actuators.maxSpeedMmPerS;
      const puller = plan.simulation?.pullerFollowsArea ? plan.simulation : null;
      const nominal = schedule.process.lineSpeedMPerS;
      const points = Array.from({ length: PREVIEW_SAMPLES }, (_, j): [number, number] => {
        const at = fromM + ((toM - fromM) * j) / (PREVIEW_SAMPLES - 1);
        const scale = puller ? interpolateLinear(puller.positionsM, puller.pullerSpeedMPerS, at) / nominal : 1;
        const v = sampleTrajectory(trajectory, at).velocityPerS * scale;
        return [at, rotary ? toDegrees(v) : v];
      });
      plots.push({
        title: `${a.id} speed ${puller ? 'with the puller following the area' : 'at the nominal line speed'}`,
        unit: `${unit}/s`,
        series: [{ label: 'speed', points, dots: false }],
        limits: [
          { label: `limit ${formatNumber(limit, 1)} ${unit}/s`, value: limit },
          { label: `limit -${formatNumber(limit, 1)} ${unit}/s`, value: -limit },
        ],
      });
    }
  });
  // the plan's simulation of the commanded motion, step by step, where it has one
  const simulation = plan.simulation ?? null;
  const simulated = (label: string, values: readonly number[] | undefined): PlotSeries[] => {
    if (!simulation || !values) return [];
    const points = simulation.positionsM.flatMap((at, k) => {
      const v = values[k];
      return v !== undefined && Number.isFinite(v) ? [[at, v] as [number, number]] : [];
    });
    return points.length > 1 ? [{ label, points: thin(points), dots: false }] : [];
  };
  plots.push({
    title: 'orifice area',
    unit: 'mm2',
    series: [
      ...simulated('simulated motion', simulation?.areaMm2),
      { label: 'target', points: checks.map((c, i) => [x[i]!, c.areaMm2]), dots: true },
      {
        label: 'achieved',
        points: achievedArea.flatMap((a, i) => (a === null ? [] : [[x[i]!, a] as [number, number]])),
        dots: true,
      },
    ],
    limits: [],
  });
  plots.push({
    title: 'draw-down ratio (area: orifice / product)',
    unit: '-',
    series: [
      ...simulated('simulated motion', simulation?.drawDownRatio),
      { label: 'target orifice', points: checks.map((c, i) => [x[i]!, c.process.drawDownRatio]), dots: true },
      {
        label: 'achieved orifice',
        points: achievedArea.flatMap((a, i) =>
          a === null ? [] : [[x[i]!, a / checks[i]!.process.productAreaMm2] as [number, number]],
        ),
        dots: true,
      },
    ],
    limits: [
      { label: `min ${schedule.limits.drawDownMin}`, value: schedule.limits.drawDownMin },
      { label: `max ${schedule.limits.drawDownMax}`, value: schedule.limits.drawDownMax },
    ],
  });
  plots.push({
    title: 'puller speed',
    unit: 'm/min',
    series: [
      ...simulated(
        simulation?.pullerFollowsArea ? 'puller (follows the area)' : 'puller (runs at line speed)',
        simulation?.pullerSpeedMPerS.map((v) => v * 60),
      ),
      {
        label: 'for target draw-down',
        points: checks.map((c, i) => [x[i]!, c.process.pullerSpeedForTargetMPerS * 60]),
        dots: true,
      },
    ],
    limits: [{ label: 'nominal line speed', value: schedule.process.lineSpeedMPerS * 60 }],
  });
  const marks = findingMarks(plan, x);
  return { fromM, toM, plots, marks };
}

/** Curves of the preview are drawn with at most this many points. */
const CURVE_POINTS = 400;

/** Every k-th point of a long curve (and its last one), so the preview stays small. */
function thin(points: readonly (readonly [number, number])[]): (readonly [number, number])[] {
  const stride = Math.max(1, Math.ceil(points.length / CURVE_POINTS));
  const out = points.filter((_, k) => k % stride === 0);
  if (out[out.length - 1] !== points[points.length - 1]) out.push(points[points.length - 1]!);
  return out;
}

function findingMarks(plan: Plan, x: readonly number[]): PreviewPlots['marks'] {
  return plan.findings.flatMap((f) => {
    const at = f.positionM ?? (f.station !== undefined ? x[f.station] : undefined);
    if (at === undefined || f.severity === 'info') return [];
    return [{ positionM: at, toPositionM: f.toPositionM ?? null, code: f.code, severity: f.severity }];
  });
}
