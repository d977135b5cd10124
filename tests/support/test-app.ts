import { readFileSync } from 'node:fs';
import { pino } from 'pino';
import { afterAll, beforeAll } from 'vitest';
import { type AppOptions, buildApp } from '../../src/app.js';

export interface TestAppOptions extends Partial<AppOptions> {
  /**
   * Answer `POST /v1/plans` only once the plan has finished (as the plan was computed before the answer until plans
   * became background jobs), so tests that read a plan at once see its result. Off: the 202 comes at once and the
   * plan is `queued`. @default true
   */
  readonly settlePlans?: boolean;
}

/** The app as server.ts builds it (in-memory store, one plan worker), with a silent logger, ready for supertest. */
export async function makeTestApp(options: TestAppOptions = {}) {
  const { settlePlans = true, ...rest } = options;
  // worker threads start when a test first needs one
  const app = await buildApp({ logger: pino({ level: 'silent' }), warmWorkers: false, ...rest });
  if (settlePlans) {
    app.addHook('onSend', async (request, reply, payload) => {
      if (request.method !== 'POST' || request.routeOptions.url !== '/v1/plans' || reply.statusCode !== 202) {
        return payload;
      }
      const id = JSON.parse(String(payload)).id as string;
      await waitForPlan(app, id);
      return payload;
    });
  }
  await app.ready();
  return app;
}

type TestApp = Awaited<ReturnType<typeof makeTestApp>>;

/** Waits until the plan is no longer queued or running (or is gone), polling the store. */
export async function waitForPlan(app: Pick<TestApp, 'plans'>, id: string, timeoutMs = 60_000): Promise<void> {
  const started = Date.now();
  for (;;) {
    const status = app.plans.store.entry(id)?.status;
    if (status !== 'queued' && status !== 'running') return;
    if (Date.now() - started > timeoutMs) throw new Error(`plan ${id} still ${status} after ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

/**
 * One app for the test file that calls this at its top level: built before its tests, closed after them. Read the
 * app through the returned getter inside tests (it exists only once `beforeAll` has run).
 */
export function useTestApp(options: TestAppOptions = {}): () => TestApp {
  let app: TestApp | null = null;
  beforeAll(async () => {
    app = await makeTestApp(options);
  });
  afterAll(async () => {
    await app?.close();
  });
  return () => {
    if (!app) throw new Error('useTestApp: the app is read before beforeAll ran');
    return app;
  };
}

/** A fixture schedule from fixtures/, parsed. */
export function fixture(name: string): Record<string, unknown> {
  return JSON.parse(readFileSync(new URL(`../../fixtures/${name}.json`, import.meta.url), 'utf8'));
}
