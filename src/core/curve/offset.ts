// Offset curves of a sampled closed curve: each vertex moved along its unit left normal.
// The offset at signed distance d is regular only where d·κ < 1 (Farouki & Neff, "Analytic
// properties of plane offset curves", CAGD 7 (1990) 83–99); this module does not check that,
// the track validator does.
// Axes: x right, y up, counter-clockwise positive; the left normal of (tx, ty) is (−ty, tx).

/**
 * Unit left normals (−ty, tx) of unit tangents `[tx0, ty0, …]`.
 * @param out optional output, same length as `tangents`
 * @throws {RangeError} when the length is odd or `out` is too short
 * @example leftNormals(new Float64Array([1, 0])); // [-0, 1]
 */
export function leftNormals(tangents: Float64Array, out?: Float64Array): Float64Array {
  if (tangents.length % 2 !== 0) throw new RangeError(`tangents must be flat [tx0, ty0, …], got odd length ${tangents.length}`);
  const r = out ?? new Float64Array(tangents.length);
  if (r.length < tangents.length) throw new RangeError(`out has length ${r.length}, need ${tangents.length}`);
  for (let i = 0; i < tangents.length; i += 2) {
    const tx = tangents[i];
    r[i] = -tangents[i + 1];
    r[i + 1] = tx;
  }
  return r;
}

/**
 * Offset a closed sampled curve: vertex i moves by `sign·distances[i]` metres along its unit
 * left normal, so `sign = 1` gives the left side (the inside of a counter-clockwise loop)
 * and `sign = -1` the right side.
 * @param points vertices `[x0, y0, …]` (m)
 * @param normals unit left normals `[nx0, ny0, …]`, one per vertex
 * @param distances offset per vertex (m), usually the half width
 * @param sign 1 for the left side, -1 for the right side
 * @param out optional output, same length as `points`
 * @returns the offset vertices `[x0, y0, …]` (m)
 * @throws {RangeError} when the array lengths disagree or `out` is too short
 * @example
 * const leftWall = offsetClosed(curve.points, curve.normals, halfWidths, 1);
 */
export function offsetClosed(points: Float64Array, normals: Float64Array, distances: Float64Array, sign: 1 | -1, out?: Float64Array): Float64Array {
  const n = points.length >> 1;
  if (points.length % 2 !== 0 || normals.length !== points.length || distances.length !== n) {
    throw new RangeError(
      `need points and normals of equal even length and one distance per vertex, got ${points.length}, ${normals.length}, ${distances.length}`,
    );
  }
  const r = out ?? new Float64Array(points.length);
  if (r.length < points.length) throw new RangeError(`out has length ${r.length}, need ${points.length}`);
  for (let i = 0; i < n; i++) {
    const d = sign * distances[i];
    r[2 * i] = points[2 * i] + d * normals[2 * i];
    r[2 * i + 1] = points[2 * i + 1] + d * normals[2 * i + 1];
  }
  return r;
}
