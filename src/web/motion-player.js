import { fill, h } from './dom.js';
import { createDrawing } from './drawing.js';
import { fixed } from './lib/describe.js';
import { nearestStation, poseAt, valueAt } from './lib/motion-model.js';
import { createCharts } from './plots.js';

/** Playback speeds: multiples of the planned line speed (or of 0.05 m of line a second without a time base). */
const SPEEDS = [1, 2, 5, 10, 20, 50];
const DEFAULT_SPEED = 10;
/** Line metres a second at 1× when the plan gives no time base. */
const FALLBACK_M_PER_S = 0.05;

/**
 * The drawing with its controls: slider, position field, station steps, play and speed.
 * @param {HTMLElement} section
 * @param {import('./lib/motion-model.js').MotionModel} model
 * @param {any} plan
 * @param {import('./lib/charts.js').ChartSpec[]} charts
 * @param {HTMLElement} chartsContainer  where the charts go
 */
export function setUpDrawing(section, model, plan, charts, chartsContainer) {
  const first = model.positions[0] ?? 0;
  const last = model.positions[model.positions.length - 1] ?? first;
  const span = Math.max(last - first, 1e-6);
  const step = niceStep(span / 300);
  const drawing = createDrawing(model, plan, step);
  const slider = /** @type {HTMLInputElement} */ (
    h('input', {
      type: 'range',
      id: 'position',
      min: String(first),
      max: String(last),
      step: String(step),
      value: String(first),
      list: 'station-ticks',
    })
  );
  const number = /** @type {HTMLInputElement} */ (
    h('input', {
      type: 'number',
      id: 'position-number',
      min: String(first),
      max: String(last),
      step: '0.001',
      value: String(first),
    })
  );
  const ticks = h(
    'datalist',
    { id: 'station-ticks' },
    model.stationPositions.map((p) => h('option', { value: String(p) })),
  );
  const play = /** @type {HTMLButtonElement} */ (
    h('button', { type: 'button', id: 'play', 'aria-pressed': 'false' }, 'Play')
  );
  const speed = /** @type {HTMLSelectElement} */ (
    h(
      'select',
      { id: 'speed' },
      SPEEDS.map((v) =>
        h(
          'option',
          { value: String(v), selected: v === DEFAULT_SPEED },
          model.clock ? `${v}× line speed` : `${fixed(v * FALLBACK_M_PER_S, 2)} m of line per second`,
        ),
      ),
    )
  );
  const prev = h('button', { type: 'button', id: 'prev-station' }, '◀ Previous station');
  const next = h('button', { type: 'button', id: 'next-station' }, 'Next station ▶');
  const readout = h('p', { id: 'readout', class: 'readout', 'aria-live': 'off' });
  const jointRows = h('tbody');
  const jointTable = h(
    'details',
    { class: 'joints' },
    h('summary', null, 'Joint positions at this line position (mm, die-body frame)'),
    h(
      'table',
      null,
      h(
        'thead',
        null,
        h(
          'tr',
          null,
          h('th', { scope: 'col' }, 'joint'),
          h('th', { scope: 'col' }, 'x (mm)'),
          h('th', { scope: 'col' }, 'y (mm)'),
        ),
      ),
      jointRows,
    ),
  );
  const source =
    model.source === 'motion'
      ? `Drawn from the plan's sampled motion (${model.positions.length} steps).`
      : 'Drawn from the plan’s stations: between stations the joints move in proportion to the actuator’s travel (plates drawn as bars round their pivot lines).';

  section.append(
    h('h2', { id: 'drawing-title-h' }, 'Die drawing'),
    h('p', { class: 'note' }, source, ' Die-body frame, millimetres, y up.'),
    drawing.element,
    h(
      'div',
      { class: 'controls', role: 'group', 'aria-label': 'line position and playback' },
      h('label', { for: 'position' }, 'Line position'),
      slider,
      ticks,
      h('label', { for: 'position-number', class: 'visually-hidden' }, 'Line position in metres'),
      h('span', { class: 'number-field' }, number, ' m'),
      prev,
      next,
      play,
      h('label', { for: 'speed' }, 'Speed'),
      speed,
      h(
        'span',
        { class: 'note' },
        'Keys on the slider: arrows step, Page Up/Down jump, Home/End, Space plays and pauses.',
      ),
    ),
    readout,
    jointTable,
  );

  let position = first;
  const plots = createCharts(chartsContainer, charts, {
    onPick: (x) => {
      stop();
      show(x);
    },
    describeFinding: (i) => plan.findings[i]?.message ?? '',
  });

  /** @param {number} x */
  const show = (x) => {
    position = Math.min(last, Math.max(first, x));
    const pose = poseAt(model, position);
    drawing.update(pose);
    slider.value = String(position);
    const near = nearestStation(model, position);
    const atStation = Math.abs((model.stationPositions[near] ?? Number.NaN) - position) < step / 2;
    slider.setAttribute('aria-valuetext', `${fixed(position, 3)} m${atStation ? `, station ${near}` : ''}`);
    if (document.activeElement !== number) number.value = fixed(position, 3).replace('−', '-');
    const acts = pose.actuators.map((a) => `${a.id} ${fixed(a.value, 2)} ${a.unit === 'deg' ? '°' : 'mm'}`).join(', ');
    const time = model.clock ? `, ${fixed(valueAt(model.clock, position), 2)} s into the motion` : '';
    readout.textContent = `${fixed(position, 3)} m of line${atStation ? ` (station ${near})` : ''}${time}${acts ? `: ${acts}` : ''}.`;
    readout.setAttribute('data-position', String(position));
    fill(
      jointRows,
      Object.entries(pose.joints).map(([jid, p]) =>
        h('tr', null, h('th', { scope: 'row' }, jid), h('td', null, fixed(p[0], 3)), h('td', null, fixed(p[1], 3))),
      ),
    );
    plots.setPosition(position);
  };

  /** @type {number | null} */
  let frame = null;
  let lastTick = 0;
  const stop = () => {
    if (frame !== null) cancelAnimationFrame(frame);
    frame = null;
    play.textContent = 'Play';
    play.setAttribute('aria-pressed', 'false');
  };
  /** @param {number} now */
  const tick = (now) => {
    const dt = Math.min(0.1, (now - lastTick) / 1000);
    lastTick = now;
    const factor = Number(speed.value);
    let x;
    if (model.clock) {
      const t = valueAt(model.clock, position) + dt * factor;
      x = valueAt({ positions: model.clock.values, values: model.clock.positions }, t);
      const tEnd = model.clock.values[model.clock.values.length - 1] ?? 0;
      if (t >= tEnd) x = first;
    } else {
      x = position + dt * factor * FALLBACK_M_PER_S;
      if (x >= last) x = first;
    }
    show(x);
    frame = requestAnimationFrame(tick);
  };
  slider.addEventListener('keydown', (event) => {
    // Space or K on the slider plays and pauses, as the play button does
    if (event.key === ' ' || event.key === 'k' || event.key === 'K') {
      event.preventDefault();
      play.click();
    }
  });
  play.addEventListener('click', () => {
    if (frame !== null) return stop();
    play.textContent = 'Pause';
    play.setAttribute('aria-pressed', 'true');
    lastTick = performance.now();
    frame = requestAnimationFrame(tick);
  });
  slider.addEventListener('input', () => {
    stop();
    // the slider moves in steps; a station within half a step is shown exactly
    const x = Number(slider.value);
    const station = model.stationPositions.find((p) => Math.abs(p - x) <= step / 2);
    show(station ?? x);
  });
  number.addEventListener('change', () => {
    const v = Number(number.value);
    if (Number.isFinite(v)) {
      stop();
      show(v);
    }
  });
  const toStation = (/** @type {1 | -1} */ dir) => {
    stop();
    const stops = [...model.stationPositions, ...(last > (model.stationPositions.at(-1) ?? last) ? [last] : [])];
    const target =
      dir > 0 ? stops.find((p) => p > position + 1e-9) : [...stops].reverse().find((p) => p < position - 1e-9);
    show(target ?? (dir > 0 ? first : last));
  };
  prev.addEventListener('click', () => toStation(-1));
  next.addEventListener('click', () => toStation(1));
  window.addEventListener('plan:show', (event) => {
    stop();
    show(/** @type {CustomEvent<number>} */ (event).detail);
    section.scrollIntoView({ behavior: 'smooth', block: 'start' });
  });
  show(first);
}

/** @param {number} approx */
function niceStep(approx) {
  const p = 10 ** Math.floor(Math.log10(Math.max(approx, 1e-9)));
  const m = approx / p;
  // a hair below 5 or 2 (0.005 / 0.001 = 4.999…) counts as 5 or 2
  return (m >= 5 - 1e-9 ? 5 : m >= 2 - 1e-9 ? 2 : 1) * p;
}
