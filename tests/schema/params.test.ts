// Tests for src/schema/params.ts: the request schema the server and the CLI share.

import { describe, expect, expectTypeOf, it } from 'vitest';
import { z } from 'zod';
import { DEFAULTS, LIMITS, resolveParams, SEED_MAX, SEED_STRING_MAX_CHARS } from '../../src/core/index.js';
import type { TrackParams, TrackRequest } from '../../src/core/index.js';
import { formatIssues } from '../../src/schema/issues.js';
import { type TrackRequestBody, trackParamsSchema, trackRequestSchema } from '../../src/schema/params.js';

/** Issues of a body the request schema refuses (fails the test when it is accepted). */
function issuesOf(body: unknown) {
  const result = trackRequestSchema.safeParse(body);
  if (result.success) throw new Error(`expected ${JSON.stringify(body)} to be refused`);
  return formatIssues(result.error);
}

/** A body with `value` at the dotted `path`. */
function at(path: string, value: unknown): Record<string, unknown> {
  const [head, tail] = path.split('.');
  return tail === undefined ? { [head]: value } : { [head]: { [tail]: value } };
}

// every bounded leaf of the request with the limit it must follow
const LEAVES: { path: string; bounds: { min: number; max: number }; integer: boolean }[] = [
  { path: 'lengthM', bounds: LIMITS.lengthM, integer: false },
  { path: 'widthM.min', bounds: LIMITS.widthM, integer: false },
  { path: 'widthM.max', bounds: LIMITS.widthM, integer: false },
  { path: 'curvatureBudgetDeg', bounds: LIMITS.curvatureBudgetDeg, integer: false },
  { path: 'turnBalance', bounds: LIMITS.turnBalance, integer: false },
  { path: 'cornerCount', bounds: LIMITS.cornerCount, integer: true },
  { path: 'minCornerRadiusM', bounds: LIMITS.minCornerRadiusM, integer: false },
  { path: 'noise', bounds: LIMITS.noise, integer: false },
  { path: 'gateSpacingM.min', bounds: LIMITS.gateSpacingM, integer: false },
  { path: 'gateSpacingM.max', bounds: LIMITS.gateSpacingM, integer: false },
  { path: 'spawnSlots', bounds: LIMITS.spawnSlots, integer: true },
  { path: 'wall.heightM', bounds: LIMITS.wall, integer: false },
  { path: 'wall.thicknessM', bounds: LIMITS.wall, integer: false },
  { path: 'clearanceM', bounds: LIMITS.clearanceM, integer: false },
  { path: 'car.lengthM', bounds: LIMITS.carLengthM, integer: false },
  { path: 'car.widthM', bounds: LIMITS.carWidthM, integer: false },
];

describe('trackRequestSchema: accepted bodies', () => {
  it('an empty body is a complete request (every field optional)', () => {
    expect(trackRequestSchema.parse({})).toEqual({});
  });

  it('a body with every field passes through unchanged (no defaults filled: the core does that)', () => {
    const body = {
      seed: 7,
      lengthM: 1500,
      widthM: { min: 10, max: 14 },
      curvatureBudgetDeg: 900,
      turnBalance: 0.4,
      cornerCount: 9,
      minCornerRadiusM: 15,
      noise: 0.3,
      gateSpacingM: { min: 5, max: 25 },
      spawnSlots: 1,
      wall: { heightM: 1.2, thicknessM: 0.5 },
      clearanceM: 1,
      car: { lengthM: 4.5, widthM: 2 },
    };
    expect(trackRequestSchema.parse(body)).toEqual(body);
  });

  it('half-given nested objects are accepted (the core fills the other half)', () => {
    expect(trackRequestSchema.parse({ widthM: { min: 16 }, wall: {}, car: { widthM: 1.8 } })).toEqual({ widthM: { min: 16 }, wall: {}, car: { widthM: 1.8 } });
  });

  it('min equal to max is accepted', () => {
    expect(trackRequestSchema.safeParse({ widthM: { min: 12, max: 12 }, gateSpacingM: { min: 10, max: 10 } }).success).toBe(true);
  });
});

describe('trackRequestSchema: every limit edge', () => {
  for (const { path, bounds, integer } of LEAVES) {
    const step = integer ? 1 : 0.001;
    it(`${path}: ${bounds.min} and ${bounds.max} accepted, ${bounds.min - step} and ${bounds.max + step} refused at ${path}`, () => {
      expect(trackRequestSchema.safeParse(at(path, bounds.min)).success).toBe(true);
      expect(trackRequestSchema.safeParse(at(path, bounds.max)).success).toBe(true);
      for (const value of [bounds.min - step, bounds.max + step]) {
        const unit = path.endsWith('M') || path.includes('M.') ? ' m' : path === 'curvatureBudgetDeg' ? ' degrees' : '';
        expect(issuesOf(at(path, value))).toEqual([
          { path, message: `expected ${integer ? 'an integer' : 'a number'} from ${bounds.min} to ${bounds.max}${unit}, got ${value}` },
        ]);
      }
    });
  }

  it('the limits are those of shared/DESIGN.md (regression pin of LIMITS as the schema states them)', () => {
    expect(issuesOf({ lengthM: 0, curvatureBudgetDeg: 0, turnBalance: 2, cornerCount: 0, minCornerRadiusM: 0, noise: 2, spawnSlots: 0, wall: { heightM: 0 } }).map((i) => i.message))
      .toMatchInlineSnapshot(`
        [
          "expected a number from 300 to 20000 m, got 0",
          "expected a number from 360 to 7200 degrees, got 0",
          "expected a number from 0 to 1, got 2",
          "expected an integer from 3 to 80, got 0",
          "expected a number from 2 to 1000 m, got 0",
          "expected a number from 0 to 1, got 2",
          "expected an integer from 1 to 64, got 0",
          "expected a number from 0.1 to 10 m, got 0",
        ]
      `);
  });

  it('integer fields refuse fractions', () => {
    expect(issuesOf({ cornerCount: 9.5, spawnSlots: 1.5 })).toMatchInlineSnapshot(`
      [
        {
          "message": "expected an integer from 3 to 80, got 9.5",
          "path": "cornerCount",
        },
        {
          "message": "expected an integer from 1 to 64, got 1.5",
          "path": "spawnSlots",
        },
      ]
    `);
  });

  it('a huge integer is one issue, not one per failed check', () => {
    expect(issuesOf({ cornerCount: 1e20 })).toEqual([{ path: 'cornerCount', message: 'expected an integer from 3 to 80, got 100000000000000000000' }]);
  });
});

describe('trackRequestSchema: seed', () => {
  it(`integers 0 and ${SEED_MAX} and strings of 1 and ${SEED_STRING_MAX_CHARS} characters are accepted`, () => {
    for (const seed of [0, SEED_MAX, 'a', 'x'.repeat(SEED_STRING_MAX_CHARS)]) expect(trackRequestSchema.parse({ seed })).toEqual({ seed });
  });

  it('-1, SEED_MAX + 1, a fraction, an empty or too long string, a boolean and null are refused at seed', () => {
    const refused = [-1, SEED_MAX + 1, 1.5, '', 'x'.repeat(SEED_STRING_MAX_CHARS + 1), true, null];
    for (const seed of refused) expect(issuesOf({ seed }).map((i) => i.path)).toEqual(['seed']);
    expect(refused.map((seed) => issuesOf({ seed })[0].message)).toMatchInlineSnapshot(`
      [
        "expected an integer from 0 to 4294967295 or a string of 1 to 64 characters, got -1",
        "expected an integer from 0 to 4294967295 or a string of 1 to 64 characters, got 4294967296",
        "expected an integer from 0 to 4294967295 or a string of 1 to 64 characters, got 1.5",
        "expected an integer from 0 to 4294967295 or a string of 1 to 64 characters, got """,
        "expected an integer from 0 to 4294967295 or a string of 1 to 64 characters, got "xxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxx"... (65 characters)",
        "expected an integer from 0 to 4294967295 or a string of 1 to 64 characters, got true",
        "expected an integer from 0 to 4294967295 or a string of 1 to 64 characters, got null",
      ]
    `);
  });
});

describe('trackRequestSchema: min <= max', () => {
  it('widthM and gateSpacingM with min > max are refused at the range path', () => {
    expect(issuesOf({ widthM: { min: 16, max: 12 }, gateSpacingM: { min: 30, max: 20 } })).toMatchInlineSnapshot(`
      [
        {
          "message": "min 16 m is greater than max 12 m",
          "path": "widthM",
        },
        {
          "message": "min 30 m is greater than max 20 m",
          "path": "gateSpacingM",
        },
      ]
    `);
  });

  it('out-of-range bounds are reported beside the order', () => {
    expect(issuesOf({ widthM: { min: 41, max: 2 } }).map((i) => i.path)).toEqual(['widthM.min', 'widthM.max', 'widthM']);
  });
});

describe('trackRequestSchema: unknown fields and wrong types', () => {
  it('unknown fields are refused by name, at the root and nested', () => {
    expect(issuesOf({ lenghtM: 1500, widthM: { min: 10, avg: 12 }, gateSpacingM: { step: 5 }, wall: { colour: 'red' }, car: { mass: 800 } })).toMatchInlineSnapshot(`
      [
        {
          "message": "unknown field "avg"; allowed fields: min, max",
          "path": "widthM.avg",
        },
        {
          "message": "unknown field "step"; allowed fields: min, max",
          "path": "gateSpacingM.step",
        },
        {
          "message": "unknown field "colour"; allowed fields: heightM, thicknessM",
          "path": "wall.colour",
        },
        {
          "message": "unknown field "mass"; allowed fields: lengthM, widthM",
          "path": "car.mass",
        },
        {
          "message": "unknown field "lenghtM"; allowed fields: seed, lengthM, widthM, curvatureBudgetDeg, turnBalance, cornerCount, minCornerRadiusM, noise, gateSpacingM, spawnSlots, wall, clearanceM, car, vehicle, drivability, sensors",
          "path": "lenghtM",
        },
      ]
    `);
  });

  it('each of several unknown fields gets its own issue', () => {
    expect(issuesOf({ a: 1, b: 2, widthM: { c: 3, d: 4 } }).map((i) => i.path)).toEqual(['widthM.c', 'widthM.d', 'a', 'b']);
  });

  it('wrong types name the value', () => {
    expect(issuesOf({ lengthM: '1500', widthM: 12, noise: null, wall: [1, 2], car: 'small' })).toMatchInlineSnapshot(`
      [
        {
          "message": "expected a number from 300 to 20000 m, got "1500"",
          "path": "lengthM",
        },
        {
          "message": "expected an object {min, max} in metres, got 12",
          "path": "widthM",
        },
        {
          "message": "expected a number from 0 to 1, got null",
          "path": "noise",
        },
        {
          "message": "expected an object {heightM, thicknessM} in metres, got an array of 2 items",
          "path": "wall",
        },
        {
          "message": "expected an object {lengthM, widthM} in metres, got "small"",
          "path": "car",
        },
      ]
    `);
  });

  it('a body that is not an object is refused at (root)', () => {
    for (const body of [[], null, 'seed=7', 7]) expect(issuesOf(body).map((i) => i.path)).toEqual(['(root)']);
    expect(issuesOf([1])).toEqual([{ path: '(root)', message: 'expected an object of track parameters, got an array of 1 item' }]);
  });

  it('non-finite numbers are refused (JSON cannot carry them, programmatic callers can)', () => {
    expect(issuesOf({ lengthM: Infinity, noise: Number.NaN }).map((i) => i.message)).toEqual([
      'expected a number from 300 to 20000 m, got Infinity',
      'expected a number from 0 to 1, got NaN',
    ]);
  });
});

describe('trackRequestSchema: documentation', () => {
  it('every leaf field states its unit, range and default', () => {
    const shape = trackRequestSchema.shape;
    for (const { path, bounds } of LEAVES) {
      const [head, tail] = path.split('.') as [keyof typeof shape, string | undefined];
      const field = tail === undefined ? shape[head] : ((shape[head].unwrap() as z.ZodObject).shape[tail] as z.ZodType);
      expect(field.description, path).toMatch(new RegExp(`Unit: \\w+\\. Allowed: ${bounds.min} to ${bounds.max}\\. Default: `));
    }
    expect(shape.seed.description).toContain(String(SEED_MAX));
    expect(shape.widthM.description).toContain(`{min: ${DEFAULTS.widthM.min}, max: ${DEFAULTS.widthM.max}}`);
  });

  it('the JSON Schema (what the OpenAPI document is made from) refuses extra fields at every level and carries defaults', () => {
    const json = z.toJSONSchema(trackRequestSchema, { io: 'input' }) as { additionalProperties: boolean; properties: Record<string, { additionalProperties?: boolean; default?: unknown }> };
    expect(json.additionalProperties).toBe(false);
    for (const key of ['widthM', 'gateSpacingM', 'wall', 'car']) expect(json.properties[key].additionalProperties).toBe(false);
    expect(json.properties.lengthM.default).toBe(DEFAULTS.lengthM);
    expect(Object.keys(json.properties)).toEqual(Object.keys(trackRequestSchema.shape));
  });
});

describe('type compatibility with the core', () => {
  it('the request schema has exactly the fields of TrackRequest, and its output is a TrackRequest once a seed is added', () => {
    expectTypeOf<keyof typeof trackRequestSchema.shape>().toEqualTypeOf<keyof TrackRequest>();
    expectTypeOf<z.output<typeof trackRequestSchema>>().toExtend<TrackRequestBody>();
    expectTypeOf<z.output<typeof trackRequestSchema> & { seed: number }>().toExtend<TrackRequest>();
    expectTypeOf<keyof ReturnType<typeof trackRequestSchema.shape.widthM.unwrap>['shape']>().toEqualTypeOf<'min' | 'max'>();
  });

  it('the resolved schema has exactly the fields of TrackParams and accepts what resolveParams returns', () => {
    expectTypeOf<keyof typeof trackParamsSchema.shape>().toEqualTypeOf<keyof TrackParams>();
    expectTypeOf<z.output<typeof trackParamsSchema>>().toExtend<TrackParams>();
    for (const request of [{ seed: 7 }, { seed: 'lap', lengthM: 300, curvatureBudgetDeg: 7200 }, { seed: 0, widthM: { min: 40 }, turnBalance: 1 }]) {
      expect(trackParamsSchema.parse(resolveParams(request))).toEqual(resolveParams(request));
    }
  });

  it('the resolved schema requires every field and tolerates extra ones', () => {
    const { cornerCount: _dropped, ...partial } = resolveParams({ seed: 7 });
    const missing = trackParamsSchema.safeParse(partial);
    expect(missing.success ? [] : formatIssues(missing.error)).toEqual([{ path: 'cornerCount', message: 'expected an integer from 3 to 80, got nothing' }]);
    expect(trackParamsSchema.safeParse({ ...resolveParams({ seed: 7 }), addedLater: true }).success).toBe(true);
    const reversed = trackParamsSchema.safeParse({ ...resolveParams({ seed: 7 }), widthM: { min: 14, max: 10 } });
    expect(reversed.success ? [] : formatIssues(reversed.error)).toEqual([{ path: 'widthM', message: 'min 14 m is greater than max 10 m' }]);
  });
});
