/**
 * Dense symmetric-definite generalized eigenproblem K̄ x = λ M̄ x (K̄ symmetric, M̄ SPD), the small
 * projected pencil of subspace iteration and Rayleigh–Ritz steps. Result: λ ascending, XᵀM̄X = I.
 *
 * Cholesky reduction (default):
 *   1. diagonal scaling D = diag(M̄)^(−1/2): K̃ = D K̄ D, M̃ = D M̄ D (unit diagonal). This removes
 *      the bad scaling of lumped or projected masses before the factorization sees it;
 *   2. M̃ = L Lᵀ,  C = L⁻¹ K̃ L⁻ᵀ (symmetric; symmetrized against rounding);
 *   3. C = Y Λ Yᵀ (symmetric-eigen.ts);
 *   4. X = D L⁻ᵀ Y, so XᵀM̄X = Yᵀ L⁻¹ M̃ L⁻ᵀ Y = I and XᵀK̄X = Λ.
 *
 * The reduction is backward stable relative to the largest eigenvalue: for graded pencils (badly
 * scaled M̄ with K̄ = O(1)) the small eigenpairs come out with residuals near ε·λ_max·cond(D)
 * rather than ε·λ. Generalized Jacobi (jacobi-generalized.ts) uses only well-conditioned plane
 * transformations and keeps small residuals for small eigenvalues too. 'auto' (the default) takes
 * Jacobi when both matrices are already nearly diagonal (late subspace-iteration steps, quadratic
 * convergence), or when the mass diagonal spans more than BADLY_SCALED_RATIO and n ≤ JACOBI_MAX_N
 * (Jacobi costs O(n³) per sweep and takes several sweeps from a full pencil); otherwise, or if
 * Jacobi does not converge, the Cholesky reduction.
 */
import { cholesky, NotPositiveDefiniteError, solveLower, solveLowerTransposed } from './cholesky.js';
import { jacobiGeneralizedEigen } from './jacobi-generalized.js';
import { symmetricEigen, type SymmetricEigenResult } from './symmetric-eigen.js';

export type GeneralizedMethod = 'cholesky' | 'jacobi' | 'auto';

export interface GeneralizedEigenOptions {
  /** 'auto' (default: see above), 'cholesky' (reduction only), or 'jacobi' (Jacobi only). */
  method?: GeneralizedMethod;
}

/** Largest n for which 'auto' runs Jacobi on a full (not nearly diagonal) pencil. */
const JACOBI_MAX_N = 200;

/** max m_ii / min m_ii above which 'auto' calls the mass badly scaled. */
const BADLY_SCALED_RATIO = 1e4;

/** Largest coupling factor (a_ij²/|a_ii a_jj|) above which 'auto' prefers the Cholesky route. */
const NEAR_DIAGONAL_COUPLING = 1e-4;

/**
 * Eigenvalues (ascending) and M̄-orthonormal eigenvectors of (K̄, M̄), both n×n column-major.
 * Throws NotPositiveDefiniteError when M̄ is not numerically positive definite.
 */
export function generalizedSymmetricEigen(
  stiffness: Float64Array,
  mass: Float64Array,
  n: number,
  options: GeneralizedEigenOptions = {},
): SymmetricEigenResult {
  if (stiffness.length < n * n || mass.length < n * n) {
    throw new Error(`generalizedSymmetricEigen: need two n×n arrays for n = ${n}`);
  }
  const method = options.method ?? 'auto';
  const useJacobi =
    method === 'jacobi' ||
    (method === 'auto' &&
      ((nearlyDiagonal(stiffness, n) && nearlyDiagonal(mass, n)) ||
        (n <= JACOBI_MAX_N && diagonalSpread(mass, n) > BADLY_SCALED_RATIO)));
  if (useJacobi) {
    checkMassDiagonal(mass, n);
    const r = jacobiGeneralizedEigen(stiffness, mass, n);
    if (r.converged) return { values: r.values, vectors: r.vectors };
  }
  return byCholesky(stiffness, mass, n);
}

function byCholesky(stiffness: Float64Array, mass: Float64Array, n: number): SymmetricEigenResult {
  const d = checkMassDiagonal(mass, n);
  const ks = new Float64Array(n * n);
  const ms = new Float64Array(n * n);
  // K̃ = D K̄ D, M̃ = D M̄ D, symmetrized from the lower triangle
  for (let j = 0; j < n; j++) {
    for (let i = j; i < n; i++) {
      const kv = stiffness[j * n + i] * d[i] * d[j];
      const mv = mass[j * n + i] * d[i] * d[j];
      ks[j * n + i] = ks[i * n + j] = kv;
      ms[j * n + i] = ms[i * n + j] = mv;
    }
  }
  const chol = cholesky(ms, n);
  if (!chol.ok) throw new NotPositiveDefiniteError('projected mass', chol.failedColumn, chol.pivot);
  const l = chol.lower;
  // W = L⁻¹ K̃, then C = L⁻¹ Wᵀ = L⁻¹ K̃ L⁻ᵀ
  solveLower(l, n, ks, n);
  const c = transpose(ks, n);
  solveLower(l, n, c, n);
  symmetrize(c, n);
  const eig = symmetricEigen(c, n);
  const x = eig.vectors;
  // X = D L⁻ᵀ Y
  solveLowerTransposed(l, n, x, n);
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) x[j * n + i] *= d[i];
  }
  return { values: eig.values, vectors: x };
}

/** d_i = 1/√m_ii; throws when a mass diagonal is not positive. */
function checkMassDiagonal(mass: Float64Array, n: number): Float64Array {
  const d = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const mii = mass[i * n + i];
    if (!(mii > 0) || !Number.isFinite(mii)) throw new NotPositiveDefiniteError('projected mass', i, mii);
    d[i] = 1 / Math.sqrt(mii);
  }
  return d;
}

/** Every coupling factor a_ij²/|a_ii a_jj| below NEAR_DIAGONAL_COUPLING. */
function nearlyDiagonal(a: Float64Array, n: number): boolean {
  for (let j = 1; j < n; j++) {
    for (let i = 0; i < j; i++) {
      const aij = a[j * n + i];
      if (aij * aij > NEAR_DIAGONAL_COUPLING * Math.abs(a[i * n + i] * a[j * n + j])) return false;
    }
  }
  return true;
}

/** max m_ii / min m_ii (Infinity when a diagonal entry is not positive). */
function diagonalSpread(mass: Float64Array, n: number): number {
  let lo = Infinity;
  let hi = 0;
  for (let i = 0; i < n; i++) {
    lo = Math.min(lo, mass[i * n + i]);
    hi = Math.max(hi, mass[i * n + i]);
  }
  return lo > 0 ? hi / lo : Infinity;
}

function transpose(a: Float64Array, n: number): Float64Array {
  const t = new Float64Array(n * n);
  // t(j, i) = a(i, j)
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) t[i * n + j] = a[j * n + i];
  }
  return t;
}

function symmetrize(a: Float64Array, n: number): void {
  // a_ij = a_ji = (a_ij + a_ji)/2
  for (let j = 0; j < n; j++) {
    for (let i = j + 1; i < n; i++) {
      const v = 0.5 * (a[j * n + i] + a[i * n + j]);
      a[j * n + i] = v;
      a[i * n + j] = v;
    }
  }
}
