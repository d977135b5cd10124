import { type ChildProcess, spawn } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';

/**
 * The service as a plant runs it: `src/server.ts` in a child process under tsx, on a SQLite file. Killed outright
 * (SIGKILL) while a plan runs, then started again on the same file, it finishes the plan and has lost nothing;
 * stopped politely (SIGTERM) it queues the running plan again within a few seconds.
 */
const root = fileURLToPath(new URL('../..', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'restart-'));
const databasePath = join(dir, 'plans.sqlite');
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
  });
}

interface Running {
  readonly child: ChildProcess;
  readonly base: string;
  readonly exited: Promise<number | null>;
  log(): string;
}

async function startServer(port: number): Promise<Running> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'src/server.ts'], {
    cwd: root,
    env: {
      ...process.env,
      DATABASE_PATH: databasePath,
      PORT: String(port),
      HOST: '127.0.0.1',
      LOG_LEVEL: 'info',
      PLAN_WORKERS: '1',
      // the crowned strip's search stops after 2 s with what it has: long enough to be caught running, short for CI
      PLAN_TIME_LIMIT_S: '2',
      SHUTDOWN_GRACE_S: '0.5',
      RATE_LIMIT_PER_MINUTE: '0',
      API_TOKENS: '',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout!.on('data', (d) => {
    output += d;
  });
  child.stderr!.on('data', (d) => {
    output += d;
  });
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  const base = `http://127.0.0.1:${port}`;
  const started = Date.now();
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the server exited at start:\n${output}`);
    try {
      if ((await fetch(`${base}/readyz`)).status === 200) break;
    } catch {
      // not listening yet
    }
    if (Date.now() - started > 30_000) throw new Error(`the server did not start:\n${output}`);
    await new Promise((r) => setTimeout(r, 100));
  }
  return { child, base, exited, log: () => output };
}

const schedule = (name: string) => readFileSync(join(root, 'fixtures', `${name}.json`), 'utf8');

async function postPlan(base: string, body: string): Promise<string> {
  const res = await fetch(`${base}/v1/plans`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body,
  });
  expect(res.status).toBe(202);
  return ((await res.json()) as { id: string }).id;
}

async function statusOf(base: string, id: string): Promise<string> {
  const res = await fetch(`${base}/v1/plans/${id}`);
  return ((await res.json()) as { status: string }).status;
}

async function until(check: () => Promise<boolean>, timeoutMs: number): Promise<void> {
  const started = Date.now();
  while (!(await check())) {
    if (Date.now() - started > timeoutMs) throw new Error('timed out');
    await new Promise((r) => setTimeout(r, 50));
  }
}

describe('restarts on the same database', () => {
  it('SIGKILL while a plan runs: after a restart the plan finishes and the finished plan before it is intact', async () => {
    const port = await freePort();
    const first = await startServer(port);
    const done = await postPlan(first.base, schedule('demo-edging-strip'));
    await until(async () => (await statusOf(first.base, done)) === 'done', 60_000);
    const before = await (await fetch(`${first.base}/v1/plans/${done}/setpoints.csv`)).text();
    const long = await postPlan(first.base, schedule('crowned-edging-strip'));
    await until(async () => (await statusOf(first.base, long)) === 'running', 30_000);
    first.child.kill('SIGKILL');
    await first.exited;

    const second = await startServer(port);
    try {
      expect(second.log()).toMatch(/plans left running are queued again/);
      await until(async () => (await statusOf(second.base, long)) === 'incomplete', 120_000);
      const plan = (await (await fetch(`${second.base}/v1/plans/${long}`)).json()) as { mechanism: unknown };
      expect(plan.mechanism).not.toBeNull();
      expect(await (await fetch(`${second.base}/v1/plans/${done}/setpoints.csv`)).text()).toBe(before);
      const list = (await (await fetch(`${second.base}/v1/plans`)).json()) as { items: { id: string }[] };
      expect(list.items.map((p) => p.id).sort()).toEqual([done, long].sort());
    } finally {
      second.child.kill('SIGKILL');
      await second.exited;
    }
  }, 240_000);

  it('SIGTERM while a plan runs: the service stops within a few seconds and the plan is queued for the next start', async () => {
    const port = await freePort();
    const server = await startServer(port);
    const id = await postPlan(server.base, schedule('crowned-edging-strip'));
    await until(async () => (await statusOf(server.base, id)) === 'running', 30_000);
    const t = Date.now();
    server.child.kill('SIGTERM');
    expect(await server.exited).toBe(0);
    expect(Date.now() - t).toBeLessThan(5000);
    expect(server.log()).toMatch(/plan queued again for the next start/);

    const again = await startServer(port);
    try {
      expect(['queued', 'running']).toContain(await statusOf(again.base, id));
    } finally {
      again.child.kill('SIGKILL');
      await again.exited;
    }
  }, 120_000);
});
