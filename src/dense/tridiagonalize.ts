/**
 * Householder reduction of a symmetric matrix to tridiagonal form.
 *
 *   T = Qᵀ A Q,   Q = H₀ H₁ ⋯ H_{n−3},   H_k = I − τ_k v_k v_kᵀ
 *
 * Step k annihilates A(k+2:n, k) with a reflector acting on rows/columns k+1..n−1. With
 * x = A(k+1:n, k), the reflector satisfies H x = β e₁ (β = −sign(x₀)‖x‖). The trailing block
 * A₂₂ = A(k+1:n, k+1:n) becomes H A₂₂ H through the symmetric rank-2 update
 *
 *   p = τ A₂₂ v,   w = p − (τ/2)(pᵀv) v,   A₂₂ ← A₂₂ − v wᵀ − w vᵀ.
 *
 * Storage: column-major n×n Float64Array, leading dimension n; only the lower triangle of A is
 * read, and the input is not modified. Cost: about 4/3·n³ flops for T plus 4/3·n³ to form Q.
 */

export interface Tridiagonal {
  /** d_i = T(i, i), length n. */
  diagonal: Float64Array;
  /** e_i = T(i+1, i), length max(n − 1, 0). */
  offDiagonal: Float64Array;
  /** The orthogonal Q (n×n column-major) with A = Q T Qᵀ, or null when not asked for. */
  q: Float64Array | null;
  /** n×n work array holding v_k (v_k(0) = 1 explicit) in column k, rows k+1 … n−1. */
  reflectors: Float64Array;
  /** τ_k of each reflector. */
  tau: Float64Array;
}

/**
 * Householder vector of x = a[start .. start+m−1] in place: on return a[start] holds β,
 * a[start+1 ..] holds v(1:) (v₀ = 1 implicit); the return value is τ (0 when x(1:) = 0).
 */
export function householderVector(a: Float64Array, start: number, m: number): number {
  const alpha = a[start];
  let tailSq = 0;
  // ‖x(1:)‖² with a scale to keep tiny or huge entries finite
  let scale = 0;
  for (let i = 1; i < m; i++) scale = Math.max(scale, Math.abs(a[start + i]));
  if (scale === 0) return 0;
  for (let i = 1; i < m; i++) {
    const t = a[start + i] / scale;
    tailSq += t * t;
  }
  const tailNorm = scale * Math.sqrt(tailSq);
  const norm = Math.hypot(alpha, tailNorm);
  const beta = alpha >= 0 ? -norm : norm;
  const tau = (beta - alpha) / beta;
  const inv = 1 / (alpha - beta);
  // v(1:) = x(1:) / (x₀ − β)
  for (let i = 1; i < m; i++) a[start + i] *= inv;
  a[start] = beta;
  return tau;
}

/** Reduce symmetric A (n×n column-major) to tridiagonal T = QᵀAQ; Q formed when wantQ. */
export function tridiagonalize(a: Float64Array, n: number, wantQ = true): Tridiagonal {
  const w = Float64Array.from(a.subarray(0, n * n));
  const tau = new Float64Array(Math.max(n, 1));
  const p = new Float64Array(n);
  const diagonal = new Float64Array(n);
  const offDiagonal = new Float64Array(Math.max(n - 1, 0));
  for (let k = 0; k + 2 < n; k++) {
    const col = k * n;
    const m = n - k - 1;
    const t = householderVector(w, col + k + 1, m);
    tau[k] = t;
    offDiagonal[k] = w[col + k + 1];
    w[col + k + 1] = 1; // v₀ = 1 made explicit while updating
    if (t !== 0) reflectTrailing(w, n, k + 1, col + k + 1, t, p);
  }
  // diagonal and last off-diagonal of T
  for (let i = 0; i < n; i++) diagonal[i] = w[i * n + i];
  if (n >= 2) offDiagonal[n - 2] = w[(n - 2) * n + n - 1];
  const q = wantQ ? formQ(w, n, tau) : null;
  return { diagonal, offDiagonal, q, reflectors: w, tau };
}

/** Z ← Q Z for an n×cols block Z: eigenvectors of T become eigenvectors of A. */
export function applyReductionQ(t: Tridiagonal, z: Float64Array, cols: number): void {
  const n = t.diagonal.length;
  const w = t.reflectors;
  // Q = H₀ ⋯ H_{n−3}: apply H_{n−3} first
  for (let k = n - 3; k >= 0; k--) {
    const tk = t.tau[k];
    if (tk === 0) continue;
    const s = k + 1;
    const vAt = k * n + s;
    // Z(s:, j) ← Z(s:, j) − τ v (vᵀ Z(s:, j))
    for (let j = 0; j < cols; j++) {
      const c = j * n;
      let dot = 0;
      for (let r = s; r < n; r++) dot += w[vAt + r - s] * z[c + r];
      dot *= tk;
      if (dot === 0) continue;
      for (let r = s; r < n; r++) z[c + r] -= dot * w[vAt + r - s];
    }
  }
}

/**
 * A₂₂ ← H A₂₂ H for the block starting at (s, s), v stored at w[vAt .. vAt+m−1]. Only the lower
 * triangle of A₂₂ is read and written.
 */
function reflectTrailing(
  w: Float64Array,
  n: number,
  s: number,
  vAt: number,
  tau: number,
  p: Float64Array,
): void {
  const m = n - s;
  p.fill(0, 0, m);
  // p = A₂₂ v from the lower triangle: column j adds A(j:, j)·v_j below and A(j+1:, j)ᵀv(j+1:) at j
  for (let j = 0; j < m; j++) {
    const c = (s + j) * n + s;
    const vj = w[vAt + j];
    let dot = 0;
    for (let r = j + 1; r < m; r++) {
      const arj = w[c + r];
      p[r] += arj * vj;
      dot += arj * w[vAt + r];
    }
    p[j] += w[c + j] * vj + dot;
  }
  // p ← τp, then w = p − (τ/2)(pᵀv) v
  let pv = 0;
  for (let i = 0; i < m; i++) {
    p[i] *= tau;
    pv += p[i] * w[vAt + i];
  }
  const half = 0.5 * tau * pv;
  for (let i = 0; i < m; i++) p[i] -= half * w[vAt + i];
  // lower triangle of A₂₂ ← A₂₂ − v wᵀ − w vᵀ, column by column
  for (let j = 0; j < m; j++) {
    const c = (s + j) * n + s;
    const vj = w[vAt + j];
    const pj = p[j];
    for (let r = j; r < m; r++) w[c + r] -= w[vAt + r] * pj + p[r] * vj;
  }
}

/** Q = H₀ H₁ ⋯ H_{n−3}, accumulated backwards so each H_k touches only Q(k+1:, k+1:). */
function formQ(w: Float64Array, n: number, tau: Float64Array): Float64Array {
  const q = new Float64Array(n * n);
  // start from the identity
  for (let i = 0; i < n; i++) q[i * n + i] = 1;
  for (let k = n - 3; k >= 0; k--) {
    const t = tau[k];
    if (t === 0) continue;
    const s = k + 1;
    const vAt = k * n + s;
    // Q(s:, j) ← Q(s:, j) − τ v (vᵀ Q(s:, j)) for the columns H_k mixes
    for (let j = s; j < n; j++) {
      const c = j * n;
      let dot = 0;
      for (let r = s; r < n; r++) dot += w[vAt + r - s] * q[c + r];
      dot *= t;
      if (dot === 0) continue;
      for (let r = s; r < n; r++) q[c + r] -= dot * w[vAt + r - s];
    }
  }
  return q;
}
