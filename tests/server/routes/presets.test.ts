import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkFeasibility, generateTrack, resolveParams, validateTrack } from '../../../src/core/index.js';
import { trackRequestSchema } from '../../../src/schema/params.js';
import { PRESETS, findPreset } from '../../../src/server/presets.js';
import { presetsSchema } from '../../../src/server/schemas.js';
import { buildApp } from '../../../src/server/app.js';
import { json } from '../helpers.js';

describe('GET /v1/presets', () => {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await buildApp({ startPool: false });
  });
  afterAll(async () => {
    await app.close();
  });

  it('lists every preset, gentle to brutal, with its description and parameters', async () => {
    const res = await app.inject({ method: 'GET', url: '/v1/presets' });
    expect(res.statusCode).toBe(200);
    expect(res.headers['cache-control']).toBe('public, max-age=300');
    expect(json(res)).toEqual({ presets: JSON.parse(JSON.stringify(PRESETS)) });
    expect(PRESETS.map((p) => p.name)).toEqual(['gentle', 'steady', 'lively', 'technical', 'fierce', 'brutal']);
    expect(presetsSchema.safeParse(json(res)).success).toBe(true);
  });
});

describe('presets', () => {
  it('every preset is a valid request with a one-line description', () => {
    for (const preset of PRESETS) {
      expect(trackRequestSchema.safeParse(preset.params).success).toBe(true);
      expect(preset.description).toMatch(/^[A-Z][^\n]{20,140}[.]$/);
      expect(findPreset(preset.name)).toBe(preset);
    }
    expect(findPreset('impossible')).toBeUndefined();
  });

  it('every preset passes the feasibility rules before any geometry', () => {
    for (const preset of PRESETS) {
      const p = resolveParams({ ...preset.params, seed: 0 });
      // radius above half the widest road plus the wall (shared/DESIGN.md, "Feasibility")
      expect(p.minCornerRadiusM).toBeGreaterThan(p.widthM.max / 2 + p.wall.thicknessM);
      expect(() => checkFeasibility(p, 0)).not.toThrow();
    }
  });

  it('every preset generates a valid track for three seeds, and difficulty rises from gentle to brutal', () => {
    const meanDifficulty: number[] = [];
    for (const preset of PRESETS) {
      let sum = 0;
      for (const seed of [1, 2, 3]) {
        const track = generateTrack({ ...preset.params, seed });
        expect(validateTrack(track)).toEqual({ valid: true, issues: [] });
        expect(track.metrics.cornerCount).toBe(preset.params.cornerCount);
        sum += track.metrics.difficulty;
      }
      meanDifficulty.push(sum / 3);
    }
    for (let i = 1; i < meanDifficulty.length; i++) expect(meanDifficulty[i]).toBeGreaterThan(meanDifficulty[i - 1]);
  });
});
