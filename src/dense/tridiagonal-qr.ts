/**
 * Implicitly shifted symmetric QR algorithm on a tridiagonal matrix T (diagonal d, off-diagonal e).
 *
 * Each step on an unreduced block T(l:m, l:m) performs, without forming it, T − μI = QR,
 * T ← RQ + μI = QᵀTQ, with the Wilkinson shift μ: the eigenvalue of the trailing 2×2 block
 * [a b; b c] closer to c,
 *
 *   δ = (a − c)/2,   μ = c − b² / (δ + sign(δ)·√(δ² + b²)).
 *
 * The step is a chase of Givens rotations G_l, …, G_{m−1}: G_l is chosen from the first column of
 * T − μI, (d_l − μ, e_l), and each later rotation removes the bulge the previous one created below
 * the sub-diagonal. Rotations are accumulated into Z (Z ← Z·G_kᵀ), so A = Z T Zᵀ stays true when
 * Z starts as the Q of a tridiagonal reduction.
 *
 * Deflation: e_i is set to zero once |e_i| ≤ ε·(|d_i| + |d_{i+1}|). Convergence is cubic for
 * almost all matrices; a block not converged after 30 steps per eigenvalue raises an error.
 */

const EPS = 2.220446049250313e-16;
const MAX_STEPS_PER_VALUE = 30;

/**
 * Eigenvalues (into d, unordered) and optionally eigenvectors (accumulated into the columns of z,
 * an n×n column-major array, leading dimension zRows) of the tridiagonal (d, e). d and e are
 * overwritten; e ends up zero.
 */
export function tridiagonalQr(
  d: Float64Array,
  e: Float64Array,
  z: Float64Array | null = null,
  zRows = d.length,
): void {
  const n = d.length;
  const cosines = new Float64Array(Math.max(n, 1));
  const sines = new Float64Array(Math.max(n, 1));
  let steps = 0;
  const maxSteps = MAX_STEPS_PER_VALUE * Math.max(n, 1);
  let m = n - 1;
  // walk up from the bottom, deflating each converged trailing eigenvalue
  while (m > 0) {
    if (negligible(d, e, m - 1)) {
      e[m - 1] = 0;
      m--;
      continue;
    }
    // top l of the unreduced block ending at m
    let l = m - 1;
    while (l > 0 && !negligible(d, e, l - 1)) l--;
    if (++steps > maxSteps) {
      throw new Error(`tridiagonal QR did not converge after ${maxSteps} steps (n = ${n})`);
    }
    implicitStep(d, e, l, m, cosines, sines);
    if (z !== null) applyRotations(z, zRows, l, m, cosines, sines);
  }
}

/** Eigenvalues only, ascending, of the tridiagonal (d, e); inputs are not modified. */
export function tridiagonalEigenvalues(d: Float64Array, e: Float64Array): Float64Array {
  const dd = Float64Array.from(d);
  const ee = Float64Array.from(e);
  tridiagonalQr(dd, ee, null);
  return dd.sort();
}

/** |e_i| ≤ ε(|d_i| + |d_{i+1}|), the standard deflation test. */
function negligible(d: Float64Array, e: Float64Array, i: number): boolean {
  return Math.abs(e[i]) <= EPS * (Math.abs(d[i]) + Math.abs(d[i + 1]));
}

/** Wilkinson shift from the trailing 2×2 block [d_{m−1} e_{m−1}; e_{m−1} d_m]. */
function wilkinsonShift(d: Float64Array, e: Float64Array, m: number): number {
  const a = d[m - 1];
  const b = e[m - 1];
  const c = d[m];
  const delta = 0.5 * (a - c);
  const root = Math.hypot(delta, b);
  const denom = delta >= 0 ? delta + root : delta - root;
  return denom === 0 ? c : c - (b / denom) * b;
}

/** One implicit QR step with Wilkinson shift on the unreduced block l..m; rotation k kept in (cos[k], sin[k]). */
function implicitStep(
  d: Float64Array,
  e: Float64Array,
  l: number,
  m: number,
  cos: Float64Array,
  sin: Float64Array,
): void {
  const mu = wilkinsonShift(d, e, m);
  // x, y: the pair the next rotation maps to (r, 0)
  let x = d[l] - mu;
  let y = e[l];
  for (let k = l; k < m; k++) {
    const r = Math.hypot(x, y);
    const c = r === 0 ? 1 : x / r;
    const s = r === 0 ? 0 : y / r;
    // the rotated column k−1 now reads (r, 0): record r as e_{k−1}
    if (k > l) e[k - 1] = r;
    // T(k:k+1, k:k+1) ← G [p q; q t] Gᵀ with G = [c s; −s c]
    const p = d[k];
    const q = e[k];
    const t = d[k + 1];
    const cs = c * s;
    d[k] = c * c * p + 2 * cs * q + s * s * t;
    d[k + 1] = s * s * p - 2 * cs * q + c * c * t;
    e[k] = cs * (t - p) + (c * c - s * s) * q;
    // the next column: e_{k+1} splits into a bulge s·e_{k+1} at (k+2, k) and c·e_{k+1}
    if (k + 1 < m) {
      const u = e[k + 1];
      x = e[k];
      y = s * u;
      e[k + 1] = c * u;
    }
    cos[k] = c;
    sin[k] = s;
  }
}

/**
 * Z ← Z·G_lᵀ⋯G_{m−1}ᵀ: for each k in order, columns k, k+1 become
 * (c·z_k + s·z_{k+1}, −s·z_k + c·z_{k+1}). (Row-chunked application measured no faster here.)
 */
function applyRotations(
  z: Float64Array,
  rows: number,
  l: number,
  m: number,
  cos: Float64Array,
  sin: Float64Array,
): void {
  for (let k = l; k < m; k++) {
    const c = cos[k];
    const s = sin[k];
    if (s === 0 && c === 1) continue;
    const a = k * rows;
    const b = a + rows;
    // rotate the column pair (k, k+1)
    for (let i = 0; i < rows; i++) {
      const zk = z[a + i];
      const zk1 = z[b + i];
      z[a + i] = c * zk + s * zk1;
      z[b + i] = c * zk1 - s * zk;
    }
  }
}
