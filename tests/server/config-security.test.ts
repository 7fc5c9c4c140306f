/**
 * The security knobs' environment variables: CORS origins, the API token and the rate limit,
 * read by readServerConfig with every bad variable named at once (and the token's value never
 * echoed), and the same rules in resolveAppOptions for callers of buildApp.
 */
import { describe, expect, it } from 'vitest';
import { apiTokenProblem, ConfigError, corsOriginsProblem, ENV_VARS, parseCorsOrigins, readServerConfig, resolveAppOptions } from '../../src/server/config.js';

const TOKEN = 'k3y-0f_the~farm.2026+x/y==';

function problemsOf(env: Record<string, string>): readonly string[] {
  try {
    readServerConfig(env);
  } catch (err) {
    if (err instanceof ConfigError) return err.problems;
    throw err;
  }
  return [];
}

describe('readServerConfig: security variables', () => {
  it('defaults: CORS off, no token, no rate limit, a one-minute window, no proxy trusted', () => {
    expect(readServerConfig({}).app).toMatchObject({ corsOrigins: [], apiToken: undefined, rateLimitMax: 0, rateLimitWindowMs: 60_000, trustProxyHops: 0 });
  });

  it('reads every variable; blanks around list entries and empty entries are dropped', () => {
    const config = readServerConfig({
      LAPWRIGHT_CORS_ORIGINS: ' https://sim.example.org, http://localhost:5173 ,,',
      LAPWRIGHT_API_TOKEN: ` ${TOKEN} `,
      LAPWRIGHT_RATE_LIMIT_MAX: '600',
      LAPWRIGHT_RATE_LIMIT_WINDOW_MS: '1000',
      LAPWRIGHT_TRUST_PROXY_HOPS: '1',
    });
    expect(config.app).toMatchObject({ corsOrigins: ['https://sim.example.org', 'http://localhost:5173'], apiToken: TOKEN, rateLimitMax: 600, rateLimitWindowMs: 1000, trustProxyHops: 1 });
  });

  it('* allows any origin; empty variables take the defaults', () => {
    expect(readServerConfig({ LAPWRIGHT_CORS_ORIGINS: '*' }).app.corsOrigins).toEqual(['*']);
    expect(readServerConfig({ LAPWRIGHT_CORS_ORIGINS: ' ', LAPWRIGHT_API_TOKEN: '', LAPWRIGHT_RATE_LIMIT_MAX: '', LAPWRIGHT_RATE_LIMIT_WINDOW_MS: '' }).app).toMatchObject({ corsOrigins: [], apiToken: undefined, rateLimitMax: 0, rateLimitWindowMs: 60_000 });
  });

  it('names every bad variable at once, and never the token itself', () => {
    const secret = 'short secret';
    expect(
      problemsOf({
        LAPWRIGHT_CORS_ORIGINS: 'https://a.example/,*',
        LAPWRIGHT_API_TOKEN: secret,
        LAPWRIGHT_RATE_LIMIT_MAX: '-1',
        LAPWRIGHT_RATE_LIMIT_WINDOW_MS: '10',
        LAPWRIGHT_TRUST_PROXY_HOPS: 'yes',
        LAPWRIGHT_WORKERS: '0',
      }),
    ).toEqual([
      'LAPWRIGHT_CORS_ORIGINS: * (any origin) must stand alone, got "https://a.example/,*"',
      'LAPWRIGHT_API_TOKEN must be 16 to 512 characters long, got 12 (make one with: openssl rand -hex 32)',
      'LAPWRIGHT_WORKERS must be an integer from 1 to 256, got "0"',
      'LAPWRIGHT_RATE_LIMIT_MAX must be an integer from 0 to 1000000000, got "-1"',
      'LAPWRIGHT_RATE_LIMIT_WINDOW_MS must be an integer from 1000 to 86400000, got "10"',
      'LAPWRIGHT_TRUST_PROXY_HOPS must be an integer from 0 to 16, got "yes"',
    ]);
    expect(problemsOf({ LAPWRIGHT_API_TOKEN: 'x'.repeat(16) + ' secret' }).join('\n')).not.toContain('secret');
  });

  it('an origin must be what a browser sends in Origin (RFC 6454 §6.1): the fix is suggested', () => {
    expect(problemsOf({ LAPWRIGHT_CORS_ORIGINS: 'https://a.example/,HTTPS://B.example,http://c.example:80,ftp://d.example,e.example' })).toEqual([
      'LAPWRIGHT_CORS_ORIGINS: each entry must be an origin scheme://host[:port] with no path, or * alone: "https://a.example/" should be "https://a.example", "HTTPS://B.example" should be "https://b.example", "http://c.example:80" should be "http://c.example", "ftp://d.example" is not an http(s) origin, "e.example" is not an http(s) origin',
    ]);
  });
});

describe('security option checks', () => {
  it('parseCorsOrigins splits on commas and trims', () => {
    expect(parseCorsOrigins('https://a.example, https://b.example:8443')).toEqual(['https://a.example', 'https://b.example:8443']);
    expect(parseCorsOrigins(' , ')).toEqual([]);
  });

  it('corsOriginsProblem accepts origins with ports, IPv6 hosts and * alone', () => {
    expect(corsOriginsProblem(['https://a.example', 'http://127.0.0.1:8080', 'http://[::1]:3000'])).toBeUndefined();
    expect(corsOriginsProblem(['*'])).toBeUndefined();
    expect(corsOriginsProblem([])).toBeUndefined();
  });

  it('apiTokenProblem: RFC 6750 §2.1 b64token characters only, = only at the end', () => {
    expect(apiTokenProblem(TOKEN)).toBeUndefined();
    expect(apiTokenProblem('a'.repeat(512))).toBeUndefined();
    expect(apiTokenProblem('a'.repeat(513))).toBe('must be 16 to 512 characters long, got 513 (make one with: openssl rand -hex 32)');
    for (const bad of ['0123456789abcdef ghi', '0123456789abcdef"', '0123456789abcdef,x', '0123456789ab=cdef', '0123456789abcdefé']) {
      expect(apiTokenProblem(bad), bad).toBe('may hold only A-Z a-z 0-9 - . _ ~ + / (and = at the end), as a Bearer token must (RFC 6750 §2.1)');
    }
  });

  it('resolveAppOptions refuses the same values (a caller\'s mistake)', () => {
    expect(() => resolveAppOptions({ rateLimitMax: 1.5 })).toThrow('rateLimitMax must be an integer from 0 to 1000000000, got 1.5');
    expect(() => resolveAppOptions({ rateLimitWindowMs: 999 })).toThrow('rateLimitWindowMs must be an integer from 1000 to 86400000, got 999');
    expect(() => resolveAppOptions({ corsOrigins: ['*', 'https://a.example'] })).toThrow('corsOrigins: * (any origin) must stand alone');
    expect(() => resolveAppOptions({ apiToken: 'short' })).toThrow('apiToken must be 16 to 512 characters long, got 5');
  });

  it('each new variable has a documented default and meaning', () => {
    for (const key of ['corsOrigins', 'apiToken', 'rateLimitMax', 'rateLimitWindowMs'] as const) {
      expect(ENV_VARS[key].defaultText.length).toBeGreaterThan(0);
      expect(ENV_VARS[key].meaning).not.toMatch(/[|<>]/);
    }
  });
});
