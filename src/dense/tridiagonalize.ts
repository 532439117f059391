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
  const diagonal = new Float64Array(n);
  const offDiagonal = new Float64Array(Math.max(n - 1, 0));
  if (n >= 3) reduceAll(w, n, tau, offDiagonal);
  // diagonal and last off-diagonal of T
  for (let i = 0; i < n; i++) diagonal[i] = w[i * n + i];
  if (n >= 2) offDiagonal[n - 2] = w[(n - 2) * n + n - 1];
  const q = wantQ ? formQ(w, n, tau) : null;
  return { diagonal, offDiagonal, q, reflectors: w, tau };
}

/**
 * All reduction steps. Step k's update of A₂₂ and step k+1's product p = A₃₃ v_{k+1} share one
 * pass over the trailing columns: column k+1 is updated first, v_{k+1} built from it, and each
 * later column contributes to the next p right after its own update. Only the first p needs a
 * pass of its own.
 */
function reduceAll(w: Float64Array, n: number, tau: Float64Array, offDiagonal: Float64Array): void {
  let p = new Float64Array(n);
  let pNext = new Float64Array(n);
  startReflector(w, n, 0, tau, offDiagonal);
  if (tau[0] !== 0) lowerProduct(w, n, 1, 0, p);
  for (let k = 0; k + 2 < n; k++) {
    const s = k + 1;
    const hasNext = k + 3 < n;
    if (tau[k] !== 0) {
      toUpdateVector(w, n, k, tau[k], p);
      updateColumn(w, n, k, p, s);
    }
    if (!hasNext) {
      // last step: update the rest of the trailing block
      if (tau[k] !== 0) for (let j = s + 1; j < n; j++) updateColumn(w, n, k, p, j);
      continue;
    }
    startReflector(w, n, s, tau, offDiagonal);
    pNext.fill(0);
    const accumulate = tau[s] !== 0;
    // remaining columns: update by step k, then add their share of p_{k+1} = A₃₃ v_{k+1}
    for (let j = s + 1; j < n; j++) {
      if (tau[k] !== 0) updateColumn(w, n, k, p, j);
      if (accumulate) addColumnProduct(w, n, s, j, pNext);
    }
    const swap = p;
    p = pNext;
    pNext = swap;
  }
}

/** Reflector k from A(k+1:, k): τ_k, e_k = β, and v_k(0) = 1 made explicit in place. */
function startReflector(
  w: Float64Array,
  n: number,
  k: number,
  tau: Float64Array,
  offDiagonal: Float64Array,
): void {
  const at = k * n + k + 1;
  tau[k] = householderVector(w, at, n - k - 1);
  offDiagonal[k] = w[at];
  w[at] = 1;
}

/** p(s:) = A(s:, s:) v_k from the lower triangle, v_k(r) = w[k·n + r]. */
function lowerProduct(w: Float64Array, n: number, s: number, k: number, p: Float64Array): void {
  p.fill(0);
  for (let j = s; j < n; j++) addColumnProduct(w, n, k, j, p);
}

/**
 * Column j's share of p = A v_k over the lower triangle: p(r) += a_rj v(j) for r > j and
 * p(j) += a_jj v(j) + Σ_{r>j} a_rj v(r), with v(r) = w[k·n + r].
 */
function addColumnProduct(w: Float64Array, n: number, k: number, j: number, p: Float64Array): void {
  const c = j * n;
  const v = k * n;
  const vj = w[v + j];
  let dot = 0;
  for (let r = j + 1; r < n; r++) {
    const arj = w[c + r];
    p[r] += arj * vj;
    dot += arj * w[v + r];
  }
  p[j] += w[c + j] * vj + dot;
}

/** p ← τp − (τ/2)(τpᵀv) v: the vector of the rank-2 update A₂₂ ← A₂₂ − v pᵀ − p vᵀ. */
function toUpdateVector(w: Float64Array, n: number, k: number, tau: number, p: Float64Array): void {
  const v = k * n;
  let pv = 0;
  // τp and (τp)ᵀv
  for (let r = k + 1; r < n; r++) {
    p[r] *= tau;
    pv += p[r] * w[v + r];
  }
  const half = 0.5 * tau * pv;
  for (let r = k + 1; r < n; r++) p[r] -= half * w[v + r];
}

/** Lower part of column j: a_rj −= v(r) p(j) + p(r) v(j) for r ≥ j, v = v_k. */
function updateColumn(w: Float64Array, n: number, k: number, p: Float64Array, j: number): void {
  const c = j * n;
  const v = k * n;
  const vj = w[v + j];
  const pj = p[j];
  for (let r = j; r < n; r++) w[c + r] -= w[v + r] * pj + p[r] * vj;
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
