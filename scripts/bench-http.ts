/**
 * HTTP benchmark of the plan service on loopback (autocannon), against the real server in a child process (tsx
 * src/server.ts) on a fresh SQLite file, with the rate limit off:
 *   1. GET /v1/plans/{id} of a finished demo plan at 100 connections: requests/s, p50/p99 latency (target p99 < 10 ms),
 *      and at 1 connection (the service time without queueing)
 *   2. GET /v1/plans/{id}/setpoints.csv at 100 connections
 *   3. GET /healthz at 10 connections while demo plans keep the workers busy (target p99 < 50 ms)
 *   4. demo plans finished per minute (a batch posted at once, timed until the last finishes)
 *   1b. the same bytes from a bare fastify server (one route, no hooks, no store) at the same connections: the
 *      ceiling of this machine and load generator, against which figure 1 is read
 *   5. GET /healthz, one request every 5 ms, while schedules at the vertex limit (200,000 vertices, about 3.5 MB) are
 *      posted to /v1/checks and /v1/plans one after another: the longest wait shows how long one large request holds
 *      the service thread (reading, validating, hashing and storing it, and sending the answer)
 *
 *   npm run bench:http [-- --duration 10 --connections 100 --plans 12 --workers <n>]
 *
 * Figures vary with machine load, so they are printed, never asserted. Every run is bounded by --duration.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import autocannon from 'autocannon';
import { scheduleAtVertexLimit } from '../tests/support/large-schedule.js';

const { values } = parseArgs({
  options: {
    duration: { type: 'string', default: '10' },
    connections: { type: 'string', default: '100' },
    plans: { type: 'string', default: '12' },
    workers: { type: 'string' },
  },
});
const duration = Math.min(60, Math.max(1, Number(values.duration)));
const connections = Math.min(1000, Math.max(1, Number(values.connections)));
const batch = Math.min(200, Math.max(1, Number(values.plans)));

const root = fileURLToPath(new URL('..', import.meta.url));
const demo = readFileSync(join(root, 'fixtures', 'demo-edging-strip.json'), 'utf8');
const JSON_HEADERS = { 'content-type': 'application/json' };
const dir = mkdtempSync(join(tmpdir(), 'bench-http-'));
const port = await freePort();
const base = `http://127.0.0.1:${port}`;
const server = await start();

try {
  const first = await postPlan();
  await finished([first]);
  const rows: string[][] = [['what', 'requests/s', 'p50 ms', 'p99 ms', 'errors / non-2xx']];
  const plan = await cannon(`${base}/v1/plans/${first}`, connections);
  rows.push([`GET /v1/plans/{id}, ${connections} connections`, ...figures(plan)]);
  // the same request one at a time: the service time, without the queueing of 100 connections on few cores
  const single = await cannon(`${base}/v1/plans/${first}`, 1);
  rows.push(['GET /v1/plans/{id}, 1 connection', ...figures(single)]);
  const report = Buffer.from(await (await fetch(`${base}/v1/plans/${first}`)).arrayBuffer());
  const bare = await bareServer(report);
  try {
    const ceiling = await cannon(bare.url, connections);
    rows.push([`bare fastify, same ${report.byteLength} bytes, ${connections} connections`, ...figures(ceiling)]);
  } finally {
    bare.child.kill();
  }
  const csv = await cannon(`${base}/v1/plans/${first}/setpoints.csv`, connections);
  rows.push([`GET setpoints.csv, ${connections} connections`, ...figures(csv)]);

  // the workers busy with demo plans all through the /healthz run
  const busy = await Promise.all(Array.from({ length: Math.max(4, Math.ceil(duration / 2)) }, () => postPlan()));
  const health = await cannon(`${base}/healthz`, 10);
  rows.push(['GET /healthz, 10 connections, plans running', ...figures(health)]);
  await finished(busy);

  const t0 = performance.now();
  const ids = await Promise.all(Array.from({ length: batch }, () => postPlan()));
  await finished(ids);
  const minutes = (performance.now() - t0) / 60_000;

  const large = scheduleAtVertexLimit();
  const held = await healthWhile(async () => {
    for (let i = 0; i < 3; i++) {
      const check = await fetch(`${base}/v1/checks`, { method: 'POST', headers: JSON_HEADERS, body: large });
      if (check.status !== 200) throw new Error(`large POST /v1/checks answered ${check.status}`);
      await check.arrayBuffer();
      const planned = await fetch(`${base}/v1/plans`, { method: 'POST', headers: JSON_HEADERS, body: large });
      if (planned.status !== 202) throw new Error(`large POST /v1/plans answered ${planned.status}`);
      const { id } = (await planned.json()) as { id: string };
      await fetch(`${base}/v1/plans/${id}`, { method: 'DELETE' });
    }
  });
  rows.push([
    `GET /healthz every 5 ms, large posts (${(large.length / 1e6).toFixed(1)} MB)`,
    '-',
    held.p50.toFixed(1),
    `${held.p99.toFixed(1)} (max ${held.max.toFixed(0)})`,
    '0 / 0',
  ]);

  const widths = rows[0]!.map((_, c) => Math.max(...rows.map((r) => r[c]!.length)));
  for (const r of rows) console.log(r.map((cell, c) => cell.padEnd(widths[c]!)).join('  '));
  console.log(
    `demo plans per minute: ${(batch / minutes).toFixed(1)} (${batch} posted at once, last finished after ${(minutes * 60).toFixed(1)} s)`,
  );
} finally {
  server.kill('SIGTERM');
  await new Promise((r) => server.once('exit', r));
  rmSync(dir, { recursive: true, force: true });
}

function figures(r: autocannon.Result): string[] {
  return [
    r.requests.average.toFixed(0),
    r.latency.p50.toFixed(1),
    r.latency.p99.toFixed(1),
    `${r.errors} / ${r.non2xx}`,
  ];
}

async function cannon(url: string, n: number): Promise<autocannon.Result> {
  return autocannon({ url, connections: n, duration, pipelining: 1 });
}

/** Latencies of GET /healthz sent every 5 ms (one at a time) while `work` runs: p50, p99 and the longest, ms. */
async function healthWhile(work: () => Promise<void>): Promise<{ p50: number; p99: number; max: number }> {
  const waits: number[] = [];
  let running = true;
  const pinger = (async () => {
    while (running) {
      const t0 = performance.now();
      await (await fetch(`${base}/healthz`)).arrayBuffer();
      waits.push(performance.now() - t0);
      await new Promise((r) => setTimeout(r, 5));
    }
  })();
  try {
    await work();
  } finally {
    running = false;
    await pinger;
  }
  waits.sort((x, y) => x - y);
  const at = (q: number) => waits[Math.min(waits.length - 1, Math.floor(q * waits.length))] ?? 0;
  return { p50: at(0.5), p99: at(0.99), max: waits[waits.length - 1] ?? 0 };
}

async function postPlan(): Promise<string> {
  const res = await fetch(`${base}/v1/plans`, {
    method: 'POST',
    headers: JSON_HEADERS,
    body: demo,
  });
  if (res.status !== 202) throw new Error(`POST /v1/plans answered ${res.status}`);
  return ((await res.json()) as { id: string }).id;
}

async function finished(ids: readonly string[]): Promise<void> {
  for (const id of ids) {
    for (;;) {
      const { status } = (await (await fetch(`${base}/v1/plans/${id}`)).json()) as { status: string };
      if (status !== 'queued' && status !== 'running') break;
      await new Promise((r) => setTimeout(r, 100));
    }
  }
}

/**
 * A bare fastify server in a child process that answers every GET with `body` (no hooks, no store, no logging): what
 * this machine and load generator allow any fastify server sending those bytes.
 */
async function bareServer(body: Buffer): Promise<{ child: ChildProcess; url: string }> {
  const file = join(dir, 'body.json');
  writeFileSync(file, body);
  const barePort = await freePort();
  const script = `
    const body = require('node:fs').readFileSync(${JSON.stringify(file)});
    const app = require('fastify')();
    app.get('/', (request, reply) => { reply.header('content-type', 'application/json; charset=utf-8').send(body); });
    app.listen({ port: ${barePort}, host: '127.0.0.1' });`;
  const child = spawn(process.execPath, ['-e', script], { cwd: root, stdio: ['ignore', 'ignore', 'inherit'] });
  const url = `http://127.0.0.1:${barePort}/`;
  for (let tries = 0; ; tries++) {
    try {
      if ((await fetch(url)).status === 200) return { child, url };
    } catch {
      // not yet listening
    }
    if (tries > 100) throw new Error('the bare server did not start');
    await new Promise((r) => setTimeout(r, 100));
  }
}

async function start(): Promise<ChildProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'src/server.ts'], {
    cwd: root,
    env: {
      ...process.env,
      PORT: String(port),
      HOST: '127.0.0.1',
      DATABASE_PATH: join(dir, 'plans.sqlite'),
      RATE_LIMIT_PER_MINUTE: '0',
      LOG_LEVEL: 'warn',
      API_TOKENS: '',
      ...(values.workers ? { PLAN_WORKERS: values.workers } : {}),
    },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const t0 = Date.now();
  for (;;) {
    try {
      if ((await fetch(`${base}/readyz`)).status === 200) return child;
    } catch {
      // not yet listening
    }
    if (Date.now() - t0 > 30_000) throw new Error('the server did not start');
    await new Promise((r) => setTimeout(r, 100));
  }
}

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const p = (s.address() as { port: number }).port;
      s.close(() => resolve(p));
    });
  });
}
