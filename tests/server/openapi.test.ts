import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import { buildApp } from '../../src/server/app.js';
import { buildOpenApiDocument, OPENAPI_FILE, renderOpenApi } from '../../src/server/openapi.js';
import { json } from './helpers.js';

const REPO_ROOT = new URL('../../', import.meta.url);

describe('OpenAPI document', () => {
  it('the checked-in openapi/openapi.json is the one the schemas make (run npm run openapi when this fails)', async () => {
    const checkedIn = await readFile(new URL(OPENAPI_FILE, REPO_ROOT), 'utf8');
    const current = renderOpenApi(await buildOpenApiDocument());
    expect(checkedIn === current, `${OPENAPI_FILE} is stale: run npm run openapi and commit the result`).toBe(true);
  });

  it('documents every route with its responses, and GET /openapi.json serves it', async () => {
    const app = await buildApp({ startPool: false });
    try {
      const res = await app.inject({ method: 'GET', url: '/openapi.json' });
      expect(res.statusCode).toBe(200);
      const doc = json(res) as { openapi: string; paths: Record<string, Record<string, { responses: Record<string, unknown>; parameters?: { name: string; in: string }[] }>>; components: { schemas: Record<string, unknown> } };
      expect(doc).toEqual(JSON.parse(renderOpenApi(await buildOpenApiDocument())));
      expect(doc.openapi).toBe('3.1.0');
      // a relative server (OpenAPI 3.1, Server Object: relative to the document's location), so
      // the interactive documentation sends its requests to the server it was loaded from
      expect((doc as unknown as { servers: { url: string }[] }).servers.map((s) => s.url)).toEqual(['/']);
      const routes = Object.entries(doc.paths).flatMap(([path, methods]) => Object.entries(methods).map(([method, op]) => `${method.toUpperCase()} ${path} ${Object.keys(op.responses).join(',')}`));
      expect(routes).toEqual([
        'GET /healthz 200',
        'GET /readyz 200,503',
        'POST /v1/tracks 200,304,400,401,406,413,415,422,429,503',
        'GET /v1/tracks/{seed} 200,304,400,401,406,422,429,503',
        'POST /v1/tracks/validate 200,400,401,413,415,422,429,503',
        'GET /v1/presets 200,401,429',
        'GET /v1/params 200,401,429',
        'GET /v1/schema/track 200,401,429',
        'POST /v1/batches 200,400,401,413,415,422,429,503',
        'GET /v1/splits/{seed} 200,400,401,429',
        'POST /v1/tracks/distance 200,400,401,413,422,429,503',
        'POST /v1/curricula 200,400,401,422,429,503',
      ]);
      // the token (when the server sets one) and the rate limit apply to every /v1 route, not to the probes
      expect((doc.components as { securitySchemes?: unknown }).securitySchemes).toEqual({ bearerAuth: { type: 'http', scheme: 'bearer', description: expect.stringContaining('LAPWRIGHT_API_TOKEN') } });
      for (const [path, methods] of Object.entries(doc.paths)) {
        for (const op of Object.values(methods) as { security?: unknown }[]) expect(op.security, path).toEqual(path.startsWith('/v1/') ? [{ bearerAuth: [] }, {}] : undefined);
      }
      // the preview page and its assets are not part of the API
      expect(Object.keys(doc.paths).filter((p) => p === '/' || p.startsWith('/assets'))).toEqual([]);
      // both track routes answer every format and point at the track's JSON Schema
      for (const op of [doc.paths['/v1/tracks'].post, doc.paths['/v1/tracks/{seed}'].get] as unknown as { responses: Record<string, { content: Record<string, unknown> }>; externalDocs: unknown }[]) {
        expect(Object.keys(op.responses['200'].content)).toEqual(['application/json', 'model/gltf-binary', 'image/svg+xml', 'text/csv']);
        expect(op.externalDocs).toEqual({ description: 'JSON Schema of the track format (draft 2020-12)', url: '/v1/schema/track' });
      }
      expect(doc.paths['/v1/tracks'].post.parameters?.map((p) => `${p.in}:${p.name}`)).toEqual(['query:format', 'query:table', 'query:heat', 'query:widthPx', 'query:pretty']);
      const get = doc.paths['/v1/tracks/{seed}'].get;
      expect(get.parameters?.map((p) => `${p.in}:${p.name}`)).toEqual([
        'query:lengthM',
        'query:widthM.min',
        'query:widthM.max',
        'query:curvatureBudgetDeg',
        'query:turnBalance',
        'query:cornerCount',
        'query:minCornerRadiusM',
        'query:noise',
        'query:gateSpacingM.min',
        'query:gateSpacingM.max',
        'query:spawnSlots',
        'query:wall.heightM',
        'query:wall.thicknessM',
        'query:clearanceM',
        'query:car.lengthM',
        'query:car.widthM',
        'query:vehicle.wheelbaseM',
        'query:vehicle.widthM',
        'query:vehicle.lengthM',
        'query:vehicle.maxSteerDeg',
        'query:vehicle.mu',
        'query:vehicle.maxAccelMps2',
        'query:vehicle.maxBrakeMps2',
        'query:vehicle.topSpeedMps',
        'query:drivability',
        'query:sensors.count',
        'query:sensors.spreadDeg',
        'query:sensors.lengthM',
        'query:format',
        'query:table',
        'query:heat',
        'query:widthPx',
        'query:pretty',
        'path:seed',
      ]);
      expect(Object.keys(doc.components.schemas).sort()).toEqual(['Error', 'FieldIssue', 'Track', 'TrackInput', 'TrackIssue', 'TrackRequest', 'TrackRequestInput']);
    } finally {
      await app.close();
    }
  });

  it('GET /docs serves the interactive documentation and its assets from the package (no network)', async () => {
    const app = await buildApp({ startPool: false });
    try {
      const page = await app.inject({ method: 'GET', url: '/docs/' });
      expect(page.statusCode).toBe(200);
      expect(page.headers['content-type']).toMatch(/^text\/html/);
      expect(page.body).toContain('./static/swagger-ui-bundle.js');
      const init = await app.inject({ method: 'GET', url: '/docs/static/swagger-initializer.js' });
      expect(init.statusCode).toBe(200);
      expect(init.body).toContain('/openapi.json');
      const bundle = await app.inject({ method: 'GET', url: '/docs/static/swagger-ui-bundle.js' });
      expect(bundle.statusCode).toBe(200);
      expect(bundle.body.length).toBeGreaterThan(100_000);
    } finally {
      await app.close();
    }
  });
});
