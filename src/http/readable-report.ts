import { formatFieldPath } from './field-path.js';

/** A figure of a response body that cannot be sent, with its place. */
export interface UnreadableFigure {
  /** Where in the response, e.g. `stations[2].land_pressure_bar`. */
  readonly path: string;
  /** What is there instead of a finite number: `NaN`, `Infinity` or `-Infinity`. */
  readonly problem: string;
}

/**
 * The first number in a response body that is not finite (NaN or ±Infinity, which an extreme input can produce),
 * depth first, or null when every number is finite. JSON has no such numbers (RFC 8259 §6) and the response schemas
 * refuse them, so the routes check before they send or store, rather than failing serialisation with a 500. A plain
 * walk, linear in the size of the body: much cheaper than parsing the body against its schema once more.
 */
export function unreadableFigure(body: unknown): UnreadableFigure | null {
  const path: (string | number)[] = [];
  const walk = (v: unknown): UnreadableFigure | null => {
    if (typeof v === 'number') return Number.isFinite(v) ? null : { path: formatFieldPath(path), problem: String(v) };
    if (v === null || typeof v !== 'object') return null;
    const entries: [string | number, unknown][] = Array.isArray(v) ? [...v.entries()] : Object.entries(v);
    for (const [k, x] of entries) {
      path.push(k);
      const found = walk(x);
      path.pop();
      if (found) return found;
    }
    return null;
  };
  return walk(body);
}
