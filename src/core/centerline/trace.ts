import { SHAPE_INTERVALS, shapeAt } from './corner-shape.js';
import type { Plan, PlannedCorner } from './plan-types.js';

/** Largest heading change of one traced arc step, radians: keeps the trace within micrometres of the profile. */
export const TRACE_MAX_TURN_RAD = Math.PI / 180;

/**
 * A plan traced as a closed polyline of constant-curvature steps, with the lap position of each
 * vertex and, per corner, the vertex range it spans.
 */
export interface Trace {
  /** Vertices [x0, y0, x1, y1, ...]; the closing vertex (back at the start) is not repeated. */
  readonly points: Float64Array;
  /** Heading of travel at each vertex, radians (unwrapped: the last is near loopSign * 2π). */
  readonly heading: Float64Array;
  /** Lap position of each vertex, metres from the start of corner 0. */
  readonly s: Float64Array;
  /** Vertex index where each corner starts and ends (end = start of the straight after it). */
  readonly cornerStart: Int32Array;
  readonly cornerEnd: Int32Array;
  /** Where the trace ends: should equal the start (closure residual), metres. */
  readonly endX: number;
  readonly endY: number;
  /** Heading at the end of the lap, radians: loopSign * 2π up to rounding. */
  readonly endHeading: number;
}

/**
 * Traces a plan from (0, 0) at heading 0. Inside a corner the curvature is piecewise linear
 * between the shape's knots; each step is an exact circular arc with the curvature at its
 * middle, which integrates a linear profile exactly, so every corner turns its planned angle.
 *
 * @param maxStepM longest step, metres (straights are cut into equal steps no longer than this)
 */
export function tracePlan(plan: Plan, maxStepM: number): Trace {
  const n = plan.corners.length;
  let count = 0;
  const steps: number[] = [];
  for (let i = 0; i < n; i++) {
    const q = cornerSubsteps(plan.corners[i], maxStepM);
    steps.push(q);
    count += q * SHAPE_INTERVALS + Math.max(1, Math.ceil(plan.straights[i] / maxStepM));
  }
  const points = new Float64Array(2 * count);
  const heading = new Float64Array(count);
  const s = new Float64Array(count);
  const cornerStart = new Int32Array(n);
  const cornerEnd = new Int32Array(n);
  let x = 0, y = 0, h = 0, pos = 0, k = 0;
  const emit = () => {
    points[2 * k] = x;
    points[2 * k + 1] = y;
    heading[k] = h;
    s[k] = pos;
    k++;
  };
  for (let i = 0; i < n; i++) {
    const c = plan.corners[i];
    cornerStart[i] = k;
    const q = steps[i];
    const m = q * SHAPE_INTERVALS;
    const step = c.lengthM / m;
    for (let j = 0; j < m; j++) {
      emit();
      const kappa = c.sign * c.peakCurvature * shapeAt(c.shape, (j + 0.5) / m);
      const turn = kappa * step;
      // chord of an arc: length step * sinc(turn / 2), direction h + turn / 2
      const half = 0.5 * turn;
      const chord = Math.abs(half) < 1e-8 ? step : (step * Math.sin(half)) / half;
      x += chord * Math.cos(h + half);
      y += chord * Math.sin(h + half);
      h += turn;
      pos += step;
    }
    cornerEnd[i] = k;
    const d = plan.straights[i];
    const pieces = Math.max(1, Math.ceil(d / maxStepM));
    const cos = Math.cos(h), sin = Math.sin(h);
    for (let j = 0; j < pieces; j++) {
      emit();
      x += (d / pieces) * cos;
      y += (d / pieces) * sin;
      pos += d / pieces;
    }
  }
  return { points, heading, s, cornerStart, cornerEnd, endX: x, endY: y, endHeading: h };
}

/**
 * Displacement of a corner traced alone from (0, 0) at heading 0, with the same steps as
 * `tracePlan`, so that the closure solve and the trace agree to rounding: [mid x, mid y, end x,
 * end y], the middle being halfway along the corner.
 */
export function cornerDisplacement(c: PlannedCorner, maxStepM: number): [number, number, number, number] {
  const m = cornerSubsteps(c, maxStepM) * SHAPE_INTERVALS;
  const step = c.lengthM / m;
  let x = 0, y = 0, h = 0, mx = 0, my = 0;
  for (let j = 0; j < m; j++) {
    if (2 * j === m) {
      mx = x;
      my = y;
    }
    const turn = c.sign * c.peakCurvature * shapeAt(c.shape, (j + 0.5) / m) * step;
    const half = 0.5 * turn;
    const chord = Math.abs(half) < 1e-8 ? step : (step * Math.sin(half)) / half;
    x += chord * Math.cos(h + half);
    y += chord * Math.sin(h + half);
    h += turn;
  }
  return [mx, my, x, y];
}

// steps per shape interval: arcs short enough and turning at most TRACE_MAX_TURN_RAD each
function cornerSubsteps(c: PlannedCorner, maxStepM: number): number {
  const interval = c.lengthM / SHAPE_INTERVALS;
  const byTurn = Math.ceil((c.peakCurvature * interval) / TRACE_MAX_TURN_RAD);
  const byLength = Math.ceil(interval / maxStepM);
  return Math.max(1, byTurn, byLength);
}
