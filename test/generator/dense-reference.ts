/**
 * Dense reference eigenvalues for small generated models, computed with the general-purpose
 * library ml-matrix (outside the project): K φ = λ M φ is reduced with the Cholesky factor of M,
 * M = L Lᵀ, to the standard symmetric problem (L⁻¹ K L⁻ᵀ) y = λ y.
 * Tests only — never for large n.
 */
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { SymmetricCsc } from '../../src/sparse/csc.js';

/** Full dense symmetric matrix from the stored lower triangle. */
export function denseOf(a: SymmetricCsc): Matrix {
  const m = new Matrix(a.n, a.n);
  for (let j = 0; j < a.n; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      const i = a.rowIdx[p];
      m.set(i, j, a.values[p]);
      m.set(j, i, a.values[p]);
    }
  }
  return m;
}

/**
 * L⁻¹ B for lower-triangular L (forward substitution on every column of B), on flat
 * row-major copies for speed; returns row-major n×n.
 */
function forwardSolve(L: Float64Array, B: Float64Array, n: number): Float64Array {
  const X = B.slice();
  // row i of X: (b_i − Σ_{k<i} l_ik x_k) / l_ii, all columns at once
  for (let i = 0; i < n; i++) {
    const xi = i * n;
    for (let k = 0; k < i; k++) {
      const l = L[i * n + k];
      if (l === 0) continue;
      const xk = k * n;
      for (let c = 0; c < n; c++) X[xi + c] -= l * X[xk + c];
    }
    const d = L[i * n + i];
    for (let c = 0; c < n; c++) X[xi + c] /= d;
  }
  return X;
}

function flat(m: Matrix): Float64Array {
  const n = m.rows;
  const out = new Float64Array(n * m.columns);
  for (let i = 0; i < n; i++) out.set(m.getRow(i), i * m.columns);
  return out;
}

function transposed(a: Float64Array, n: number): Float64Array {
  const t = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) t[j * n + i] = a[i * n + j];
  return t;
}

/** Ascending generalized eigenvalues of (K, M); M must be positive definite. */
export function generalizedEigenvalues(stiffness: SymmetricCsc, mass: SymmetricCsc): number[] {
  const chol = new CholeskyDecomposition(denseOf(mass));
  if (!chol.isPositiveDefinite()) throw new Error('mass matrix is not positive definite');
  const n = stiffness.n;
  const L = flat(chol.lowerTriangularMatrix);
  const A = forwardSolve(L, flat(denseOf(stiffness)), n); // L⁻¹ K
  const C = forwardSolve(L, transposed(A, n), n); // L⁻¹ (L⁻¹ K)ᵀ = L⁻¹ K L⁻ᵀ
  const sym = new Matrix(n, n);
  // symmetrize the rounding: (C + Cᵀ)/2
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) sym.set(i, j, 0.5 * (C[i * n + j] + C[j * n + i]));
  const evd = new EigenvalueDecomposition(sym, { assumeSymmetric: true });
  return [...evd.realEigenvalues].sort((x, y) => x - y);
}

export function frequenciesHz(eigenvalues: number[]): number[] {
  return eigenvalues.map((l) => Math.sqrt(Math.max(l, 0)) / (2 * Math.PI));
}
