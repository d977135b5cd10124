import {
  apiFetch,
  FINISHED,
  followPlan,
  jsonOf,
  PlanFetchError,
  progressText,
  sendTokenWithDownload,
  setUpTokenField,
} from './api.js';
import { fill, h, localTime, s } from './dom.js';
import { createDrawing, regionPath } from './drawing.js';
import { buildCharts, findingPosition } from './lib/charts.js';
import { brief, fixed } from './lib/describe.js';
import { boundsOf, regionArea } from './lib/geometry.js';
import { modelFromMotion, modelFromStations, nearestStation, poseAt, valueAt } from './lib/motion-model.js';
import { createCharts } from './plots.js';

/** The plan page: `/plans/{id}`. Waits for an unfinished plan, then shows it. */

const main = /** @type {HTMLElement} */ (document.getElementById('plan'));
const statusLine = /** @type {HTMLElement} */ (document.getElementById('plan-status'));
const id = decodeURIComponent(window.location.pathname.split('/').filter(Boolean)[1] ?? '');
const base = `/v1/plans/${encodeURIComponent(id)}`;

/** Playback speeds: multiples of the planned line speed (or of 0.05 m of line a second without a time base). */
const SPEEDS = [1, 2, 5, 10, 20, 50];
const DEFAULT_SPEED = 10;
/** Line metres a second at 1× when the plan gives no time base. */
const FALLBACK_M_PER_S = 0.05;

/** The downloads of a plan, with what each holds; drawings (DXF) take `?dimensions=cold|hot`. */
const DOWNLOADS = [
  ['setpoints.csv', 'actuator setpoints per time step (CSV)'],
  ['setpoints.json', 'the same with units, law and cautions (JSON)'],
  ['cam-table.csv', 'electronic cam: line position against actuator values and slopes (CSV)'],
  ['cam-table.json', 'the same with its metadata (JSON)'],
  ['puller-speed.csv', 'puller speed against line position (CSV)'],
  ['puller-speed.json', 'the same with units and cautions (JSON)'],
  ['plates.dxf', 'every part to cut on one sheet, with a parts list (DXF)'],
  ['die-body.dxf', 'die body: opening, pin holes, actuator mounts, swept area (DXF)'],
  ['stations.dxf', 'target and achieved orifice and the parts at every station (DXF)'],
  ['preview.svg', 'preview drawing with the stations and plots (SVG)'],
  ['motion.json', 'the sampled motion this page draws (JSON)'],
];

async function start() {
  setUpTokenField(() => window.location.reload());
  let plan;
  try {
    const response = await apiFetch(base);
    plan = await jsonOf(response);
    if (!response.ok) throw new PlanFetchError(response.status, plan);
    showCautions(plan.cautions ?? []);
    if (!FINISHED.has(plan.status)) {
      const title = document.getElementById('plan-title');
      if (title && plan.name) {
        fill(title, plan.name, ' ', h('span', { class: `badge status-${plan.status}` }, plan.status));
        document.title = `${plan.name} – plan review`;
      }
      statusLine.textContent = progressText(plan);
      const bar = h('progress', { max: '1', 'aria-label': 'plan progress' });
      statusLine.after(bar);
      plan = await followPlan(id, (p) => {
        statusLine.textContent = progressText(p);
        const badge = document.querySelector('#plan-title .badge');
        if (badge) {
          badge.textContent = p.status;
          badge.className = `badge status-${p.status}`;
        }
        if (typeof p?.progress?.fraction === 'number') bar.setAttribute('value', String(p.progress.fraction));
      });
      bar.remove();
    }
  } catch (error) {
    const status = error instanceof PlanFetchError ? error.status : 0;
    statusLine.textContent =
      status === 404
        ? `There is no plan ${id}.`
        : `The plan could not be read: ${error instanceof Error ? error.message : error}`;
    main.setAttribute('aria-busy', 'false');
    return;
  }
  await render(plan);
  main.setAttribute('aria-busy', 'false');
}

/**
 * The cautions, in the side panel and as the header's hazard line (both always on screen).
 * @param {{ code: string, hazard: string, message: string }[]} cautions
 */
function showCautions(cautions) {
  const list = /** @type {HTMLElement} */ (document.getElementById('caution-list'));
  fill(
    list,
    cautions.map((c) => h('li', { 'data-caution': c.code }, h('strong', null, capital(c.hazard)), ': ', c.message)),
  );
  const strip = document.getElementById('hazard-strip');
  if (strip && cautions.length) strip.textContent = `Safety: ${cautions.map((c) => c.hazard).join(' · ')}`;
}

/** @param {string} text */
function capital(text) {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/**
 * The model of the plan's motion: `motion.json` when the service has it, else the stations (with the setpoints for
 * the actuators and the time base).
 * @param {any} plan
 */
async function loadModel(plan) {
  const motion = await apiFetch(`${base}/motion.json`);
  if (motion.ok) return modelFromMotion(await motion.json(), plan);
  const setpoints = plan.motion ? await apiFetch(`${base}/setpoints.json`) : null;
  return modelFromStations(plan, setpoints?.ok ? await setpoints.json() : null);
}

/** @param {any} plan */
async function render(plan) {
  document.title = `${plan.name} – plan review`;
  showCautions(plan.cautions ?? []);
  fill(
    main,
    h('h1', { id: 'plan-title' }, plan.name, ' ', h('span', { class: `badge status-${plan.status}` }, plan.status)),
    h('p', { id: 'plan-status', role: 'status' }, progressText(plan)),
    overview(plan),
  );
  const model = await loadModel(plan);
  const findings = plan.findings ?? [];
  const charts = buildCharts(model, findings);

  const drawingSection = h('section', { 'aria-labelledby': 'drawing-title-h', class: 'card' });
  const chartsSection = h(
    'section',
    { 'aria-labelledby': 'charts-title', class: 'card' },
    h('h2', { id: 'charts-title' }, 'Against line position'),
    h(
      'p',
      { class: 'note' },
      'Dashed lines are limits; triangles mark findings where they occur (red error, brown warning, blue note); the black line is the position shown in the drawing. Click a chart to move there.',
    ),
  );
  main.append(
    drawingSection,
    chartsSection,
    findingsSection(plan, model),
    stationsSection(plan),
    figuresSection(plan),
    downloadsSection(plan),
  );

  if (model.joints.length === 0 || model.positions.length === 0) {
    drawingSection.append(
      h('h2', { id: 'drawing-title-h' }, 'Die drawing'),
      h('p', null, 'This plan has no plate chain to draw (see its findings).'),
    );
  } else {
    setUpDrawing(drawingSection, model, plan, charts);
  }
}

/**
 * Status, outcome and the plan's main figures.
 * @param {any} plan
 */
function overview(plan) {
  const mech = plan.mechanisation;
  const items = [
    ['Plan', plan.id],
    ['Created', localTime(plan.created_at)],
    ['Outcome', plan.outcome?.meets_request ? 'meets the request' : 'short of the request'],
    ['Plates', plan.chain ? String(plan.chain.plate_count) : '–'],
    ['Links', mech ? String(mech.link_count) : '–'],
    [
      'Actuators',
      plan.mechanism
        ? plan.mechanism.actuators.map((a) => `${a.id} (${a.kind}, on ${a.joint})`).join(', ') || 'none'
        : '–',
    ],
    ['Mobility', plan.mechanism ? String(plan.mechanism.mobility) : '–'],
    [
      'Motion',
      plan.motion
        ? `${plan.motion.law}${plan.motion.periodic ? ', periodic' : ''}, time step ${plan.motion.time_step_s} s`
        : 'none',
    ],
  ];
  const shortfalls = plan.outcome?.shortfalls ?? [];
  return h(
    'section',
    { class: 'card overview', 'aria-label': 'overview' },
    h(
      'dl',
      { class: 'facts' },
      items.map(([k, v]) => [h('dt', null, k), h('dd', null, v)]),
    ),
    plan.error ? h('p', { class: 'problem' }, `Failed: ${plan.error}`) : null,
    shortfalls.length
      ? h(
          'div',
          null,
          h('h2', null, 'Shortfalls'),
          h(
            'ul',
            { class: 'shortfalls' },
            shortfalls.map((t) => h('li', null, t)),
          ),
        )
      : null,
  );
}

/**
 * The drawing with its controls: slider, position field, station steps, play and speed.
 * @param {HTMLElement} section
 * @param {import('./lib/motion-model.js').MotionModel} model
 * @param {any} plan
 * @param {import('./lib/charts.js').ChartSpec[]} charts
 */
function setUpDrawing(section, model, plan, charts) {
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
  const plots = createCharts(document.getElementById('charts-title')?.parentElement ?? section, charts, {
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

/** Moves the drawing to a line position (from the findings and stations lists). @param {number} x */
function showAt(x) {
  window.dispatchEvent(new CustomEvent('plan:show', { detail: x }));
}

/**
 * Findings with what helps, errors first; those with a line position can be shown in the drawing.
 * @param {any} plan
 * @param {import('./lib/motion-model.js').MotionModel} model
 */
function findingsSection(plan, model) {
  const order = { error: 0, warning: 1, info: 2 };
  const findings = (plan.findings ?? [])
    .map((f, i) => ({ f, i }))
    .sort((a, b) => order[a.f.severity] - order[b.f.severity] || a.i - b.i);
  const count = (sev) => findings.filter((x) => x.f.severity === sev).length;
  return h(
    'section',
    { class: 'card', 'aria-labelledby': 'findings-title', id: 'findings' },
    h('h2', { id: 'findings-title' }, 'Findings'),
    h(
      'p',
      null,
      `${count('error')} errors, ${count('warning')} warnings, ${count('info')} notes. Each says what is wrong and what helps.`,
    ),
    h(
      'ol',
      { class: 'findings' },
      findings.map(({ f, i }) => {
        const x = findingPosition(f, model.stationPositions);
        const where =
          x === null
            ? 'whole plan'
            : f.to_position_m !== undefined && f.to_position_m > x
              ? `from ${fixed(x, 3)} to ${fixed(f.to_position_m, 3)} m`
              : `at ${fixed(x, 3)} m${f.station !== undefined ? ` (station ${f.station})` : ''}`;
        const figures = [
          f.value !== undefined ? `value ${brief(f.value)}` : null,
          f.limit !== undefined ? `limit ${brief(f.limit)}` : null,
        ].filter(Boolean);
        return h(
          'li',
          { class: `finding severity-${f.severity}`, 'data-code': f.code, 'data-finding': String(i) },
          h('span', { class: `badge severity-${f.severity}` }, f.severity),
          ' ',
          h('strong', null, f.code),
          ` — ${where}${figures.length ? `; ${figures.join(', ')}` : ''}`,
          x !== null
            ? [' ', h('button', { type: 'button', class: 'link-button', onclick: () => showAt(x) }, 'show in drawing')]
            : null,
          h('p', null, f.message),
        );
      }),
    ),
  );
}

/**
 * Target against achieved orifice at every station.
 * @param {any} plan
 */
function stationsSection(plan) {
  const stations = plan.stations ?? [];
  return h(
    'section',
    { class: 'card', 'aria-labelledby': 'stations-title' },
    h('h2', { id: 'stations-title' }, 'Target and achieved orifice per station'),
    h(
      'p',
      { class: 'note' },
      'Thumbnails: target outline dashed, achieved orifice filled. Deviation is the largest distance between the two boundaries.',
    ),
    h(
      'div',
      { class: 'table-wrap' },
      h(
        'table',
        { class: 'stations' },
        h(
          'thead',
          null,
          h(
            'tr',
            null,
            [
              'station',
              'line position (m)',
              'orifice',
              'target area (mm²)',
              'achieved area (mm²)',
              'area error (%)',
              'largest deviation (mm)',
              '',
            ].map((t) => h('th', { scope: 'col' }, t)),
          ),
        ),
        h(
          'tbody',
          null,
          stations.map((st) =>
            h(
              'tr',
              { 'data-station': String(st.index) },
              h('th', { scope: 'row' }, String(st.index)),
              h('td', null, fixed(st.position_m, 3)),
              h('td', null, thumbnail(st)),
              h('td', null, fixed(regionArea(st.target_orifice), 2)),
              h('td', null, fixed(regionArea(st.achieved_orifice), 2)),
              h('td', null, fixed(st.fit.area_error_pct, 3)),
              h('td', null, fixed(st.fit.max_deviation_mm, 3)),
              h(
                'td',
                null,
                h(
                  'button',
                  { type: 'button', class: 'link-button', onclick: () => showAt(st.position_m) },
                  'show in drawing',
                ),
              ),
            ),
          ),
        ),
      ),
    ),
  );
}

/** @param {any} station */
function thumbnail(station) {
  const b = boundsOf([...station.target_orifice.outer, ...station.achieved_orifice.outer]) ?? {
    minX: 0,
    minY: 0,
    maxX: 1,
    maxY: 1,
  };
  const pad = 0.05 * Math.max(b.maxX - b.minX, b.maxY - b.minY);
  const w = b.maxX - b.minX + 2 * pad;
  const hgt = b.maxY - b.minY + 2 * pad;
  return s(
    'svg',
    {
      class: 'thumb',
      viewBox: `${b.minX - pad} ${-(b.maxY + pad)} ${w} ${hgt}`,
      role: 'img',
      'aria-label': `station ${station.index}: achieved orifice filled, target dashed`,
    },
    s(
      'g',
      { transform: 'scale(1,-1)' },
      s('path', { class: 'achieved', d: regionPath(station.achieved_orifice) }),
      s('path', { class: 'target', d: regionPath(station.target_orifice) }),
    ),
  );
}

/**
 * The fit, the mechanism's transmission angles and the room between its parts.
 * @param {any} plan
 */
function figuresSection(plan) {
  const chain = plan.chain;
  const mech = plan.mechanisation;
  const rows = [];
  if (chain) {
    rows.push(
      ['Plate chain', `${chain.plate_count} plates, ${chain.status}`],
      ['Plate lengths (pivot to pivot)', `${chain.plate_lengths_mm.map((v) => fixed(v, 2)).join(', ')} mm`],
      ['Pivot line to melt edge', `${fixed(chain.edge_offset_mm, 2)} mm`],
      ['Chain ends', `start ${chain.start.kind}, end ${chain.end.kind}`],
      ['Fit solver', `${chain.solver.status} after ${chain.solver.iterations} iterations`],
    );
    const below = chain.search?.below_answer;
    if (below) {
      rows.push([
        'One plate fewer',
        below.best_miss_mm === null
          ? `${below.plate_count} plates: no start of ${below.starts} closed`
          : `${below.plate_count} plates miss by ${fixed(below.best_miss_mm, 3)} mm at best (${below.starts} starts)`,
      ]);
    }
    if (chain.telescoping.length)
      rows.push([
        'Telescoping plates',
        chain.telescoping.map((t) => `${t.plate} (stroke ${fixed(t.stroke_mm, 2)} mm)`).join(', '),
      ]);
  }
  const deviations = (plan.stations ?? []).map((st) => st.fit.max_deviation_mm);
  if (deviations.length) rows.push(['Largest deviation over the stations', `${fixed(Math.max(...deviations), 3)} mm`]);
  if (mech) {
    rows.push([
      'Mechanism',
      `${mech.status}${mech.mode ? `, ${mech.mode}` : ''}: ${mech.actuator_count} of ${mech.requested_actuators} requested actuators, ${mech.link_count} links`,
    ]);
    const ta = mech.transmission_angle_deg;
    if (ta.min !== null) rows.push(['Transmission angle at the links', `${fixed(ta.min, 1)}° to ${fixed(ta.max, 1)}°`]);
    for (const j of ta.joints)
      rows.push([
        `Transmission angle at ${j.joint}`,
        `${fixed(j.min, 1)}° to ${fixed(j.max, 1)}° (worst ${fixed(j.worst, 1)}°)`,
      ]);
  }
  const sim = plan.simulation;
  if (sim) {
    const range = (
      /** @type {{ min: number | null, max: number | null }} */ r,
      /** @type {number} */ d,
      /** @type {string} */ unit,
    ) => (r.min === null || r.max === null ? '–' : `${fixed(r.min, d)} to ${fixed(r.max, d)}${unit}`);
    rows.push(
      [
        'Motion simulated',
        `${sim.steps} steps, ${sim.time_step_s} s apart${sim.capped ? ' (step coarsened)' : ''}; one pass takes ${fixed(sim.duration_s, 1)} s`,
      ],
      ['Orifice area along the motion', range(sim.area_mm2, 1, ' mm²')],
      ['Draw-down along the motion', range(sim.draw_down_ratio, 3, '')],
      [
        'Puller speed',
        `${range(sim.puller_speed_m_per_min, 3, ' m/min')}${sim.puller_follows_area ? `, holding draw-down ${fixed(sim.target_draw_down_ratio, 3)}` : ''}`,
      ],
      ['Die pressure over the first station’s', range(sim.die_pressure_ratio, 3, '')],
      ['Thinnest wall along the motion', sim.min_wall_mm === null ? '–' : `${fixed(sim.min_wall_mm, 2)} mm`],
      [
        'Largest leak past the plates',
        sim.max_leak_area_mm2 > 0 ? `${fixed(sim.max_leak_area_mm2, 2)} mm²` : 'none: sealed throughout',
      ],
      ['Fastest plate pivot', `${fixed(sim.max_tip_speed_mm_per_s, 2)} mm/s`],
      ['Transmission angle along the motion', range(sim.transmission_angle_deg, 1, '°')],
      ['Tightest room along the motion', sim.min_clearance_mm === null ? '–' : `${fixed(sim.min_clearance_mm, 2)} mm`],
      ['Steps not assembled', String(sim.unsolved_steps)],
    );
  }
  const clearances = mech?.clearances ?? [];
  return h(
    'section',
    { class: 'card', 'aria-labelledby': 'figures-title' },
    h('h2', { id: 'figures-title' }, 'Fit and clearance'),
    h(
      'dl',
      { class: 'facts' },
      rows.map(([k, v]) => [h('dt', null, k), h('dd', null, v)]),
    ),
    clearances.length
      ? h(
          'div',
          { class: 'table-wrap' },
          h(
            'table',
            { class: 'clearances' },
            h('caption', null, 'Tightest room between parts over the whole motion, smallest first'),
            h(
              'thead',
              null,
              h(
                'tr',
                null,
                ['parts', 'kind', 'room (mm)', 'where'].map((t) => h('th', { scope: 'col' }, t)),
              ),
            ),
            h(
              'tbody',
              null,
              clearances.map((c) =>
                h(
                  'tr',
                  { class: c.clearance_mm < 0 ? 'overlap' : null },
                  h('td', null, c.parts.join(' / ')),
                  h('td', null, c.kind),
                  h('td', null, fixed(c.clearance_mm, 2), c.clearance_mm < 0 ? ' (overlap)' : ''),
                  h('td', null, clearanceWhere(c)),
                ),
              ),
            ),
          ),
        )
      : null,
  );
}

/** @param {any} c */
function clearanceWhere(c) {
  if (c.station === null) return '–';
  if (c.leg_to_station === null) return `at station ${c.station}`;
  return `from station ${c.station} toward ${c.leg_to_station}, ${Math.round(c.leg_fraction * 100)} % of the way`;
}

/**
 * Links to every download, and to each part's own DXF; one the service cannot give for this plan says why. A choice of
 * cold (as cut, room temperature) or hot (as planned, at die temperature) dimensions applies to every DXF link.
 * @param {any} plan
 */
function downloadsSection(plan) {
  /** @type {HTMLAnchorElement[]} */
  const dxfLinks = [];
  /**
   * @param {string} name  path under the plan
   * @param {string} what
   * @param {boolean} [ask]  ask the service (HEAD) whether it can give this file
   */
  const item = (name, what, ask = true) => {
    const link = /** @type {HTMLAnchorElement} */ (
      h('a', { href: `${base}/${name}`, download: `${plan.name}-${name.replace('/', '-')}` }, name)
    );
    if (name.endsWith('.dxf')) dxfLinks.push(link);
    sendTokenWithDownload(link);
    const note = h('span', { class: 'note' });
    if (ask) {
      apiFetch(link.href, { method: 'HEAD' }).then((r) => {
        if (!r.ok) note.textContent = `(not available for this plan: ${r.status})`;
      });
    }
    return h('li', { 'data-download': name }, link, ` — ${what} `, note);
  };
  const parts = (plan.mechanism?.bodies ?? [])
    .filter((/** @type {any} */ b) => b.kind === 'plate' || b.kind === 'link')
    .map((/** @type {any} */ b) => b.id);
  const dimensions = /** @type {HTMLSelectElement} */ (
    h(
      'select',
      { id: 'dxf-dimensions' },
      h('option', { value: 'cold' }, 'cold: as cut, at room temperature'),
      h('option', { value: 'hot' }, 'hot: as planned, at die temperature'),
    )
  );
  dimensions.addEventListener('change', () => {
    for (const link of dxfLinks) {
      const url = new URL(link.href);
      url.searchParams.set('dimensions', dimensions.value);
      link.href = url.pathname + url.search;
    }
  });
  return h(
    'section',
    { class: 'card', 'aria-labelledby': 'downloads-title' },
    h('h2', { id: 'downloads-title' }, 'Downloads'),
    h('p', null, h('label', { for: 'dxf-dimensions' }, 'DXF dimensions '), dimensions),
    h(
      'ul',
      { class: 'downloads' },
      DOWNLOADS.map(([name, what]) => item(name, what)),
    ),
    parts.length
      ? h(
          'details',
          null,
          h('summary', null, `Each part on its own (${parts.length} DXF files)`),
          h(
            'ul',
            { class: 'downloads' },
            parts.map((id) => item(`plates/${id}.dxf`, `${id} to cut (DXF)`, false)),
          ),
        )
      : null,
  );
}

start();
