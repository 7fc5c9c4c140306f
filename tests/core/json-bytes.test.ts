import { createHash } from 'node:crypto';
import { fc, test } from '@fast-check/vitest';
import { describe, expect } from 'vitest';
import { generateTrack, generateTrackJson } from '../../src/core/generate.js';
import { jsonBytesWithSha256 } from '../../src/core/json-bytes.js';

// the writer's bytes read back as text (a copy: the next call reuses the buffer)
function jsonWithSha256(value: unknown): { json: string; sha256: string } | null {
  const made = jsonBytesWithSha256(value);
  return made === null ? null : { json: new TextDecoder().decode(made.bytes), sha256: made.sha256 };
}

// The reference is the JavaScript engine's own JSON.stringify (ECMA-262, JSON.stringify and
// Number::toString: the shortest decimal that reads back as the same double) and node:crypto's
// sha256 of its UTF-8 text.
function reference(value: unknown): { json: string; sha256: string } {
  const json = JSON.stringify(value);
  return { json, sha256: createHash('sha256').update(json).digest('hex') };
}

describe('jsonBytesWithSha256 writes the same text as JSON.stringify', () => {
  test('numbers at the edges of the integer-written range and outside it', () => {
    const edge = [
      0, -0, 1, -1, 0.5, 1e-6, -1e-6, 9.99e-7, 1e-7, 5e-324, 123456.789, 999999.999999999, 1e6, 1e6 + 0.5, 1e15, 1e21, 1.5e21,
      2 ** 31, 2 ** 53, -(2 ** 53), 0.1 + 0.2, 1 / 3, Math.PI, 0.999999958, 1.000000001, 0.000001234, 123.456, -45.1,
      Number.MAX_VALUE, Number.MIN_VALUE, Number.EPSILON, NaN, Infinity, -Infinity, 1e-9, 0.000000001, 12345.000000001,
    ];
    for (const x of edge) expect(jsonWithSha256([x]), String(x)).toEqual(reference([x]));
  });

  test.prop([fc.array(fc.double(), { maxLength: 64 })], { numRuns: 300, seed: 20261202 })('any doubles', (xs) => {
    expect(jsonWithSha256(xs)).toEqual(reference(xs));
  });

  // numbers rounded to a fixed count of decimals, as a track ships them
  const rounded = fc
    .tuple(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.integer({ min: 0, max: 9 }))
    .map(([x, d]) => Math.round(x * 10 ** d) / 10 ** d);
  test.prop([fc.array(rounded, { maxLength: 64 })], { numRuns: 500, seed: 20261203 })('numbers rounded to 0-9 decimals', (xs) => {
    expect(jsonWithSha256(xs)).toEqual(reference(xs));
  });

  // the six-decimal path (curvature, headings): every whole-part length, leading zeros in the
  // decimals, trailing zeros dropped, values just off the millimetre grid and next to 1e-6
  test('six-decimal numbers', () => {
    const edge = [
      0.000001, 0.000009, 0.000123, 0.00012, 0.0001, 0.001001, 0.123456, 0.12345, 0.1234, -0.000777, -0.05, 1.000001,
      9.999999, 12.34567, 1234.567891, 9999.999999, 10000.000001, 12345.678901, 99999.9999, 100000.000001,
      123456.000001, 999999.999999, -999999.999999, 0.0000011, 0.0000015, 1.0000001, 0.1 + 0.2,
    ];
    for (const x of edge) expect(jsonWithSha256([x, [x, -x]]), String(x)).toEqual(reference([x, [x, -x]]));
  });
  test.prop([fc.array(fc.integer({ min: -(10 ** 12) + 1, max: 10 ** 12 - 1 }).map((k) => k / 1e6), { maxLength: 64 })], { numRuns: 500, seed: 20261206 })('multiples of 1e-6 below 1e6', (xs) => {
    expect(jsonWithSha256(xs)).toEqual(reference(xs));
    const pairs = xs.map((x, i) => [x, xs[xs.length - 1 - i]]);
    expect(jsonWithSha256(pairs)).toEqual(reference(pairs));
  });

  test.prop([fc.jsonValue()], { numRuns: 300, seed: 20261204 })('any JSON value (objects, arrays, strings, nesting)', (v) => {
    const made = jsonWithSha256(v);
    const ref = reference(v);
    // text beyond ASCII is left to JSON.stringify (null); all else must match
    if (/^[\x00-\x7f]*$/.test(ref.json)) expect(made).toEqual(ref);
    else expect(made).toBeNull();
  });

  // arrays that start with an [x, y] pair take a path of their own; anything may follow
  const item = fc.oneof(
    fc.tuple(fc.double(), fc.double()),
    fc.tuple(rounded, rounded),
    fc.array(rounded, { maxLength: 3 }),
    fc.constantFrom(undefined, null, 'x', [1e21, -1e-7], [-0, 5e-324]),
  );
  test.prop([fc.tuple(fc.tuple(rounded, rounded), fc.array(item, { maxLength: 40 }))], { numRuns: 400, seed: 20261205 })('arrays of points, mixed with other items', ([first, rest]) => {
    const v = [first, ...rest];
    expect(jsonWithSha256(v)).toEqual(reference(v));
  });

  test('undefined and functions are skipped in objects and written null in arrays', () => {
    const v = { a: undefined, b: () => 1, c: [undefined, () => 1, 2], d: 'x' };
    expect(jsonWithSha256(v)).toEqual(reference(v));
  });

  test('generated tracks: the shipped bytes are the UTF-8 of JSON.stringify of the track and the id their hash', () => {
    for (const request of [{ seed: 1 }, { seed: 2, lengthM: 8000, cornerCount: 30, curvatureBudgetDeg: 3000 }, { seed: 3, lengthM: 600, widthM: { min: 6, max: 8 }, cornerCount: 12, minCornerRadiusM: 8 }]) {
      const { track, bytes } = generateTrackJson(request);
      expect(Buffer.from(bytes).equals(Buffer.from(JSON.stringify(track), 'utf8'))).toBe(true);
      expect(bytes.byteLength).toBe(bytes.buffer.byteLength);
      const { format, id, ...rest } = track;
      expect(id).toBe(createHash('sha256').update(JSON.stringify({ format, ...rest })).digest('hex'));
      expect(generateTrack(request).id).toBe(id);
    }
  });
});
