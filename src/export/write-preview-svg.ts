import type { Point, Region, Ring } from '../geometry/index.js';
import type { DrawingModel } from './drawing-model.js';
import { boxOf, cautionLines } from './drawing-notes.js';
import { wrapText } from './dxf-builder.js';
import { formatNumber } from './format-number.js';
import type { LinePlot, PreviewPlots } from './preview-plots.js';

/** Width of the preview, px. */
const WIDTH = 1000;
const MARGIN = 30;
const PANEL_COLUMNS = 4;
const PANEL_HEIGHT = 260;
const PLOT_HEIGHT = 190;
const PLOT_LEFT = 80;
const FONT = 12;
/** Finding labels closer than this along the line are stacked, px. */
const MARK_LABEL_PX = 130;

/** Colours of the station panels and plot series (readable on white, distinct for colour-blind readers). */
const COLOURS = Object.freeze({
  target: '#1b7837',
  achieved: '#c51b7d',
  part: '#2166ac',
  limit: '#b35806',
  mark: '#d6604d',
  series: ['#2166ac', '#c51b7d', '#1b7837', '#762a83'],
});

/**
 * The plan at a glance as one SVG document, written as text (no browser): a panel per station with the target orifice,
 * the achieved orifice and every part in place (one path each; pin holes as circles); then plots against line
 * position (actuator values, orifice area, draw-down with its limits, puller speed with the nominal line speed), the
 * findings that have a place along the line marked on every plot; then the cautions. Geometry as planned (the die at
 * working temperature). The same plan gives the same bytes.
 */
export function writePreviewSvg(model: DrawingModel, plots: PreviewPlots): string {
  const out: string[] = [];
  let y = MARGIN;
  const text = (x: number, yy: number, value: string, attrs = '') =>
    out.push(`<text x="${n(x)}" y="${n(yy)}"${attrs}>${escapeXml(value)}</text>`);

  text(MARGIN, y, `${model.scheduleName}: die motion plan preview`, ' font-size="18" font-weight="bold"');
  y += 20;
  text(
    MARGIN,
    y,
    `Geometry as planned, the die at ${Math.round(model.dieTemperatureC)} °C (hot); millimetres, die-body frame, y up. Target orifice green, achieved red dashed, parts blue.`,
  );
  y += 14;

  // station panels: one scale for all, fitted to the opening and every part at every station
  const rings: Ring[] = [model.opening.outer];
  for (const s of model.stations) for (const p of s.parts) rings.push(p.outline);
  const box = boxOf(rings);
  const panelWidth = (WIDTH - 2 * MARGIN) / PANEL_COLUMNS;
  const inner = { w: panelWidth - 16, h: PANEL_HEIGHT - 40 };
  const scale = Math.min(inner.w / (box.maxX - box.minX), inner.h / (box.maxY - box.minY));
  model.stations.forEach((s, i) => {
    const col = i % PANEL_COLUMNS;
    const row = Math.floor(i / PANEL_COLUMNS);
    const left = MARGIN + col * panelWidth;
    const top = y + row * PANEL_HEIGHT;
    // centred in the panel
    const padX = (inner.w - (box.maxX - box.minX) * scale) / 2;
    const padY = (inner.h - (box.maxY - box.minY) * scale) / 2;
    const map = (p: Point): Point => [
      left + 8 + padX + (p[0] - box.minX) * scale,
      top + 30 + inner.h - padY - (p[1] - box.minY) * scale,
    ];
    out.push(
      `<g class="station" data-station="${i + 1}"><rect x="${n(left + 2)}" y="${n(top + 2)}" width="${n(panelWidth - 4)}" height="${n(PANEL_HEIGHT - 4)}" fill="none" stroke="#bbbbbb"/>`,
    );
    text(
      left + 8,
      top + 18,
      `station ${i + 1}: ${formatNumber(s.positionM, 3)} m, deviation ${formatNumber(s.deviationMm, 3)} mm`,
    );
    out.push(
      `<path class="die-opening" d="${pathData([model.opening.outer], map)}" fill="#f4f4f4" stroke="#999999" stroke-width="0.8"/>`,
    );
    for (const part of s.parts) {
      out.push(
        `<path class="part" data-part="${part.id}" d="${pathData([part.outline], map)}" fill="${COLOURS.part}" fill-opacity="0.15" stroke="${COLOURS.part}" stroke-width="1"/>`,
      );
      for (const h of part.holes) {
        const c = map(h.centre);
        out.push(
          `<circle class="pin-hole" cx="${n(c[0])}" cy="${n(c[1])}" r="${n((h.diameterMm / 2) * scale)}" fill="#ffffff" stroke="${COLOURS.part}" stroke-width="0.8"/>`,
        );
      }
    }
    out.push(
      `<path class="target-orifice" data-station="${i + 1}" d="${regionPath(s.target, map)}" fill="${COLOURS.target}" fill-opacity="0.25" fill-rule="evenodd" stroke="${COLOURS.target}" stroke-width="1.5"/>`,
    );
    out.push(
      `<path class="achieved-orifice" data-station="${i + 1}" d="${s.achieved.outer.length >= 3 ? regionPath(s.achieved, map) : 'M0 0'}" fill="none" stroke="${COLOURS.achieved}" stroke-width="1.5" stroke-dasharray="4 3"/>`,
    );
    out.push('</g>');
  });
  y += Math.ceil(model.stations.length / PANEL_COLUMNS) * PANEL_HEIGHT + 20;

  plots.plots.forEach((plot, k) => {
    y = drawPlot(out, plot, plots, y, k === 0);
  });
  if (plots.marks.length > 0) {
    y += 4;
    text(
      MARGIN,
      y,
      'Dotted red lines: findings with a place along the line (codes on the first plot; see the findings of the plan).',
    );
    y += 10;
  }

  const cautions = cautionLines(model).flatMap((line) => wrapText(line, 150));
  for (const line of cautions) {
    y += 15;
    text(MARGIN, y, line, line.startsWith('SAFETY') ? ' font-weight="bold"' : '');
  }
  y += MARGIN;
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${WIDTH}" height="${n(y)}" viewBox="0 0 ${WIDTH} ${n(y)}" font-family="sans-serif" font-size="${FONT}">`,
    `<rect width="${WIDTH}" height="${n(y)}" fill="#ffffff"/>`,
    ...out,
    '</svg>',
    '',
  ].join('\n');
}

/** One plot with axes, ticks, units, limits, series and finding marks; returns the y below it. */
function drawPlot(out: string[], plot: LinePlot, all: PreviewPlots, top: number, labelMarks: boolean): number {
  const left = MARGIN + PLOT_LEFT;
  const right = WIDTH - MARGIN - 150;
  const plotTop = top + 24;
  const bottom = top + PLOT_HEIGHT - 30;
  const values = [...plot.series.flatMap((s) => s.points.map((p) => p[1])), ...plot.limits.map((l) => l.value)];
  let lo = Math.min(...values);
  let hi = Math.max(...values);
  if (!(hi > lo)) {
    const pad = Math.max(Math.abs(lo) * 0.05, 1);
    lo -= pad;
    hi += pad;
  }
  const ticksY = niceTicks(lo, hi, 5);
  lo = Math.min(lo, ticksY[0]!);
  hi = Math.max(hi, ticksY[ticksY.length - 1]!);
  const span = all.toM - all.fromM || 1;
  const px = (x: number) => left + ((x - all.fromM) / span) * (right - left);
  const py = (v: number) => bottom - ((v - lo) / (hi - lo)) * (bottom - plotTop);
  out.push(`<g class="plot" data-title="${escapeXml(plot.title)}">`);
  out.push(
    `<text x="${n(MARGIN)}" y="${n(top + 14)}" font-weight="bold">${escapeXml(`${plot.title} (${plot.unit})`)}</text>`,
  );
  out.push(
    `<rect x="${n(left)}" y="${n(plotTop)}" width="${n(right - left)}" height="${n(bottom - plotTop)}" fill="none" stroke="#444444"/>`,
  );
  for (const t of ticksY) {
    out.push(`<line x1="${n(left - 4)}" y1="${n(py(t))}" x2="${n(right)}" y2="${n(py(t))}" stroke="#e0e0e0"/>`);
    out.push(`<text x="${n(left - 6)}" y="${n(py(t) + 4)}" text-anchor="end">${tickText(t, ticksY)}</text>`);
  }
  const ticksX = niceTicks(all.fromM, all.toM, 6).filter((t) => t >= all.fromM - 1e-9 && t <= all.toM + 1e-9);
  for (const t of ticksX) {
    out.push(`<line x1="${n(px(t))}" y1="${n(bottom)}" x2="${n(px(t))}" y2="${n(bottom + 4)}" stroke="#444444"/>`);
    out.push(`<text x="${n(px(t))}" y="${n(bottom + 16)}" text-anchor="middle">${tickText(t, ticksX)}</text>`);
  }
  out.push(`<text x="${n(right)}" y="${n(bottom + 28)}" text-anchor="end">line position (m)</text>`);
  for (const l of plot.limits) {
    out.push(
      `<line class="limit" x1="${n(left)}" y1="${n(py(l.value))}" x2="${n(right)}" y2="${n(py(l.value))}" stroke="${COLOURS.limit}" stroke-dasharray="6 4"/>`,
    );
    out.push(
      `<text x="${n(right - 4)}" y="${n(py(l.value) - 4)}" text-anchor="end" fill="${COLOURS.limit}">${escapeXml(l.label)}</text>`,
    );
  }
  plot.series.forEach((s, k) => {
    const colour = COLOURS.series[k % COLOURS.series.length]!;
    if (s.dots) {
      // the first series as rings, the others as dots, so equal values stay visible
      for (const [x, v] of s.points) {
        out.push(
          k === 0
            ? `<circle class="value" cx="${n(px(x))}" cy="${n(py(v))}" r="5" fill="none" stroke="${colour}" stroke-width="1.5"/>`
            : `<circle class="value" cx="${n(px(x))}" cy="${n(py(v))}" r="3" fill="${colour}"/>`,
        );
      }
    } else if (s.points.length > 1) {
      const d = s.points.map(([x, v], j) => `${j === 0 ? 'M' : 'L'}${n(px(x))} ${n(py(v))}`).join(' ');
      out.push(`<path class="series" d="${d}" fill="none" stroke="${colour}" stroke-width="1.5"/>`);
    }
    out.push(`<text x="${n(right + 6)}" y="${n(plotTop + 12 + 15 * k)}" fill="${colour}">${escapeXml(s.label)}</text>`);
  });
  // findings marked where they are along the line (a band over a range); codes at one place listed once, one under
  // the other, and places closer than a label's width stacked below each other
  const places = new Map<string, { x: number; to: number | null; codes: string[] }>();
  for (const m of all.marks) {
    if (m.positionM < all.fromM - 1e-9 || m.positionM > all.toM + 1e-9) continue;
    const to = m.toPositionM === null ? null : Math.min(m.toPositionM, all.toM);
    const key = `${formatNumber(m.positionM, 6)}|${to === null ? '' : formatNumber(to, 6)}`;
    const place = places.get(key) ?? { x: px(m.positionM), to: to === null ? null : px(to), codes: [] };
    if (!place.codes.includes(m.code)) place.codes.push(m.code);
    places.set(key, place);
  }
  let lastX = Number.NEGATIVE_INFINITY;
  let row = 0;
  for (const [key, place] of [...places.entries()].sort((a, b) => a[1].x - b[1].x)) {
    const where = key.replace('|', ' to ').replace(/ to $/, '');
    if (place.to !== null && place.to > place.x) {
      out.push(
        `<rect class="finding-range" x="${n(place.x)}" y="${n(plotTop)}" width="${n(place.to - place.x)}" height="${n(bottom - plotTop)}" fill="${COLOURS.mark}" fill-opacity="0.08"/>`,
      );
    }
    out.push(
      `<line class="finding" x1="${n(place.x)}" y1="${n(plotTop)}" x2="${n(place.x)}" y2="${n(bottom)}" stroke="${COLOURS.mark}" stroke-dasharray="2 3"><title>${escapeXml(`${place.codes.join(', ')} at ${where} m`)}</title></line>`,
    );
    if (!labelMarks) continue;
    row = place.x - lastX < MARK_LABEL_PX ? row : 0;
    lastX = place.x;
    for (const code of place.codes) {
      out.push(
        `<text x="${n(place.x + 3)}" y="${n(plotTop + 11 + 11 * row)}" fill="${COLOURS.mark}" font-size="10">${escapeXml(code)}</text>`,
      );
      row++;
    }
  }
  out.push('</g>');
  return top + PLOT_HEIGHT;
}

/** About `count` round tick values covering [lo, hi] (steps of 1, 2 or 5 times a power of ten). */
function niceTicks(lo: number, hi: number, count: number): number[] {
  const raw = (hi - lo) / Math.max(1, count - 1);
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? 10 * power;
  const first = Math.floor(lo / step + 1e-9) * step;
  const ticks: number[] = [];
  for (let t = first; t <= hi + step * 1e-9; t += step) ticks.push(Math.round(t / step) * step);
  if (ticks[ticks.length - 1]! < hi - step * 1e-9) ticks.push(ticks[ticks.length - 1]! + step);
  return ticks;
}

/** A tick label with as many decimals as the step needs. */
function tickText(t: number, ticks: readonly number[]): string {
  const step = ticks.length > 1 ? Math.abs(ticks[1]! - ticks[0]!) : 1;
  const decimals = Math.max(0, Math.min(6, -Math.floor(Math.log10(step) + 1e-9)));
  return formatNumber(t, decimals);
}

function pathData(rings: readonly Ring[], map: (p: Point) => Point): string {
  return rings
    .map((ring) => `${ring.map((p, j) => `${j === 0 ? 'M' : 'L'}${n(map(p)[0])} ${n(map(p)[1])}`).join(' ')} Z`)
    .join(' ');
}

function regionPath(region: Region, map: (p: Point) => Point): string {
  return pathData([region.outer, ...region.holes], map);
}

/** A pixel coordinate: 2 decimals. */
function n(x: number): string {
  return formatNumber(x, 2);
}

function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}
