import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Schedule } from '../../src/domain/index.js';
import { ScheduleWire } from '../../src/http/schedule-schema.js';
import { toSchedule } from '../../src/http/to-schedule.js';
import { PlanJobs, WorkerPool } from '../../src/jobs/index.js';
import { SqlitePlanStore, scheduleHash, scheduleParts } from '../../src/store/index.js';
import { fixture } from '../support/test-app.js';

/**
 * The plan queue over a real worker pool (one plan thread): plans go queued → running → finished with progress on
 * the way, a running plan can be cancelled or put back in the queue at shutdown, and one past the hard limit fails
 * with the reason. The crowned strip takes a few seconds to plan: long enough to catch it running.
 */
const schedule = (name: string): Schedule => {
  const mapped = toSchedule(ScheduleWire.parse(fixture(name)));
  if (!mapped.ok) throw new Error(`${name} must map`);
  return mapped.schedule;
};

let pool: WorkerPool;
beforeAll(() => {
  pool = new WorkerPool({ planThreads: 1 });
});
afterAll(async () => {
  await pool.close();
});

function setUp(options: { hardLimitS?: number } = {}) {
  const store = new SqlitePlanStore(':memory:');
  const log: string[] = [];
  const jobs = new PlanJobs({
    store,
    pool,
    concurrency: 1,
    timeLimitS: 20,
    ...options,
    log: (_level, _fields, message) => log.push(message),
  });
  let n = 0;
  const queue = (s: Schedule) => {
    const id = `plan-${++n}`;
    store.add({
      id,
      createdAt: new Date(Date.UTC(2026, 11, 2, 10, 0, n)).toISOString(),
      ...scheduleParts(s),
      scheduleHash: scheduleHash(s),
      requestFindings: [],
      client: null,
      idempotencyKey: null,
    });
    jobs.kick();
    return id;
  };
  const until = async (check: () => boolean, timeoutMs = 60_000) => {
    const started = Date.now();
    while (!check()) {
      if (Date.now() - started > timeoutMs) throw new Error('timed out');
      await new Promise((r) => setTimeout(r, 10));
    }
  };
  return { store, jobs, log, queue, until };
}

describe('PlanJobs', () => {
  it('runs queued plans one at a time in a worker, recording progress, and stores each result with its status', async () => {
    const { store, jobs, queue, until } = setUp();
    jobs.start();
    const a = queue(schedule('demo-edging-strip'));
    const b = queue(schedule('demo-edging-strip'));
    expect(store.entry(a)?.status).toBe('running');
    expect(store.entry(b)?.status).toBe('queued');
    const stages = new Set<string>();
    await until(() => {
      const p = store.entry(a)?.progress;
      if (p) stages.add(p.stage);
      return store.entry(b)?.status === 'done';
    });
    expect(stages.size).toBeGreaterThan(0);
    expect(store.entry(a)).toMatchObject({ status: 'done', attempts: 1 });
    const report = JSON.parse(store.report(a)!);
    expect(report).toMatchObject({
      id: a,
      status: 'done',
      progress: null,
      schedule_hash: store.entry(a)!.scheduleHash,
    });
    expect(report.plan_hash).toBe(store.entry(a)!.planHash);
    expect(store.get(a)?.plan.fit?.plateCount).toBe(4);
    await jobs.drain(0);
    store.close();
  }, 60_000);

  it('cancels a running plan: its thread stops and nothing is stored for it', async () => {
    const { store, jobs, queue, until } = setUp();
    jobs.start();
    const id = queue(schedule('crowned-edging-strip'));
    await until(() => store.entry(id)?.status === 'running');
    const started = Date.now();
    expect(await jobs.cancel(id)).toBe(true);
    expect(Date.now() - started).toBeLessThan(5000);
    expect(jobs.active).toBe(0);
    expect(store.report(id)).toBeUndefined();
    await jobs.drain(0);
    store.close();
  }, 60_000);

  it('at shutdown puts a plan still running after the grace period back in the queue, and a new start finishes it', async () => {
    const { store, jobs, queue, until } = setUp();
    jobs.start();
    const id = queue(schedule('crowned-edging-strip'));
    await until(() => store.entry(id)?.status === 'running');
    const drained = await jobs.drain(100);
    expect(drained).toEqual({ finished: 0, requeued: 1 });
    expect(store.entry(id)?.status).toBe('queued');
    const next = new PlanJobs({ store, pool, concurrency: 1, timeLimitS: 2, log: () => {} });
    next.start();
    await until(() => store.entry(id)?.status === 'incomplete');
    expect(store.entry(id)?.attempts).toBe(2);
    await next.drain(0);
    store.close();
  }, 90_000);

  it('stores a plan that runs past the hard time limit as failed, saying so, with the material cautions', async () => {
    const { store, jobs, queue, until } = setUp({ hardLimitS: 0.3 });
    jobs.start();
    const id = queue(schedule('crowned-edging-strip'));
    await until(() => store.entry(id)?.status === 'failed');
    const report = JSON.parse(store.report(id)!);
    expect(report.error).toMatch(/ran longer than 0.3 s and was stopped/);
    expect(report.cautions.length).toBeGreaterThan(3);
    expect(report.stations).toEqual([]);
    await jobs.drain(0);
    store.close();
  }, 60_000);
});
