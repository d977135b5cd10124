// @ts-check
/**
 * A schedule written out line by line with the field path of every line, so that the errors of a 400 answer can be
 * shown next to the field they name. Paths are written as the service writes them: `stations[2].orifice.outer`,
 * `(body)` for the whole document. Pure: unit-tested in tests/web/schedule-lines.test.ts.
 */

/** @typedef {{ path: string, text: string, depth: number, closing: boolean }} Line */

/**
 * The document as indented lines, each with the path of the value it opens or holds. A pair of numbers (a point) is
 * written on one line.
 * @param {unknown} value
 * @returns {Line[]}
 */
export function scheduleLines(value) {
  /** @type {Line[]} */
  const lines = [];
  /**
   * @param {unknown} v
   * @param {string} path
   * @param {number} depth
   * @param {string} prefix
   * @param {string} comma
   */
  const walk = (v, path, depth, prefix, comma) => {
    const own = path === '' ? '(body)' : path;
    if (Array.isArray(v) && !isFlatNumbers(v)) {
      lines.push({ path: own, text: `${prefix}[`, depth, closing: false });
      v.forEach((item, i) => {
        walk(item, `${path}[${i}]`, depth + 1, '', i < v.length - 1 ? ',' : '');
      });
      lines.push({ path: own, text: `]${comma}`, depth, closing: true });
    } else if (v !== null && typeof v === 'object' && !Array.isArray(v)) {
      const entries = Object.entries(v);
      lines.push({ path: own, text: `${prefix}{`, depth, closing: false });
      entries.forEach(([key, item], i) => {
        walk(
          item,
          path === '' ? key : `${path}.${key}`,
          depth + 1,
          `${JSON.stringify(key)}: `,
          i < entries.length - 1 ? ',' : '',
        );
      });
      lines.push({ path: own, text: `}${comma}`, depth, closing: true });
    } else {
      lines.push({ path: own, text: `${prefix}${JSON.stringify(v) ?? 'null'}${comma}`, depth, closing: false });
    }
  };
  walk(value, '', 0, '', '');
  return lines;
}

/**
 * @param {unknown[]} v
 */
function isFlatNumbers(v) {
  return v.length <= 3 && v.every((x) => typeof x === 'number');
}

/**
 * A path as its parts: `stations[2].orifice.outer` → `['stations', 2, 'orifice', 'outer']`; `(body)` → `[]`.
 * @param {string} path
 * @returns {(string | number)[]}
 */
export function pathParts(path) {
  if (path === '(body)' || path === '') return [];
  /** @type {(string | number)[]} */
  const parts = [];
  for (const m of path.matchAll(/([^.[\]]+)|\[(\d+)\]/g)) {
    if (m[2] !== undefined) parts.push(Number(m[2]));
    else if (m[1] !== undefined) parts.push(m[1]);
  }
  return parts;
}

/**
 * @param {(string | number)[]} parts
 */
function joinParts(parts) {
  let out = '';
  for (const p of parts) out += typeof p === 'number' ? `[${p}]` : out === '' ? p : `.${p}`;
  return out === '' ? '(body)' : out;
}

/**
 * The line each error belongs under: the line of the field it names, or of the nearest enclosing field that the
 * document has (a missing field's error goes under the object that lacks it).
 * @param {readonly Line[]} lines
 * @param {readonly { path: string, message: string }[]} details
 * @returns {Map<number, { path: string, message: string }[]>}  line index → errors
 */
export function placeErrors(lines, details) {
  /** @type {Map<string, number>} */
  const firstLine = new Map();
  lines.forEach((line, i) => {
    if (!line.closing && !firstLine.has(line.path)) firstLine.set(line.path, i);
  });
  /** @type {Map<number, { path: string, message: string }[]>} */
  const placed = new Map();
  for (const detail of details) {
    const parts = pathParts(detail.path);
    let at = 0;
    for (let n = parts.length; n >= 0; n--) {
      const found = firstLine.get(joinParts(parts.slice(0, n)));
      if (found !== undefined) {
        at = found;
        break;
      }
    }
    placed.set(at, [...(placed.get(at) ?? []), detail]);
  }
  return placed;
}

/**
 * Which lines to show when the document is long: every line up to `max`, else the lines within `context` of an error
 * (the rest folded).
 * @param {number} count
 * @param {Iterable<number>} errorLines
 * @param {number} [max]
 * @param {number} [context]
 * @returns {boolean[]}
 */
export function visibleLines(count, errorLines, max = 1500, context = 4) {
  if (count <= max) return Array.from({ length: count }, () => true);
  const shown = Array.from({ length: count }, () => false);
  for (const at of errorLines) {
    for (let i = Math.max(0, at - context); i <= Math.min(count - 1, at + context); i++) shown[i] = true;
  }
  return shown;
}
