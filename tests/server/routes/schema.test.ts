import { readFile } from 'node:fs/promises';
import { Ajv2020 } from 'ajv/dist/2020.js';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TRACK_SCHEMA_FILE } from '../../../src/export/index.js';
import { buildApp } from '../../../src/server/app.js';
import { inlineRoot } from '../../../src/server/routes/schema.js';
import { readyApp } from '../helpers.js';

const REPO_ROOT = new URL('../../../', import.meta.url);

describe('GET /v1/schema/track', () => {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await buildApp({ startPool: false });
  });
  afterAll(async () => {
    await app.close();
  });

  it('serves the checked-in JSON Schema of the track format, byte for byte', async () => {
    const res = await app.inject({ method: 'GET', url: '/v1/schema/track' });
    expect([res.statusCode, res.headers['content-type'], res.headers['cache-control']]).toEqual([200, 'application/schema+json; charset=utf-8', 'public, max-age=300']);
    expect(res.body).toBe(await readFile(new URL(TRACK_SCHEMA_FILE, REPO_ROOT), 'utf8'));
  });

  it('a track the service answers passes it (ajv, draft 2020-12)', async () => {
    const schema = JSON.parse((await app.inject({ method: 'GET', url: '/v1/schema/track' })).body) as Record<string, unknown>;
    const validate = new Ajv2020({ allErrors: true, strict: true }).compile(schema);
    const live = await readyApp({ workers: 1 });
    try {
      const track = JSON.parse((await live.inject({ method: 'GET', url: '/v1/tracks/larkspur-schema?lengthM=600' })).body) as unknown;
      expect(validate(track), JSON.stringify(validate.errors)).toBe(true);
    } finally {
      await live.close();
    }
  });
});

describe('inlineRoot', () => {
  it('inlines a root $ref into $defs, keeping the other definitions', () => {
    expect(inlineRoot({ $schema: 's', title: 't', $ref: '#/$defs/A', $defs: { A: { type: 'object', properties: { b: { $ref: '#/$defs/B' } } }, B: { type: 'number' } } })).toEqual({
      $schema: 's',
      title: 't',
      type: 'object',
      properties: { b: { $ref: '#/$defs/B' } },
      $defs: { B: { type: 'number' } },
    });
    expect(inlineRoot({ $ref: '#/$defs/A', $defs: { A: { type: 'string' } } })).toEqual({ type: 'string' });
  });

  it('leaves alone a schema without a root $ref, or whose root refers to itself', () => {
    const plain = { type: 'object' };
    expect(inlineRoot(plain)).toBe(plain);
    const recursive = { $ref: '#/$defs/A', $defs: { A: { type: 'array', items: { $ref: '#/$defs/A' } } } };
    expect(inlineRoot(recursive)).toBe(recursive);
  });
});
