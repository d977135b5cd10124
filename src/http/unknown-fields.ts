import type { z } from 'zod';
import type { Finding } from '../domain/index.js';
import { formatFieldPath } from './field-path.js';

/** The parts of a zod schema this walk looks into (zod 4 internals exposed on every schema). */
interface SchemaLike {
  readonly def: { readonly type: string };
  readonly shape?: Readonly<Record<string, SchemaLike>>;
  readonly element?: SchemaLike;
  unwrap?: () => SchemaLike;
}

/**
 * Fields of a request body that the schema does not know (zod drops them silently). A typo such as `min_wall` for
 * `min_wall_mm` would otherwise fall back to the default without a word, so each becomes a warning with its path.
 * Walks objects, optional wrappers and arrays; stops at anything else. Safe for any key: a key is known only when the
 * schema's shape owns it (`Object.hasOwn`), so names of built-in object properties (`constructor`, `toString`,
 * `__proto__`, `hasOwnProperty`) are reported like any other unknown field, at any depth.
 */
export function unknownFields(body: unknown, schema: z.ZodType): Finding[] {
  const out: Finding[] = [];
  const walk = (value: unknown, s: SchemaLike, path: (string | number)[]): void => {
    let node = s;
    while (node.def.type === 'optional' && node.unwrap) node = node.unwrap();
    if (node.def.type === 'array' && node.element && Array.isArray(value)) {
      value.forEach((item, i) => {
        walk(item, node.element!, [...path, i]);
      });
      return;
    }
    if (node.def.type !== 'object' || !node.shape || value === null || typeof value !== 'object') return;
    const shape = node.shape;
    // Object.entries reads own values only, so even an own `__proto__` key yields its own value
    for (const [key, child] of Object.entries(value)) {
      const known = Object.hasOwn(shape, key) ? shape[key] : undefined;
      if (known?.def) walk(child, known, [...path, key]);
      else {
        const where = formatFieldPath([...path, key]);
        out.push({
          code: 'UNKNOWN_FIELD',
          severity: 'warning',
          message: `The field ${where} is not part of the schedule format and was ignored; check its spelling (units belong in the name, e.g. min_wall_mm). The value's default was used instead.`,
        });
      }
    }
  };
  walk(body, schema as unknown as SchemaLike, []);
  return out;
}
