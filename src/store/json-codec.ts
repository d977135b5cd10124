import { gunzipSync, gzipSync } from 'node:zlib';

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

/**
 * `encodeJson`, gzip-compressed (RFC 1952, the fastest level): how the store keeps schedules, which at the vertex limit
 * are about 3 MB of JSON and compress about 3×, so the service thread writes and reads a third of the bytes.
 */
export function packJson(value: unknown): Uint8Array {
  return packText(encodeJson(value));
}

/** Text written by `encodeJson`, packed as `packJson` packs it (for a caller that needs the text too). */
export function packText(json: string): Uint8Array {
  return gzipSync(json, { level: 1 });
}

/** Reads what `packJson` wrote. */
export function unpackJson<T>(packed: Uint8Array): T {
  return decodeJson<T>(gunzipSync(packed).toString('utf8'));
}
