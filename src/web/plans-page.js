import { apiFetch, FINISHED, jsonOf, progressText, setUpTokenField } from './api.js';
import { fill, h, localTime } from './dom.js';
import { setUpPostForm } from './post-form.js';

/** The plan list (`GET /v1/plans`, newest first, a page at a time) and the form that posts a schedule. */

const PAGE_SIZE = 25;
const body = /** @type {HTMLElement} */ (document.querySelector('#plan-list tbody'));
const status = /** @type {HTMLElement} */ (document.getElementById('list-status'));
const more = /** @type {HTMLButtonElement} */ (document.getElementById('more'));
/** @type {string | null} */
let next = null;
/** @type {ReturnType<typeof setTimeout> | undefined} */
let again;

/**
 * Loads the first page (or the page after `next` when `older`), and asks again in 3 s while a plan is unfinished.
 * @param {boolean} [older]
 */
async function load(older = false) {
  clearTimeout(again);
  const query = new URLSearchParams({ limit: String(PAGE_SIZE) });
  if (older && next) query.set('cursor', next);
  const response = await apiFetch(`/v1/plans?${query}`);
  const answer = await jsonOf(response);
  if (!response.ok) {
    status.textContent = `The plan list could not be read (${response.status}): ${answer?.message ?? 'no reason given'}`;
    return;
  }
  const items = answer?.items ?? [];
  next = answer?.next_cursor ?? null;
  more.hidden = next === null;
  const rows = items.map(row);
  if (older) body.append(...rows);
  else fill(body, rows);
  status.textContent =
    body.children.length === 0
      ? 'No plans yet: post a schedule below.'
      : `${body.children.length} ${body.children.length === 1 ? 'plan' : 'plans'} shown.`;
  if (items.some((/** @type {any} */ p) => !FINISHED.has(p.status))) again = setTimeout(() => load(), 3000);
}

/**
 * One plan as a table row.
 * @param {any} plan
 */
function row(plan) {
  const created = plan.created_at ?? '';
  return h(
    'tr',
    { 'data-plan': plan.id },
    h('td', null, h('a', { href: `/plans/${encodeURIComponent(plan.id)}` }, plan.name ?? plan.id)),
    h('td', null, h('span', { class: `badge status-${plan.status}` }, plan.status)),
    h('td', null, created ? h('time', { datetime: created }, localTime(created)) : '–'),
    h('td', null, outcome(plan)),
  );
}

/**
 * What came of a plan, from its status (and its progress while unfinished).
 * @param {any} plan
 */
function outcome(plan) {
  if (plan.status === 'done') return 'meets the request';
  if (plan.status === 'incomplete') return 'short of the request: see its shortfalls';
  if (plan.status === 'failed') return 'no chain could be fitted: see its findings';
  return progressText(plan);
}

setUpTokenField(() => load());
document.getElementById('refresh')?.addEventListener('click', () => load());
more.addEventListener('click', () => load(true));
setUpPostForm(
  /** @type {HTMLFormElement} */ (document.getElementById('post-form')),
  /** @type {HTMLElement} */ (document.getElementById('post-result')),
  { onPosted: () => load() },
);
load();
