/**
 * Writes api-spec/openapi.json from the routes' zod schemas (`npm run spec`). tests/http/openapi.test.ts fails when
 * the committed file drifts from what the code would write.
 */
import { writeFileSync } from 'node:fs';
import { pino } from 'pino';
import { buildApp } from '../src/app.js';

const app = await buildApp({ logger: pino({ level: 'silent' }) });
await app.ready();
writeFileSync(new URL('../api-spec/openapi.json', import.meta.url), `${JSON.stringify(app.swagger(), null, 2)}\n`);
await app.close();
console.log('wrote api-spec/openapi.json');
