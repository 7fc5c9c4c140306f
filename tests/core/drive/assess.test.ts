// Tests for src/core/drive/assess.ts: the speed profile, reference drive and sensor check on
// generated tracks of realistic profiles, with the default vehicle.

import { describe, expect, it } from 'vitest';
import { buildCandidate } from '../../../src/core/candidate.js';
import { assessTrack } from '../../../src/core/drive/assess.js';
import { generateTrack } from '../../../src/core/generate.js';
import { gridLayout } from '../../../src/core/layout/spawn.js';
import { cornerRadiusFloorM } from '../../../src/core/params/drivability.js';
import { checkFeasibility, splitTurning } from '../../../src/core/params/feasibility.js';
import { resolveParams } from '../../../src/core/params/resolve.js';
import type { TrackRequest } from '../../../src/core/params/types.js';
import * as lapwright from '../../../src/index.js';
import { validateTrack } from '../../../src/core/validate/index.js';
import { stadiumTrack } from '../../helpers/synthetic-track.js';

// the core's realistic profiles (tests/bench/run.ts, shared/DESIGN.md)
const PROFILES: Record<string, Omit<TrackRequest, 'seed'>> = {
  'kart 600 m, 12 corners, 6-8 m wide, R 8': { lengthM: 600, curvatureBudgetDeg: 1200, cornerCount: 12, minCornerRadiusM: 8, widthM: { min: 6, max: 8 } },
  'circuit 4.6 km, 15 corners': { lengthM: 4600, curvatureBudgetDeg: 1570, cornerCount: 15, turnBalance: 0.4, widthM: { min: 8, max: 18 } },
  default: {},
};

describe('assessTrack', () => {
  for (const [name, base] of Object.entries(PROFILES)) {
    it(`${name}: the reference drive laps every layout the checker accepts (the first valid attempt of 20 seeds), clear of the walls`, () => {
      for (let seed = 0; seed < 20; seed++) {
        const p = resolveParams({ ...base, seed });
        const grid = gridLayout(p);
        checkFeasibility(p, grid.lengthM);
        const q = { ...p, minCornerRadiusM: cornerRadiusFloorM(p) };
        for (let attempt = 0; attempt < 64; attempt++) {
          const c = buildCandidate(q, splitTurning(q), grid, attempt, p);
          if (c.track === null || !validateTrack(c.track).valid) continue;
          expect(c.drive.completed, `seed ${seed}, attempt ${attempt}: ${c.drive.failure} at s=${c.drive.atS}`).toBe(true);
          expect(c.track.metrics.minWallMarginM).toBeGreaterThan(0);
          expect(c.track.metrics.sensorCoverage).toBe(1);
          break;
        }
      }
    });
  }

  it('what ships can be made again from the track alone: the metrics equal a fresh assessment of the JSON (through the public entry)', () => {
    const t = JSON.parse(JSON.stringify(generateTrack({ seed: 5, lengthM: 900, cornerCount: 7 })));
    const a = lapwright.assessTrack(t, t.params.vehicle, t.params.sensors);
    expect(lapwright.vehicleMinRadiusM(t.params.vehicle)).toBeCloseTo(t.metrics.vehicleMinRadiusM, 3);
    const r3 = (x: number) => Math.round(x * 1e3) / 1e3;
    expect(r3(a.profile.lapTimeS)).toBe(t.metrics.referenceLapTimeS);
    expect(r3(a.drive.lapTimeS)).toBe(t.metrics.driveLapTimeS);
    expect(r3(a.drive.minWallMarginM)).toBe(t.metrics.minWallMarginM);
    expect(r3(a.drive.maxLateralDeviationM)).toBe(t.metrics.maxLateralDeviationM);
    expect(a.sensors.wallsBothSides).toBe(t.metrics.sensorCoverage);
  });

  it('on the synthetic stadium: drive, profile and sensors together', () => {
    const t = stadiumTrack();
    const a = assessTrack(t, t.params.vehicle, t.params.sensors);
    expect(a.drive.completed).toBe(true);
    expect(a.sensors.wallsBothSides).toBe(1);
    expect(a.profile.minSpeedMps).toBeCloseTo(Math.sqrt(0.9 * 9.80665 * 40), 6);
  });
});
