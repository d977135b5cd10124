// @ts-check
/**
 * What the page plots against line position: one chart per quantity with its unit, the limits it is held to, and the
 * findings marked where they occur. Pure: no DOM; unit-tested in tests/web/charts.test.ts.
 */
import { valueAt } from './motion-model.js';

/** @typedef {import('./motion-model.js').MotionModel} MotionModel */
/** @typedef {import('./motion-model.js').Curve} Curve */

/**
 * @typedef {object} Finding  a finding as the plan reports it
 * @property {string} code
 * @property {'info' | 'warning' | 'error'} severity
 * @property {number} [station]
 * @property {number} [position_m]
 * @property {number} [to_position_m]  end of the line-position range it holds over, when it holds over one
 * @property {number} [value]
 * @property {number} [limit]
 * @property {readonly [number, number]} [at_mm]  where in the die-body frame, mm
 * @property {string} message
 */

/** @typedef {{ label: string, value: number, side: 'min' | 'max' }} Limit */
/**
 * @typedef {{ x: number, y: number, severity: Finding['severity'], code: string, finding: number, to?: number }} Marker
 *   `to`: end of the range the finding holds over (drawn as a band from `x`)
 */

/**
 * @typedef {object} ChartSpec
 * @property {string} key
 * @property {string} title
 * @property {string} unit  as printed on the axis
 * @property {number[]} x  line positions, m
 * @property {{ label: string, values: (number | null)[] }[]} lines
 * @property {Limit[]} limits
 * @property {Marker[]} markers
 * @property {boolean} atStations  values known at the stations only (drawn as points joined by straight lines)
 */

/** The process charts: key in the motion model's series, title and unit. */
const PROCESS_CHARTS = [
  { key: 'area_mm2', title: 'Orifice area', unit: 'mm²', label: 'area' },
  { key: 'draw_down_ratio', title: 'Draw-down (orifice area / product area)', unit: '–', label: 'draw-down' },
  { key: 'puller_speed_m_per_min', title: 'Puller speed', unit: 'm/min', label: 'puller speed' },
  { key: 'die_pressure_ratio', title: 'Die pressure ratio', unit: '–', label: 'pressure ratio' },
];

/**
 * Which chart a finding belongs on, by code; codes not listed go on the orifice-area chart (they concern the orifice
 * or the mechanism at that station).
 */
export const CHART_OF_CODE = Object.freeze({
  DRAW_DOWN_HIGH: 'draw_down_ratio',
  DRAW_DOWN_LOW: 'draw_down_ratio',
  MOTION_DRAW_DOWN_HIGH: 'draw_down_ratio',
  MOTION_DRAW_DOWN_LOW: 'draw_down_ratio',
  PRESSURE_SWING: 'die_pressure_ratio',
  MOTION_PRESSURE_RISE: 'die_pressure_ratio',
  MOTION_TRANSMISSION_ANGLE: 'actuators',
  HIGH_LAND_PRESSURE: 'die_pressure_ratio',
  LAND_PRESSURE_OUT_OF_RANGE: 'die_pressure_ratio',
  ACTUATOR_LIMIT: 'actuators',
  ACTUATOR_REVERSES: 'actuators',
  TRANSMISSION_ANGLE_MARGINAL: 'actuators',
  TRANSMISSION_ANGLE_AT_JOINT: 'actuators',
  MECHANISM_DEFECT: 'actuators',
});

/**
 * Findings at one station whose `value` is in the unit of their chart (the marker sits at the value itself); a finding
 * over a range gives its worst value, not the one where the range starts, so it sits on the curve.
 */
const VALUE_ON_CHART = new Set(['DRAW_DOWN_HIGH', 'DRAW_DOWN_LOW']);

/** Limits a finding states, by code: the chart and the side of the limit. */
const LIMIT_OF_CODE = Object.freeze({
  DRAW_DOWN_HIGH: { chart: 'draw_down_ratio', side: /** @type {const} */ ('max'), label: 'highest draw-down' },
  DRAW_DOWN_LOW: { chart: 'draw_down_ratio', side: /** @type {const} */ ('min'), label: 'lowest draw-down' },
  MOTION_DRAW_DOWN_HIGH: { chart: 'draw_down_ratio', side: /** @type {const} */ ('max'), label: 'highest draw-down' },
  MOTION_DRAW_DOWN_LOW: { chart: 'draw_down_ratio', side: /** @type {const} */ ('min'), label: 'lowest draw-down' },
  PRESSURE_SWING: { chart: 'die_pressure_ratio', side: /** @type {const} */ ('max'), label: 'pressure swing limit' },
  MOTION_PRESSURE_RISE: {
    chart: 'die_pressure_ratio',
    side: /** @type {const} */ ('max'),
    label: 'pressure rise limit',
  },
});

/**
 * @typedef {Record<string, { min?: number, max?: number }>} LimitsByChart  limits given outright, by chart key
 */

/**
 * The charts of a plan: actuators (one chart per unit), then orifice area, draw-down, puller speed and die-pressure
 * ratio where the model has them. Limits come from `limits` and from the findings that state one; findings with a
 * line position (or a station) are marked on their chart.
 * @param {MotionModel} model
 * @param {readonly Finding[]} findings
 * @param {LimitsByChart} [limits]
 * @returns {ChartSpec[]}
 */
export function buildCharts(model, findings, limits = {}) {
  /** @type {ChartSpec[]} */
  const charts = [];
  for (const unit of ['deg', 'mm']) {
    const acts = model.actuators.filter((a) => a.unit === unit);
    const base = acts[0];
    if (!base || base.curve.positions.length === 0) continue;
    const x = [...base.curve.positions];
    charts.push({
      key: `actuators_${unit}`,
      title: unit === 'deg' ? 'Actuator angle' : 'Actuator stroke',
      unit: unit === 'deg' ? '°' : 'mm',
      x,
      lines: acts.map((a) => ({
        label: a.id,
        values: a.curve.positions === base.curve.positions ? [...a.curve.values] : x.map((p) => valueAt(a.curve, p)),
      })),
      limits: [],
      markers: [],
      atStations: x.length <= model.stationPositions.length,
    });
  }
  for (const spec of PROCESS_CHARTS) {
    const curve = model.series[spec.key];
    if (!curve || curve.positions.length === 0) continue;
    charts.push({
      key: spec.key,
      title: spec.title,
      unit: spec.unit,
      x: [...curve.positions],
      lines: [{ label: spec.label, values: [...curve.values] }],
      limits: [],
      markers: [],
      atStations: curve.atStations,
    });
  }
  for (const chart of charts) chart.limits = limitsFor(chart.key, findings, limits[chart.key]);
  const stationPositions = model.stationPositions;
  findings.forEach((finding, index) => {
    const marker = findingMarker(finding, index, charts, stationPositions);
    if (marker) charts.find((c) => c.key === marker.chart)?.markers.push(marker.marker);
  });
  return charts;
}

/**
 * The limits drawn on one chart: those given outright and those findings state, each once.
 * @param {string} key
 * @param {readonly Finding[]} findings
 * @param {{ min?: number, max?: number } | undefined} given
 * @returns {Limit[]}
 */
export function limitsFor(key, findings, given) {
  /** @type {Limit[]} */
  const out = [];
  const add = (/** @type {Limit} */ limit) => {
    if (!Number.isFinite(limit.value)) return;
    if (
      out.some((l) => l.side === limit.side && Math.abs(l.value - limit.value) <= 1e-9 * Math.max(1, Math.abs(l.value)))
    )
      return;
    out.push(limit);
  };
  if (given?.min !== undefined) add({ label: 'lowest allowed', value: given.min, side: 'min' });
  if (given?.max !== undefined) add({ label: 'highest allowed', value: given.max, side: 'max' });
  for (const f of findings) {
    const rule = LIMIT_OF_CODE[/** @type {keyof typeof LIMIT_OF_CODE} */ (f.code)];
    if (rule && rule.chart === key && f.limit !== undefined)
      add({ label: rule.label, value: f.limit, side: rule.side });
  }
  return out;
}

/**
 * Line position a finding refers to, m: its `position_m`, else its station's; null when it concerns the whole plan.
 * @param {Finding} finding
 * @param {readonly number[]} stationPositions
 */
export function findingPosition(finding, stationPositions) {
  if (finding.position_m !== undefined && Number.isFinite(finding.position_m)) return finding.position_m;
  if (finding.station !== undefined) return stationPositions[finding.station] ?? null;
  return null;
}

/**
 * Where a finding is marked: on its chart (see CHART_OF_CODE; the first chart when that one is not drawn), at its line
 * position, at its own value when that is in the chart's unit, else on the chart's first line there.
 * @param {Finding} finding
 * @param {number} index  the finding's index in the plan's list
 * @param {readonly ChartSpec[]} charts
 * @param {readonly number[]} stationPositions
 * @returns {{ chart: string, marker: Marker } | null}
 */
export function findingMarker(finding, index, charts, stationPositions) {
  const x = findingPosition(finding, stationPositions);
  if (x === null) return null;
  const wanted = CHART_OF_CODE[/** @type {keyof typeof CHART_OF_CODE} */ (finding.code)] ?? 'area_mm2';
  const chart =
    charts.find((c) => c.key === wanted || (wanted === 'actuators' && c.key.startsWith('actuators_'))) ??
    charts.find((c) => c.key === 'area_mm2') ??
    charts[0];
  if (!chart) return null;
  const first = chart.lines[0];
  const onLine = first ? valueAt({ positions: chart.x, values: first.values }, x) : Number.NaN;
  const y = VALUE_ON_CHART.has(finding.code) && finding.value !== undefined ? finding.value : onLine;
  /** @type {Marker} */
  const marker = { x, y, severity: finding.severity, code: finding.code, finding: index };
  const to = finding.to_position_m;
  if (to !== undefined && Number.isFinite(to) && to > x) marker.to = to;
  return { chart: chart.key, marker };
}

/**
 * The findings that have a place in the die (`at_mm`) and hold at line position `x`: over their range
 * (`position_m` to `to_position_m`), or within `toleranceM` of their one line position.
 * @param {readonly Finding[]} findings
 * @param {readonly number[]} stationPositions
 * @param {number} x  line position, m
 * @param {number} toleranceM
 * @returns {{ finding: number, at: readonly [number, number], severity: Finding['severity'], code: string }[]}
 */
export function findingsAt(findings, stationPositions, x, toleranceM) {
  const out = [];
  for (const [index, f] of findings.entries()) {
    if (!f.at_mm) continue;
    const from = findingPosition(f, stationPositions);
    if (from === null) continue;
    const to = f.to_position_m !== undefined && f.to_position_m > from ? f.to_position_m : from;
    if (x >= from - toleranceM && x <= to + toleranceM)
      out.push({ finding: index, at: f.at_mm, severity: f.severity, code: f.code });
  }
  return out;
}
