/**
 * GET / (the preview page) and GET /assets/{name} (its stylesheet and script): plain files from
 * src/web, read once at start-up and served from memory. `npm run build` copies src/web next to
 * the compiled server (dist/src/web), so the same relative path works from sources and from the
 * build. The page talks only to this service's API; it needs no network beyond it.
 */
import { createHash } from 'node:crypto';
import { readdir, readFile } from 'node:fs/promises';
import { extname } from 'node:path';
import type { FastifyPluginAsync, FastifyReply, FastifyRequest } from 'fastify';
import { errorBody } from '../errors.js';
import { matchesIfNoneMatch } from '../negotiate.js';

/** The folder the page's files live in: src/web, or dist/src/web in the build. */
export const WEB_DIR = new URL('../../web/', import.meta.url);

/** URL prefix of the page's assets. */
export const ASSETS_PREFIX = '/assets/';

const PAGE_FILE = 'index.html';

const MEDIA_TYPES: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.svg': 'image/svg+xml; charset=utf-8',
  '.png': 'image/png',
};

/** The page loads its own files and talks to its own origin only. */
export const PAGE_SECURITY_HEADERS: Readonly<Record<string, string>> = {
  'content-security-policy': "default-src 'none'; script-src 'self'; style-src 'self'; img-src 'self' blob: data:; connect-src 'self' blob:; base-uri 'none'; form-action 'self'; frame-ancestors 'none'",
  'x-content-type-options': 'nosniff',
  'referrer-policy': 'no-referrer',
};

interface StaticFile {
  readonly body: Buffer;
  readonly type: string;
  readonly etag: string;
}

/** Preview page routes (not in the OpenAPI document: they serve a page, not the API). */
export const webRoutes: FastifyPluginAsync = async (app) => {
  const files = await loadWebFiles(WEB_DIR);
  const page = files.get(PAGE_FILE)!;
  app.get('/', { schema: { hide: true } }, async (request, reply) => sendFile(request, reply, page));
  app.get(`${ASSETS_PREFIX}:name`, { schema: { hide: true } }, async (request, reply) => {
    const { name } = request.params as { name: string };
    const file = name !== PAGE_FILE ? files.get(name) : undefined;
    if (file === undefined) return reply.code(404).type('application/json; charset=utf-8').send(errorBody('ERR_NOT_FOUND', `no asset ${JSON.stringify(name.slice(0, 100))}; the page's assets are ${[...files.keys()].filter((f) => f !== PAGE_FILE).join(', ')}`));
    return sendFile(request, reply, file);
  });
};

/**
 * Reads every file of the page's folder (flat: no sub-folders) into memory.
 * @throws Error naming the folder when it or its index.html is missing (a build without the copy step)
 */
export async function loadWebFiles(dir: URL): Promise<Map<string, StaticFile>> {
  let names: string[];
  try {
    names = (await readdir(dir, { withFileTypes: true })).filter((e) => e.isFile()).map((e) => e.name);
  } catch (err) {
    throw new Error(`the preview page's files are missing from ${dir.pathname} (npm run build copies src/web there): ${err instanceof Error ? err.message : String(err)}`);
  }
  const files = new Map<string, StaticFile>();
  for (const name of names.sort()) {
    const type = MEDIA_TYPES[extname(name)];
    if (type === undefined) continue;
    const body = await readFile(new URL(name, dir));
    files.set(name, { body, type, etag: `"${createHash('sha256').update(body).digest('hex').slice(0, 32)}"` });
  }
  if (!files.has(PAGE_FILE)) throw new Error(`the preview page ${PAGE_FILE} is missing from ${dir.pathname} (npm run build copies src/web there)`);
  return files;
}

// revalidated each time (no-cache), so a new version of the service never shows a stale page
function sendFile(request: FastifyRequest, reply: FastifyReply, file: StaticFile): FastifyReply {
  for (const [name, value] of Object.entries(PAGE_SECURITY_HEADERS)) reply.header(name, value);
  reply.header('etag', file.etag);
  reply.header('cache-control', 'no-cache');
  if (matchesIfNoneMatch(request.headers['if-none-match'], file.etag)) return reply.code(304).send();
  return reply.type(file.type).send(file.body);
}
