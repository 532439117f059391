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

/** Solve L X = B for lower-triangular L (row-major dense), in place on B's columns. */
function forwardSolve(L: Matrix, B: Matrix): Matrix {
  const n = L.rows;
  const X = B.clone();
  for (let c = 0; c < B.columns; c++) {
    for (let i = 0; i < n; i++) {
      let s = X.get(i, c);
      for (let k = 0; k < i; k++) s -= L.get(i, k) * X.get(k, c);
      X.set(i, c, s / L.get(i, i));
    }
  }
  return X;
}

/** Ascending generalized eigenvalues of (K, M); M must be positive definite. */
export function generalizedEigenvalues(stiffness: SymmetricCsc, mass: SymmetricCsc): number[] {
  const chol = new CholeskyDecomposition(denseOf(mass));
  if (!chol.isPositiveDefinite()) throw new Error('mass matrix is not positive definite');
  const L = chol.lowerTriangularMatrix;
  const A = forwardSolve(L, denseOf(stiffness)); // L⁻¹ K
  const C = forwardSolve(L, A.transpose()); // L⁻¹ (L⁻¹ K)ᵀ = L⁻¹ K L⁻ᵀ
  const sym = C.add(C.transpose()).mul(0.5);
  const evd = new EigenvalueDecomposition(sym, { assumeSymmetric: true });
  return [...evd.realEigenvalues].sort((x, y) => x - y);
}

export function frequenciesHz(eigenvalues: number[]): number[] {
  return eigenvalues.map((l) => Math.sqrt(Math.max(l, 0)) / (2 * Math.PI));
}
