/**
 * What the vehicle asks of the request, before any geometry: the tightest corner it can follow
 * and room beside it on the narrowest road. With drivability 'refuse' a corner floor below the
 * vehicle's tightest turn is infeasible; with 'avoid' the generator raises the floor instead.
 */
import { turningRadiusM } from '../drive/bicycle.js';
import { InfeasibleError } from '../errors.js';
import type { TrackParams, VehicleSpec } from './types.js';

/**
 * Room the reference drive needs beside the vehicle on the narrowest road, metres each side:
 * pure pursuit cuts corners by a few decimetres and the footprint's corners swing wider than its
 * rear axle (measured on the realistic profiles: largest deviation about 0.5 m).
 */
export const VEHICLE_SIDE_ROOM_M = 0.5;

/**
 * Tightest centerline radius the vehicle can follow, metres: the kinematic bicycle's turning
 * radius at full lock, wheelbase / tan(maxSteer) (the path of the rear axle's centre), plus half
 * the vehicle's width, so that the outer rear wheel's circle fits the centerline's and the
 * steering keeps some reserve for the controller.
 *
 * @example vehicleMinRadiusM({ wheelbaseM: 2.5, maxSteerDeg: 30, widthM: 2, ... }) // 5.330 m
 */
export function vehicleMinRadiusM(v: Pick<VehicleSpec, 'wheelbaseM' | 'maxSteerDeg' | 'widthM'>): number {
  return turningRadiusM(v.wheelbaseM, (v.maxSteerDeg * Math.PI) / 180) + v.widthM / 2;
}

/**
 * The corner radius floor the generator keeps: minCornerRadiusM, raised to the vehicle's tightest
 * radius under drivability 'avoid'.
 *
 * @throws InfeasibleError `vehicle_cannot_turn` under 'refuse' when minCornerRadiusM is below the
 *   vehicle's tightest radius; `vehicle_too_wide` when the vehicle and VEHICLE_SIDE_ROOM_M each
 *   side do not fit on the narrowest road
 */
export function cornerRadiusFloorM(p: TrackParams): number {
  const v = p.vehicle;
  if (v.widthM + 2 * VEHICLE_SIDE_ROOM_M > p.widthM.min) {
    throw new InfeasibleError(
      'vehicle_too_wide',
      `a ${v.widthM} m wide vehicle needs ${fmt(v.widthM + 2 * VEHICLE_SIDE_ROOM_M)} m of road (${VEHICLE_SIDE_ROOM_M} m each side to steer), more than the narrowest road (widthM.min ${p.widthM.min} m)`,
      `raise widthM.min to at least ${fmt(v.widthM + 2 * VEHICLE_SIDE_ROOM_M)} m, or give a narrower vehicle.widthM (at most ${fmt(p.widthM.min - 2 * VEHICLE_SIDE_ROOM_M)} m)`,
    );
  }
  const need = vehicleMinRadiusM(v);
  if (p.minCornerRadiusM >= need) return p.minCornerRadiusM;
  if (p.drivability === 'avoid') return need;
  // the lock that would follow minCornerRadiusM, if any
  const room = p.minCornerRadiusM - v.widthM / 2;
  const lock = room > 0 ? Math.ceil((Math.atan(v.wheelbaseM / room) * 180) / Math.PI * 10) / 10 : NaN;
  throw new InfeasibleError(
    'vehicle_cannot_turn',
    `corners as tight as minCornerRadiusM ${p.minCornerRadiusM} m are beyond the vehicle: at full lock (${v.maxSteerDeg} degrees, wheelbase ${v.wheelbaseM} m) it follows a centerline radius of ${fmt(need)} m at the least (wheelbase / tan(maxSteer) + width / 2)`,
    `raise minCornerRadiusM to at least ${Math.ceil(need * 10) / 10} m${Number.isFinite(lock) && lock <= 60 ? `, or give the vehicle a steering lock of ${lock} degrees (vehicle.maxSteerDeg)` : ''}, or set drivability to "avoid" to keep every corner at least ${fmt(need)} m`,
  );
}

function fmt(x: number): string {
  return String(Math.round(x * 100) / 100);
}
