import type { FastifyInstance } from 'fastify';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { generateTrack } from '../../src/core/index.js';
import { TrackCache } from '../../src/server/track-cache.js';
import { json, readyApp } from './helpers.js';

const entry = (id: string, size: number) => ({ id, bytes: new Uint8Array(size), fileName: `${id}.json` });

describe('TrackCache', () => {
  it('drops the least recently used answers first, within its byte budget', () => {
    // each entry: its bytes + 2 × key length + 512 of overhead
    const cache = new TrackCache(3 * (1000 + 2 + 512));
    cache.set('a', entry('a', 1000));
    cache.set('b', entry('b', 1000));
    cache.set('c', entry('c', 1000));
    expect(cache.get('a')?.id).toBe('a'); // a is now the most recent
    cache.set('d', entry('d', 1000)); // b goes
    expect(cache.get('b')).toBeUndefined();
    expect(['a', 'c', 'd'].map((k) => cache.get(k)?.id)).toEqual(['a', 'c', 'd']);
    expect(cache.stats()).toMatchObject({ entries: 3, bytes: 3 * 1514, hits: 4, misses: 1 });
  });

  it('keeps nothing larger than itself, and nothing at all with a budget of 0', () => {
    const small = new TrackCache(1000);
    small.set('big', entry('big', 2000));
    expect(small.stats().entries).toBe(0);
    const off = new TrackCache(0);
    off.set('a', entry('a', 1));
    expect(off.get('a')).toBeUndefined();
  });

  it('storing a key again replaces its answer and its size', () => {
    const cache = new TrackCache(10_000);
    cache.set('a', entry('a', 1000));
    cache.set('a', entry('a2', 3000));
    expect(cache.get('a')?.id).toBe('a2');
    expect(cache.stats().bytes).toBe(3000 + 2 + 512);
  });
});

describe('track routes answer repeats from the cache', () => {
  let app: FastifyInstance | null = null;
  afterEach(async () => {
    await app?.close();
    app = null;
  });

  it('a repeated GET with a seed is answered without a worker: the same bytes, ETag and headers', async () => {
    app = await readyApp();
    const run = vi.spyOn(app.lapwright.pool!, 'run');
    const first = await app.inject({ method: 'GET', url: '/v1/tracks/larkspur-7?lengthM=900' });
    const second = await app.inject({ method: 'GET', url: '/v1/tracks/larkspur-7?lengthM=900' });
    expect(first.statusCode).toBe(200);
    expect(second.body).toBe(first.body);
    expect(second.headers.etag).toBe(first.headers.etag);
    expect(second.headers['content-disposition']).toBe(first.headers['content-disposition']);
    expect(run).toHaveBeenCalledTimes(1);
    // the cached answer is the core's track for that request (guarantee 7)
    expect((json(second) as { id: string }).id).toBe(generateTrack({ seed: 'larkspur-7', lengthM: 900 }).id);
    // If-None-Match on a cached answer: 304, still no worker
    const again = await app.inject({ method: 'GET', url: '/v1/tracks/larkspur-7?lengthM=900', headers: { 'if-none-match': String(first.headers.etag) } });
    expect(again.statusCode).toBe(304);
    expect(run).toHaveBeenCalledTimes(1);
  });

  it('POST and GET of the same request share an answer; another format or parameter is another answer', async () => {
    app = await readyApp();
    const run = vi.spyOn(app.lapwright.pool!, 'run');
    const posted = await app.inject({ method: 'POST', url: '/v1/tracks', payload: { lengthM: 900, seed: 'larkspur-8' } });
    const got = await app.inject({ method: 'GET', url: '/v1/tracks/larkspur-8?lengthM=900' });
    expect(got.body).toBe(posted.body);
    expect(run).toHaveBeenCalledTimes(1);
    await app.inject({ method: 'GET', url: '/v1/tracks/larkspur-8?lengthM=900&format=svg' });
    await app.inject({ method: 'GET', url: '/v1/tracks/larkspur-8?lengthM=901' });
    expect(run).toHaveBeenCalledTimes(3);
  });

  it('a request without a seed is never taken from the cache (each draws a new seed)', async () => {
    app = await readyApp();
    const run = vi.spyOn(app.lapwright.pool!, 'run');
    const a = json(await app.inject({ method: 'POST', url: '/v1/tracks', payload: { lengthM: 900 } })) as { seed: number };
    const b = json(await app.inject({ method: 'POST', url: '/v1/tracks', payload: { lengthM: 900 } })) as { seed: number };
    expect(run).toHaveBeenCalledTimes(2);
    expect(a.seed).not.toBe(b.seed);
    expect(app.lapwright.cache.stats().entries).toBe(0);
  });

  it('with cacheBytes 0 every request goes to a worker', async () => {
    app = await readyApp({ cacheBytes: 0 });
    const run = vi.spyOn(app.lapwright.pool!, 'run');
    for (let i = 0; i < 2; i++) expect((await app.inject({ method: 'GET', url: '/v1/tracks/7?lengthM=900' })).statusCode).toBe(200);
    expect(run).toHaveBeenCalledTimes(2);
  });
});
