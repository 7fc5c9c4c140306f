import { MEASURE_CHORD_M } from '../rules.js';
import { polylineLength, signedArea } from '../geom/polyline.js';
import type { Point, Track } from '../track.js';

/**
 * A structurally sound track as flat arrays, with what several rules measure on it computed
 * once. Axes: x right, y up, counter-clockwise positive; the left wall on the +normal side.
 */
export interface TrackGeometry {
  /** Number of centerline points (and wall vertices). */
  readonly n: number;
  /** Closed centerline [x0, y0, …], metres. */
  readonly center: Float64Array;
  /** Closed left and right wall faces [x0, y0, …], metres, one vertex per centerline point. */
  readonly left: Float64Array;
  readonly right: Float64Array;
  /** Lap position of each point, metres, with s[n] = lapM closing the lap. */
  readonly s: Float64Array;
  readonly curvature: Float64Array;
  readonly halfLeftM: Float64Array;
  readonly halfRightM: Float64Array;
  /** Lap length the positions refer to (centerline.lengthM), metres. */
  readonly lapM: number;
  /** Length of the closed centerline polyline, metres. */
  readonly polylineM: number;
  /** +1 for a counter-clockwise loop (signedArea > 0), else -1. */
  readonly loopSign: 1 | -1;
  /** Vertex stride whose chords are about MEASURE_CHORD_M long (see {@link measureStride}). */
  readonly stride: number;
  /** Direction of segment i (vertex i to i + 1, cyclic), radians in (-π, π]. */
  readonly segmentRad: Float64Array;
  /** Direction of segment i unwrapped along the lap from segment 0; entry n is segment 0 after one lap. */
  readonly headingRad: Float64Array;
}

/**
 * Flatten a structurally sound track (checkStructure passed) for the hot rules.
 * Cost O(n): one atan2 per segment.
 */
export function buildGeometry(track: Track): TrackGeometry {
  const cl = track.centerline;
  const n = cl.points.length;
  const center = flatten(cl.points);
  const s = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) s[i] = cl.s[i];
  s[n] = cl.lengthM;
  const segmentRad = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const j = i + 1 === n ? 0 : i + 1;
    segmentRad[i] = Math.atan2(center[2 * j + 1] - center[2 * i + 1], center[2 * j] - center[2 * i]);
  }
  // unwrap: each step adds the exterior angle, so the sum telescopes and rounding noise stays local
  const headingRad = new Float64Array(n + 1);
  headingRad[0] = segmentRad[0];
  for (let i = 1; i <= n; i++) headingRad[i] = headingRad[i - 1] + wrapAngle(segmentRad[i === n ? 0 : i] - segmentRad[i - 1]);
  return {
    n,
    center,
    left: flatten(track.walls.left),
    right: flatten(track.walls.right),
    s,
    curvature: Float64Array.from(cl.curvature),
    halfLeftM: Float64Array.from(cl.halfWidthLeftM),
    halfRightM: Float64Array.from(cl.halfWidthRightM),
    lapM: cl.lengthM,
    polylineM: polylineLength(center, true),
    loopSign: signedArea(center) > 0 ? 1 : -1,
    stride: measureStride(cl.spacingM, n),
    segmentRad,
    headingRad,
  };
}

/**
 * Vertex stride whose chords span about MEASURE_CHORD_M: max(1, round(MEASURE_CHORD_M / spacingM)),
 * capped so that a decimated loop keeps at least 3 vertices and i ± stride never meet.
 * @example measureStride(1, 1500); // 3
 */
export function measureStride(spacingM: number, n: number): number {
  const k = Math.max(1, Math.round(MEASURE_CHORD_M / spacingM));
  return Math.max(1, Math.min(k, Math.floor((n - 1) / 3)));
}

/** The angle a in radians shifted by a multiple of 2π into (-π, π]. */
export function wrapAngle(a: number): number {
  if (a > Math.PI || a <= -Math.PI) a -= 2 * Math.PI * Math.ceil((a - Math.PI) / (2 * Math.PI));
  return a;
}

function flatten(points: readonly Point[]): Float64Array {
  const out = new Float64Array(2 * points.length);
  for (let i = 0; i < points.length; i++) {
    out[2 * i] = points[i][0];
    out[2 * i + 1] = points[i][1];
  }
  return out;
}
