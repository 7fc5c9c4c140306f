/**
 * The drivability assessment of a shipped track for a vehicle: the friction-limited speed
 * profile (speed-profile.ts), the reference drive (reference-drive.ts) and the sensor check
 * (sensors.ts), all on the numbers that ship, so anyone holding the track's JSON can make them
 * again.
 */
import type { SensorSpec, VehicleSpec } from '../params/types.js';
import type { Track } from '../track.js';
import { referenceDrive, type DriveResult } from './reference-drive.js';
import { buildRoadStrip } from './road-strip.js';
import { sensorCoverage, type SensorCoverage } from './sensors.js';
import { speedProfile, STANDARD_GRAVITY_MPS2, type SpeedProfile } from './speed-profile.js';

/** The three checks' results. */
export interface Assessment {
  readonly profile: SpeedProfile;
  readonly drive: DriveResult;
  readonly sensors: SensorCoverage;
}

/**
 * Runs the speed profile, the reference drive and the sensor check on a track.
 *
 * @param track the shipped centerline (points, curvature, headings, spacing), wall faces and gates
 * @param vehicle the car: size, wheelbase, steering lock, grip, acceleration, braking, top speed
 * @param sensors ray count, spread and length
 * @returns the profile, the drive's result and the sensor coverage
 * @throws RangeError when the wall faces do not have one vertex per centerline point
 * @example assessTrack(track, track.params.vehicle, track.params.sensors).drive.completed // true
 */
export function assessTrack(track: Pick<Track, 'centerline' | 'walls' | 'gates'>, vehicle: VehicleSpec, sensors: SensorSpec): Assessment {
  const c = track.centerline;
  const strip = buildRoadStrip(track);
  const profile = speedProfile(c.curvature, c.spacingM, vehicle);
  const grip = vehicle.mu * STANDARD_GRAVITY_MPS2;
  const drive = referenceDrive(
    strip,
    profile.speedMps,
    (c.headingDeg[0] * Math.PI) / 180,
    {
      wheelbaseM: vehicle.wheelbaseM,
      widthM: vehicle.widthM,
      lengthM: vehicle.lengthM,
      maxSteerRad: (vehicle.maxSteerDeg * Math.PI) / 180,
      accelMps2: Math.min(vehicle.maxAccelMps2, grip),
      brakeMps2: Math.min(vehicle.maxBrakeMps2, grip),
    },
    profile.lapTimeS,
  );
  const headingRad = new Float64Array(c.headingDeg.length);
  for (let i = 0; i < headingRad.length; i++) headingRad[i] = (c.headingDeg[i] * Math.PI) / 180;
  return { profile, drive, sensors: sensorCoverage(strip, headingRad, track.gates, sensors) };
}
