/**
 * Piecewise-linear interpolation along a closed sequence: knots `xs` (increasing, xs[0] <= x)
 * carry values `ys`; the last piece runs from the last knot to (`xEnd`, `yEnd`), the point where
 * the loop closes. Binary search, O(log n).
 *
 * @example interpolateClosed(new Float64Array([0, 10]), 20, new Float64Array([0, 1]), 2, 15) // 1.5
 */
export function interpolateClosed(xs: ArrayLike<number>, xEnd: number, ys: ArrayLike<number>, yEnd: number, x: number): number {
  const n = xs.length;
  let lo = 0, hi = n - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (xs[mid] <= x) lo = mid;
    else hi = mid - 1;
  }
  const x1 = lo + 1 < n ? xs[lo + 1] : xEnd;
  const y1 = lo + 1 < n ? ys[lo + 1] : yEnd;
  const t = x1 > xs[lo] ? (x - xs[lo]) / (x1 - xs[lo]) : 0;
  return ys[lo] + t * (y1 - ys[lo]);
}
