import { describe, expect, it } from 'vitest';
import { matchesIfNoneMatch, negotiateFormat } from '../../src/server/negotiate.js';

describe('negotiateFormat', () => {
  it('the format query wins over Accept', () => {
    expect(negotiateFormat('svg', 'application/json')).toEqual({ format: 'svg' });
    expect(negotiateFormat('json', 'text/csv')).toEqual({ format: 'json' });
  });

  it('no Accept header, or an empty one, means JSON', () => {
    expect(negotiateFormat(undefined, undefined)).toEqual({ format: 'json' });
    expect(negotiateFormat(undefined, '  ')).toEqual({ format: 'json' });
  });

  it('the most preferred format by q, the most specific range deciding; JSON on a tie', () => {
    expect(negotiateFormat(undefined, '*/*')).toEqual({ format: 'json' });
    expect(negotiateFormat(undefined, 'text/csv, application/json')).toEqual({ format: 'json' });
    expect(negotiateFormat(undefined, 'text/csv, application/json;q=0.9')).toEqual({ format: 'csv' });
    expect(negotiateFormat(undefined, '*/*;q=0.1, image/svg+xml')).toEqual({ format: 'svg' });
    expect(negotiateFormat(undefined, 'application/json;q=0, */*')).toEqual({ format: 'svg' });
    expect(negotiateFormat(undefined, 'MODEL/GLTF-BINARY')).toEqual({ format: 'glb' });
  });

  it('nothing acceptable, or nothing parseable: no format', () => {
    expect(negotiateFormat(undefined, 'text/html')).toEqual({ format: null, accept: 'text/html' });
    expect(negotiateFormat(undefined, 'nonsense')).toEqual({ format: null, accept: 'nonsense' });
    expect(negotiateFormat(undefined, '*/*;q=0')).toEqual({ format: null, accept: '*/*;q=0' });
  });
});

describe('matchesIfNoneMatch', () => {
  it('weak comparison over a list, and *', () => {
    expect(matchesIfNoneMatch(undefined, '"a"')).toBe(false);
    expect(matchesIfNoneMatch('"a"', '"a"')).toBe(true);
    expect(matchesIfNoneMatch('W/"a"', '"a"')).toBe(true);
    expect(matchesIfNoneMatch('"b", W/"a"', '"a"')).toBe(true);
    expect(matchesIfNoneMatch('*', '"a"')).toBe(true);
    expect(matchesIfNoneMatch('"b"', '"a"')).toBe(false);
    expect(matchesIfNoneMatch('a', '"a"')).toBe(false);
  });
});
