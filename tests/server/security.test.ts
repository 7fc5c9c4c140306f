/**
 * The security layer through the real app (inject, no port): security headers on every kind of
 * answer, CORS off by default and exact when configured, the optional API token on every /v1
 * route and on nothing else, and the optional per-client rate limit with its window.
 */
import type { FastifyInstance } from 'fastify';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { buildApp, type AppOptions } from '../../src/server/app.js';
import { PAGE_SECURITY_HEADERS } from '../../src/server/routes/web.js';
import { API_CSP, bearerToken, DOCS_CSP, isTokenRoute } from '../../src/server/security.js';
import { json, readyApp } from './helpers.js';

const TOKEN = 'f3a1c9e07b5d4e2a8c6b0d1e2f3a4b5c';
const ORIGIN = 'https://sim.example.org';

type Res = Awaited<ReturnType<FastifyInstance['inject']>>;

// helmet's rendering of API_CSP: directives joined by ';' without blanks
const API_CSP_HEADER = API_CSP.split('; ').join(';');

// the headers every answer carries, whatever its route or status
function expectSecurityHeaders(res: Res, csp = API_CSP_HEADER): void {
  const what = `${res.statusCode} ${res.body.slice(0, 80)}`;
  // W3C Content Security Policy Level 3; an API answer loads nothing and is never framed
  // (OWASP REST Security Cheat Sheet: default-src 'none'; frame-ancestors 'none')
  expect(res.headers['content-security-policy'], what).toBe(csp);
  // Fetch standard §X-Content-Type-Options: no MIME sniffing
  expect(res.headers['x-content-type-options'], what).toBe('nosniff');
  // RFC 7034: X-Frame-Options, for browsers without frame-ancestors
  expect(res.headers['x-frame-options'], what).toBe('DENY');
  // RFC 6797 §6.1: max-age in seconds (180 days); no includeSubDomains, sibling hosts keep their own policy
  expect(res.headers['strict-transport-security'], what).toBe('max-age=15552000');
  // W3C Referrer Policy: no-referrer
  expect(res.headers['referrer-policy'], what).toBe('no-referrer');
  // Fetch standard §Cross-Origin-Resource-Policy; HTML standard §Cross-Origin-Opener-Policy
  expect(res.headers['cross-origin-resource-policy'], what).toBe('same-origin');
  expect(res.headers['cross-origin-opener-policy'], what).toBe('same-origin');
  expect(res.headers['x-powered-by'], what).toBeUndefined();
}

async function withApp(options: AppOptions, run: (app: FastifyInstance) => Promise<void>): Promise<void> {
  const app = await buildApp({ startPool: false, ...options });
  try {
    await run(app);
  } finally {
    await app.close();
  }
}

describe('security headers (@fastify/helmet)', () => {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await buildApp({ startPool: false, bodyLimitBytes: 1024 });
  });
  afterAll(async () => {
    await app.close();
  });

  it('on JSON answers', async () => {
    for (const url of ['/healthz', '/v1/presets', '/v1/params', '/openapi.json']) {
      const res = await app.inject({ method: 'GET', url });
      expect([url, res.statusCode]).toEqual([url, 200]);
      expectSecurityHeaders(res);
    }
  });

  it('on errors: 400, 404, 413, 415, 503, and a URL the router cannot decode', async () => {
    const answers = [
      await app.inject({ method: 'POST', url: '/v1/tracks', payload: '{', headers: { 'content-type': 'application/json' } }),
      await app.inject({ method: 'GET', url: '/nowhere' }),
      await app.inject({ method: 'POST', url: '/v1/tracks', payload: JSON.stringify({ seed: 'x'.repeat(2000) }), headers: { 'content-type': 'application/json' } }),
      await app.inject({ method: 'POST', url: '/v1/tracks', payload: 'lengthM=1', headers: { 'content-type': 'text/plain' } }),
      // no workers in this app: readiness answers 503
      await app.inject({ method: 'GET', url: '/readyz' }),
      await app.inject({ method: 'GET', url: '/v1/tracks/%E0%A4%A' }),
    ];
    expect(answers.map((r) => r.statusCode)).toEqual([400, 404, 413, 415, 503, 400]);
    for (const res of answers) expectSecurityHeaders(res);
  });

  it('the preview page keeps its own policy (it loads its script, styles and blob images), with the other headers', async () => {
    for (const url of ['/', '/assets/app.js']) {
      const res = await app.inject({ method: 'GET', url });
      expect(res.statusCode).toBe(200);
      expectSecurityHeaders(res, PAGE_SECURITY_HEADERS['content-security-policy']);
    }
  });

  it('the interactive documentation gets a policy that lets Swagger UI run from this origin only', async () => {
    for (const url of ['/docs/', '/docs/static/swagger-ui-bundle.js', '/docs/static/swagger-initializer.js']) {
      const res = await app.inject({ method: 'GET', url });
      expect([url, res.statusCode]).toEqual([url, 200]);
      expectSecurityHeaders(res, DOCS_CSP);
    }
    // every script the page loads comes from the service itself
    const page = await app.inject({ method: 'GET', url: '/docs/' });
    const sources = [...page.body.matchAll(/<script[^>]*src="([^"]+)"/g)].map((m) => m[1]);
    expect(sources.length).toBeGreaterThan(0);
    for (const src of sources) expect(src).toMatch(/^\.\/static\//);
    expect(page.body).not.toMatch(/<script>(?!\s*<\/script>)/);
  });
});

describe('CORS (@fastify/cors)', () => {
  it('off by default: no Access-Control-Allow-Origin for any origin, and no preflight route', async () => {
    await withApp({}, async (app) => {
      const res = await app.inject({ method: 'GET', url: '/v1/presets', headers: { origin: ORIGIN } });
      expect(res.statusCode).toBe(200);
      expect(Object.keys(res.headers).filter((h) => h.startsWith('access-control-'))).toEqual([]);
      const preflight = await app.inject({ method: 'OPTIONS', url: '/v1/tracks', headers: { origin: ORIGIN, 'access-control-request-method': 'POST' } });
      expect(preflight.statusCode).toBe(404);
      expect(preflight.headers['access-control-allow-origin']).toBeUndefined();
    });
  });

  it('a configured origin gets Access-Control-Allow-Origin and Vary: Origin; any other origin gets none', async () => {
    await withApp({ corsOrigins: [ORIGIN, 'http://localhost:5173'] }, async (app) => {
      // Fetch standard §CORS protocol: the allowed origin is echoed, and caches must key on Origin
      const ok = await app.inject({ method: 'GET', url: '/v1/presets', headers: { origin: ORIGIN } });
      expect([ok.statusCode, ok.headers['access-control-allow-origin']]).toEqual([200, ORIGIN]);
      expect(String(ok.headers.vary)).toMatch(/\bOrigin\b/);
      expect(ok.headers['access-control-expose-headers']).toContain('ETag');
      expect(ok.headers['access-control-allow-credentials']).toBeUndefined();
      const other = await app.inject({ method: 'GET', url: '/v1/presets', headers: { origin: 'https://elsewhere.example' } });
      expect([other.statusCode, other.headers['access-control-allow-origin']]).toEqual([200, undefined]);
      // a configured origin lets the page embed exports: CORP is relaxed (Fetch standard §CORP)
      expect(ok.headers['cross-origin-resource-policy']).toBe('cross-origin');
    });
  });

  it('preflight OPTIONS: 204 with the methods, the headers (Authorization included) and a max-age', async () => {
    await withApp({ corsOrigins: [ORIGIN], apiToken: TOKEN }, async (app) => {
      // a preflight carries no Authorization (Fetch standard §CORS-preflight request): it must not need the token
      const res = await app.inject({ method: 'OPTIONS', url: '/v1/tracks', headers: { origin: ORIGIN, 'access-control-request-method': 'POST', 'access-control-request-headers': 'content-type, authorization' } });
      expect(res.statusCode).toBe(204);
      expect(res.headers['access-control-allow-origin']).toBe(ORIGIN);
      expect(res.headers['access-control-allow-methods']).toBe('GET, HEAD, POST');
      expect(String(res.headers['access-control-allow-headers']).toLowerCase().split(', ')).toEqual(expect.arrayContaining(['authorization', 'content-type']));
      expect(res.headers['access-control-max-age']).toBe('600');
      expectSecurityHeaders({ ...res, headers: { ...res.headers, 'cross-origin-resource-policy': 'same-origin' } } as Res);
      const foreign = await app.inject({ method: 'OPTIONS', url: '/v1/tracks', headers: { origin: 'https://elsewhere.example', 'access-control-request-method': 'POST' } });
      expect(foreign.headers['access-control-allow-origin']).toBeUndefined();
    });
  });

  it('* allows any origin', async () => {
    await withApp({ corsOrigins: ['*'] }, async (app) => {
      const res = await app.inject({ method: 'GET', url: '/v1/presets', headers: { origin: 'https://anyone.example' } });
      expect(res.headers['access-control-allow-origin']).toBe('*');
    });
  });

  it('a route that varies by Accept keeps Origin in Vary too (a shared cache must not mix origins)', async () => {
    const app = await readyApp({ corsOrigins: [ORIGIN] });
    try {
      const res = await app.inject({ method: 'GET', url: '/v1/tracks/7?lengthM=600', headers: { origin: ORIGIN } });
      expect(res.statusCode).toBe(200);
      expect(String(res.headers.vary).split(/,\s*/).sort()).toEqual(['Accept', 'Origin']);
      expect(res.headers['access-control-allow-origin']).toBe(ORIGIN);
    } finally {
      await app.close();
    }
  });
});

describe('API token (Authorization: Bearer, RFC 6750)', () => {
  let app: FastifyInstance;
  let doc: { paths: Record<string, Record<string, unknown>> };
  beforeAll(async () => {
    app = await buildApp({ startPool: false, apiToken: TOKEN });
    doc = json(await app.inject({ method: 'GET', url: '/openapi.json' })) as typeof doc;
  });
  afterAll(async () => {
    await app.close();
  });

  it('401 without a token, with the error body and WWW-Authenticate: Bearer (RFC 6750 §3)', async () => {
    const res = await app.inject({ method: 'GET', url: '/v1/presets' });
    expect([res.statusCode, json(res)]).toEqual([401, { statusCode: 401, code: 'ERR_UNAUTHORIZED', error: 'Unauthorized', message: 'this server needs an API token: send the header Authorization: Bearer followed by the token' }]);
    // RFC 6750 §3.1: no error code when the request had no credentials
    expect(res.headers['www-authenticate']).toBe('Bearer realm="lapwright"');
    expectSecurityHeaders(res);
  });

  it('401 invalid_token with a wrong token, a prefix of it, or it plus one character', async () => {
    for (const wrong of [`${TOKEN.slice(0, -1)}0`, TOKEN.slice(0, -1), `${TOKEN}0`, TOKEN.toUpperCase()]) {
      const res = await app.inject({ method: 'GET', url: '/v1/presets', headers: { authorization: `Bearer ${wrong}` } });
      expect([res.statusCode, json(res)]).toEqual([401, { statusCode: 401, code: 'ERR_UNAUTHORIZED', error: 'Unauthorized', message: 'the API token sent is not this server\'s' }]);
      // RFC 6750 §3.1: invalid_token when the token is not the right one
      expect(res.headers['www-authenticate']).toBe('Bearer realm="lapwright", error="invalid_token"');
    }
  });

  it('401 for another scheme or a malformed header; the scheme name is case-insensitive (RFC 9110 §11.1)', async () => {
    for (const header of [`Basic ${Buffer.from(`user:${TOKEN}`).toString('base64')}`, TOKEN, `Bearer`, `Bearer ${TOKEN} extra`, `Token ${TOKEN}`]) {
      const res = await app.inject({ method: 'GET', url: '/v1/presets', headers: { authorization: header } });
      expect([header, res.statusCode, res.headers['www-authenticate']]).toEqual([header, 401, 'Bearer realm="lapwright"']);
    }
    for (const scheme of ['Bearer', 'bearer', 'BEARER']) {
      const res = await app.inject({ method: 'GET', url: '/v1/presets', headers: { authorization: `${scheme} ${TOKEN}` } });
      expect([scheme, res.statusCode]).toEqual([scheme, 200]);
    }
  });

  it('200 with the token', async () => {
    const res = await app.inject({ method: 'GET', url: '/v1/params', headers: { authorization: `Bearer ${TOKEN}` } });
    expect(res.statusCode).toBe(200);
    expect(res.headers['www-authenticate']).toBeUndefined();
  });

  it('every /v1 operation of the OpenAPI document, and HEAD of its GETs, needs the token; the check comes before the body is read', async () => {
    const operations = Object.entries(doc.paths).flatMap(([path, methods]) => Object.keys(methods).map((m) => [m.toUpperCase(), path.replace('{seed}', '42')] as const));
    const v1 = operations.filter(([, path]) => path.startsWith('/v1/'));
    expect(v1.length).toBeGreaterThanOrEqual(10);
    for (const [method, url] of [...v1, ...v1.filter(([m]) => m === 'GET').map(([, u]) => ['HEAD', u] as const)]) {
      // a body that would be a 400 if it were read
      const res = await app.inject({ method: method as 'GET', url, ...(method === 'POST' ? { payload: '{not json', headers: { 'content-type': 'application/json' } } : {}) });
      expect([method, url, res.statusCode]).toEqual([method, url, 401]);
    }
  });

  it('/healthz, /readyz, /, its assets, /docs and /openapi.json stay open', async () => {
    for (const url of ['/healthz', '/readyz', '/', '/assets/app.js', '/docs/', '/docs/static/swagger-ui-bundle.js', '/openapi.json']) {
      const res = await app.inject({ method: 'GET', url });
      // /readyz is 503 here: this app runs no workers
      expect([url, res.statusCode]).toEqual([url, url === '/readyz' ? 503 : 200]);
    }
  });

  it('without a token set, /v1 needs none', async () => {
    await withApp({}, async (open) => {
      expect((await open.inject({ method: 'GET', url: '/v1/presets' })).statusCode).toBe(200);
    });
  });

  it('isTokenRoute and bearerToken', () => {
    expect(['/v1', '/v1/tracks', '/v1/tracks/:seed'].map(isTokenRoute)).toEqual([true, true, true]);
    expect(['/', '/v10', '/v1x/a', '/healthz', '/docs/json', '/openapi.json'].map(isTokenRoute)).toEqual([false, false, false, false, false, false]);
    expect(bearerToken(`Bearer  ${TOKEN} `)).toBe(TOKEN);
    expect(bearerToken('Bearer a=b')).toBeUndefined();
    expect(bearerToken('Bearer abc==')).toBe('abc==');
    expect(bearerToken(undefined)).toBeUndefined();
  });
});

describe('rate limit (@fastify/rate-limit)', () => {
  afterEach(() => {
    vi.useRealTimers();
  });

  it('off by default: many requests, no 429 and no rate-limit headers', async () => {
    await withApp({}, async (app) => {
      for (let i = 0; i < 50; i++) {
        const res = await app.inject({ method: 'GET', url: '/v1/presets' });
        expect(res.statusCode).toBe(200);
        expect(res.headers['x-ratelimit-limit']).toBeUndefined();
      }
    });
  });

  it('the (N+1)th request of a client in a window is a 429 with Retry-After (RFC 6585 §4); other clients, /healthz and the next window are not limited', async () => {
    // only Date is faked: the store dates its windows with Date.now(); nothing waits on a clock
    vi.useFakeTimers({ toFake: ['Date'] });
    const start = new Date('2026-01-01T00:00:00Z').getTime();
    vi.setSystemTime(start);
    await withApp({ rateLimitMax: 3, rateLimitWindowMs: 60_000 }, async (app) => {
      const remaining: unknown[] = [];
      for (let i = 0; i < 3; i++) {
        const res = await app.inject({ method: 'GET', url: '/v1/presets' });
        expect(res.statusCode).toBe(200);
        remaining.push(res.headers['x-ratelimit-remaining']);
      }
      expect(remaining).toEqual(['2', '1', '0']);
      vi.setSystemTime(start + 20_000);
      const refused = await app.inject({ method: 'GET', url: '/v1/params' });
      expect([refused.statusCode, json(refused)]).toEqual([
        429,
        { statusCode: 429, code: 'ERR_RATE_LIMITED', error: 'Too Many Requests', message: 'more than 3 requests from this client in 1 min: retry in 40 s (Retry-After)' },
      ]);
      // RFC 9110 §10.2.3: Retry-After in seconds, here what is left of the window
      expect(refused.headers['retry-after']).toBe('40');
      expectSecurityHeaders(refused);
      // unknown paths count too, so probing for routes is limited
      expect((await app.inject({ method: 'GET', url: '/nowhere' })).statusCode).toBe(429);
      // probes are exempt
      for (let i = 0; i < 10; i++) {
        expect((await app.inject({ method: 'GET', url: '/healthz' })).statusCode).toBe(200);
        expect((await app.inject({ method: 'GET', url: '/readyz' })).statusCode).toBe(503);
      }
      // another client address has its own count
      expect((await app.inject({ method: 'GET', url: '/v1/presets', remoteAddress: '10.1.2.3' })).statusCode).toBe(200);
      // the next window starts afresh
      vi.setSystemTime(start + 60_000);
      const again = await app.inject({ method: 'GET', url: '/v1/presets' });
      expect([again.statusCode, again.headers['x-ratelimit-remaining']]).toEqual([200, '2']);
    });
  });

  it('behind trusted proxies the client is named by X-Forwarded-For; without them the header is ignored', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-01-01T00:00:00Z'));
    // one ingress in front (10.0.0.5): the client is the last X-Forwarded-For entry, so two
    // clients behind it have a count each (proxy-addr semantics: trust the first N hops)
    await withApp({ rateLimitMax: 1, trustProxyHops: 1 }, async (app) => {
      const viaIngress = (client: string) => app.inject({ method: 'GET', url: '/v1/presets', remoteAddress: '10.0.0.5', headers: { 'x-forwarded-for': client } });
      expect((await viaIngress('203.0.113.7')).statusCode).toBe(200);
      expect((await viaIngress('203.0.113.8')).statusCode).toBe(200);
      expect((await viaIngress('203.0.113.7')).statusCode).toBe(429);
      // a client that puts its own entry first cannot pose as another: only the last hop counts
      expect((await viaIngress('198.51.100.1, 203.0.113.8')).statusCode).toBe(429);
    });
    // the default: the socket's address, whatever the header says
    await withApp({ rateLimitMax: 1 }, async (app) => {
      const forged = (client: string) => app.inject({ method: 'GET', url: '/v1/presets', remoteAddress: '10.0.0.5', headers: { 'x-forwarded-for': client } });
      expect((await forged('203.0.113.7')).statusCode).toBe(200);
      expect((await forged('203.0.113.8')).statusCode).toBe(429);
    });
  });

  it('with a token set, refused tokens count against the limit too (guessing is limited)', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-01-01T00:00:00Z'));
    await withApp({ rateLimitMax: 2, apiToken: TOKEN }, async (app) => {
      const statuses = [];
      for (let i = 0; i < 3; i++) statuses.push((await app.inject({ method: 'GET', url: '/v1/presets', headers: { authorization: `Bearer wrong-token-${i}-xxxxxxxx` } })).statusCode);
      statuses.push((await app.inject({ method: 'GET', url: '/v1/presets', headers: { authorization: `Bearer ${TOKEN}` } })).statusCode);
      expect(statuses).toEqual([401, 401, 429, 429]);
    });
  });
});
