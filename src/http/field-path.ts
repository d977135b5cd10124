/** Formats a path of keys as a reader expects it: `stations[3].orifice.outer[2]`. */
export function formatFieldPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const key of path) {
    if (typeof key === 'number') out += `[${key}]`;
    else out += out === '' ? String(key) : `.${String(key)}`;
  }
  return out === '' ? '(body)' : out;
}

/**
 * A JSON-pointer-like path as zod issues give it (`/stations/0/orifice/outer/2`), formatted the same way
 * (`stations[0].orifice.outer[2]`); `(body)` for the body itself.
 */
export function formatInstancePath(instancePath: string): string {
  const parts = instancePath.split('/').filter((p) => p !== '');
  let out = '';
  for (const part of parts) out += /^\d+$/.test(part) ? `[${part}]` : out === '' ? part : `.${part}`;
  return out === '' ? '(body)' : out;
}
