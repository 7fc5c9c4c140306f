// Tests for src/core/params/drivability.ts and the generator's drivability option.

import { describe, expect, it } from 'vitest';
import { isInfeasibleError } from '../../../src/core/errors.js';
import { generateTrack } from '../../../src/core/generate.js';
import { cornerRadiusFloorM, VEHICLE_SIDE_ROOM_M, vehicleMinRadiusM } from '../../../src/core/params/drivability.js';
import { resolveParams } from '../../../src/core/params/resolve.js';
import type { TrackRequest } from '../../../src/core/params/types.js';
import { validateTrack } from '../../../src/core/validate/index.js';

function refusal(request: TrackRequest) {
  try {
    generateTrack(request);
  } catch (err) {
    if (isInfeasibleError(err)) return err;
    throw err;
  }
  throw new Error('expected the request to be refused');
}

const KART: Omit<TrackRequest, 'seed'> = { lengthM: 600, curvatureBudgetDeg: 1200, cornerCount: 12, minCornerRadiusM: 8, widthM: { min: 6, max: 8 } };

describe('vehicleMinRadiusM', () => {
  it('the default vehicle: 2.5 / tan 30° + 2 / 2 = 5.330 m', () => {
    // kinematic bicycle turning radius L / tan δ (Kong et al. 2015) plus half the width
    expect(vehicleMinRadiusM(resolveParams({ seed: 0 }).vehicle)).toBeCloseTo(2.5 / Math.tan(Math.PI / 6) + 1, 12);
    expect(vehicleMinRadiusM({ wheelbaseM: 2.7, maxSteerDeg: 35, widthM: 0 })).toBeCloseTo(3.856, 3);
  });
});

describe('the vehicle in the request', () => {
  it('width and length default to the car footprint; every other field to DEFAULTS.vehicle', () => {
    const p = resolveParams({ seed: 0, car: { widthM: 1.6, lengthM: 3.9 }, vehicle: { mu: 1.4 } });
    expect(p.vehicle).toEqual({ wheelbaseM: 2.5, widthM: 1.6, lengthM: 3.9, maxSteerDeg: 30, mu: 1.4, maxAccelMps2: 6, maxBrakeMps2: 8, topSpeedMps: 60 });
    expect(p.drivability).toBe('avoid');
    expect(p.sensors).toEqual({ count: 9, spreadDeg: 180, lengthM: 30 });
  });

  it('refuse: corners tighter than the vehicle turns are infeasible, with the radius and the lock that would do', () => {
    const err = refusal({ ...KART, seed: 1, drivability: 'refuse', vehicle: { maxSteerDeg: 10 } });
    expect(err.reason).toBe('vehicle_cannot_turn');
    // 2.5 / tan 10° + 1 = 15.18 m; the lock for 8 m: atan(2.5 / 7) = 19.65°
    expect(err.message).toContain('15.18 m');
    expect(err.hint).toContain('raise minCornerRadiusM to at least 15.2 m');
    expect(err.hint).toContain('19.7 degrees');
    expect(err.attempts).toBe(0);
  });

  it('avoid: the generator keeps every corner at the vehicle\'s radius and says so in the metrics', () => {
    const t = generateTrack({ ...KART, seed: 1, vehicle: { maxSteerDeg: 10 } });
    expect(validateTrack(t).valid).toBe(true);
    expect(t.params.minCornerRadiusM).toBe(8);
    expect(t.metrics.vehicleMinRadiusM).toBeCloseTo(15.178, 3);
    expect(t.metrics.cornerRadiusFloorM).toBeCloseTo(15.178, 3);
    expect(t.metrics.minRadiusM).toBeGreaterThanOrEqual(t.metrics.cornerRadiusFloorM);
    for (const c of t.corners) expect(c.minRadiusM).toBeGreaterThanOrEqual(15.178);
  });

  it('avoid: a raise the lap cannot hold is refused with the raise named', () => {
    // 1200° of corners at 15.18 m need 398 m of lap (corners and straights); 350 m is too short, though enough at 8 m
    const err = refusal({ ...KART, lengthM: 350, seed: 1, vehicle: { maxSteerDeg: 10 } });
    expect(err.reason).toBe('corners_too_long');
    expect(err.message).toContain('minCornerRadiusM raised from 8 to 15.18 m');
    expect(err.hint).toContain('vehicle.maxSteerDeg');
  });

  it('a vehicle with no room to steer on the narrowest road is infeasible', () => {
    const err = refusal({ seed: 1, widthM: { min: 4, max: 6 }, minCornerRadiusM: 8, vehicle: { widthM: 3.5 } });
    expect(err.reason).toBe('vehicle_too_wide');
    expect(err.hint).toContain(`raise widthM.min to at least ${3.5 + 2 * VEHICLE_SIDE_ROOM_M} m`);
    expect(() => cornerRadiusFloorM(resolveParams({ seed: 1, widthM: { min: 4.5, max: 6 }, vehicle: { widthM: 3.5 } }))).not.toThrow();
  });

  it('refuse: a layout the reference drive cannot lap is refused with the place; avoid retries and then gives up with a hint', () => {
    // a 20 m long vehicle on a kart track
    const refused = refusal({ ...KART, seed: 1, drivability: 'refuse', vehicle: { lengthM: 20 } });
    expect(refused.reason).toBe('reference_drive_failed');
    expect(refused.message).toMatch(/crossed the (left|right) wall at s=\d+(\.\d+)? m \(x -?\d/);
    expect(refused.attempts).toBeGreaterThan(0);
    const avoided = refusal({ ...KART, seed: 1, vehicle: { lengthM: 20 } });
    expect(avoided.reason).toBe('no_valid_layout');
    expect(avoided.message).toContain('reference_drive');
    expect(avoided.hint).toContain('reference drive could not lap');
  });
});
