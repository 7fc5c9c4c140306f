import { orient } from '../geom/orient.js';
import { segmentsIntersect } from '../geom/segment-intersect.js';
import { SegmentIndex } from '../spatial/segment-index.js';
import type { TrackGeometry } from './geometry.js';

/**
 * Point queries at which a grid over the faces pays for its build: below it each query scans
 * both faces once (a y-span test per edge, orient only on edges that span the point's height).
 * Measured on 1500-point tracks: one build costs about as much as 30 scans.
 */
const RING_INDEX_MIN_QUERIES = 32;

/** Locates points relative to the road ring: strictly between the wall faces. */
export interface RoadRing {
  /** True iff (x, y) lies strictly inside the outer face and strictly outside the inner face. */
  contains(x: number, y: number): boolean;
}

/**
 * The road ring of a track whose faces nest (the inner one is the left face on a counter-clockwise
 * loop, the right one on a clockwise loop). Point location gives exactly what pointInPolygon does
 * on each face (the same half-open winding rule with exact orientation) but skips edges that
 * cannot count: those not spanning the point's height, or, with the grid built for many queries,
 * those away from the horizontal ray through the point (about O(√n) per query instead of O(n)).
 * @param queries how many points will be located (chooses scan or grid).
 */
export function buildRoadRing(g: TrackGeometry, queries: number): RoadRing {
  const inner = g.loopSign > 0 ? g.left : g.right;
  const outer = g.loopSign > 0 ? g.right : g.left;
  if (queries < RING_INDEX_MIN_QUERIES) {
    return { contains: (x, y) => scanFace(inner, x, y) === -1 && scanFace(outer, x, y) === 1 };
  }
  const index = SegmentIndex.fromPolylines([{ coords: inner, closed: true }, { coords: outer, closed: true }]);
  let maxX = -Infinity;
  for (const f of [inner, outer]) for (let i = 0; i < f.length; i += 2) if (f[i] > maxX) maxX = f[i];
  // a buffer that holds every segment, so no query overflows it
  const found = new Int32Array(index.numItems);
  return {
    contains(x, y) {
      if (gridFace(index, found, inner, 0, x, y, maxX) !== -1) return false;
      return gridFace(index, found, outer, 1, x, y, maxX) === 1;
    },
  };
}

/** 1 strictly inside the closed face, 0 on it, -1 strictly outside: every edge that spans py. */
function scanFace(face: Float64Array, px: number, py: number): 1 | 0 | -1 {
  const n = face.length >> 1;
  let winding = 0;
  for (let j = n - 1, k = 0; k < n; j = k++) {
    const ay = face[2 * j + 1], by = face[2 * k + 1];
    // an edge entirely above or below p neither contains it nor crosses its ray
    if ((ay > py && by > py) || (ay < py && by < py)) continue;
    const w = edgeWinding(face[2 * j], ay, face[2 * k], by, px, py);
    if (w === 2) return 0;
    winding += w;
  }
  return winding !== 0 ? 1 : -1;
}

/** As scanFace, over the grid's candidates along the ray from p towards +x. */
function gridFace(index: SegmentIndex, found: Int32Array, face: Float64Array, which: number, px: number, py: number, maxX: number): 1 | 0 | -1 {
  const n = face.length >> 1;
  let winding = 0;
  // every edge that counts spans py and meets the ray to the right of p, or contains p
  const count = index.searchInto(px, py, Math.max(px, maxX), py, found);
  for (let c = 0; c < count; c++) {
    const id = found[c];
    if (index.polyline(id) !== which) continue;
    const j = index.segment(id);
    const k = j + 1 === n ? 0 : j + 1;
    const w = edgeWinding(face[2 * j], face[2 * j + 1], face[2 * k], face[2 * k + 1], px, py);
    if (w === 2) return 0;
    winding += w;
  }
  return winding !== 0 ? 1 : -1;
}

/**
 * Contribution of edge a → b to the winding number of p (half-open rule in y, exact orient, as in
 * pointInPolygon): +1, -1 or 0; 2 when p lies on the edge.
 */
function edgeWinding(ax: number, ay: number, bx: number, by: number, px: number, py: number): number {
  const side = orient(ax, ay, bx, by, px, py);
  if (side === 0 && segmentsIntersect(ax, ay, bx, by, px, py, px, py)) return 2;
  if (ay <= py) return by > py && side > 0 ? 1 : 0;
  return by <= py && side < 0 ? -1 : 0;
}
