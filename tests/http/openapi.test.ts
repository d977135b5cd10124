import { readFileSync } from 'node:fs';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { ERROR_CATALOGUE } from '../../src/http/error-catalogue.js';
import { SERVICE_VERSION } from '../../src/version.js';
import { useTestApp } from '../support/test-app.js';

const testApp = useTestApp();

describe('the published description', () => {
  it('GET /openapi.json equals the committed api-spec/openapi.json (run `npm run spec` after changing a schema)', async () => {
    const res = await request(testApp().server).get('/openapi.json');
    expect(res.status).toBe(200);
    const committed = JSON.parse(readFileSync(new URL('../../api-spec/openapi.json', import.meta.url), 'utf8'));
    expect(res.body).toEqual(committed);
    expect(Object.keys(res.body.paths)).toEqual(expect.arrayContaining(['/v1/checks', '/healthz']));
  });

  it('api-spec/errors.md documents every error code of the catalogue with its status', () => {
    const doc = readFileSync(new URL('../../api-spec/errors.md', import.meta.url), 'utf8');
    for (const [code, entry] of Object.entries(ERROR_CATALOGUE)) {
      expect(doc).toMatch(new RegExp(`\\|\\s*\`${code}\`\\s*\\|\\s*${entry.status}\\s*\\|`));
    }
  });

  it('every /v1 route lists the statuses it can answer (RFC 9110 status meanings), each error with the Error schema', () => {
    const doc = JSON.parse(readFileSync(new URL('../../api-spec/openapi.json', import.meta.url), 'utf8'));
    const need: [RegExp, string, string[]][] = [
      [/^\/v1\//, '', ['401', '403', '429', '500']],
      [/^\/v1\/(checks|plans)$/, 'post', ['400', '413', '415', '503']],
      [/^\/v1\/plans$/, 'post', ['202', '422']],
      [/^\/v1\/plans\/\{id\}$/, 'get', ['200', '304', '404']],
      [/^\/v1\/plans\/\{id\}$/, 'delete', ['204', '404']],
      [/^\/v1\/plans\/\{id\}\/.+/, 'get', ['200', '304', '404', '409', '503']],
    ];
    let checked = 0;
    for (const [path, item] of Object.entries(doc.paths as Record<string, Record<string, { responses: object }>>)) {
      for (const [method, op] of Object.entries(item)) {
        const responses = op.responses as Record<string, { content?: Record<string, { schema?: unknown }> }>;
        for (const [pattern, verb, statuses] of need) {
          if (!pattern.test(path) || (verb !== '' && verb !== method)) continue;
          for (const status of statuses) {
            expect(responses[status], `${method.toUpperCase()} ${path} ${status}`).toBeDefined();
            checked++;
          }
        }
        for (const [status, response] of Object.entries(responses)) {
          if (path.startsWith('/v1/') && Number(status) >= 400) {
            expect(response.content?.['application/json']?.schema, `${method} ${path} ${status}`).toEqual({
              $ref: '#/components/schemas/Error',
            });
          }
        }
      }
    }
    expect(checked).toBeGreaterThan(100);
  });

  it('the service version matches package.json', () => {
    const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8'));
    expect(SERVICE_VERSION).toBe(pkg.version);
  });
});
