import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Manifest } from '../../../src/core/index.js';
import { curriculumAnswerSchema } from '../../../src/server/batch-schemas.js';
import { json, readyApp } from '../helpers.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await readyApp({ workers: 1 });
});
afterAll(async () => {
  await app.close();
});

type Answer = ReturnType<typeof curriculumAnswerSchema.parse>;

describe('POST /v1/curricula', () => {
  it('stages ramp from a left loop through a right loop to mixed circuits, and metrics.difficulty rises: every sample of a stage is harder than every sample before it', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/curricula', payload: { stages: 4, to: 0.6, samples: 2 } });
    expect(res.statusCode).toBe(200);
    const answer = json(res) as Answer;
    expect(curriculumAnswerSchema.safeParse(answer).success).toBe(true);
    expect(answer.stages.map((s) => s.kind)).toEqual(['loop-left', 'loop-right', 'mixed', 'mixed']);
    let previousMax = -Infinity;
    for (const stage of answer.stages) {
      const d = stage.samples.map((t) => t.metrics.difficulty);
      expect(d).toHaveLength(2);
      for (const x of d) expect(x >= stage.difficulty.min && x <= stage.difficulty.max).toBe(true);
      expect(Math.min(...d)).toBeGreaterThan(previousMax);
      previousMax = Math.max(...d);
      expect(stage.samples.every((t) => t.split === 'train')).toBe(true);
    }
    // a stage's batch body gives its samples first
    const stage = answer.stages[2];
    const batch = await app.inject({ method: 'POST', url: '/v1/batches', payload: { ...stage.batch, count: 2, detail: 'summary' } });
    const manifest = JSON.parse(batch.body.trimEnd().split('\n').at(-1)!) as Manifest;
    expect(manifest.tracks.map((t) => t.id)).toEqual(stage.samples.map((t) => t.id));
  });

  it('400 for stages closer than the ladder tells apart, and for from above to', async () => {
    const close = await app.inject({ method: 'POST', url: '/v1/curricula', payload: { stages: 6, from: 0, to: 0.3 } });
    expect([close.statusCode, (json(close) as { issues: unknown }).issues]).toEqual([
      400,
      [{ path: 'stages', message: '6 stages from level 0 to 0.3 are 0.06 apart, closer than 0.08: ask for at most 4 stages, or widen from..to.' }],
    ]);
    const reversed = await app.inject({ method: 'POST', url: '/v1/curricula', payload: { stages: 2, from: 0.5, to: 0.2 } });
    expect((json(reversed) as { issues: unknown }).issues).toEqual([{ path: 'to', message: 'expected a level above from (0.5), got 0.2' }]);
  });
});
