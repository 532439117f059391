/**
 * Generalized Jacobi method: simultaneous diagonalization of symmetric K and SPD M by
 * non-orthogonal plane transformations, K ← PᵀKP, M ← PᵀMP, X ← XP, until both are diagonal.
 * Then λ_i = k_ii / m_ii and x_i = X(:, i) / √m_ii, so XᵀMX = I and XᵀKX = Λ.
 *
 * Start: D = diag(M)^(−1/2), K ← DKD, M ← DMD, X = D (unit mass diagonal, scale-free).
 *
 * Pair step (i, j): P differs from I only in the 2×2 block P₂ at rows/columns i, j, chosen so that
 * P₂ᵀ K₂ P₂ and P₂ᵀ M₂ P₂ are diagonal, K₂, M₂ the 2×2 blocks of the pair:
 *
 *   M₂ = L Lᵀ (2×2 Cholesky),  C = L⁻¹ K₂ L⁻ᵀ,  C = R diag Rᵀ (one symmetric Jacobi rotation
 *   R = [c s; −s c], t = tan θ the root of t² + 2τt − 1 = 0 with |θ| ≤ π/4, τ = (c₂₂ − c₁₁)/2c₁₂),
 *   P₂ = L⁻ᵀ R,  so P₂ᵀ M₂ P₂ = I and P₂ᵀ K₂ P₂ = diag.
 *
 * This is equivalent to the classical two-parameter form P₂ = [1 α; γ 1] (Bathe, Finite Element
 * Procedures, §11.3.2, from memory) up to column scaling, but stays well defined when the 2×2
 * pencil is nearly proportional (K₂ ≈ λM₂, i.e. a repeated eigenvalue), where the α, γ formulas
 * divide rounding noise by rounding noise.
 *
 * Thresholds: a pair is rotated when its coupling factor max(k_ij²/|k_ii k_jj|, m_ij²/(m_ii m_jj))
 * exceeds max(tol², 10⁻⁸·worst), worst the largest coupling at the start of the sweep; the method
 * has converged when every coupling is ≤ tol². Stiffness entries at the rounding level of the whole
 * matrix (|k_ij| ≲ nε·κ√(m_ii m_jj), κ = max|k_ll|/m_ll) count as zero, so near-zero k_ii
 * (rigid-body directions) do not keep the sweep going. Convergence is quadratic once both matrices
 * are nearly diagonal, which is the situation late in subspace iteration.
 */

const EPS = 2.220446049250313e-16;

export interface JacobiGeneralizedOptions {
  /** Relative off-diagonal size regarded as zero (default 1e-12). */
  tolerance?: number;
  /** Sweeps before giving up (default 30). */
  maxSweeps?: number;
}

export interface JacobiGeneralizedResult {
  /** Eigenvalues, ascending. */
  values: Float64Array;
  /** M-orthonormal eigenvectors, n×n column-major, column j belongs to values[j]. */
  vectors: Float64Array;
  sweeps: number;
  converged: boolean;
}

/** Working state: K, M (full symmetric storage) and the accumulated X. */
interface Pencil {
  n: number;
  k: Float64Array;
  m: Float64Array;
  x: Float64Array;
  /** Square of the stiffness rounding floor factor (nε/tol)². */
  floorSq: number;
}

/** Eigenpairs of (K, M), K symmetric, M SPD, both n×n column-major (full storage). */
export function jacobiGeneralizedEigen(
  stiffness: Float64Array,
  mass: Float64Array,
  n: number,
  options: JacobiGeneralizedOptions = {},
): JacobiGeneralizedResult {
  const tol = options.tolerance ?? 1e-12;
  const maxSweeps = options.maxSweeps ?? 30;
  const p = scaledPencil(stiffness, mass, n, ((Math.max(n, 1) * EPS) / tol) ** 2);
  let sweeps = 0;
  let worst = maxCoupling(p);
  while (worst > tol * tol && sweeps < maxSweeps) {
    sweeps++;
    const threshold = Math.max(tol * tol, 1e-8 * worst);
    const kap = kappa(p);
    // one cyclic sweep over the strict upper triangle
    for (let j = 1; j < n; j++) {
      for (let i = 0; i < j; i++) {
        if (coupling(p, i, j, kap) > threshold) rotatePair(p, i, j);
      }
    }
    worst = maxCoupling(p);
  }
  return finish(p, sweeps, worst <= tol * tol);
}

/** K ← DKD, M ← DMD, X = D with D = diag(M)^(−1/2). */
function scaledPencil(
  stiffness: Float64Array,
  mass: Float64Array,
  n: number,
  floorSq: number,
): Pencil {
  const d = new Float64Array(n);
  // d_i = 1/√m_ii (a non-positive mass diagonal means M is not SPD)
  for (let i = 0; i < n; i++) {
    const mii = mass[i * n + i];
    if (!(mii > 0) || !Number.isFinite(mii)) {
      throw new Error(`generalized Jacobi: mass diagonal ${i} is not positive`);
    }
    d[i] = 1 / Math.sqrt(mii);
  }
  const k = new Float64Array(n * n);
  const m = new Float64Array(n * n);
  const x = new Float64Array(n * n);
  // scaled copies, symmetrized from the lower triangle
  for (let j = 0; j < n; j++) {
    x[j * n + j] = d[j];
    for (let i = j; i < n; i++) {
      const f = d[i] * d[j];
      k[j * n + i] = k[i * n + j] = stiffness[j * n + i] * f;
      m[j * n + i] = m[i * n + j] = mass[j * n + i] * f;
    }
  }
  return { n, k, m, x, floorSq };
}

/** κ = max_l |k_ll| / m_ll, the scale near-zero stiffness entries are measured against. */
function kappa(p: Pencil): number {
  let c = 0;
  for (let l = 0; l < p.n; l++) c = Math.max(c, Math.abs(p.k[l * p.n + l]) / p.m[l * p.n + l]);
  return c;
}

/** The larger of the two coupling factors of pair (i, j). */
function coupling(p: Pencil, i: number, j: number, kap: number): number {
  const { n, k, m } = p;
  const mm = m[i * n + i] * m[j * n + j];
  const kij = k[j * n + i];
  const mij = m[j * n + i];
  const denomK = Math.abs(k[i * n + i] * k[j * n + j]) + p.floorSq * kap * kap * mm;
  const ck = denomK > 0 ? (kij * kij) / denomK : 0;
  return Math.max(ck, (mij * mij) / mm);
}

function maxCoupling(p: Pencil): number {
  const kap = kappa(p);
  let worst = 0;
  // max coupling over all pairs i < j
  for (let j = 1; j < p.n; j++) {
    for (let i = 0; i < j; i++) worst = Math.max(worst, coupling(p, i, j, kap));
  }
  return worst;
}

/** P₂ = L⁻ᵀR (column-major [p11, p21, p12, p22]) diagonalizing the pair's 2×2 pencil. */
function pairTransform(p: Pencil, i: number, j: number): [number, number, number, number] {
  const { n, k, m } = p;
  // M₂ = LLᵀ
  const l11 = Math.sqrt(m[i * n + i]);
  const l21 = m[j * n + i] / l11;
  const l22 = Math.sqrt(Math.max(m[j * n + j] - l21 * l21, Number.MIN_VALUE));
  // U = L⁻ᵀ = [u11 u12; 0 u22]
  const u11 = 1 / l11;
  const u12 = -l21 / (l11 * l22);
  const u22 = 1 / l22;
  const kii = k[i * n + i];
  const kij = k[j * n + i];
  const kjj = k[j * n + j];
  // C = Uᵀ K₂ U
  const c11 = u11 * u11 * kii;
  const c12 = u11 * (u12 * kii + u22 * kij);
  const c22 = u12 * u12 * kii + 2 * u12 * u22 * kij + u22 * u22 * kjj;
  // symmetric Jacobi rotation with |θ| ≤ π/4
  let c = 1;
  let s = 0;
  if (c12 !== 0) {
    const tau = (c22 - c11) / (2 * c12);
    const t = (tau >= 0 ? 1 : -1) / (Math.abs(tau) + Math.sqrt(1 + tau * tau));
    c = 1 / Math.sqrt(1 + t * t);
    s = t * c;
  }
  // P₂ = U R, R = [c s; −s c]
  return [u11 * c - u12 * s, -u22 * s, u11 * s + u12 * c, u22 * c];
}

/** K ← PᵀKP, M ← PᵀMP, X ← XP for the pair (i, j). */
function rotatePair(p: Pencil, i: number, j: number): void {
  const t = pairTransform(p, i, j);
  transformSymmetric(p.k, p.n, i, j, t);
  transformSymmetric(p.m, p.n, i, j, t);
  const { n, x } = p;
  const ci = i * n;
  const cj = j * n;
  // X(:, i) ← p11 X(:, i) + p21 X(:, j),  X(:, j) ← p12 X(:, i) + p22 X(:, j)
  for (let r = 0; r < n; r++) {
    const xi = x[ci + r];
    const xj = x[cj + r];
    x[ci + r] = t[0] * xi + t[1] * xj;
    x[cj + r] = t[2] * xi + t[3] * xj;
  }
}

/**
 * A ← PᵀAP for symmetric A and P₂ = [p11 p12; p21 p22] at (i, j): columns i, j become
 * p11A(:, i) + p21A(:, j) and p12A(:, i) + p22A(:, j), rows mirror them, and the 2×2 block is
 * P₂ᵀA₂P₂ with its off-diagonal set to the zero it is by construction.
 */
function transformSymmetric(
  a: Float64Array,
  n: number,
  i: number,
  j: number,
  t: [number, number, number, number],
): void {
  const [p11, p21, p12, p22] = t;
  const ci = i * n;
  const cj = j * n;
  const aii = a[ci + i];
  const ajj = a[cj + j];
  const aij = a[cj + i];
  // off-block entries of columns i, j, mirrored into rows i, j
  for (let r = 0; r < n; r++) {
    if (r === i || r === j) continue;
    const ai = a[ci + r];
    const aj = a[cj + r];
    const ni = p11 * ai + p21 * aj;
    const nj = p12 * ai + p22 * aj;
    a[ci + r] = ni;
    a[cj + r] = nj;
    a[r * n + i] = ni;
    a[r * n + j] = nj;
  }
  a[ci + i] = p11 * p11 * aii + 2 * p11 * p21 * aij + p21 * p21 * ajj;
  a[cj + j] = p12 * p12 * aii + 2 * p12 * p22 * aij + p22 * p22 * ajj;
  a[cj + i] = 0;
  a[ci + j] = 0;
}

/** λ_i = k_ii/m_ii, x_i = X(:, i)/√m_ii, sorted ascending. */
function finish(p: Pencil, sweeps: number, converged: boolean): JacobiGeneralizedResult {
  const { n, k, m, x } = p;
  const raw = new Float64Array(n);
  // Rayleigh quotients of the diagonalized pencil
  for (let i = 0; i < n; i++) raw[i] = k[i * n + i] / m[i * n + i];
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => raw[a] - raw[b]);
  const values = new Float64Array(n);
  const vectors = new Float64Array(n * n);
  // column j of the result is X(:, order[j]) / √m
  for (let j = 0; j < n; j++) {
    const src = order[j];
    values[j] = raw[src];
    const s = 1 / Math.sqrt(m[src * n + src]);
    for (let r = 0; r < n; r++) vectors[j * n + r] = x[src * n + r] * s;
  }
  return { values, vectors, sweeps, converged };
}
