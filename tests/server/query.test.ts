import { describe, expect, it } from 'vitest';
import { nestQuery, parsePathSeed } from '../../src/server/query.js';

describe('parsePathSeed', () => {
  it('digits that fit are the integer seed; anything else is a string seed', () => {
    expect(parsePathSeed('0')).toBe(0);
    expect(parsePathSeed('42')).toBe(42);
    expect(parsePathSeed('4294967295')).toBe(4294967295);
    expect(parsePathSeed('4294967296')).toBe('4294967296');
    expect(parsePathSeed('-1')).toBe('-1');
    expect(parsePathSeed('1e3')).toBe('1e3');
    expect(parsePathSeed('lap-7')).toBe('lap-7');
  });
});

describe('nestQuery', () => {
  it('dotted keys become nested fields; JSON numbers become numbers, the rest stays text', () => {
    expect(nestQuery({ lengthM: '2400', 'widthM.min': '8', 'widthM.max': ' 12 ', noise: '.5', format: 'json', turnBalance: '0x1' }, 'a')).toEqual({
      body: { lengthM: 2400, widthM: { min: 8, max: 12 }, noise: '.5', turnBalance: '0x1', seed: 'a' },
      issues: [],
    });
  });

  it('a repeated key stays an array (the schema then names it)', () => {
    expect(nestQuery({ noise: ['0.1', '0.2'] }, 1).body).toEqual({ noise: [0.1, 0.2], seed: 1 });
  });

  it('keys like __proto__ become plain fields, so the schema refuses them by name', () => {
    const { body } = nestQuery({ __proto__x: '1', ['__proto__.polluted']: '1' } as Record<string, unknown>, 1);
    expect(Object.getPrototypeOf(body)).toBe(Object.prototype);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    expect(Object.keys(body)).toEqual(['__proto__x', '__proto__', 'seed']);
  });

  it('reports a seed in the query, empty key parts and value/object conflicts', () => {
    expect(nestQuery({ seed: '3', 'a..b': '1', widthM: '8', 'widthM.min': '8', 'gateSpacingM.min': '5', gateSpacingM: '9' }, 1).issues).toEqual([
      { path: 'seed', message: 'the seed goes in the path (/v1/tracks/{seed}), not in the query string' },
      { path: 'a..b', message: 'query key "a..b" has an empty part; nested fields are written parent.child (widthM.min=8)' },
      { path: 'widthM', message: 'query sets "widthM" both as a value and as an object ("widthM.min"); use the dotted keys only' },
      { path: 'gateSpacingM', message: 'query sets "gateSpacingM" both as a value and as an object ("gateSpacingM"); use the dotted keys only' },
    ]);
  });
});
