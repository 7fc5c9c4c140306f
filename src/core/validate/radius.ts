import { circumCurvature } from '../curve/curvature.js';
import { CURVATURE_ROUNDING, ROUNDING_M } from '../rules.js';
import type { TrackParams } from '../params/types.js';
import type { TrackMetrics } from '../track.js';
import type { TrackGeometry } from './geometry.js';
import { MAX_ISSUES_PER_RULE, num, worstOfRuns, type IssueSink } from './issue-sink.js';

/**
 * Largest shift of a chord's sagitta from 1 mm rounding, metres: the middle point moves by up to
 * √2·ROUNDING_M and the chord through the two end points by up to as much again.
 */
export const SAGITTA_ROUNDING_M = 2 * Math.SQRT2 * ROUNDING_M;

/**
 * How much rounding can raise the curvature of the circle through three points h apart, 1/m:
 * that curvature is 2·sagitta / h² (to first order), so rounding adds at most
 * 2·SAGITTA_ROUNDING_M / h². About 3e-4 1/m for h = 3 m.
 * @example roundingCurvatureAllowance(3); // ≈ 3.1e-4
 */
export function roundingCurvatureAllowance(hM: number): number {
  return (2 * SAGITTA_ROUNDING_M) / (hM * hM);
}

/**
 * Rule 'min_radius': the radius of curvature is at least params.minCornerRadiusM everywhere —
 * (a) by the shipped curvature (within CURVATURE_ROUNDING), (b) by the geometry: the circle
 * through points i − k, i, i + k (k the measuring stride) within
 * {@link roundingCurvatureAllowance}, and (c) by metrics.minRadiusM.
 * Rule 'radius_vs_width': wherever the shipped curvature is non-zero its radius exceeds the half
 * width on the inner side (left where curvature > 0) plus the wall thickness, so walls never fold.
 * One issue per run of offending points, at the tightest one.
 */
export function checkRadius(g: TrackGeometry, params: TrackParams, metrics: TrackMetrics, sink: IssueSink): void {
  const { n, center: c, curvature: kappa, stride: k } = g;
  const rMin = params.minCornerRadiusM;
  const kMax = 1 / rMin;
  const h = (k * g.lapM) / n;
  const kGeomMax = kMax + roundingCurvatureAllowance(h);
  const shipped = new Float64Array(n);
  const geometric = new Float64Array(n);
  const geometricK = new Float64Array(n);
  const folds = new Float64Array(n);
  const thickness = params.wall.thicknessM;
  for (let i = 0; i < n; i++) {
    const a = Math.abs(kappa[i]);
    shipped[i] = a - (kMax + CURVATURE_ROUNDING);
    const p = i - k < 0 ? i - k + n : i - k;
    const q = i + k >= n ? i + k - n : i + k;
    const kg = Math.abs(circumCurvature(c[2 * p], c[2 * p + 1], c[2 * i], c[2 * i + 1], c[2 * q], c[2 * q + 1]));
    geometricK[i] = kg;
    // NaN (coincident points) counts as a violation
    geometric[i] = kg <= kGeomMax ? 0 : Number.isNaN(kg) ? Infinity : kg - kGeomMax;
    const inner = kappa[i] > 0 ? g.halfLeftM[i] : g.halfRightM[i];
    folds[i] = a > 0 && !(1 / a > inner + thickness) ? a * (inner + thickness) : 0;
  }
  for (const i of worstOfRuns(shipped, MAX_ISSUES_PER_RULE)) {
    const r = 1 / Math.abs(kappa[i]);
    sink.add({
      code: 'min_radius',
      at: { s: num(g.s[i]), index: i },
      limit: rMin,
      actual: num(r),
      message: `radius ${num(r)} m < ${rMin} m at s=${num(g.s[i])} m (shipped curvature ${kappa[i]} 1/m)`,
    });
  }
  for (const i of worstOfRuns(geometric, MAX_ISSUES_PER_RULE)) {
    const r = 1 / geometricK[i];
    sink.add({
      code: 'min_radius',
      at: { s: num(g.s[i]), index: i, x: c[2 * i], y: c[2 * i + 1] },
      limit: rMin,
      actual: num(r),
      message: `radius ${num(r)} m < ${rMin} m at s=${num(g.s[i])} m (circle through points ${k} apart on the shipped centerline)`,
    });
  }
  if (!(metrics.minRadiusM >= rMin)) {
    sink.add({
      code: 'min_radius',
      limit: rMin,
      actual: metrics.minRadiusM,
      message: `metrics.minRadiusM ${num(metrics.minRadiusM)} m < ${rMin} m`,
    });
  }
  for (const i of worstOfRuns(folds, MAX_ISSUES_PER_RULE)) {
    const r = 1 / Math.abs(kappa[i]);
    const side = kappa[i] > 0 ? 'left' : 'right';
    const inner = (kappa[i] > 0 ? g.halfLeftM[i] : g.halfRightM[i]) + thickness;
    sink.add({
      code: 'radius_vs_width',
      at: { s: num(g.s[i]), index: i },
      limit: num(inner),
      actual: num(r),
      message: `radius ${num(r)} m <= ${side} half width + wall thickness ${num(inner)} m at s=${num(g.s[i])} m`,
    });
  }
}
