import { connect } from 'node:net';
import { pino } from 'pino';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../src/app.js';
import { ERROR_CATALOGUE } from '../../src/http/error-catalogue.js';
import { readablePlan } from '../../src/http/readable-plan-report.js';
import { unreadableFigure } from '../../src/http/readable-report.js';
import { FIELD_RANGES } from '../../src/http/schedule-schema.js';
import { toFindingWire } from '../../src/http/to-check-report.js';
import { planResult } from '../../src/jobs/index.js';
import { SqlitePlanStore, scheduleHash, scheduleParts } from '../../src/store/index.js';
import { makeTestApp } from '../support/test-app.js';

/**
 * Issue 9, "bad input never a 5xx": one test per case the request generator found. References: the HTTP status
 * meanings of RFC 9110; JSON (RFC 8259) has no NaN or Infinity; the ranges are common practice, no source
 * (src/http/schedule-schema.ts FIELD_RANGES).
 */
type App = Awaited<ReturnType<typeof buildApp>>;
const store = new SqlitePlanStore(':memory:');
let app: App;
beforeAll(async () => {
  app = await makeTestApp({ store });
});
afterAll(async () => {
  await app.close();
  store.close();
});

const rect = [
  [0, 0],
  [40, 0],
  [40, 10],
  [0, 10],
];
const bump = [
  [0, 0],
  [40, 0],
  [40, 10],
  [25, 10],
  [20, 13],
  [15, 10],
  [0, 10],
];
const oneStation = (extra: Record<string, unknown> = {}) => ({
  ...extra,
  stations: [{ position_m: 0, orifice: { outer: rect } }],
});
/** Two tiny stations that plan in a fraction of a second (one plate count, one actuator). */
const twoStations = (extra: Record<string, unknown> = {}) => ({
  limits: { max_plates: 3, fit_tolerance_mm: 0.5 },
  actuators: { count: 1 },
  ...extra,
  stations: [
    { position_m: 0, orifice: { outer: rect } },
    { position_m: 1, orifice: { outer: bump } },
  ],
});
const postRaw = (url: string, text: string) =>
  request(app.server).post(url).set('content-type', 'application/json').send(text);
const post = (url: string, body: unknown) => postRaw(url, JSON.stringify(body));

/** Every error body: a catalogue code with its status, a sentence, details, and the request id. */
function expectCatalogued(res: request.Response, code: keyof typeof ERROR_CATALOGUE): void {
  expect(res.status).toBe(ERROR_CATALOGUE[code].status);
  expect(res.body.error).toBe(code);
  expect(typeof res.body.message).toBe('string');
  expect(Array.isArray(res.body.details)).toBe(true);
  expect(res.body.request_id).toBe(res.headers['x-request-id']);
}

describe('unknown fields named like built-in object properties', () => {
  it('warns about constructor, toString, hasOwnProperty and valueOf at any depth instead of failing', async () => {
    const body = oneStation({ constructor: 1, process: { toString: 'x', hasOwnProperty: {} } }) as {
      stations: Record<string, unknown>[];
    };
    Object.assign(body.stations[0]!.orifice as object, { valueOf: [1] });
    Object.assign(body.stations[0]!, { isPrototypeOf: null });
    const res = await post('/v1/checks', body);
    expect(res.status).toBe(200);
    const paths = res.body.findings
      .filter((f: { code: string }) => f.code === 'UNKNOWN_FIELD')
      .map((f: { message: string }) => f.message.split(' ')[2]);
    expect(paths.sort()).toEqual(
      [
        'constructor',
        'process.toString',
        'process.hasOwnProperty',
        'stations[0].orifice.valueOf',
        'stations[0].isPrototypeOf',
      ].sort(),
    );
  });

  it('refuses a body with a __proto__ key (any depth) as malformed_json, and nothing is polluted', async () => {
    for (const text of [
      '{"__proto__":{"polluted":1},"stations":[]}',
      '{"stations":[{"position_m":0,"orifice":{"outer":[[0,0],[1,0],[1,1]],"__proto__":{"polluted":1}}}]}',
      '{"constructor":{"prototype":{"polluted":1}},"stations":[]}',
    ]) {
      const res = await postRaw('/v1/checks', text);
      expectCatalogued(res, 'malformed_json');
      expect(res.body.message).toMatch(/__proto__/);
    }
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});

describe('extreme but well-formed numbers', () => {
  const cases: [string, Record<string, unknown>, string][] = [
    ['power_law_n 1e-300', { process: { power_law_n: 1e-300 } }, 'process.power_law_n'],
    ['throughput 1e308', { process: { throughput_kg_per_h: 1e308 } }, 'process.throughput_kg_per_h'],
    ['line speed 1e-308', { process: { line_speed_m_per_min: 1e-308 } }, 'process.line_speed_m_per_min'],
    ['min_wall_mm 1e12', { limits: { min_wall_mm: 1e12 } }, 'limits.min_wall_mm'],
    ['power-law consistency 1e300', { process: { power_law_m_pa_s_n: 1e300 } }, 'process.power_law_m_pa_s_n'],
    ['melt density 1e-200', { process: { melt_density_g_per_cm3: 1e-200 } }, 'process.melt_density_g_per_cm3'],
    ['link length 1e200', { links: { max_length_mm: 1e200 } }, 'links.max_length_mm'],
  ];
  for (const [label, extra, path] of cases) {
    it(`${label}: 400 naming ${path} and its range, at /v1/checks and /v1/plans`, async () => {
      for (const url of ['/v1/checks', '/v1/plans']) {
        const res = await post(url, twoStations(extra));
        expectCatalogued(res, 'invalid_schedule');
        const detail = res.body.details.find((d: { path: string }) => d.path === path);
        expect(detail?.message).toMatch(/must lie within .+–.+ \(.*common practice, no source\)/);
      }
    });
  }

  it('states the range in words an engineer reads: line speed 0.01–200 m/min, throughput 0.01–10 000 kg/h', async () => {
    const res = await post('/v1/checks', oneStation({ process: { line_speed_m_per_min: 500 } }));
    expect(res.body.details[0].message).toMatch(/^line_speed_m_per_min must lie within 0\.01–200 m\/min/);
    const tp = await post('/v1/checks', oneStation({ process: { throughput_kg_per_h: 0 } }));
    expect(tp.body.details[0].message).toMatch(/0\.01–10\u202f000 kg\/h/);
  });

  it('accepts both ends of every range (ranges include their ends)', async () => {
    for (const end of ['min', 'max'] as const) {
      const process = {
        line_speed_m_per_min: FIELD_RANGES.line_speed_m_per_min[end],
        throughput_kg_per_h: FIELD_RANGES.throughput_kg_per_h[end],
        power_law_n: FIELD_RANGES.power_law_n[end],
        power_law_m_pa_s_n: FIELD_RANGES.power_law_m_pa_s_n[end],
        die_temperature_c: FIELD_RANGES.die_temperature_c[end],
        die_land_length_mm: FIELD_RANGES.die_land_length_mm[end],
      };
      const res = await post('/v1/checks', oneStation({ process }));
      expect(res.status).toBe(200);
    }
  });

  it('a number too large for JSON (1e999 reads as Infinity) is refused with its path', async () => {
    const res = await postRaw(
      '/v1/checks',
      '{"stations":[{"position_m":1e999,"orifice":{"outer":[[0,0],[1,0],[1,1]]}}]}',
    );
    expectCatalogued(res, 'invalid_schedule');
    expect(res.body.details[0].path).toBe('stations[0].position_m');
  });
});

describe('a stored plan is always readable', () => {
  it('a plan whose figures are not finite is stored and read back as failed with the place, not a 500', async () => {
    const created = await post('/v1/plans', twoStations());
    expect(created.status).toBe(202);
    const record = store.get(created.body.id)!;
    expect(record.plan.fit).not.toBeNull();
    // what an extreme input could leave behind: a NaN plate length and an infinite finding value
    const poisoned = {
      ...record,
      id: 'poisoned-plan',
      plan: {
        ...record.plan,
        fit: { ...record.plan.fit!, chain: { ...record.plan.fit!.chain, lengthsMm: [Number.NaN] } },
        findings: [{ code: 'X', severity: 'warning' as const, value: Number.POSITIVE_INFINITY, message: 'x' }],
      },
    };
    // stored the way a worker stores a finished plan (queued, claimed, finished with its written-out result)
    store.add({
      id: poisoned.id,
      createdAt: poisoned.createdAt,
      ...scheduleParts(poisoned.schedule),
      scheduleHash: scheduleHash(poisoned.schedule),
      requestFindings: [],
      client: null,
      idempotencyKey: null,
    });
    expect(store.claimNext(new Date().toISOString())?.entry.id).toBe('poisoned-plan');
    const written = planResult(poisoned, {
      scheduleHash: scheduleHash(poisoned.schedule),
      startedAt: null,
      finishedAt: new Date().toISOString(),
    });
    expect(written.unreadable?.path).toBe('chain.plate_lengths_mm[0]');
    expect(store.finish('poisoned-plan', written.result, new Date().toISOString())).toBe(true);
    const res = await request(app.server).get('/v1/plans/poisoned-plan');
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('failed');
    expect(res.body.error).toMatch(/chain\.plate_lengths_mm\[0\] is not a finite number \(NaN\)/);
    expect(res.body.findings).toEqual([{ code: 'X', severity: 'warning', message: 'x' }]);

    const checked = readablePlan(poisoned);
    expect(checked.unreadable?.path).toBe('chain.plate_lengths_mm[0]');
    expect(checked.record.plan.status).toBe('failed');
  });

  it('unreadableFigure finds the first number that is not finite, with its path (RFC 8259 has no NaN)', () => {
    expect(unreadableFigure({ a: [1, { b: Number.NaN }], c: Number.POSITIVE_INFINITY })).toEqual({
      path: 'a[1].b',
      problem: 'NaN',
    });
    expect(unreadableFigure({ a: [1, { b: 2 }], c: null, d: 'NaN' })).toBeNull();
  });

  it('toFindingWire leaves out a value, limit or place that is not a finite number', () => {
    const wire = toFindingWire({
      code: 'X',
      severity: 'info',
      value: Number.NaN,
      limit: Number.NEGATIVE_INFINITY,
      at: [Number.NaN, 0],
      message: 'm',
    });
    expect(wire).toEqual({ code: 'X', severity: 'info', message: 'm' });
  });
});

describe('degenerate holes and folded edges are refused like outer rings, with the path', () => {
  const withHole = (hole: number[][]) => ({
    stations: [{ position_m: 0, orifice: { outer: rect, holes: [hole] } }],
  });
  const cases: [string, unknown, string, RegExp][] = [
    [
      'a hole whose points lie on one line',
      withHole([
        [5, 5],
        [6, 5],
        [7, 5],
      ]),
      'stations[0].orifice.holes[0]',
      /encloses no area/,
    ],
    [
      'a hole of two distinct points',
      withHole([
        [5, 5],
        [6, 6],
        [5, 5],
      ]),
      'stations[0].orifice.holes[0]',
      /only 2 distinct points/,
    ],
    [
      'a speck of a hole (1e-7 mm across)',
      withHole([
        [5, 5],
        [5.0000001, 5],
        [5, 5.0000001],
      ]),
      'stations[0].orifice.holes[0]',
      /only 1 distinct point|no area/,
    ],
    [
      'a hole whose edge folds back over the previous one',
      withHole([
        [5, 2],
        [15, 2],
        [10, 2],
        [10, 6],
      ]),
      'stations[0].orifice.holes[0]',
      /folds back/,
    ],
    [
      'an outer edge that folds back over the previous one',
      {
        stations: [
          {
            position_m: 0,
            orifice: {
              outer: [
                [0, 0],
                [40, 0],
                [20, 0],
                [20, 10],
                [0, 10],
              ],
            },
          },
        ],
      },
      'stations[0].orifice.outer',
      /folds back/,
    ],
  ];
  for (const [label, body, path, message] of cases) {
    it(`${label}: 400 at ${path}`, async () => {
      const res = await post('/v1/checks', body);
      expectCatalogued(res, 'invalid_schedule');
      const detail = res.body.details.find((d: { path: string }) => d.path === path);
      expect(detail?.message).toMatch(message);
    });
  }
});

describe('every error through the catalogue, with request_id', () => {
  it('an id longer than 100 characters is 404 not_found', async () => {
    const res = await request(app.server).get(`/v1/plans/${'a'.repeat(300)}`);
    expectCatalogued(res, 'not_found');
  });

  it('a broken percent-escape in the URL is 400 malformed_request', async () => {
    for (const url of ['/v1/plans/%zz', '/v1/plans/%E0%A4%A']) {
      const res = await request(app.server).get(url);
      expectCatalogued(res, 'malformed_request');
    }
  });

  it('an unknown route, a wrong method, another content type, too large a body and broken JSON', async () => {
    expectCatalogued(await request(app.server).get('/v2/anything'), 'not_found');
    expectCatalogued(await request(app.server).delete('/v1/checks'), 'not_found');
    expectCatalogued(
      await request(app.server).post('/v1/checks').set('content-type', 'application/xml').send('<a/>'),
      'unsupported_media_type',
    );
    expectCatalogued(await postRaw('/v1/checks', `{"pad":"${'x'.repeat(6 * 1024 * 1024)}"}`), 'body_too_large');
    expectCatalogued(await postRaw('/v1/checks', '{"stations": [,]}'), 'malformed_json');
    expectCatalogued(await postRaw('/v1/checks', ''), 'malformed_json');
  });

  it('a body that is not an object, or stations of the wrong type, is 400 invalid_schedule naming the field', async () => {
    for (const [text, path] of [
      ['[]', '(body)'],
      ['42', '(body)'],
      ['"schedule"', '(body)'],
      ['null', '(body)'],
      ['{"stations":"none"}', 'stations'],
      ['{"stations":[{"position_m":"0","orifice":{"outer":[[0,0],[1,0],[1,1]]}}]}', 'stations[0].position_m'],
    ] as const) {
      const res = await postRaw('/v1/checks', text);
      expectCatalogued(res, 'invalid_schedule');
      expect(res.body.details.map((d: { path: string }) => d.path)).toContain(path);
    }
  });
});

describe('timeouts and requests the HTTP parser refuses', () => {
  /** Sends raw bytes to a fresh app with a 300 ms request timeout; resolves with all it answered before closing. */
  async function rawAnswer(bytes: string): Promise<{ text: string; waitedMs: number }> {
    const slow = await buildApp({
      logger: pino({ level: 'silent' }),
      timeouts: { requestMs: 300, connectionMs: 1000 },
    });
    await slow.listen({ host: '127.0.0.1', port: 0 });
    const { port } = slow.server.address() as { port: number };
    const started = performance.now();
    const text = await new Promise<string>((resolve, reject) => {
      const socket = connect(port, '127.0.0.1', () => {
        socket.write(bytes);
      });
      let got = '';
      socket.on('data', (d) => {
        got += d.toString();
      });
      socket.on('close', () => resolve(got));
      socket.on('error', reject);
    });
    const waitedMs = performance.now() - started;
    await slow.close();
    return { text, waitedMs };
  }

  /** The status line, the headers (names lower-cased) and the JSON body of a raw HTTP answer. */
  function readAnswer(text: string) {
    const [head = '', body = ''] = text.split('\r\n\r\n');
    const [statusLine = '', ...lines] = head.split('\r\n');
    const headers = Object.fromEntries(
      lines.map((l) => [l.slice(0, l.indexOf(':')).toLowerCase(), l.slice(l.indexOf(':') + 1).trim()]),
    );
    return { status: Number(statusLine.split(' ')[1]), headers, body: JSON.parse(body) };
  }

  it('a client that never finishes its request is answered 408 request_timeout from the catalogue and let go', async () => {
    const { text, waitedMs } = await rawAnswer(
      'POST /v1/checks HTTP/1.1\r\nHost: x\r\nContent-Type: application/json\r\nContent-Length: 100\r\n\r\n{"st',
    );
    const answer = readAnswer(text);
    expect(answer.status).toBe(408);
    expect(answer.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(answer.headers.connection).toBe('close');
    expect(answer.body).toEqual({
      error: 'request_timeout',
      message: "The request's headers and body did not all arrive within 0.3 s; the connection is closed.",
      details: [],
      request_id: answer.headers['x-request-id'],
    });
    expect(waitedMs).toBeLessThan(5000);
  });

  it('headers that never end are answered 408 request_timeout too', async () => {
    const answer = readAnswer((await rawAnswer('GET /healthz HTTP/1.1\r\nHost: x\r\n')).text);
    expect(answer.status).toBe(408);
    expect(answer.body.error).toBe('request_timeout');
  });

  it('headers larger than 16 KiB are answered 431 headers_too_large from the catalogue', async () => {
    const { text } = await rawAnswer(`GET /healthz HTTP/1.1\r\nHost: x\r\nX-Big: ${'a'.repeat(20_000)}\r\n\r\n`);
    const answer = readAnswer(text);
    expect(answer.status).toBe(431);
    expect(answer.body.error).toBe('headers_too_large');
    expect(answer.body.request_id).toBe(answer.headers['x-request-id']);
  });

  it('bytes that are not HTTP, or a Content-Length that is not a number, are answered 400 malformed_request', async () => {
    for (const bytes of ['GARBAGE\r\n\r\n', 'GET / HTTP/1.1\r\nHost: x\r\nContent-Length: abc\r\n\r\n']) {
      const answer = readAnswer((await rawAnswer(bytes)).text);
      expect(answer.status).toBe(400);
      expect(answer.body.error).toBe('malformed_request');
      expect(answer.body.message).toBe(
        'The request cannot be read as HTTP/1.1: check the request line and the headers.',
      );
    }
  });
});
