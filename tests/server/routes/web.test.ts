import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../../src/server/app.js';
import { loadWebFiles, PAGE_SECURITY_HEADERS } from '../../../src/server/routes/web.js';
import { json } from '../helpers.js';

describe('preview page routes', () => {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await buildApp({ startPool: false });
  });
  afterAll(async () => {
    await app.close();
  });

  it('GET / serves the page with its security headers; it links only to its own assets', async () => {
    const res = await app.inject({ method: 'GET', url: '/' });
    expect([res.statusCode, res.headers['content-type'], res.headers['cache-control']]).toEqual([200, 'text/html; charset=utf-8', 'no-cache']);
    for (const [name, value] of Object.entries(PAGE_SECURITY_HEADERS)) expect(res.headers[name]).toBe(value);
    expect(res.body).toMatch(/^<!doctype html>/);
    // no CDN: every script and stylesheet comes from /assets/
    const links = [...res.body.matchAll(/<(?:script|link)[^>]*(?:src|href)="([^"]+)"/g)].map((m) => m[1]);
    expect(links).toEqual(['data:,', '/assets/style.css', '/assets/app.js']);
    expect(res.body).toContain('simulation and games only');
  });

  it('serves the stylesheet and the script with their media types, and 304 on a matching ETag', async () => {
    const css = await app.inject({ method: 'GET', url: '/assets/style.css' });
    expect([css.statusCode, css.headers['content-type']]).toEqual([200, 'text/css; charset=utf-8']);
    const js = await app.inject({ method: 'GET', url: '/assets/app.js' });
    expect([js.statusCode, js.headers['content-type']]).toEqual([200, 'text/javascript; charset=utf-8']);
    // one self-contained script that names no other origin (works offline, no CDN)
    expect(js.body).not.toMatch(/https?:\/\//);
    expect(js.body).not.toMatch(/^\s*import\s/m);
    const again = await app.inject({ method: 'GET', url: '/assets/app.js', headers: { 'if-none-match': js.headers.etag as string } });
    expect([again.statusCode, again.body]).toEqual([304, '']);
  });

  it('404 with the error body for an unknown asset, and no way out of the folder', async () => {
    for (const url of ['/assets/nope.js', '/assets/index.html', '/assets/..%2Fapp.ts', '/assets/%2e%2e%2fserver%2fapp.ts']) {
      const res = await app.inject({ method: 'GET', url });
      expect([url, res.statusCode, (json(res) as { code: string }).code]).toEqual([url, 404, 'ERR_NOT_FOUND']);
    }
    const res = await app.inject({ method: 'GET', url: '/assets/nope.js' });
    expect(json(res)).toEqual({ statusCode: 404, code: 'ERR_NOT_FOUND', error: 'Not Found', message: 'no asset "nope.js"; the page\'s assets are app.js, style.css' });
  });

  it('a folder without the page is a start-up error that says what to run', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'lapwright-web-'));
    try {
      await writeFile(join(dir, 'style.css'), 'body {}');
      await expect(loadWebFiles(pathToFileURL(`${dir}/`))).rejects.toThrow(/the preview page index\.html is missing from .* \(npm run build copies src\/web there\)/);
      await expect(loadWebFiles(pathToFileURL(`${dir}/absent/`))).rejects.toThrow(/the preview page's files are missing from .*absent/);
    } finally {
      await rm(dir, { recursive: true, force: true });
    }
  });
});
