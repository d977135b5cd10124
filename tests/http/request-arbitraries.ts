/**
 * Generated requests for the property test of issue 9 ("bad input never a 5xx") and for scripts/fuzz-requests.ts: a
 * valid schedule (tiny for plans), then none to three breakages: unknown keys named like built-in object properties
 * at any depth, extreme or non-finite numbers (also as raw JSON literals such as 1e999), wrong types, removed fields,
 * degenerate rings, bodies that are not schedules at all. Not a test file itself.
 */
import fc from 'fast-check';
import type { buildApp } from '../../src/app.js';
import { ERROR_CATALOGUE } from '../../src/http/error-catalogue.js';
import { FIELD_RANGES, type FieldRange } from '../../src/http/schedule-schema.js';

type App = Awaited<ReturnType<typeof buildApp>>;
type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
type Path = (string | number)[];

/** One generated request, and what the answer must show. */
export interface RequestCase {
  readonly url: '/v1/checks' | '/v1/plans';
  /** The body as sent (may be invalid JSON on purpose). */
  readonly text: string;
  /** Unknown fields added to a body that is otherwise valid: a 200 must warn about each, by path. */
  readonly unknownPaths: readonly string[];
  /** What was done to the valid schedule, for the failure report. */
  readonly breakages: readonly string[];
}

/** Names of built-in object properties, the keys that crashed the unknown-field walk. */
export const BUILT_IN_NAMES = [
  'constructor',
  'toString',
  'toLocaleString',
  'valueOf',
  'hasOwnProperty',
  'isPrototypeOf',
  'propertyIsEnumerable',
  '__proto__',
  '__defineGetter__',
  '__lookupSetter__',
  'prototype',
  'length',
  'then',
] as const;

/** Numbers that are well-formed JSON but extreme, and raw literals JSON.parse turns into ±Infinity or 0. */
const EXTREME_NUMBERS: readonly number[] = [
  0,
  -0,
  -1,
  1e-300,
  1e-308,
  5e-324,
  1e308,
  -1e308,
  Number.MAX_VALUE,
  Number.MAX_SAFE_INTEGER,
  1e12,
  -1e12,
  1e6,
  0.5,
  2.5,
];
const RAW_LITERALS = ['1e999', '-1e999', '1e-999', '123456789012345678901234567890'];
const NAN_ISH = ['NaN', 'Infinity', '-Infinity', '1e999', '', ' ', '0x10', '1,5', 'null', '∞'];
const WRONG_TYPES: readonly Json[] = ['x', '', true, false, null, [], {}, [[]], { a: 1 }, ['1', '2'], 'NaN'];

const RAW = '@@raw:';
/** A value written into the JSON text as a raw literal (e.g. 1e999), not as a string. */
const raw = (literal: string): string => `${RAW}${literal}@@`;

const NUMERIC_FIELDS: readonly [Path, FieldRange][] = [
  [['process', 'line_speed_m_per_min'], FIELD_RANGES.line_speed_m_per_min],
  [['process', 'throughput_kg_per_h'], FIELD_RANGES.throughput_kg_per_h],
  [['process', 'melt_density_g_per_cm3'], FIELD_RANGES.density_g_per_cm3],
  [['process', 'solid_density_g_per_cm3'], FIELD_RANGES.density_g_per_cm3],
  [['process', 'die_swell'], FIELD_RANGES.die_swell],
  [['process', 'power_law_n'], FIELD_RANGES.power_law_n],
  [['process', 'power_law_m_pa_s_n'], FIELD_RANGES.power_law_m_pa_s_n],
  [['process', 'die_temperature_c'], FIELD_RANGES.die_temperature_c],
  [['process', 'die_land_length_mm'], FIELD_RANGES.die_land_length_mm],
  [['limits', 'min_wall_mm'], FIELD_RANGES.min_wall_mm],
  [['limits', 'max_wall_ratio'], FIELD_RANGES.max_wall_ratio],
  [['limits', 'fit_tolerance_mm'], FIELD_RANGES.fit_tolerance_mm],
  [['plates', 'pivot_hole_diameter_mm'], FIELD_RANGES.pivot_hole_diameter_mm],
  [['plates', 'ligament_mm'], FIELD_RANGES.ligament_mm],
  [['plates', 'thickness_mm'], FIELD_RANGES.thickness_mm],
  [['plates', 'depth_mm'], FIELD_RANGES.depth_mm],
  [['links', 'min_length_mm'], FIELD_RANGES.link_length_mm],
  [['links', 'max_length_mm'], FIELD_RANGES.link_length_mm],
  [['actuators', 'max_speed_deg_per_s'], FIELD_RANGES.max_speed_deg_per_s],
  [['actuators', 'max_accel_deg_per_s2'], FIELD_RANGES.max_accel_deg_per_s2],
  [['time_step_s'], FIELD_RANGES.time_step_s],
];
const INTEGER_FIELDS: readonly Path[] = [
  ['limits', 'max_plates'],
  ['limits', 'min_plates'],
  ['limits', 'plate_count'],
  ['actuators', 'count'],
];

/** A value inside a range, ends included (the ranges are inclusive). */
const inRange = (r: FieldRange) =>
  fc.oneof(fc.constantFrom(r.min, r.max), fc.double({ min: r.min, max: r.max, noNaN: true }));

/**
 * A star-shaped ring of n points around (cx, cy): radii 70–100 % of r, angles jittered by up to 15 % of a sector, so
 * no gap between neighbours exceeds 1.3 sectors (156° for a triangle) and every edge stays at least
 * 0.7 r cos 78° ≈ 0.146 r from the centre.
 */
const starRing = (cx: number, cy: number, r: number, maxPoints: number) =>
  fc
    .array(fc.tuple(fc.double({ min: 0.7, max: 1, noNaN: true }), fc.double({ min: -0.15, max: 0.15, noNaN: true })), {
      minLength: 3,
      maxLength: maxPoints,
    })
    .map((jitter) =>
      jitter.map(([k, da], i): [number, number] => {
        const a = (2 * Math.PI * (i + da)) / jitter.length;
        return [round(cx + k * r * Math.cos(a)), round(cy + k * r * Math.sin(a))];
      }),
    );

const round = (x: number) => Math.round(x * 1e4) / 1e4;

/** A valid schedule for `POST /v1/checks`: 1–3 stations of 3–8 point rings, some with a hole, optional settings. */
export const checkSchedule = fc
  .record({
    cx: fc.double({ min: -500, max: 500, noNaN: true }),
    cy: fc.double({ min: -500, max: 500, noNaN: true }),
    r: fc.double({ min: 2, max: 300, noNaN: true }),
    stations: fc.integer({ min: 1, max: 3 }),
    withHole: fc.boolean(),
    settings: fc.subarray([...NUMERIC_FIELDS], { maxLength: 6 }),
  })
  .chain(({ cx, cy, r, stations, withHole, settings }) =>
    fc.record({
      rings: fc.array(starRing(cx, cy, r, 8), { minLength: stations, maxLength: stations }),
      values: fc.tuple(...settings.map(([, range]) => inRange(range))),
      hole: fc.constant(withHole),
      settings: fc.constant(settings),
      cx: fc.constant(cx),
      cy: fc.constant(cy),
      r: fc.constant(r),
    }),
  )
  .map(({ rings, values, hole, settings, cx, cy, r }) => {
    const body: { [key: string]: Json } = {
      name: 'generated',
      stations: rings.map((outer, i) => ({
        position_m: i * 0.5,
        orifice: {
          outer,
          // inside every ring: its corners lie 0.07 r from the centre, every edge at least 0.146 r
          ...(hole ? { holes: [square(cx, cy, 0.05 * r).reverse()] } : {}),
        },
      })),
    };
    settings.forEach(([path], k) => {
      setAt(body, path, values[k] as number);
    });
    // settings drawn independently may contradict each other (min_length ≥ max_length): both answers are fine
    return body;
  });

function square(cx: number, cy: number, h: number): [number, number][] {
  return [
    [round(cx - h), round(cy - h)],
    [round(cx + h), round(cy - h)],
    [round(cx + h), round(cy + h)],
    [round(cx - h), round(cy + h)],
  ];
}

/**
 * A valid schedule for `POST /v1/plans`, kept tiny because a plan runs the chain fit synchronously: two stations of
 * at most 7 points (a 40 × 10 mm strip, then the same with a bump on its top edge), at most 3 plates, 1 actuator.
 */
export const planSchedule = fc
  .record({
    height: fc.double({ min: 1, max: 5, noNaN: true }),
    at: fc.double({ min: 12, max: 28, noNaN: true }),
    halfWidth: fc.double({ min: 3, max: 8, noNaN: true }),
    maxPlates: fc.integer({ min: 1, max: 3 }),
    tolerance: fc.constantFrom(0.3, 0.5, 1),
  })
  .map(({ height, at, halfWidth, maxPlates, tolerance }) => {
    const body: { [key: string]: Json } = {
      limits: { max_plates: maxPlates, fit_tolerance_mm: tolerance },
      actuators: { count: 1 },
      stations: [
        { position_m: 0, orifice: { outer: square10() } },
        {
          position_m: 1,
          orifice: {
            outer: [
              [0, 0],
              [40, 0],
              [40, 10],
              [round(at + halfWidth), 10],
              [round(at), round(10 + height)],
              [round(at - halfWidth), 10],
              [0, 10],
            ],
          },
        },
      ],
    };
    return body;
  });

function square10(): [number, number][] {
  return [
    [0, 0],
    [40, 0],
    [40, 10],
    [0, 10],
  ];
}

/** One breakage: what it did, as a function of the body and the random draws it needs. */
type Breakage = (body: Json) => { body: Json; note: string; unknownPath?: string };

const objectPaths = (v: Json, path: Path = [], out: Path[] = []): Path[] => {
  if (Array.isArray(v)) {
    for (const [i, x] of v.entries()) objectPaths(x, [...path, i], out);
  } else if (v !== null && typeof v === 'object') {
    out.push(path);
    for (const [k, x] of Object.entries(v)) objectPaths(x, [...path, k], out);
  }
  return out;
};
const allPaths = (v: Json, path: Path = [], out: Path[] = []): Path[] => {
  if (path.length > 0) out.push(path);
  if (Array.isArray(v)) {
    for (const [i, x] of v.entries()) allPaths(x, [...path, i], out);
  } else if (v !== null && typeof v === 'object')
    for (const [k, x] of Object.entries(v)) allPaths(x, [...path, k], out);
  return out;
};
const ringPaths = (v: Json): Path[] =>
  allPaths(v).filter((p) => p.at(-1) === 'outer' || (p.at(-2) === 'holes' && typeof p.at(-1) === 'number'));

function getAt(body: Json, path: Path): Json | undefined {
  let node: Json | undefined = body;
  for (const k of path) {
    if (node === null || typeof node !== 'object') return undefined;
    node = Object.hasOwn(node, k) ? (node as Record<string | number, Json>)[k] : undefined;
  }
  return node;
}

/** Sets a value at a path, creating objects on the way; an own property even for `__proto__`. */
function setAt(body: Json, path: Path, value: Json): void {
  let node = body as Record<string | number, Json>;
  for (const k of path.slice(0, -1)) {
    if (!Object.hasOwn(node, k) || node[k] === null || typeof node[k] !== 'object') defineOwn(node, k, {});
    node = node[k] as Record<string | number, Json>;
  }
  defineOwn(node, path.at(-1)!, value);
}

function defineOwn(node: Record<string | number, Json>, key: string | number, value: Json): void {
  Object.defineProperty(node, key, { value, enumerable: true, writable: true, configurable: true });
}

function formatPath(path: Path): string {
  let out = '';
  for (const k of path) out += typeof k === 'number' ? `[${k}]` : out === '' ? k : `.${k}`;
  return out;
}

const pick = <T>(items: readonly T[]) => fc.nat().map((n) => items[n % items.length]!);

const extraKey = fc
  .record({
    name: fc.oneof(
      fc.constantFrom(...BUILT_IN_NAMES),
      fc.string({ maxLength: 12 }).map((s) => `x_${s}`),
    ),
    value: fc.jsonValue({ maxDepth: 2 }) as fc.Arbitrary<Json>,
    where: fc.nat(),
  })
  .map(
    ({ name, value, where }): Breakage =>
      (body) => {
        const places = objectPaths(body);
        if (places.length === 0) return { body, note: 'no object to add a key to' };
        const place = places[where % places.length]!;
        setAt(body, [...place, name], value);
        return { body, note: `extra key ${formatPath([...place, name])}`, unknownPath: formatPath([...place, name]) };
      },
  );

const badNumber = fc
  .record({
    field: fc.oneof(pick(NUMERIC_FIELDS.map(([p]) => p)), pick(INTEGER_FIELDS)),
    value: fc.oneof(
      fc.constantFrom(...EXTREME_NUMBERS),
      fc.double(), // NaN and ±Infinity become null in JSON.stringify
      fc.constantFrom(...RAW_LITERALS).map(raw),
      fc.constantFrom(...NAN_ISH),
      fc.integer({ min: -1000, max: 1000 }),
    ),
  })
  .map(
    ({ field, value }): Breakage =>
      (body) => {
        setAt(body, field, value);
        return { body, note: `${formatPath(field)} = ${String(value)}` };
      },
  );

const badCoordinate = fc
  .record({
    which: fc.nat(),
    vertex: fc.nat(),
    axis: fc.integer({ min: 0, max: 1 }),
    value: fc.oneof(
      fc.constantFrom(...EXTREME_NUMBERS),
      fc.constantFrom(...RAW_LITERALS).map(raw),
      fc.constantFrom(...NAN_ISH),
    ),
  })
  .map(
    ({ which, vertex, axis, value }): Breakage =>
      (body) => {
        const rings = ringPaths(body);
        if (rings.length === 0) return { body, note: 'no ring' };
        const ring = rings[which % rings.length]!;
        const pts = getAt(body, ring);
        if (!Array.isArray(pts) || pts.length === 0) return { body, note: 'empty ring' };
        const at = [...ring, vertex % pts.length, axis];
        setAt(body, at, value);
        return { body, note: `${formatPath(at)} = ${String(value)}` };
      },
  );

const DEGENERATE_RINGS: readonly [string, Json][] = [
  [
    'collinear',
    [
      [1, 1],
      [2, 1],
      [3, 1],
    ],
  ],
  [
    'two distinct points',
    [
      [1, 1],
      [2, 2],
      [1, 1],
      [2, 2],
    ],
  ],
  [
    'one point',
    [
      [1, 1],
      [1, 1],
      [1, 1],
    ],
  ],
  [
    'speck',
    [
      [1, 1],
      [1.0000001, 1],
      [1, 1.0000001],
    ],
  ],
  [
    'folded edge',
    [
      [0, 0],
      [10, 0],
      [5, 0],
      [5, 5],
    ],
  ],
  [
    'bow-tie',
    [
      [0, 0],
      [10, 10],
      [10, 0],
      [0, 10],
    ],
  ],
  [
    'huge',
    [
      [0, 0],
      [1e6, 0],
      [0, 1e6],
    ],
  ],
  [
    'beyond ±2000 mm',
    [
      [1990, 1990],
      [2010, 1990],
      [2010, 2010],
    ],
  ],
  ['too short', [[0, 0]]],
  ['empty', []],
  [
    'points of three coordinates',
    [
      [0, 0, 0],
      [1, 0, 0],
      [1, 1, 0],
    ],
  ],
];

const degenerateRing = fc.record({ which: fc.nat(), ring: pick(DEGENERATE_RINGS) }).map(
  ({ which, ring: [label, ring] }): Breakage =>
    (body) => {
      const rings = ringPaths(body);
      if (rings.length === 0) return { body, note: 'no ring' };
      const at = rings[which % rings.length]!;
      setAt(body, at, structuredClone(ring));
      return { body, note: `${formatPath(at)} ${label}` };
    },
);

const wrongType = fc.record({ where: fc.nat(), value: fc.constantFrom(...WRONG_TYPES) }).map(
  ({ where, value }): Breakage =>
    (body) => {
      const paths = allPaths(body);
      if (paths.length === 0) return { body, note: 'nothing to retype' };
      const at = paths[where % paths.length]!;
      setAt(body, at, structuredClone(value));
      return { body, note: `${formatPath(at)} = ${JSON.stringify(value)}` };
    },
);

const removal = fc.nat().map(
  (where): Breakage =>
    (body) => {
      const paths = allPaths(body).filter((p) => typeof p.at(-1) === 'string');
      if (paths.length === 0) return { body, note: 'nothing to remove' };
      const at = paths[where % paths.length]!;
      const parent = getAt(body, at.slice(0, -1)) as Record<string, Json>;
      delete parent[at.at(-1) as string];
      return { body, note: `removed ${formatPath(at)}` };
    },
);

const NOT_A_SCHEDULE: readonly string[] = [
  '[]',
  '42',
  '"schedule"',
  'null',
  'true',
  '{}',
  '{"stations":[]}',
  '{"stations":null}',
  '{"stations":{}}',
  '{"stations":[null]}',
  '{"stations":[{}]}',
  '{"stations":[{"position_m":0}]}',
  '{"stations":[{"position_m":0,"orifice":null}]}',
  '{"stations":[{"position_m":0,"orifice":{"outer":null}}]}',
  '{',
  '{"stations": [,]}',
  '',
  'NaN',
  '{"a":1,}',
  '{"__proto__":{"polluted":true}}',
  '{"constructor":{"prototype":{"polluted":true}}}',
  `${'['.repeat(2000)}${']'.repeat(2000)}`,
];

/** Applies 0–3 breakages to a valid schedule (0: the valid schedule itself), or sends something else entirely. */
function requestCase(url: RequestCase['url'], valid: fc.Arbitrary<{ [key: string]: Json }>): fc.Arbitrary<RequestCase> {
  const breakage = fc.oneof(extraKey, badNumber, badCoordinate, degenerateRing, wrongType, removal);
  const edited = fc.tuple(valid, fc.array(breakage, { maxLength: 3 })).map(([body, breakages]): RequestCase => {
    // breakages edit in place: work on a copy, since fast-check reuses generated values while shrinking
    let current: Json = structuredClone(body);
    const notes: string[] = [];
    const unknown: string[] = [];
    for (const b of breakages) {
      const r = b(current);
      current = r.body;
      notes.push(r.note);
      if (r.unknownPath !== undefined) unknown.push(r.unknownPath);
    }
    const text = JSON.stringify(current).replace(/"@@raw:([^"@]*)@@"/g, '$1');
    // the unknown-field promise holds for a body whose only change is the added key
    const onlyKey = breakages.length === 1 && unknown.length === 1;
    return { url, text, unknownPaths: onlyKey ? unknown : [], breakages: notes };
  });
  const other = fc
    .constantFrom(...NOT_A_SCHEDULE)
    .map((text): RequestCase => ({ url, text, unknownPaths: [], breakages: ['not a schedule'] }));
  return fc.oneof({ weight: 9, arbitrary: edited }, { weight: 1, arbitrary: other });
}

/** Requests for `POST /v1/checks`. */
export const checkRequest = requestCase('/v1/checks', checkSchedule);
/** Requests for `POST /v1/plans` (tiny schedules, see `planSchedule`). */
export const planRequest = requestCase('/v1/plans', planSchedule);

/** The answer to one request, as the property judges it. */
export interface Answer {
  readonly status: number;
  readonly body: unknown;
  /** Status of `GET` on the plan's Location, for a 202. */
  readonly readBack?: { readonly status: number; readonly body: unknown };
}

const FIELD_PATH = /^(\(body\)|[A-Za-z_$][\w$]*(\[\d+\])*(\.[A-Za-z_$][\w$]*(\[\d+\])*)*)$/;

/**
 * What every answer must show; returns the broken promise in words, or null. No 5xx; every 4xx speaks the catalogue
 * (its code with its status, a sentence, `request_id`), and an `invalid_schedule` names a field path in each detail;
 * a 200 check warns about each unknown field added; a 202 plan reads back with 200.
 */
export function brokenPromise(c: RequestCase, a: Answer): string | null {
  if (a.status >= 500) return `answered ${a.status}: ${JSON.stringify(a.body)}`;
  const body = a.body as Record<string, unknown>;
  if (a.status >= 400) {
    const code = body.error as keyof typeof ERROR_CATALOGUE;
    if (!Object.hasOwn(ERROR_CATALOGUE, code)) return `error code ${String(code)} is not in the catalogue`;
    if (ERROR_CATALOGUE[code].status !== a.status) return `${code} came with ${a.status}`;
    if (typeof body.message !== 'string' || body.message === '') return 'an error without a message';
    if (typeof body.request_id !== 'string') return 'an error without request_id';
    const details = body.details as { path: unknown; message: unknown }[];
    if (!Array.isArray(details)) return 'an error without details';
    if (code === 'invalid_schedule') {
      if (details.length === 0) return 'invalid_schedule without details';
      for (const d of details) {
        if (typeof d.path !== 'string' || !FIELD_PATH.test(d.path))
          return `detail path ${String(d.path)} is not a path`;
        if (typeof d.message !== 'string' || d.message === '') return `detail at ${d.path} has no message`;
      }
    }
    return null;
  }
  if (c.url === '/v1/checks') {
    if (a.status !== 200) return `check answered ${a.status}`;
    const warned = (body.findings as { code: string; message: string }[])
      .filter((f) => f.code === 'UNKNOWN_FIELD')
      .map((f) => f.message);
    for (const p of c.unknownPaths) {
      if (!warned.some((m) => m.includes(` ${p} `))) return `no UNKNOWN_FIELD warning for ${p}`;
    }
    return null;
  }
  if (a.status !== 202) return `plan answered ${a.status}`;
  if (a.readBack?.status !== 200)
    return `the plan read back with ${a.readBack?.status}: ${JSON.stringify(a.readBack?.body)}`;
  const status = (a.readBack.body as { status?: string }).status;
  if (!['done', 'incomplete', 'failed'].includes(status ?? '')) return `the plan read back with status ${status}`;
  return null;
}

/** Sends one case through the app (fastify's inject: same routing, parsing and serialisation as the socket). */
export async function answer(server: Pick<App, 'inject'>, c: RequestCase): Promise<Answer> {
  const res = await server.inject({
    method: 'POST',
    url: c.url,
    headers: { 'content-type': 'application/json' },
    payload: c.text,
  });
  const body = parse(res.body);
  if (res.statusCode !== 202) return { status: res.statusCode, body };
  // plans are computed in the background: read the Location until the plan has finished (at most 60 s)
  const started = Date.now();
  for (;;) {
    const back = await server.inject({ method: 'GET', url: res.headers.location as string });
    const status = (parse(back.body) as { status?: string } | null)?.status;
    const waiting = back.statusCode === 200 && (status === 'queued' || status === 'running');
    if (!waiting || Date.now() - started > 60_000) {
      return { status: res.statusCode, body, readBack: { status: back.statusCode, body: parse(back.body) } };
    }
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
}

function parse(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return text;
  }
}

/** A GET of a finished plan's download with an abused query, path part or header. */
export interface DownloadCase {
  /** Which of the plans the test made: a plan that is done, or one that failed (it has no mechanism). */
  readonly plan: 'done' | 'failed';
  /** The path below /v1/plans/{id}/, query included, as sent (percent-escapes and all). */
  readonly path: string;
  readonly headers: Readonly<Record<string, string>>;
}

const DOWNLOAD_FILES = [
  'setpoints.csv',
  'setpoints.json',
  'cam-table.csv',
  'cam-table.json',
  'puller-speed.csv',
  'puller-speed.json',
  'motion.json',
  'plates.dxf',
  'die-body.dxf',
  'stations.dxf',
  'preview.svg',
] as const;
const PART_IDS = [
  'plate_1',
  'plate_4',
  'link_1',
  'plate_0',
  'plate_-1',
  'plate_99999999999999999999',
  'slider_start',
  'plate_1_slide',
  '..',
  '%2e%2e',
  '%2F',
  '%00',
  '__proto__',
  'constructor',
  'a'.repeat(101),
];
const QUERY_KEYS = ['points', 'motion', 'dimensions', 'x', '__proto__', 'points[]'];
const QUERY_VALUES = [
  '0',
  '-1',
  '1',
  '2',
  '1e9',
  '10001',
  '10002',
  '000101',
  '2.0',
  'abc',
  '',
  'hot',
  'cold',
  'law',
  'tracked',
  '%00',
  '%E2%88%9E',
  '%zz',
  'x'.repeat(500),
];
const IF_NONE_MATCH = ['*', '"x"', 'W/"x"', '', ',,', '"x", *', ' * '];

/** Downloads of a done or failed plan with 0–3 abused query parameters (repeated keys too) and odd headers. */
export const downloadRequest: fc.Arbitrary<DownloadCase> = fc
  .record({
    plan: fc.constantFrom('done' as const, 'failed' as const),
    file: fc.oneof(
      fc.constantFrom(...DOWNLOAD_FILES),
      fc
        .oneof(
          fc.constantFrom(...PART_IDS),
          fc.string({ maxLength: 20 }).map((s) => encodeURIComponent(s)),
        )
        .map((part) => `plates/${part}.dxf`),
    ),
    query: fc.array(
      fc.tuple(
        fc.constantFrom(...QUERY_KEYS),
        fc.oneof(
          fc.constantFrom(...QUERY_VALUES),
          fc.string({ maxLength: 12 }).map((s) => encodeURIComponent(s)),
        ),
      ),
      { maxLength: 3 },
    ),
    ifNoneMatch: fc.option(fc.constantFrom(...IF_NONE_MATCH), { nil: undefined }),
    accept: fc.option(fc.constantFrom('text/csv', 'application/xml', '*/*;q=0', ''), { nil: undefined }),
  })
  .map(({ plan, file, query, ifNoneMatch, accept }) => ({
    plan,
    path: query.length === 0 ? file : `${file}?${query.map(([k, v]) => `${k}=${v}`).join('&')}`,
    headers: {
      ...(ifNoneMatch === undefined ? {} : { 'if-none-match': ifNoneMatch }),
      ...(accept === undefined ? {} : { accept }),
    },
  }));

/** The answer to a download request, and the same request without If-None-Match when it was answered 304. */
export interface DownloadAnswer {
  readonly status: number;
  readonly headers: Readonly<Record<string, unknown>>;
  readonly body: unknown;
  readonly unconditionalStatus?: number;
}

/**
 * What every download answer must show; returns the broken promise in words, or null. No 5xx; a 4xx speaks the
 * catalogue and carries no ETag (a refusal is nothing to revalidate); a 304 only where the same request without
 * If-None-Match answers 200.
 */
export function brokenDownloadPromise(a: DownloadAnswer): string | null {
  if (a.status >= 500) return `answered ${a.status}: ${JSON.stringify(a.body)}`;
  if (a.status === 304) {
    return a.unconditionalStatus === 200 ? null : `304 for a download that answers ${a.unconditionalStatus}`;
  }
  if (a.status >= 400) {
    const body = a.body as Record<string, unknown>;
    const code = body.error as keyof typeof ERROR_CATALOGUE;
    if (!Object.hasOwn(ERROR_CATALOGUE, code)) return `error code ${String(code)} is not in the catalogue`;
    if (ERROR_CATALOGUE[code].status !== a.status) return `${code} came with ${a.status}`;
    if (typeof body.message !== 'string' || body.message === '') return 'an error without a message';
    if (typeof body.request_id !== 'string') return 'an error without request_id';
    if (!Array.isArray(body.details)) return 'an error without details';
    if (a.headers.etag !== undefined) return `a ${a.status} with an ETag`;
    return null;
  }
  return a.status === 200 ? null : `answered ${a.status}`;
}

/** Sends one download case for the plan ids given; a 304 is asked again without If-None-Match. */
export async function downloadAnswer(
  server: Pick<App, 'inject'>,
  ids: Readonly<Record<DownloadCase['plan'], string>>,
  c: DownloadCase,
): Promise<DownloadAnswer> {
  const url = `/v1/plans/${ids[c.plan]}/${c.path}`;
  const res = await server.inject({ method: 'GET', url, headers: { ...c.headers } });
  const answer = { status: res.statusCode, headers: res.headers, body: parse(res.body) };
  if (res.statusCode !== 304) return answer;
  const { 'if-none-match': _, ...rest } = c.headers;
  const again = await server.inject({ method: 'GET', url, headers: rest });
  return { ...answer, unconditionalStatus: again.statusCode };
}
