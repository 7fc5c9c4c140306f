/**
 * The API token is compared in constant time: both sides are hashed to 32 bytes and go through
 * crypto.timingSafeEqual, never ===, whose running time leaks how long a common prefix is
 * (common practice, no source; Node documents timingSafeEqual for exactly this). node:crypto is
 * wrapped here so the test sees every comparison the service makes.
 */
import type * as Crypto from 'node:crypto';
import { describe, expect, it, vi } from 'vitest';

const calls = vi.hoisted(() => [] as [Buffer, Buffer][]);
vi.mock('node:crypto', async (importOriginal) => {
  const actual = await importOriginal<typeof Crypto>();
  return {
    ...actual,
    timingSafeEqual: (a: NodeJS.ArrayBufferView, b: NodeJS.ArrayBufferView) => {
      calls.push([Buffer.from(a.buffer, a.byteOffset, a.byteLength), Buffer.from(b.buffer, b.byteOffset, b.byteLength)]);
      return actual.timingSafeEqual(a, b);
    },
  };
});

const { buildApp } = await import('../../src/server/app.js');
const { tokenDigest, tokenMatches } = await import('../../src/server/security.js');

const TOKEN = 'f3a1c9e07b5d4e2a8c6b0d1e2f3a4b5c';

describe('API token comparison', () => {
  it('each request\'s token goes through timingSafeEqual as two 32-byte digests, whatever its length', async () => {
    const app = await buildApp({ startPool: false, apiToken: TOKEN });
    try {
      calls.length = 0;
      const sent = [TOKEN, 'x', `${TOKEN}${TOKEN}`, `${TOKEN.slice(0, -1)}0`];
      const statuses = [];
      for (const token of sent) statuses.push((await app.inject({ method: 'GET', url: '/v1/presets', headers: { authorization: `Bearer ${token}` } })).statusCode);
      expect(statuses).toEqual([200, 401, 401, 401]);
      expect(calls.length).toBe(sent.length);
      for (const [a, b] of calls) expect([a.length, b.length]).toEqual([32, 32]);
      // the token itself never reaches the comparison, only its SHA-256 digest (FIPS 180-4)
      expect(calls.every(([a, b]) => !a.toString('latin1').includes(TOKEN) && !b.toString('latin1').includes(TOKEN))).toBe(true);
    } finally {
      await app.close();
    }
  });

  it('tokenMatches: true only for the same token', () => {
    const digest = tokenDigest(TOKEN);
    expect(tokenMatches(TOKEN, digest)).toBe(true);
    for (const other of ['', TOKEN.slice(1), `${TOKEN} `, TOKEN.replace('f', 'F')]) expect(tokenMatches(other, digest)).toBe(false);
  });
});
