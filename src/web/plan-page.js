import { apiFetch, FINISHED, followPlan, jsonOf, PlanFetchError, progressText, setUpTokenField } from './api.js';
import { fill, h } from './dom.js';
import { buildCharts } from './lib/charts.js';
import { modelFromMotion, modelFromStations } from './lib/motion-model.js';
import { setUpDrawing } from './motion-player.js';
import { downloadsSection, figuresSection, findingsSection, overview, stationsSection } from './plan-sections.js';

/** The plan page: `/plans/{id}`. Waits for an unfinished plan, then shows it. */

const main = /** @type {HTMLElement} */ (document.getElementById('plan'));
const statusLine = /** @type {HTMLElement} */ (document.getElementById('plan-status'));
const id = decodeURIComponent(window.location.pathname.split('/').filter(Boolean)[1] ?? '');
const base = `/v1/plans/${encodeURIComponent(id)}`;

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
  const charts = buildCharts(model, findings, model.limits);

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
    downloadsSection(plan, base),
  );

  if (model.joints.length === 0 || model.positions.length === 0) {
    drawingSection.append(
      h('h2', { id: 'drawing-title-h' }, 'Die drawing'),
      h('p', null, 'This plan has no plate chain to draw (see its findings).'),
    );
  } else {
    setUpDrawing(drawingSection, model, plan, charts, chartsSection);
  }
}

start();
