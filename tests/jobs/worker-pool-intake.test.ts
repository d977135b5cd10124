import { readFileSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import { ERROR_CATALOGUE } from '../../src/http/error-catalogue.js';
import { sendBusy } from '../../src/http/worker-replies.js';
import { PoolBusyError, WorkerPool } from '../../src/jobs/index.js';
import { scheduleAtVertexLimit } from '../support/large-schedule.js';

/**
 * The worker pool's intake of posted bodies: bounded waiting (503 service_busy, RFC 9110 §15.6.4, with Retry-After,
 * §10.2.3) and bodies moved to the worker rather than copied (an ArrayBuffer in a postMessage transfer list is
 * detached on the sending side: HTML Living Standard, structured serialize with transfer; Node worker_threads).
 */
const demo = readFileSync(new URL('../../fixtures/demo-edging-strip.json', import.meta.url));
const pool = new WorkerPool({ planThreads: 1, checkThreads: 1, maxCheckQueue: 1, warm: false });
afterAll(() => pool.close());

describe('WorkerPool intake', () => {
  it('refuses checks and plan intakes beyond the waiting limit with PoolBusyError, and serves the rest', async () => {
    const results = await Promise.allSettled([
      pool.check(Buffer.from(demo)),
      pool.check(Buffer.from(demo)),
      pool.takePlan(Buffer.from(demo)),
    ]);
    expect(results.map((r) => r.status)).toEqual(['fulfilled', 'rejected', 'rejected']);
    for (const r of results.slice(1)) expect((r as PromiseRejectedResult).reason).toBeInstanceOf(PoolBusyError);
    const first = (results[0] as PromiseFulfilledResult<Awaited<ReturnType<WorkerPool['check']>>>).value;
    expect(first.ok).toBe(true);
    // the queue is free again once the first has finished
    expect((await pool.takePlan(Buffer.from(demo))).ok).toBe(true);
  }, 60_000);

  it('moves a body that owns its memory to the worker (detached here) and copies one in a shared pool block', async () => {
    const large = Buffer.from(scheduleAtVertexLimit());
    expect(large.byteOffset).toBe(0);
    expect(large.byteLength).toBe(large.buffer.byteLength);
    const taken = await pool.takePlan(large);
    expect(taken.ok).toBe(true);
    expect(large.buffer.byteLength).toBe(0);
    // a small body shares Node's 8 KiB allocation pool with other buffers: it must be copied, never detached
    const small = Buffer.from('{"stations": []}');
    const neighbour = Buffer.from('kept');
    const refused = await pool.check(small);
    expect(refused.ok).toBe(false);
    expect(small.toString()).toBe('{"stations": []}');
    expect(neighbour.toString()).toBe('kept');
  }, 120_000);

  it('sendBusy answers 503 service_busy with Retry-After in the catalogue shape', () => {
    const sent: { status?: number; headers: Record<string, string>; body?: unknown } = { headers: {} };
    const reply = {
      header(name: string, value: string) {
        sent.headers[name] = value;
        return reply;
      },
      code(status: number) {
        sent.status = status;
        return { send: (body: unknown) => (sent.body = body) };
      },
    };
    sendBusy(reply, 'r-1', 'checks');
    expect(sent.status).toBe(503);
    expect(ERROR_CATALOGUE.service_busy.status).toBe(503);
    expect(sent.headers['retry-after']).toBe('2');
    expect(sent.body).toMatchObject({ error: 'service_busy', request_id: 'r-1', details: [] });
    expect((sent.body as { message: string }).message).toMatch(/checks are waiting for a worker; try again in 2 s/);
  });
});
