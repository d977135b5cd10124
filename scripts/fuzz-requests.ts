/**
 * Sends many generated requests (tests/http/request-arbitraries.ts) through the app and reports what came back:
 * counts by status and error code, every broken promise (a 5xx, an error outside the catalogue, a detail without a
 * field path, an unknown field not warned about, a plan that does not read back) with the request, and the time taken.
 *
 *   npx tsx scripts/fuzz-requests.ts --checks 10000 --plans 1500 [--downloads 2500] [--seed 123]
 *
 * Plans are computed by the app's worker pool: each 202 is read back until the plan has finished. Downloads are asked
 * of a done and a failed plan with abused queries, part ids and If-None-Match (no 5xx, refusals catalogued without an
 * ETag, 304 only for a download that exists). The same property
 * runs in CI (tests/http/property-bad-input.test.ts) with FUZZ_RUNS requests (800 by default).
 * Exit code 1 when any promise was broken. The CI property test runs a fixed-seed sample of the same generators.
 */
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import fc from 'fast-check';
import { pino } from 'pino';
import { buildApp } from '../src/app.js';
import {
  answer,
  brokenDownloadPromise,
  brokenPromise,
  checkRequest,
  type DownloadCase,
  downloadAnswer,
  downloadRequest,
  planRequest,
  type RequestCase,
} from '../tests/http/request-arbitraries.js';

const { values } = parseArgs({
  options: {
    checks: { type: 'string', default: '4000' },
    plans: { type: 'string', default: '300' },
    downloads: { type: 'string', default: '1000' },
    seed: { type: 'string' },
  },
});
const seed = values.seed === undefined ? Date.now() % 2 ** 31 : Number(values.seed);
const app = await buildApp({ logger: pino({ level: 'silent' }) });
await app.ready();

let failures = 0;
for (const [label, arbitrary, runs] of [
  ['POST /v1/checks', checkRequest, Number(values.checks)],
  ['POST /v1/plans', planRequest, Number(values.plans)],
] as const) {
  const counts = new Map<string, number>();
  const started = performance.now();
  let slowest = 0;
  for (const c of fc.sample(arbitrary as fc.Arbitrary<RequestCase>, { numRuns: runs, seed })) {
    const t = performance.now();
    const a = await answer(app, c);
    slowest = Math.max(slowest, performance.now() - t);
    const code = (a.body as { error?: string } | null)?.error;
    const key = `${a.status}${code ? ` ${code}` : ''}${a.readBack ? ` → GET ${a.readBack.status}` : ''}`;
    counts.set(key, (counts.get(key) ?? 0) + 1);
    const broken = brokenPromise(c, a);
    if (broken !== null) {
      failures++;
      console.log(
        `BROKEN ${label}: ${broken}\n  breakages: ${c.breakages.join('; ')}\n  body: ${c.text.slice(0, 500)}`,
      );
    }
  }
  const ms = performance.now() - started;
  console.log(
    `${label}: ${runs} requests in ${(ms / 1000).toFixed(1)} s (${(ms / runs).toFixed(1)} ms each, slowest ${slowest.toFixed(0)} ms), seed ${seed}`,
  );
  for (const [key, n] of [...counts].sort()) console.log(`  ${key}: ${n}`);
}
{
  // downloads of a done plan (the demo) and a failed one (two stations of one shape: nothing moves)
  const finished = async (body: { stations: unknown[] }) => {
    const id = (await app.inject({ method: 'POST', url: '/v1/plans', payload: body })).json().id as string;
    while (['queued', 'running'].includes(app.plans.store.entry(id)?.status ?? '')) {
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    return id;
  };
  const demo = JSON.parse(readFileSync(new URL('../fixtures/demo-edging-strip.json', import.meta.url), 'utf8'));
  const ids = {
    done: await finished(demo),
    failed: await finished({ ...demo, stations: [demo.stations[0], { ...demo.stations[0], position_m: 1 }] }),
  };
  const runs = Number(values.downloads);
  const counts = new Map<string, number>();
  const started = performance.now();
  for (const c of fc.sample(downloadRequest as fc.Arbitrary<DownloadCase>, { numRuns: runs, seed })) {
    const a = await downloadAnswer(app, ids, c);
    const code = (a.body as { error?: string } | null)?.error;
    const key = `${a.status}${code ? ` ${code}` : ''}`;
    counts.set(key, (counts.get(key) ?? 0) + 1);
    const broken = brokenDownloadPromise(a);
    if (broken !== null) {
      failures++;
      console.log(`BROKEN GET download: ${broken}\n  GET ${c.path} ${JSON.stringify(c.headers)} (${c.plan} plan)`);
    }
  }
  const ms = performance.now() - started;
  console.log(`GET downloads: ${runs} requests in ${(ms / 1000).toFixed(1)} s, seed ${seed}`);
  for (const [key, n] of [...counts].sort()) console.log(`  ${key}: ${n}`);
}
await app.close();
console.log(failures === 0 ? 'no broken promise' : `${failures} broken promises`);
process.exit(failures === 0 ? 0 : 1);
