import { apiFetch, sendTokenWithDownload } from './api.js';
import { h, localTime, s } from './dom.js';
import { regionPath } from './drawing.js';
import { findingPosition } from './lib/charts.js';
import { brief, fixed } from './lib/describe.js';
import { boundsOf, regionArea } from './lib/geometry.js';

/** The plan page's sections beside the drawing: overview, findings, stations, figures and downloads. */

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

/**
 * Status, outcome and the plan's main figures.
 * @param {any} plan
 */
export function overview(plan) {
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

/** Moves the drawing to a line position (from the findings and stations lists). @param {number} x */
function showAt(x) {
  window.dispatchEvent(new CustomEvent('plan:show', { detail: x }));
}

/**
 * Findings with what helps, errors first; those with a line position can be shown in the drawing.
 * @param {any} plan
 * @param {import('./lib/motion-model.js').MotionModel} model
 */
export function findingsSection(plan, model) {
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
export function stationsSection(plan) {
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
export function figuresSection(plan) {
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
 * @param {string} base  the plan's path, `/v1/plans/{id}`
 */
export function downloadsSection(plan, base) {
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
