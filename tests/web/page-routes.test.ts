import { describe, expect, it } from 'vitest';
import { useTestApp } from '../support/test-app.js';

const testApp = useTestApp();

describe('review page routes', () => {
  it('GET / and GET /plans/{id} answer the pages as HTML that load their scripts as same-origin modules', async () => {
    for (const [url, script] of [
      ['/', '/web/plans-page.js'],
      ['/plans/0b1d3c9e-0000-4000-8000-000000000000', '/web/plan-page.js'],
    ] as const) {
      const res = await testApp().inject({ method: 'GET', url });
      expect(res.statusCode).toBe(200);
      expect(res.headers['content-type']).toMatch(/^text\/html/);
      expect(res.body).toContain(`<script type="module" src="${script}"></script>`);
      // no inline script or style: a strict Content-Security-Policy holds
      expect(res.body).not.toMatch(/<script(?![^>]*\ssrc=)[^>]*>|\sstyle=|\son[a-z]+=/i);
      const page = await testApp().inject({ method: 'GET', url: script });
      expect(page.statusCode).toBe(200);
      expect(page.headers['content-type']).toMatch(/javascript/);
    }
  });

  it('uPlot is served from node_modules (its module and style sheet only), nothing outside the web folder', async () => {
    const esm = await testApp().inject({ method: 'GET', url: '/web/vendor/uplot/uPlot.esm.js' });
    expect(esm.statusCode).toBe(200);
    expect(esm.body).toContain('export');
    expect((await testApp().inject({ method: 'GET', url: '/web/vendor/uplot/uPlot.min.css' })).statusCode).toBe(200);
    expect((await testApp().inject({ method: 'GET', url: '/web/vendor/uplot/uPlot.cjs.js' })).statusCode).toBe(404);
    expect((await testApp().inject({ method: 'GET', url: '/web/../package.json' })).statusCode).toBe(404);
    expect((await testApp().inject({ method: 'GET', url: '/web/%2e%2e/package.json' })).statusCode).not.toBe(200);
  });

  it('the page routes stay out of the API description', async () => {
    const spec = (await testApp().inject({ method: 'GET', url: '/openapi.json' })).json() as { paths: object };
    const paths = Object.keys(spec.paths);
    expect(paths.length).toBeGreaterThan(3);
    expect(paths.filter((p) => p === '/' || p.startsWith('/plans') || p.startsWith('/web'))).toEqual([]);
  });
});
