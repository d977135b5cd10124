/**
 * Talking to the service from the page: every request carries the access token when one is stored for this browser
 * tab (sessionStorage), as `Authorization: Bearer …`. A 401 or 403 opens the token field in the page header.
 */

const TOKEN_KEY = 'die-motion-planner.token';

/** @returns {string} the stored token, or '' */
export function storedToken() {
  try {
    return sessionStorage.getItem(TOKEN_KEY) ?? '';
  } catch {
    return '';
  }
}

/** @param {string} token  '' forgets it */
function storeToken(token) {
  try {
    if (token) sessionStorage.setItem(TOKEN_KEY, token);
    else sessionStorage.removeItem(TOKEN_KEY);
  } catch {
    // storage can be off (private mode): the token then lasts until the page is left
  }
}

/**
 * `fetch` with the token. Resolves with the response whatever its status; a 401 or 403 opens the token field.
 * @param {string} url
 * @param {RequestInit} [init]
 */
export async function apiFetch(url, init = {}) {
  const headers = new Headers(init.headers);
  const token = storedToken();
  if (token) headers.set('authorization', `Bearer ${token}`);
  const response = await fetch(url, { ...init, headers });
  if (response.status === 401 || response.status === 403) {
    const body = await response
      .clone()
      .json()
      .catch(() => null);
    openTokenField(
      response.status === 401
        ? 'This service asks for an access token.'
        : `The token was refused${body?.message ? `: ${body.message}` : '.'}`,
    );
  }
  return response;
}

/**
 * The JSON body of a response, or null when it has none.
 * @param {Response} response
 * @returns {Promise<any>}
 */
export async function jsonOf(response) {
  try {
    return await response.json();
  } catch {
    return null;
  }
}

/** Called after a new token is saved (the page reloads what it shows). */
let onTokenSaved = () => window.location.reload();

/**
 * Fills the header's token form (`#token-form`) and says what to do after a token is saved.
 * @param {() => void} [afterSave]
 */
export function setUpTokenField(afterSave) {
  if (afterSave) onTokenSaved = afterSave;
  const form = /** @type {HTMLFormElement | null} */ (document.getElementById('token-form'));
  if (!form) return;
  const input = /** @type {HTMLInputElement} */ (form.querySelector('input'));
  const forget = /** @type {HTMLButtonElement} */ (form.querySelector('[data-action="forget"]'));
  if (storedToken()) {
    form.hidden = false;
    input.placeholder = 'token saved for this tab';
  }
  form.addEventListener('submit', (event) => {
    event.preventDefault();
    storeToken(input.value.trim());
    input.value = '';
    input.placeholder = storedToken() ? 'token saved for this tab' : 'paste the token';
    onTokenSaved();
  });
  forget.addEventListener('click', () => {
    storeToken('');
    input.placeholder = 'paste the token';
  });
}

/** @param {string} why */
function openTokenField(why) {
  const form = document.getElementById('token-form');
  if (!form) return;
  form.hidden = false;
  const note = form.querySelector('[data-role="why"]');
  if (note) note.textContent = why;
  form.querySelector('input')?.focus();
}

/**
 * Downloads a file through `apiFetch` when a token is stored (a plain link cannot send the header); without a token
 * the link is followed as usual.
 * @param {HTMLAnchorElement} link
 */
export function sendTokenWithDownload(link) {
  link.addEventListener('click', async (event) => {
    if (!storedToken()) return;
    event.preventDefault();
    const response = await apiFetch(link.href);
    if (!response.ok) return;
    const url = URL.createObjectURL(await response.blob());
    const a = document.createElement('a');
    a.href = url;
    a.download = link.getAttribute('download') || link.href.split('/').pop() || 'download';
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 10_000);
  });
}

/** Statuses after which a plan no longer changes. */
export const FINISHED = new Set(['done', 'incomplete', 'failed']);

/**
 * Asks for a plan until it is finished, calling `onStatus` with every answer; resolves with the last one. Waits 0.5 s
 * between asks at first, then up to 3 s.
 * @param {string} id
 * @param {(plan: any) => void} onStatus
 * @param {{ signal?: AbortSignal }} [options]
 */
export async function followPlan(id, onStatus, options = {}) {
  let wait = 500;
  for (;;) {
    const response = await apiFetch(`/v1/plans/${encodeURIComponent(id)}`, { signal: options.signal });
    const body = await jsonOf(response);
    if (!response.ok) throw new PlanFetchError(response.status, body);
    onStatus(body);
    if (FINISHED.has(body?.status)) return body;
    await new Promise((resolve) => setTimeout(resolve, wait));
    wait = Math.min(3000, wait * 1.5);
  }
}

/** A plan could not be read: the HTTP status and the service's error body. */
export class PlanFetchError extends Error {
  /**
   * @param {number} status
   * @param {any} body
   */
  constructor(status, body) {
    super(body?.message ?? `The service answered ${status}.`);
    this.status = status;
    this.body = body;
  }
}

/**
 * How far a plan has come, in words, from its status and progress (`{ stage, fraction }` while running).
 * @param {any} plan
 */
export function progressText(plan) {
  const status = plan?.status;
  if (status === 'queued') return 'Waiting for a free worker.';
  if (status === 'running') {
    const p = plan.progress;
    const pct = typeof p?.fraction === 'number' ? ` ${Math.round(p.fraction * 100)} %` : '';
    return `Running${pct}${p?.stage ? `: ${p.stage}` : ''}.`;
  }
  if (status === 'done') return 'Done: the plan meets the request.';
  if (status === 'incomplete') return 'Computed, but short of the request (see the shortfalls).';
  if (status === 'failed') return `Failed${plan.error ? `: ${plan.error}` : '.'}`;
  return String(status ?? 'unknown');
}
