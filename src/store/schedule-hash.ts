import { createHash } from 'node:crypto';
import type { Schedule } from '../domain/index.js';

/**
 * SHA-256 (hex) of a normalised schedule, written as JSON with sorted keys: the same schedule gives the same hash
 * whatever the key order, spacing or ring orientation of the request it came from.
 */
export function scheduleHash(schedule: Schedule): string {
  return createHash('sha256').update(canonicalJson(schedule)).digest('hex');
}

/** SHA-256 (hex) of a text. */
export function textHash(text: string): string {
  return createHash('sha256').update(text).digest('hex');
}

function canonicalJson(value: unknown): string {
  if (typeof value === 'number') return Number.isFinite(value) ? JSON.stringify(value) : `"${value}"`;
  if (value === null || typeof value !== 'object') return JSON.stringify(value) ?? 'null';
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}
