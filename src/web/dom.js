/**
 * A small element builder: `h('p', { class: 'note' }, 'text', child)`. Attributes starting with `on` are event
 * listeners; `null`, `undefined` and `false` children are skipped. Text is always set as text, never parsed as HTML.
 * @param {string} tag
 * @param {Record<string, any> | null} [attrs]
 * @param {...any} children
 * @returns {HTMLElement}
 */
export function h(tag, attrs, ...children) {
  const el = document.createElement(tag);
  for (const [name, value] of Object.entries(attrs ?? {})) {
    if (value === null || value === undefined || value === false) continue;
    if (name.startsWith('on') && typeof value === 'function') el.addEventListener(name.slice(2), value);
    else if (value === true) el.setAttribute(name, '');
    else el.setAttribute(name, String(value));
  }
  append(el, children);
  return el;
}

/** SVG namespace. */
export const SVG_NS = 'http://www.w3.org/2000/svg';

/**
 * An SVG element with attributes.
 * @param {string} tag
 * @param {Record<string, any>} [attrs]
 * @param {...any} children
 * @returns {SVGElement}
 */
export function s(tag, attrs, ...children) {
  const el = document.createElementNS(SVG_NS, tag);
  for (const [name, value] of Object.entries(attrs ?? {})) {
    if (value !== null && value !== undefined && value !== false) el.setAttribute(name, String(value));
  }
  append(el, children);
  return el;
}

/**
 * @param {Element} el
 * @param {any[]} children
 */
function append(el, children) {
  for (const child of children.flat(Number.POSITIVE_INFINITY)) {
    if (child === null || child === undefined || child === false) continue;
    el.append(child instanceof Node ? child : String(child));
  }
}

/**
 * Replaces an element's children.
 * @param {Element} el
 * @param {...any} children
 */
export function fill(el, ...children) {
  el.replaceChildren();
  append(el, children);
}

/**
 * A date and time as the reader's browser writes them, with the zone.
 * @param {string} iso
 */
export function localTime(iso) {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : d.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}
