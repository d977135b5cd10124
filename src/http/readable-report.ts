import type { z } from 'zod';
import { formatFieldPath } from './field-path.js';

/** Why a response body cannot be sent, with the place in it; null when it can. */
export interface UnreadableFigure {
  /** Where in the response, e.g. `stations[2].land_pressure_bar`. */
  readonly path: string;
  /** What is wrong there, from the response schema. */
  readonly problem: string;
}

/**
 * Checks a response body against its wire schema before it is sent or stored, so a figure that is not a finite number
 * (NaN or Infinity from an extreme input) is caught here, with its place, rather than failing serialisation as a 500.
 * JSON has no NaN or Infinity, and the response schemas refuse them (zod's `z.number()` is finite).
 */
export function unreadableFigure(body: unknown, schema: z.ZodType): UnreadableFigure | null {
  let parsed: ReturnType<z.ZodType['safeParse']>;
  try {
    parsed = schema.safeParse(body);
  } catch (err) {
    return { path: '(body)', problem: err instanceof Error ? err.message : String(err) };
  }
  if (parsed.success) return null;
  const issue = parsed.error.issues[0];
  if (issue === undefined) return { path: '(body)', problem: 'invalid value' };
  const path = issue.path.filter((k): k is string | number => typeof k !== 'symbol');
  return { path: formatFieldPath(path), problem: issue.message };
}
