import { apiFetch, FINISHED, followPlan, jsonOf, progressText } from './api.js';
import { fill, h } from './dom.js';
import { placeErrors, scheduleLines, visibleLines } from './lib/schedule-lines.js';

/**
 * The "plan a schedule" form: paste or open a JSON schedule, post it to `/v1/plans`, show a refusal's details next to
 * the fields they name, follow the plan until it is finished and then open it.
 * @param {HTMLFormElement} form  holds `textarea[name=schedule]`, `input[type=file]` and a submit button
 * @param {HTMLElement} result  where the answer goes
 * @param {{ onPosted?: () => void, open?: (id: string) => void }} [hooks]
 */
export function setUpPostForm(form, result, hooks = {}) {
  const text = /** @type {HTMLTextAreaElement} */ (form.querySelector('textarea[name="schedule"]'));
  const file = /** @type {HTMLInputElement} */ (form.querySelector('input[type="file"]'));
  const submit = /** @type {HTMLButtonElement} */ (form.querySelector('button[type="submit"]'));
  const open = hooks.open ?? ((id) => window.location.assign(`/plans/${encodeURIComponent(id)}`));

  file.addEventListener('change', async () => {
    const chosen = file.files?.[0];
    if (!chosen) return;
    text.value = await chosen.text();
    fill(result, h('p', { class: 'note' }, `Read ${chosen.name} (${Math.round(chosen.size / 1024)} KiB).`));
  });

  form.addEventListener('submit', async (event) => {
    event.preventDefault();
    let schedule;
    try {
      schedule = JSON.parse(text.value);
    } catch (error) {
      showProblem(result, 'The text is not JSON.', [], null, String(error instanceof Error ? error.message : error));
      text.focus();
      return;
    }
    submit.disabled = true;
    fill(result, h('p', { role: 'status' }, 'Sending the schedule…'));
    try {
      const response = await apiFetch('/v1/plans', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: text.value,
      });
      const body = await jsonOf(response);
      if (response.status !== 202 && response.status !== 201 && response.status !== 200) {
        showProblem(result, headline(response.status, body), body?.details ?? [], schedule, null);
        return;
      }
      const id = body?.id;
      hooks.onPosted?.();
      const status = h('p', { role: 'status', 'data-role': 'job-status' }, progressText(body));
      const bar = h('progress', { max: '1', 'aria-label': 'plan progress' });
      const link = h('a', { href: `/plans/${encodeURIComponent(id)}` }, 'Open the plan');
      fill(result, h('div', { class: 'job' }, h('p', null, `Plan ${id} accepted.`), status, bar, h('p', null, link)));
      const finished = FINISHED.has(body?.status)
        ? body
        : await followPlan(id, (plan) => {
            status.textContent = progressText(plan);
            const f = plan?.progress?.fraction;
            if (typeof f === 'number') bar.setAttribute('value', String(f));
          });
      status.textContent = progressText(finished);
      bar.setAttribute('value', '1');
      hooks.onPosted?.();
      open(id);
    } catch (error) {
      showProblem(
        result,
        `The plan could not be followed: ${error instanceof Error ? error.message : error}`,
        [],
        null,
        null,
      );
    } finally {
      submit.disabled = false;
    }
  });
}

/**
 * @param {number} status
 * @param {any} body
 */
function headline(status, body) {
  const code = body?.error ? ` (${body.error})` : '';
  return `Refused with ${status}${code}: ${body?.message ?? 'no reason given.'}`;
}

/**
 * A refusal: the headline, then the schedule line by line with each error under the field it names.
 * @param {HTMLElement} result
 * @param {string} title
 * @param {{ path: string, message: string }[]} details
 * @param {unknown} schedule  the parsed schedule, or null
 * @param {string | null} note
 */
function showProblem(result, title, details, schedule, note) {
  const parts = [h('p', { class: 'problem', role: 'alert' }, title)];
  if (note) parts.push(h('p', { class: 'note' }, note));
  if (details.length > 0) {
    parts.push(
      h(
        'ul',
        { class: 'error-list', 'aria-label': 'fields with errors' },
        details.map((d) => h('li', null, h('code', null, d.path), ': ', d.message)),
      ),
    );
  }
  if (schedule !== null && details.length > 0) parts.push(annotatedSchedule(schedule, details));
  fill(result, ...parts);
  result.querySelector('.field-error')?.scrollIntoView({ block: 'nearest' });
}

/**
 * The schedule as numbered lines with the errors placed right after the line of the field they name.
 * @param {unknown} schedule
 * @param {{ path: string, message: string }[]} details
 */
function annotatedSchedule(schedule, details) {
  const lines = scheduleLines(schedule);
  const placed = placeErrors(lines, details);
  const shown = visibleLines(lines.length, placed.keys());
  const list = h('ol', { class: 'schedule-lines', 'aria-label': 'the schedule sent, with its errors' });
  let folded = false;
  lines.forEach((line, i) => {
    if (!shown[i]) {
      if (!folded) list.append(h('li', { class: 'fold', 'aria-hidden': 'true' }, '…'));
      folded = true;
      return;
    }
    folded = false;
    const errors = placed.get(i) ?? [];
    const item = h(
      'li',
      { value: String(i + 1), class: errors.length ? 'line has-error' : 'line', 'data-path': line.path },
      h('code', null, `${'  '.repeat(line.depth)}${line.text}`),
    );
    for (const e of errors) {
      item.append(
        h('div', { class: 'field-error', 'data-path': e.path }, h('strong', null, e.path), ` — ${e.message}`),
      );
    }
    list.append(item);
  });
  return h('div', { class: 'schedule-view' }, list);
}
