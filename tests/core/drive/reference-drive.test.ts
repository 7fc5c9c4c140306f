// Tests for src/core/drive/reference-drive.ts: one lap of pure pursuit on the kinematic bicycle.

import { describe, expect, it } from 'vitest';
import { referenceDrive, type DriveVehicle } from '../../../src/core/drive/reference-drive.js';
import { buildRoadStrip } from '../../../src/core/drive/road-strip.js';
import { speedProfile } from '../../../src/core/drive/speed-profile.js';
import { generateTrack } from '../../../src/core/generate.js';
import { STANDARD_GRAVITY_MPS2 } from '../../../src/core/drive/speed-profile.js';
import { stadiumTrack } from '../../helpers/synthetic-track.js';

const car: DriveVehicle = { wheelbaseM: 2.5, widthM: 2, lengthM: 4.5, maxSteerRad: Math.PI / 6, accelMps2: 6, brakeMps2: 8 };
const limits = { mu: 0.9, maxAccelMps2: 6, maxBrakeMps2: 8, topSpeedMps: 60 };

function drive(track: ReturnType<typeof stadiumTrack>, vehicle: DriveVehicle = car) {
  const strip = buildRoadStrip(track);
  const p = speedProfile(track.centerline.curvature, track.centerline.spacingM, limits);
  return { profile: p, result: referenceDrive(strip, p.speedMps, (track.centerline.headingDeg[0] * Math.PI) / 180, vehicle, p.lapTimeS) };
}

describe('referenceDrive', () => {
  it('laps a stadium close to the centerline and to the profile lap time, clear of the walls', () => {
    const { profile, result } = drive(stadiumTrack());
    expect(result.completed).toBe(true);
    expect(result.failure).toBeNull();
    // the car follows the profile's speeds; cutting the corner entries a little shortens its path
    expect(Math.abs(result.lapTimeS / profile.lapTimeS - 1)).toBeLessThan(0.02);
    expect(result.maxLateralDeviationM).toBeLessThan(0.5);
    // half widths are at least 4.25 m, the car 1 m each side of its axis
    expect(result.minWallMarginM).toBeGreaterThan(2.5);
    expect(result.minWallMarginM).toBeLessThan(5);
  });

  it('on a constant-radius arc pure pursuit settles on the path itself (goal on the circle: γ = 1/R)', () => {
    // a long half circle: by its middle the rear axle is back on the centerline (Coulter 1992)
    const track = stadiumTrack({ radiusM: 120, straightM: 40 });
    const strip = buildRoadStrip(track);
    const p = speedProfile(track.centerline.curvature, track.centerline.spacingM, limits);
    const r = referenceDrive(strip, p.speedMps, 0, car, p.lapTimeS);
    expect(r.completed).toBe(true);
    expect(r.maxLateralDeviationM).toBeLessThan(0.3);
  });

  it('the same inputs give the same lap, to the last bit', () => {
    expect(drive(stadiumTrack()).result).toEqual(drive(stadiumTrack()).result);
  });

  it('a car wider than the road fails at the start, on the wall nearest to it', () => {
    const { result } = drive(stadiumTrack(), { ...car, widthM: 11 });
    expect(result.completed).toBe(false);
    expect(result.failure).toBe('wall');
    expect(result.minWallMarginM).toBeLessThan(0);
    expect(Number.isNaN(result.lapTimeS)).toBe(true);
  });

  it('a car that cannot turn tightly enough runs wide into the first half circle and says where', () => {
    // lock 2°: the tightest circle is 2.5 / tan 2° = 71.6 m, the corner 25 m
    const track = stadiumTrack({ radiusM: 25, straightM: 120 });
    const { result } = drive(track, { ...car, maxSteerRad: (2 * Math.PI) / 180 });
    expect(result.completed).toBe(false);
    expect(result.failure).toBe('wall');
    // the right (outer) wall of the first half circle, which runs from s = 60 m to 60 + 25π m
    expect(result.side).toBe('right');
    expect(result.atS).toBeGreaterThan(60);
    expect(result.atS).toBeLessThan(60 + 25 * Math.PI);
  });

  // the drive measures the footprint at few poses (bounds from measured neighbours skip the
  // rest); measuring every pose exactly must give the same answer, failures included
  it('skipping poses changes nothing: the same result as measuring every pose exactly', () => {
    const cases: { track: ReturnType<typeof stadiumTrack>; vehicle: DriveVehicle }[] = [
      { track: stadiumTrack(), vehicle: car },
      { track: stadiumTrack(), vehicle: { ...car, widthM: 11 } },
      { track: stadiumTrack({ radiusM: 25, straightM: 120 }), vehicle: { ...car, maxSteerRad: (2 * Math.PI) / 180 } },
      { track: stadiumTrack({ radiusM: 25, straightM: 120 }), vehicle: { ...car, maxSteerRad: (9 * Math.PI) / 180 } },
      // long cars, where a face bulges furthest between two corners (the bound taken near the car)
      { track: stadiumTrack({ radiusM: 25, straightM: 120 }), vehicle: { ...car, lengthM: 8, wheelbaseM: 4.5 } },
      { track: stadiumTrack({ radiusM: 8, straightM: 60 }), vehicle: { ...car, lengthM: 8, wheelbaseM: 4 } },
    ];
    for (const { track, vehicle } of cases) {
      const strip = buildRoadStrip(track);
      const p = speedProfile(track.centerline.curvature, track.centerline.spacingM, limits);
      const args = [strip, p.speedMps, (track.centerline.headingDeg[0] * Math.PI) / 180, vehicle, p.lapTimeS] as const;
      expect(referenceDrive(...args)).toEqual(referenceDrive(...args, true));
    }
    // generated tracks, with the car they were made for and with wider and less agile ones
    let failures = 0;
    for (let seed = 0; seed < 12; seed++) {
      const t = generateTrack(seed % 3 === 0 ? { seed, lengthM: 700, cornerCount: 10, curvatureBudgetDeg: 1000, minCornerRadiusM: 9, widthM: { min: 6, max: 8 } } : { seed });
      const v = t.params.vehicle;
      const grip = v.mu * STANDARD_GRAVITY_MPS2;
      const strip = buildRoadStrip(t);
      const p = speedProfile(t.centerline.curvature, t.centerline.spacingM, v);
      for (const [widthM, steerDeg] of [[v.widthM, v.maxSteerDeg], [v.widthM + 3, v.maxSteerDeg], [v.widthM, 12]]) {
        const vehicle: DriveVehicle = { wheelbaseM: v.wheelbaseM, widthM, lengthM: v.lengthM, maxSteerRad: (steerDeg * Math.PI) / 180, accelMps2: Math.min(v.maxAccelMps2, grip), brakeMps2: Math.min(v.maxBrakeMps2, grip) };
        const args = [strip, p.speedMps, (t.centerline.headingDeg[0] * Math.PI) / 180, vehicle, p.lapTimeS] as const;
        const fast = referenceDrive(...args);
        expect(fast, `seed ${seed}, width ${widthM}, lock ${steerDeg}`).toEqual(referenceDrive(...args, true));
        if (!fast.completed) failures++;
      }
    }
    // both branches were exercised: laps that fail and laps that finish
    expect(failures).toBeGreaterThan(3);
    expect(failures).toBeLessThan(30);
  });

  it('a speed profile of another length is a programmer error', () => {
    const track = stadiumTrack();
    expect(() => referenceDrive(buildRoadStrip(track), new Float64Array(3), 0, car, 10)).toThrow(RangeError);
  });
});
