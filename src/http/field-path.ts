/** Formats a path of keys as a reader expects it: `stations[3].orifice.outer[2]`. */
export function formatFieldPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const key of path) {
    if (typeof key === 'number') out += `[${key}]`;
    else out += out === '' ? String(key) : `.${String(key)}`;
  }
  return out === '' ? '(body)' : out;
}
