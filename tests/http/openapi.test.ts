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

  it('the service version matches package.json', () => {
    const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8'));
    expect(SERVICE_VERSION).toBe(pkg.version);
  });
});
