import { readFileSync } from 'node:fs';
import { pino } from 'pino';
import { afterAll, beforeAll } from 'vitest';
import { buildApp } from '../../src/app.js';

/** The app as server.ts builds it, with a silent logger, ready for supertest on `app.server`. */
export async function makeTestApp() {
  const app = await buildApp({ logger: pino({ level: 'silent' }) });
  await app.ready();
  return app;
}

type TestApp = Awaited<ReturnType<typeof makeTestApp>>;

/**
 * One app for the test file that calls this at its top level: built before its tests, closed after them. Read the
 * app through the returned getter inside tests (it exists only once `beforeAll` has run).
 */
export function useTestApp(): () => TestApp {
  let app: TestApp | null = null;
  beforeAll(async () => {
    app = await makeTestApp();
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
