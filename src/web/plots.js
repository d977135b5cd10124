import uPlot from '/web/vendor/uplot/uPlot.esm.js';
import { h } from './dom.js';
import { fixed } from './lib/describe.js';

/** @typedef {import('./lib/charts.js').ChartSpec} ChartSpec */

const LINE_COLOURS = ['#1f4e8c', '#b3541e', '#2e7d32', '#6a1b9a'];
const SEVERITY_COLOURS = { error: '#b00020', warning: '#8a5a00', info: '#245a8a' };
const LIMIT_COLOUR = '#b00020';
const POSITION_COLOUR = '#222222';

/**
 * One uPlot chart per spec against line position, with its limits as dashed lines, its findings as triangles (filled
 * by severity) and the chosen line position as a vertical line. Clicking a chart picks that line position. Under each
 * chart a short text says its range, limits and marked findings, for readers who cannot see the canvas.
 * @param {HTMLElement} container
 * @param {ChartSpec[]} charts
 * @param {{ onPick: (x: number) => void, describeFinding: (index: number) => string }} hooks
 */
export function createCharts(container, charts, hooks) {
  let position = charts[0]?.x[0] ?? 0;
  /** @type {uPlot[]} */
  const plots = [];
  for (const chart of charts) {
    const plotBox = h('div', { class: 'plot' });
    const figure = h(
      'figure',
      { class: 'chart', 'data-chart': chart.key, 'data-markers': String(chart.markers.length) },
      h('figcaption', null, h('strong', null, chart.title), ` (${chart.unit}) against line position (m)`),
      plotBox,
      h('p', { class: 'chart-summary note' }, summary(chart)),
      chart.markers.length
        ? h(
            'ul',
            { class: 'markers' },
            chart.markers.map((m) =>
              h(
                'li',
                { 'data-finding': String(m.finding) },
                h('span', { class: `badge severity-${m.severity}` }, m.severity),
                ` ${m.code} ${m.to === undefined ? `at ${fixed(m.x, 3)} m` : `from ${fixed(m.x, 3)} to ${fixed(m.to, 3)} m (shaded)`}: `,
                h('button', { type: 'button', class: 'link-button', onclick: () => hooks.onPick(m.x) }, 'show'),
                ' ',
                h('span', { class: 'visually-hidden' }, hooks.describeFinding(m.finding)),
              ),
            ),
          )
        : null,
    );
    container.append(figure);
    const limitsMin = Math.min(...chart.limits.map((l) => l.value));
    const limitsMax = Math.max(...chart.limits.map((l) => l.value));
    const markY = chart.markers.map((m) => m.y).filter(Number.isFinite);
    const plot = new uPlot(
      {
        width: Math.max(280, plotBox.clientWidth || container.clientWidth || 600),
        height: 200,
        scales: {
          x: { time: false },
          y: {
            range: (_u, lo, hi) => {
              const a = Math.min(lo, limitsMin, ...markY);
              const b = Math.max(hi, limitsMax, ...markY);
              const span = b - a || Math.abs(b) || 1;
              return [a - 0.08 * span, b + 0.08 * span];
            },
          },
        },
        axes: [
          { label: 'line position (m)', stroke: '#333', grid: { stroke: '#e3e3e3' } },
          { label: chart.unit === '–' ? 'ratio' : chart.unit, stroke: '#333', grid: { stroke: '#e3e3e3' }, size: 60 },
        ],
        series: [
          { label: 'line position (m)', value: (_u, v) => (v == null ? '–' : `${fixed(v, 3)} m`) },
          ...chart.lines.map((line, i) => ({
            label: line.label,
            stroke: LINE_COLOURS[i % LINE_COLOURS.length],
            width: 2,
            points: { show: chart.atStations, size: 7 },
            value: (_u, v) => (v == null ? '–' : `${fixed(v, 3)} ${chart.unit}`),
          })),
        ],
        hooks: { draw: [(u) => drawOverlay(u, chart, position)] },
      },
      [chart.x, ...chart.lines.map((l) => l.values)],
      plotBox,
    );
    plot.over.addEventListener('click', () => {
      const left = plot.cursor.left;
      if (left !== undefined && left >= 0) hooks.onPick(plot.posToVal(left, 'x'));
    });
    plots.push(plot);
    new ResizeObserver(() => {
      const w = plotBox.clientWidth;
      if (w > 0 && Math.abs(w - plot.width) > 2) plot.setSize({ width: w, height: 200 });
    }).observe(plotBox);
  }
  return {
    /** @param {number} x  the chosen line position, m */
    setPosition(x) {
      position = x;
      for (const plot of plots) plot.redraw(false, false);
    },
  };
}

/**
 * @param {ChartSpec} chart
 */
function summary(chart) {
  const parts = [];
  for (const line of chart.lines) {
    const v = line.values.filter(Number.isFinite);
    if (v.length)
      parts.push(`${line.label} from ${fixed(Math.min(...v), 3)} to ${fixed(Math.max(...v), 3)} ${chart.unit}`);
  }
  if (chart.atStations) parts.push('known at the stations only');
  for (const l of chart.limits) parts.push(`${l.label} ${fixed(l.value, 3)} ${chart.unit} (dashed)`);
  parts.push(chart.markers.length ? `${chart.markers.length} findings marked (triangles)` : 'no findings marked');
  return `${parts.join('; ')}.`;
}

/**
 * Limits, findings and the chosen position drawn over the plot.
 * @param {uPlot} u
 * @param {ChartSpec} chart
 * @param {number} position
 */
function drawOverlay(u, chart, position) {
  const { ctx, bbox } = u;
  const px = uPlot.pxRatio;
  ctx.save();
  ctx.beginPath();
  ctx.rect(bbox.left, bbox.top, bbox.width, bbox.height);
  ctx.clip();
  ctx.font = `${12 * px}px system-ui, sans-serif`;
  for (const limit of chart.limits) {
    const y = u.valToPos(limit.value, 'y', true);
    ctx.strokeStyle = LIMIT_COLOUR;
    ctx.lineWidth = 1.5 * px;
    ctx.setLineDash([6 * px, 4 * px]);
    ctx.beginPath();
    ctx.moveTo(bbox.left, y);
    ctx.lineTo(bbox.left + bbox.width, y);
    ctx.stroke();
    ctx.setLineDash([]);
    ctx.fillStyle = LIMIT_COLOUR;
    ctx.textAlign = 'right';
    ctx.fillText(
      `${limit.label} ${fixed(limit.value, 3)}`,
      bbox.left + bbox.width - 4 * px,
      y + (limit.side === 'max' ? -4 : 14) * px,
    );
  }
  const x = u.valToPos(position, 'x', true);
  ctx.strokeStyle = POSITION_COLOUR;
  ctx.lineWidth = 1.5 * px;
  ctx.beginPath();
  ctx.moveTo(x, bbox.top);
  ctx.lineTo(x, bbox.top + bbox.height);
  ctx.stroke();
  for (const m of chart.markers) {
    if (m.to !== undefined) {
      const x0 = u.valToPos(m.x, 'x', true);
      const x1 = u.valToPos(m.to, 'x', true);
      ctx.fillStyle = `${SEVERITY_COLOURS[m.severity] ?? '#333333'}26`;
      ctx.fillRect(x0, bbox.top, Math.max(1, x1 - x0), bbox.height);
    }
    if (!Number.isFinite(m.y)) continue;
    const mx = u.valToPos(m.x, 'x', true);
    const my = u.valToPos(m.y, 'y', true);
    const r = 7 * px;
    ctx.fillStyle = SEVERITY_COLOURS[m.severity] ?? '#333333';
    ctx.strokeStyle = '#ffffff';
    ctx.lineWidth = 1.5 * px;
    ctx.beginPath();
    ctx.moveTo(mx, my - r);
    ctx.lineTo(mx + r, my + r * 0.8);
    ctx.lineTo(mx - r, my + r * 0.8);
    ctx.closePath();
    ctx.fill();
    ctx.stroke();
  }
  ctx.restore();
}
