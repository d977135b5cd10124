import { readFileSync } from 'node:fs';
import { pino } from 'pino';
import { buildApp } from '../../src/app.js';

/** The app as server.ts builds it, with a silent logger, ready for supertest on `app.server`. */
export async function makeTestApp() {
  const app = await buildApp({ logger: pino({ level: 'silent' }) });
  await app.ready();
  return app;
}

/** A fixture schedule from fixtures/, parsed. */
export function fixture(name: string): Record<string, unknown> {
  return JSON.parse(readFileSync(new URL(`../../fixtures/${name}.json`, import.meta.url), 'utf8'));
}
