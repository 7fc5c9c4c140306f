import { DEFAULTS, DEGREES_PER_DERIVED_CORNER, LIMITS, METRES_PER_DERIVED_CORNER } from './defaults.js';
import type { RangeM, TrackParams, TrackRequest } from './types.js';

/**
 * Fills defaults and derives what the request left open; does not judge feasibility
 * (see `checkFeasibility`). Range checks belong to the schema at the shell; this function only
 * guards against values a shell should never pass.
 *
 * A half-given range keeps the given bound and takes the default for the other, widened so that
 * min <= max (`widthM: {min: 16}` becomes 16..16). The vehicle's width and length default to the
 * car's footprint (`car`, which places the start poses), so one car starts and drives the lap.
 *
 * @param request parameters as sent (metres, degrees); `seed` must be present
 * @returns every parameter resolved, in canonical key order
 * @throws RangeError when `seed` is missing (a shell chooses one before calling the core)
 * @example resolveParams({ seed: 7 }).cornerCount // 9
 */
export function resolveParams(request: TrackRequest): TrackParams {
  if (request.seed === undefined) throw new RangeError('seed is required by the core - a shell chooses one when the caller leaves it out.');
  const lengthM = request.lengthM ?? DEFAULTS.lengthM;
  const curvatureBudgetDeg = request.curvatureBudgetDeg ?? DEFAULTS.curvatureBudgetDeg;
  const turnBalance = request.turnBalance ?? DEFAULTS.turnBalance;
  const car = {
    lengthM: request.car?.lengthM ?? DEFAULTS.car.lengthM,
    widthM: request.car?.widthM ?? DEFAULTS.car.widthM,
  };
  const v = request.vehicle;
  return {
    seed: request.seed,
    lengthM,
    widthM: fillRange(request.widthM, DEFAULTS.widthM),
    curvatureBudgetDeg,
    turnBalance,
    cornerCount: request.cornerCount ?? deriveCornerCount(lengthM, curvatureBudgetDeg, turnBalance),
    minCornerRadiusM: request.minCornerRadiusM ?? DEFAULTS.minCornerRadiusM,
    noise: request.noise ?? DEFAULTS.noise,
    gateSpacingM: fillRange(request.gateSpacingM, DEFAULTS.gateSpacingM),
    spawnSlots: request.spawnSlots ?? DEFAULTS.spawnSlots,
    wall: {
      heightM: request.wall?.heightM ?? DEFAULTS.wall.heightM,
      thicknessM: request.wall?.thicknessM ?? DEFAULTS.wall.thicknessM,
    },
    clearanceM: request.clearanceM ?? DEFAULTS.clearanceM,
    car,
    vehicle: {
      wheelbaseM: v?.wheelbaseM ?? DEFAULTS.vehicle.wheelbaseM,
      widthM: v?.widthM ?? car.widthM,
      lengthM: v?.lengthM ?? car.lengthM,
      maxSteerDeg: v?.maxSteerDeg ?? DEFAULTS.vehicle.maxSteerDeg,
      mu: v?.mu ?? DEFAULTS.vehicle.mu,
      maxAccelMps2: v?.maxAccelMps2 ?? DEFAULTS.vehicle.maxAccelMps2,
      maxBrakeMps2: v?.maxBrakeMps2 ?? DEFAULTS.vehicle.maxBrakeMps2,
      topSpeedMps: v?.topSpeedMps ?? DEFAULTS.vehicle.topSpeedMps,
    },
    drivability: request.drivability ?? DEFAULTS.drivability,
    sensors: {
      count: request.sensors?.count ?? DEFAULTS.sensors.count,
      spreadDeg: request.sensors?.spreadDeg ?? DEFAULTS.sensors.spreadDeg,
      lengthM: request.sensors?.lengthM ?? DEFAULTS.sensors.lengthM,
    },
  };
}

/**
 * Corner count for a request that did not give one: one corner per 105 degrees of budget, at
 * most one per 40 m of lap, then nudged so that a turnBalance strictly between 0 and 1 yields
 * corners both ways (round(turnBalance * n) neither 0 nor n) where the limits allow it.
 */
export function deriveCornerCount(lengthM: number, curvatureBudgetDeg: number, turnBalance: number): number {
  const { min, max } = LIMITS.cornerCount;
  const byLength = Math.max(min, Math.floor(lengthM / METRES_PER_DERIVED_CORNER));
  let n = clamp(Math.round(curvatureBudgetDeg / DEGREES_PER_DERIVED_CORNER), min, Math.min(max, byLength));
  if (turnBalance > 0 && turnBalance < 1) {
    while (n < max && (Math.round(turnBalance * n) === 0 || Math.round(turnBalance * n) === n)) n++;
  }
  return n;
}

function fillRange(given: Partial<RangeM> | undefined, fallback: RangeM): RangeM {
  const min = given?.min;
  const max = given?.max;
  if (min !== undefined && max !== undefined) return { min, max };
  if (min !== undefined) return { min, max: Math.max(min, fallback.max) };
  if (max !== undefined) return { min: Math.min(max, fallback.min), max };
  return { min: fallback.min, max: fallback.max };
}

function clamp(x: number, lo: number, hi: number): number {
  return x < lo ? lo : x > hi ? hi : x;
}
