/**
 * Straight lengths that close the loop exactly.
 *
 * With every corner fixed, the lap closes iff the straights (lengths d_i >= lo_i along known
 * unit headings (cx_i, cy_i)) add up to minus the corners' summed displacement, and the lap
 * length iff they add up to the length left over:
 *
 *   sum d_i cx_i = rx,   sum d_i cy_i = ry,   sum d_i = D.
 *
 * Among the solutions, the one nearest the drawn wishes d^_i in the weighted least-squares sense
 * (weights 1 / w_i) is d = d^ + W A^T (A W A^T)^-1 (b - A d^): a 3 x 3 solve. Straights that
 * fall below their bound are pinned to it and the rest solved again (an active-set pass, at
 * most one round per straight).
 *
 * @returns the lengths, or null when no lengths above the bounds close the loop
 */
export function solveStraights(
  cosH: Float64Array,
  sinH: Float64Array,
  wish: Float64Array,
  weight: Float64Array,
  lo: Float64Array,
  rx: number,
  ry: number,
  total: number,
): Float64Array | null {
  const n = wish.length;
  const d = new Float64Array(n);
  const pinned = new Uint8Array(n);
  for (let round = 0; round <= n; round++) {
    // right-hand side minus the pinned straights, and the normal matrix of the free ones
    let bx = rx;
    let by = ry;
    let bs = total;
    let m00 = 0, m01 = 0, m02 = 0, m11 = 0, m12 = 0, m22 = 0;
    for (let i = 0; i < n; i++) {
      const c = cosH[i], s = sinH[i];
      if (pinned[i]) {
        bx -= lo[i] * c;
        by -= lo[i] * s;
        bs -= lo[i];
        continue;
      }
      const w = weight[i];
      bx -= wish[i] * c;
      by -= wish[i] * s;
      bs -= wish[i];
      m00 += w * c * c; m01 += w * c * s; m02 += w * c;
      m11 += w * s * s; m12 += w * s;
      m22 += w;
    }
    const lam = solve3(m00, m01, m02, m11, m12, m22, bx, by, bs);
    if (lam === null) return null;
    let worst = -1;
    let worstGap = 0;
    for (let i = 0; i < n; i++) {
      if (pinned[i]) {
        d[i] = lo[i];
        continue;
      }
      d[i] = wish[i] + weight[i] * (lam[0] * cosH[i] + lam[1] * sinH[i] + lam[2]);
      const gap = lo[i] - d[i];
      if (gap > worstGap) {
        worstGap = gap;
        worst = i;
      }
    }
    if (worst < 0) return d;
    pinned[worst] = 1;
  }
  return null;
}

/** Ill-conditioned normal matrix below this relative determinant: the free straights are (nearly) parallel. */
const MIN_RELATIVE_DETERMINANT = 1e-10;

// symmetric 3 x 3 solve by Cramer's rule
function solve3(a: number, b: number, c: number, d: number, e: number, f: number, x: number, y: number, z: number): [number, number, number] | null {
  // matrix [[a b c] [b d e] [c e f]]
  const A = d * f - e * e;
  const B = c * e - b * f;
  const C = b * e - c * d;
  const det = a * A + b * B + c * C;
  const scale = Math.abs(a * d * f) + Math.abs(b * b * f) + Math.abs(c * c * d) + 1e-300;
  if (!(Math.abs(det) > MIN_RELATIVE_DETERMINANT * scale)) return null;
  const E = a * f - c * c;
  const F = b * c - a * e;
  const I = a * d - b * b;
  return [(A * x + B * y + C * z) / det, (B * x + E * y + F * z) / det, (C * x + F * y + I * z) / det];
}
