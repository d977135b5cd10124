import type { ICircleEntity } from 'dxf-parser';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { ERROR_CATALOGUE } from '../../src/http/error-catalogue.js';
import { fixture, useTestApp } from '../support/test-app.js';
import { entitiesOn, readDxf } from './demo-drawings.js';

const testApp = useTestApp();
const get = (path: string) => request(testApp().server).get(path).buffer(true).parse(text);

/** supertest reads application/dxf as binary: keep every body as text. */
function text(res: request.Response, done: (err: Error | null, body: string) => void) {
  let body = '';
  res.setEncoding('utf8');
  res.on('data', (chunk: string) => {
    body += chunk;
  });
  res.on('end', () => done(null, body));
}

/** Posts a schedule as a plan and waits (GET /v1/plans/{id}) until it is no longer queued or running. */
async function finishedPlan(schedule: Record<string, unknown>): Promise<string> {
  const created = await request(testApp().server)
    .post('/v1/plans')
    .set('content-type', 'application/json')
    .send(JSON.stringify(schedule));
  expect(created.status).toBe(202);
  const id = created.body.id as string;
  for (let tries = 0; tries < 600; tries++) {
    const status = (await request(testApp().server).get(`/v1/plans/${id}`)).body.status;
    if (status !== 'queued' && status !== 'running') return id;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`plan ${id} did not finish`);
}

describe('drawing downloads of the demo plan', () => {
  let id = '';
  beforeAll(async () => {
    id = await finishedPlan(fixture('demo-edging-strip'));
  }, 90_000);

  const dxfRoutes = [
    ['plates.dxf', 'edging-strip-demo-plates.dxf'],
    ['plates/plate_1.dxf', 'edging-strip-demo-plate_1.dxf'],
    ['plates/link_1.dxf', 'edging-strip-demo-link_1.dxf'],
    ['die-body.dxf', 'edging-strip-demo-die-body.dxf'],
    ['stations.dxf', 'edging-strip-demo-stations.dxf'],
  ] as const;
  for (const [route, file] of dxfRoutes) {
    it(`GET ${route} is application/dxf named ${file}, a DXF in millimetres that dxf-parser reads`, async () => {
      const res = await get(`/v1/plans/${id}/${route}`);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('application/dxf');
      expect(res.headers['content-disposition']).toBe(`attachment; filename="${file}"`);
      // Autodesk DXF reference, HEADER section: $INSUNITS 4 = millimetres
      expect(readDxf(res.body as string).header.$INSUNITS).toBe(4);
    });
  }

  it("GET plates/plate_2.dxf?dimensions=hot puts the holes on the plan's pivots; the default (cold) is smaller by 1 + αΔT", async () => {
    const planReport = (await request(testApp().server).get(`/v1/plans/${id}`)).body;
    const pivot = planReport.mechanism.joints.find((j: { id: string }) => j.id === 'pivot_1').station_positions[0];
    const centre = (body: string) => entitiesOn<ICircleEntity>(readDxf(body), 'CIRCLE', 'pin-holes')[0]!.center;
    const hot = centre((await get(`/v1/plans/${id}/plates/plate_2.dxf?dimensions=hot`)).body);
    // the report rounds coordinates to 0.1 µm (wire format): compare within that
    expect(Math.abs(hot.x - pivot[0])).toBeLessThanOrEqual(1e-4);
    expect(Math.abs(hot.y - pivot[1])).toBeLessThanOrEqual(1e-4);
    const cold = centre((await get(`/v1/plans/${id}/plates/plate_2.dxf`)).body);
    // linear expansion, H13 11.3 µm/(m·K), die at 190 °C (docs/MODEL.md §5)
    expect(cold.x).toBeCloseTo(hot.x / (1 + 11.3e-6 * 170), 5);
  });

  it('GET preview.svg is image/svg+xml, shown inline', async () => {
    const res = await get(`/v1/plans/${id}/preview.svg`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('image/svg+xml; charset=utf-8');
    expect(res.headers['content-disposition']).toBe('inline; filename="edging-strip-demo-preview.svg"');
    expect(res.body as string).toContain('<svg xmlns="http://www.w3.org/2000/svg"');
  });

  it('the same plan gives the same bytes on every download', async () => {
    const a = (await get(`/v1/plans/${id}/die-body.dxf`)).body;
    const b = (await get(`/v1/plans/${id}/die-body.dxf`)).body;
    expect(a).toBe(b);
  });

  it('each part is its own resource: plate_1 and plate_2 carry different ETags, and plate_1’s ETag gets no 304 for plate_2', async () => {
    // RFC 9110 §8.8.3: an entity tag identifies one representation of one resource
    const one = await get(`/v1/plans/${id}/plates/plate_1.dxf`);
    const two = await get(`/v1/plans/${id}/plates/plate_2.dxf`);
    expect(one.headers.etag).toBeDefined();
    // the download gate keys ETags (and its download cache) by the resource: it must be the path asked for
    // (plates/plate_2.dxf), not the route pattern (plates/:part.dxf), or every part answers with the first one cached
    expect(
      two.headers.etag,
      'downloadOf in src/app.ts must name the resource by the request path, not routeOptions.url',
    ).not.toBe(one.headers.etag);
    const asked = await get(`/v1/plans/${id}/plates/plate_2.dxf`).set('if-none-match', one.headers.etag as string);
    expect(asked.status).toBe(200);
    expect(asked.body).toBe(two.body);
  });

  it('an unknown part is 404 not_found naming the parts the plan has', async () => {
    const res = await request(testApp().server).get(`/v1/plans/${id}/plates/plate_9.dxf`);
    expect(res.status).toBe(404);
    expect(res.body.error).toBe('not_found');
    expect(res.body.message).toContain('plate_1, plate_2, plate_3, plate_4, link_1');
  });

  it('?dimensions=warm is 400 malformed_request naming the parameter', async () => {
    const res = await request(testApp().server).get(`/v1/plans/${id}/stations.dxf?dimensions=warm`);
    expect(res.status).toBe(400);
    expect(res.body.error).toBe('malformed_request');
    expect(res.body.details[0].path).toBe('dimensions');
  });

  it('an unknown plan is 404 not_found', async () => {
    const res = await request(testApp().server).get('/v1/plans/00000000-0000-0000-0000-000000000000/plates.dxf');
    expect(res.status).toBe(404);
    expect(res.body.error).toBe('not_found');
  });

  it('the drawing routes are in the OpenAPI description with their content types', async () => {
    const spec = (await request(testApp().server).get('/openapi.json')).body;
    for (const path of ['plates.dxf', 'plates/{part}.dxf', 'die-body.dxf', 'stations.dxf']) {
      const op = spec.paths[`/v1/plans/{id}/${path}`]?.get;
      expect(op, path).toBeDefined();
      expect(Object.keys(op.responses['200'].content)).toContain('application/dxf');
    }
    expect(Object.keys(spec.paths['/v1/plans/{id}/preview.svg'].get.responses['200'].content)).toContain(
      'image/svg+xml',
    );
  });
});

describe('drawings of a plan that failed', () => {
  it('are 409 no_mechanism (fixed-part-disagrees: the die body would have to move, so no chain is fitted)', async () => {
    // docs/MODEL.md §6: fixed-part-disagrees.json gives SPAN_NOT_RECONCILED and a failed plan
    const id = await finishedPlan(fixture('fixed-part-disagrees'));
    for (const route of ['plates.dxf', 'plates/plate_1.dxf', 'die-body.dxf', 'stations.dxf', 'preview.svg']) {
      const res = await request(testApp().server).get(`/v1/plans/${id}/${route}`);
      expect(res.status, route).toBe(ERROR_CATALOGUE.no_mechanism.status);
      expect(res.body.error).toBe('no_mechanism');
    }
  }, 90_000);
});
