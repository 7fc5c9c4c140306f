import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { DEFAULTS, LIMITS } from '../../../src/core/index.js';
import { EXPORT_FORMAT_NAMES, SVG_WIDTH_LIMITS_PX } from '../../../src/export/index.js';
import { trackRequestSchema } from '../../../src/schema/params.js';
import { buildApp } from '../../../src/server/app.js';
import { describeParams, paramsDocSchema, type ParamDoc } from '../../../src/server/params-doc.js';
import { json } from '../helpers.js';

describe('GET /v1/params', () => {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await buildApp({ startPool: false });
  });
  afterAll(async () => {
    await app.close();
  });

  it('answers the parameter description, in its documented shape', async () => {
    const res = await app.inject({ method: 'GET', url: '/v1/params' });
    expect([res.statusCode, res.headers['cache-control']]).toEqual([200, 'public, max-age=300']);
    expect(json(res)).toEqual(JSON.parse(JSON.stringify(describeParams())));
    expect(paramsDocSchema.strict().safeParse(json(res)).success).toBe(true);
  });
});

describe('describeParams', () => {
  const doc = describeParams();
  const byName = new Map<string, ParamDoc>(doc.parameters.map((p) => [p.name, p]));

  it('lists every request parameter but the seed, nested ones dotted, in the schema\'s order', () => {
    // the oracle: the zod shape itself (object fields hold the nested parameters)
    const expected = Object.entries(trackRequestSchema.shape).flatMap(([key, field]) => {
      if (key === 'seed') return [];
      const inner = (field as z.ZodOptional<z.ZodType>).unwrap();
      return inner instanceof z.ZodObject ? Object.keys(inner.shape).map((sub) => `${key}.${sub}`) : [key];
    });
    expect(doc.parameters.map((p) => p.name)).toEqual(expected);
    expect(expected.slice(0, 16)).toEqual([
      'lengthM',
      'widthM.min',
      'widthM.max',
      'curvatureBudgetDeg',
      'turnBalance',
      'cornerCount',
      'minCornerRadiusM',
      'noise',
      'gateSpacingM.min',
      'gateSpacingM.max',
      'spawnSlots',
      'wall.heightM',
      'wall.thicknessM',
      'clearanceM',
      'car.lengthM',
      'car.widthM',
    ]);
  });

  it('ranges and defaults are the core\'s LIMITS and DEFAULTS', () => {
    expect(byName.get('lengthM')).toEqual({ name: 'lengthM', type: 'number', unit: 'm', min: LIMITS.lengthM.min, max: LIMITS.lengthM.max, default: DEFAULTS.lengthM, defaultText: String(DEFAULTS.lengthM), meaning: 'Centerline length of one lap.' });
    expect(byName.get('widthM.max')).toMatchObject({ unit: 'm', min: LIMITS.widthM.min, max: LIMITS.widthM.max, default: DEFAULTS.widthM.max });
    expect(byName.get('curvatureBudgetDeg')).toMatchObject({ unit: 'deg', min: LIMITS.curvatureBudgetDeg.min, max: LIMITS.curvatureBudgetDeg.max, default: DEFAULTS.curvatureBudgetDeg });
    expect(byName.get('turnBalance')).toMatchObject({ unit: null, type: 'number', default: DEFAULTS.turnBalance });
    expect(byName.get('spawnSlots')).toMatchObject({ unit: null, type: 'integer', min: LIMITS.spawnSlots.min, max: LIMITS.spawnSlots.max });
    expect(byName.get('wall.thicknessM')).toMatchObject({ unit: 'm', default: DEFAULTS.wall.thicknessM });
    expect(byName.get('car.widthM')).toMatchObject({ unit: 'm', min: LIMITS.carWidthM.min, default: DEFAULTS.car.widthM });
    // cornerCount is derived when left out
    expect(byName.get('cornerCount')).toMatchObject({ type: 'integer', default: null, defaultText: 'derived from lengthM and curvatureBudgetDeg' });
  });

  it('every range is one the request schema accepts at both ends and refuses just outside; every choice lists what it accepts', () => {
    const request = (name: string, value: unknown) => {
      const [head, sub] = name.split('.');
      return sub === undefined ? { [head]: value } : { [head]: { [sub]: value } };
    };
    for (const p of doc.parameters) {
      expect(p.meaning).not.toMatch(/Unit:|Allowed:|Default:/);
      if (p.type === 'choice') {
        for (const value of p.values!) expect(trackRequestSchema.safeParse(request(p.name, value)).success, `${p.name} = ${value}`).toBe(true);
        expect(trackRequestSchema.safeParse(request(p.name, 'none-of-these')).success).toBe(false);
        continue;
      }
      // every parameter of the request schema today is a bounded number or a choice
      expect(['number', 'integer'], p.name).toContain(p.type);
      if (p.min === undefined || p.max === undefined) throw new Error(`${p.name} has no range`);
      expect(trackRequestSchema.safeParse(request(p.name, p.min)).success, `${p.name} = ${p.min}`).toBe(true);
      expect(trackRequestSchema.safeParse(request(p.name, p.max)).success, `${p.name} = ${p.max}`).toBe(true);
      expect(trackRequestSchema.safeParse(request(p.name, p.max + 1)).success, `${p.name} = ${p.max + 1}`).toBe(false);
      if (typeof p.default === 'number') expect(p.default >= p.min && p.default <= p.max).toBe(true);
    }
  });

  it('the seed, the formats and the export options', () => {
    expect(doc.seed).toMatchObject({ integerMax: 4294967295, stringMaxChars: 64 });
    expect(doc.formats.map((f) => f.name)).toEqual(EXPORT_FORMAT_NAMES);
    expect(doc.exportOptions.map((o) => `${o.format}:${o.name}:${o.type}`)).toEqual(['csv:table:string', 'svg:heat:boolean', 'svg:widthPx:integer', 'json:pretty:boolean']);
    expect(doc.exportOptions.find((o) => o.name === 'widthPx')).toMatchObject(SVG_WIDTH_LIMITS_PX);
    expect(doc.exportOptions.find((o) => o.name === 'table')?.values).toEqual(['centerline', 'gates']);
  });
});

describe('describeParams of other kinds of parameter', () => {
  // a made-up request schema with a word choice, a flag, a speed and an acceleration
  const schema = z.strictObject({
    mode: z.enum(['calm', 'eager']).optional().meta({ description: 'How to go. Default: calm.', default: 'calm' }),
    flag: z.boolean().optional().meta({ description: 'A switch.' }),
    topSpeedMps: z.number().min(1).max(100).optional().meta({ description: 'Top speed. Unit: m/s. Allowed: 1 to 100. Default: 30.', default: 30 }),
    kart: z.strictObject({ maxAccelMps2: z.number().min(0.5).max(20).optional().meta({ description: 'Push. Unit: m/s². Allowed: 0.5 to 20. Default: 4.', default: 4 }) }).optional(),
  });

  it('a choice lists its words, anything without a range is text, and units follow the name', () => {
    expect(describeParams(schema).parameters).toEqual([
      { name: 'mode', type: 'choice', unit: null, values: ['calm', 'eager'], default: 'calm', defaultText: 'calm', meaning: 'How to go.' },
      { name: 'flag', type: 'text', unit: null, default: null, defaultText: 'derived', meaning: 'A switch.' },
      { name: 'topSpeedMps', type: 'number', unit: 'm/s', min: 1, max: 100, default: 30, defaultText: '30', meaning: 'Top speed.' },
      { name: 'kart.maxAccelMps2', type: 'number', unit: 'm/s²', min: 0.5, max: 20, default: 4, defaultText: '4', meaning: 'Push.' },
    ]);
  });
});
