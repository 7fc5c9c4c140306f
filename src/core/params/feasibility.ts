import { InfeasibleError } from '../errors.js';
import type { TrackParams } from './types.js';

/** Smallest turn the planner calls a corner, degrees (common practice, no source: a kink). */
export const MIN_CORNER_ANGLE_DEG = 8;
/** Largest single corner, degrees: beyond a long hairpin the exit heads back across the entry. */
export const MAX_CORNER_ANGLE_DEG = 230;
/** Mean of the fullest corner curvature shape the planner draws (peak 1): corner length >= angle * radius / this. */
export const FULLEST_CORNER_SHAPE_MEAN = 0.85;
/** Straight left between consecutive corners at the least, metres. */
export const MIN_STRAIGHT_M = 2;
/** Room left beside a car at a start pose on the narrowest road, metres, each side. */
export const MIN_CAR_SIDE_GAP_M = 0.1;
/** Share of the lap the starting grid may take at most. */
export const MAX_GRID_SHARE = 0.5;

/** How the corners split between the two directions (Hopf's Umlaufsatz: net turning is ±360°). */
export interface TurnSplit {
  readonly rightCount: number;
  readonly leftCount: number;
  /** Net turning direction of the loop: +1 counter-clockwise (left majority), -1 clockwise. */
  readonly loopSign: 1 | -1 | 0;
  readonly leftTurningDeg: number;
  readonly rightTurningDeg: number;
}

/**
 * Splits corners and turning between left and right: right corners = round(turnBalance * n);
 * the direction with more corners carries the +360° net (the majority gets (K + 360) / 2,
 * the minority (K - 360) / 2). A tie leaves `loopSign` 0 for the planner to draw.
 */
export function splitTurning(p: TrackParams): TurnSplit {
  const rightCount = Math.round(p.turnBalance * p.cornerCount);
  const leftCount = p.cornerCount - rightCount;
  const loopSign = leftCount > rightCount ? 1 : rightCount > leftCount ? -1 : 0;
  const k = p.curvatureBudgetDeg;
  if (rightCount === 0) return { rightCount, leftCount, loopSign: 1, leftTurningDeg: 360, rightTurningDeg: 0 };
  if (leftCount === 0) return { rightCount, leftCount, loopSign: -1, leftTurningDeg: 0, rightTurningDeg: 360 };
  const major = (k + 360) / 2;
  const minor = (k - 360) / 2;
  return loopSign >= 0
    ? { rightCount, leftCount, loopSign, leftTurningDeg: major, rightTurningDeg: minor }
    : { rightCount, leftCount, loopSign, leftTurningDeg: minor, rightTurningDeg: major };
}

/** Lap length the corners need at the least, metres: every corner at the tightest radius. */
export function minimumLapLengthM(p: TrackParams): number {
  const turningRad = (p.curvatureBudgetDeg * Math.PI) / 180;
  return (turningRad * p.minCornerRadiusM) / FULLEST_CORNER_SHAPE_MEAN + p.cornerCount * MIN_STRAIGHT_M;
}

/**
 * Rejects, before any geometry, a request no closed simple loop can meet, with the reason and a
 * hint that names the parameter to change and how far (shared/DESIGN.md, "Feasibility").
 *
 * @throws InfeasibleError with reason turning_vs_balance, turning_too_low, corner_angle_too_large,
 *   radius_vs_width, corners_too_long, gate_spacing_vs_length, spawns_too_wide or spawns_too_long
 */
export function checkFeasibility(p: TrackParams, gridLengthM: number): void {
  const split = splitTurning(p);
  const k = p.curvatureBudgetDeg;
  const oneWay = split.rightCount === 0 || split.leftCount === 0;
  const tolerance = 0.05 * k; // the result may differ from the budget by 5%
  if (oneWay && Math.abs(k - 360) > tolerance) {
    const side = split.rightCount === 0 ? 'left' : 'right';
    throw new InfeasibleError(
      'turning_vs_balance',
      `every one of the ${p.cornerCount} corners turns ${side} (turnBalance ${p.turnBalance}), so a closed loop turns exactly 360 degrees, not ${k}`,
      `set curvatureBudgetDeg to 360, or set turnBalance so that round(turnBalance * ${p.cornerCount}) is between 1 and ${p.cornerCount - 1} (e.g. ${suggestBalance(p.cornerCount, side)})`,
    );
  }
  if (!oneWay) {
    const minority = Math.min(split.leftCount, split.rightCount);
    const needed = 360 + 2 * minority * MIN_CORNER_ANGLE_DEG;
    if (k < needed) {
      throw new InfeasibleError(
        'turning_too_low',
        `${minority} corners turn the minority way and share (budget - 360) / 2 = ${fmt((k - 360) / 2)} degrees, less than ${MIN_CORNER_ANGLE_DEG} degrees each`,
        `raise curvatureBudgetDeg to at least ${needed}, or lower turnBalance towards ${split.loopSign > 0 ? 0 : 1}`,
      );
    }
  }
  checkAngles(p, split);
  const maxHalfWidth = p.widthM.max / 2;
  if (p.minCornerRadiusM <= maxHalfWidth + p.wall.thicknessM) {
    throw new InfeasibleError(
      'radius_vs_width',
      `minCornerRadiusM ${p.minCornerRadiusM} m does not exceed half the widest road plus the wall (${fmt(maxHalfWidth)} + ${p.wall.thicknessM} m): the inner wall would fold over`,
      `raise minCornerRadiusM above ${fmt(maxHalfWidth + p.wall.thicknessM)} m, or lower widthM.max below ${fmt(2 * (p.minCornerRadiusM - p.wall.thicknessM))} m`,
    );
  }
  const needLength = minimumLapLengthM(p);
  if (needLength > p.lengthM) {
    const maxBudget = Math.floor(((p.lengthM - p.cornerCount * MIN_STRAIGHT_M) * FULLEST_CORNER_SHAPE_MEAN * 180) / (Math.PI * p.minCornerRadiusM));
    throw new InfeasibleError(
      'corners_too_long',
      `${fmt(k)} degrees of corners at radius >= ${p.minCornerRadiusM} m need at least ${Math.ceil(needLength)} m of lap, more than lengthM ${p.lengthM}`,
      `raise lengthM to at least ${Math.ceil(needLength)}, or lower curvatureBudgetDeg to at most ${maxBudget}, or lower minCornerRadiusM`,
    );
  }
  const fewest = Math.ceil(p.lengthM / p.gateSpacingM.max);
  const most = Math.floor(p.lengthM / p.gateSpacingM.min);
  if (fewest > most) {
    throw new InfeasibleError(
      'gate_spacing_vs_length',
      `no whole number of gates spaces a ${p.lengthM} m lap between ${p.gateSpacingM.min} and ${p.gateSpacingM.max} m`,
      `widen gateSpacingM (e.g. min ${fmt(p.lengthM / fewest)}), or set lengthM to a multiple of the spacing`,
    );
  }
  if (p.car.widthM + 2 * MIN_CAR_SIDE_GAP_M >= p.widthM.min) {
    throw new InfeasibleError(
      'spawns_too_wide',
      `a ${p.car.widthM} m wide car does not fit on the narrowest road (${p.widthM.min} m) with ${MIN_CAR_SIDE_GAP_M} m each side`,
      `raise widthM.min above ${fmt(p.car.widthM + 2 * MIN_CAR_SIDE_GAP_M)} m, or give a narrower car.widthM`,
    );
  }
  if (gridLengthM > MAX_GRID_SHARE * p.lengthM) {
    throw new InfeasibleError(
      'spawns_too_long',
      `${p.spawnSlots} start poses need ${Math.ceil(gridLengthM)} m of road behind the start line, more than half the lap`,
      `lower spawnSlots, or raise lengthM to at least ${Math.ceil(gridLengthM / MAX_GRID_SHARE)}`,
    );
  }
}

function checkAngles(p: TrackParams, split: TurnSplit): void {
  const groups: [string, number, number][] = [
    ['left', split.leftCount, split.leftTurningDeg],
    ['right', split.rightCount, split.rightTurningDeg],
  ];
  for (const [side, count, total] of groups) {
    if (count === 0) continue;
    if (total > count * MAX_CORNER_ANGLE_DEG) {
      const needed = Math.ceil(total / MAX_CORNER_ANGLE_DEG);
      throw new InfeasibleError(
        'corner_angle_too_large',
        `${count} ${side} corners would turn ${fmt(total / count)} degrees each, more than ${MAX_CORNER_ANGLE_DEG}`,
        `raise cornerCount so that at least ${needed} corners turn ${side}, or lower curvatureBudgetDeg`,
      );
    }
    if (total < count * MIN_CORNER_ANGLE_DEG) {
      const most = Math.floor(total / MIN_CORNER_ANGLE_DEG);
      throw new InfeasibleError(
        'turning_too_low',
        `${count} ${side} corners would turn ${fmt(total / count)} degrees each, less than ${MIN_CORNER_ANGLE_DEG}`,
        `lower cornerCount so that at most ${most} corners turn ${side}, or raise curvatureBudgetDeg`,
      );
    }
  }
}

// the balance that turns exactly one corner the other way
function suggestBalance(n: number, side: string): number {
  const share = Math.ceil(100 / n) / 100;
  return side === 'left' ? share : Math.round((1 - share) * 100) / 100;
}

function fmt(x: number): string {
  return String(Math.round(x * 10) / 10);
}
