/**
 * JSON that keeps numbers JSON cannot hold: NaN and ±Infinity are written as `{"$number":"NaN"}` and read back as
 * numbers, so a plan (which may carry NaN for "not tried") reads back equal to what was stored.
 */
export function encodeJson(value: unknown): string {
  return JSON.stringify(value, (_key, v) =>
    typeof v === 'number' && !Number.isFinite(v) ? { $number: String(v) } : v,
  );
}

/** Reads what `encodeJson` wrote. */
export function decodeJson<T>(text: string): T {
  return JSON.parse(text, (_key, v) => {
    if (v !== null && typeof v === 'object' && !Array.isArray(v) && typeof v.$number === 'string') {
      const keys = Object.keys(v);
      if (keys.length === 1) return Number(v.$number);
    }
    return v;
  }) as T;
}
