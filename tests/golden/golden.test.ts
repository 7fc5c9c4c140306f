// Golden hashes: any change of output must be deliberate. On purpose: UPDATE_GOLDEN=1 npm test,
// a CHANGELOG line, and a bump of GENERATOR_VERSION (DEVELOPERS.md, "Golden hashes").

import { createHash } from 'node:crypto';
import { readFileSync, writeFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { generateTrack } from '../../src/core/generate.js';
import type { TrackRequest } from '../../src/core/params/types.js';
import type { Track } from '../../src/core/track.js';

const FILE = new URL('./hashes.json', import.meta.url);

/** Fixed requests: a spread of sizes, directions and both kinds of seed. */
const REQUESTS: Record<string, TrackRequest> = {
  'default/1': { seed: 1 },
  'circuit/harbour-loop': { seed: 'harbour-loop', lengthM: 4600, curvatureBudgetDeg: 1570, cornerCount: 15, turnBalance: 0.4, widthM: { min: 8, max: 18 } },
  'kart/42': { seed: 42, lengthM: 600, curvatureBudgetDeg: 1200, cornerCount: 12, minCornerRadiusM: 8, widthM: { min: 6, max: 8 }, spawnSlots: 8 },
  'oval-right/9': { seed: 9, lengthM: 2000, curvatureBudgetDeg: 360, turnBalance: 1, cornerCount: 4, noise: 0 },
  'long/3': { seed: 3, lengthM: 8000, curvatureBudgetDeg: 3000, cornerCount: 30, gateSpacingM: { min: 4, max: 40 } },
  'narrow-grid/77': { seed: 77, widthM: { min: 5, max: 7 }, minCornerRadiusM: 10, spawnSlots: 12, wall: { heightM: 0.8, thicknessM: 0.3 } },
};

// hashes of each part of the track, in pipeline order, so a mismatch names the first stage that moved
function stageHashes(t: Track): Record<string, string> {
  const h = (v: unknown) => createHash('sha256').update(JSON.stringify(v)).digest('hex').slice(0, 16);
  return {
    id: t.id,
    params: h(t.params),
    controlPoints: h(t.centerline.spline.controlPoints),
    centerline: h(t.centerline),
    walls: h(t.walls),
    gates: h(t.gates),
    spawns: h(t.spawns),
    corners: h(t.corners),
    metrics: h(t.metrics),
  };
}

describe('golden hashes', () => {
  const stored = JSON.parse(readFileSync(FILE, 'utf8')) as Record<string, Record<string, string>>;
  const fresh: Record<string, Record<string, string>> = {};
  for (const [name, request] of Object.entries(REQUESTS)) {
    it(`${name}: the same bytes as recorded`, () => {
      const got = stageHashes(generateTrack(request));
      fresh[name] = got;
      if (process.env.UPDATE_GOLDEN === '1') return;
      const want = stored[name];
      expect(want, `no golden hash for ${name}: run UPDATE_GOLDEN=1 npm test`).toBeDefined();
      const first = Object.keys(got).find((k) => k !== 'id' && got[k] !== want[k]);
      expect(got.id, `${name} (seed ${JSON.stringify(request.seed)}) changed; first stage that differs: ${first ?? 'none'}`).toBe(want.id);
    });
  }
  it.runIf(process.env.UPDATE_GOLDEN === '1')('writes the file', () => {
    writeFileSync(FILE, JSON.stringify(fresh, null, 2) + '\n');
  });
});
