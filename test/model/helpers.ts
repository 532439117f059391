/**
 * Test helpers for the geometry checks: dense reference modes of small models from the
 * general-purpose library ml-matrix (outside the project), packed as a ModesResult.
 * K φ = λ M φ is reduced with M = L Lᵀ to (L⁻¹ K L⁻ᵀ) y = λ y, φ = L⁻ᵀ y (so φᵀMφ = 1).
 * Small models only (dense n × n).
 */
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { SymmetricCsc } from '../../src/sparse/csc.js';
import type { ModesResult } from '../../src/eigen/modes-types.js';
import { frequencyHzFromEigenvalue } from '../../src/eigen/modes-types.js';

export function denseOf(a: SymmetricCsc): Matrix {
  const m = new Matrix(a.n, a.n);
  for (let j = 0; j < a.n; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      m.set(a.rowIdx[p], j, a.values[p]);
      m.set(j, a.rowIdx[p], a.values[p]);
    }
  }
  return m;
}

/** The lowest `count` modes (all when omitted) of (K, M), dense. */
export function denseModes(stiffness: SymmetricCsc, mass: SymmetricCsc, count?: number): ModesResult {
  const n = stiffness.n;
  const chol = new CholeskyDecomposition(denseOf(mass));
  if (!chol.isPositiveDefinite()) throw new Error('mass matrix is not positive definite');
  const L = chol.lowerTriangularMatrix;
  const lInverse = lowerInverse(L);
  const c = lInverse.mmul(denseOf(stiffness)).mmul(lInverse.transpose());
  const sym = c.add(c.transpose()).mul(0.5);
  const evd = new EigenvalueDecomposition(sym, { assumeSymmetric: true });
  const values = evd.realEigenvalues;
  const order = values.map((_, i) => i).sort((a, b) => values[a] - values[b]);
  const k = Math.min(count ?? n, n);
  const phi = lInverse.transpose().mmul(evd.eigenvectorMatrix);
  const shapes = new Float64Array(n * k);
  const eigenvalues = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    eigenvalues[j] = values[order[j]];
    for (let i = 0; i < n; i++) shapes[j * n + i] = phi.get(i, order[j]);
  }
  return {
    n,
    eigenvalues,
    frequenciesHz: eigenvalues.map(frequencyHzFromEigenvalue),
    shapes,
    residuals: new Float64Array(k),
    sturm: { shift: 0, countBelow: 0, modesReturned: k, ok: true },
    orthogonality: { massMaxDeviation: 0, stiffnessMaxDeviation: 0 },
    method: 'subspace',
    shifts: [],
    iterations: 0,
    timings: { totalMs: 0, factorMs: 0, iterateMs: 0, verifyMs: 0 },
    factor: {} as ModesResult['factor'],
    warnings: [],
  };
}

function lowerInverse(L: Matrix): Matrix {
  const n = L.rows;
  const x = new Matrix(n, n);
  // column c of L⁻¹ by forward substitution on e_c
  for (let c = 0; c < n; c++) {
    for (let i = c; i < n; i++) {
      let s = i === c ? 1 : 0;
      for (let k = c; k < i; k++) s -= L.get(i, k) * x.get(k, c);
      x.set(i, c, s / L.get(i, i));
    }
  }
  return x;
}

/**
 * cos of the largest principal angle between span(A) and span(B) (column-major n × ka, n × kb,
 * ka ≤ kb) in the M inner product: the smallest singular value of Qaᵀ M Qb with M-orthonormal
 * Qa, Qb. Returns the angle in radians.
 */
export function largestPrincipalAngle(a: Float64Array, ka: number, b: Float64Array, kb: number, mass: SymmetricCsc): number {
  const n = mass.n;
  const m = denseOf(mass);
  const toMatrix = (v: Float64Array, k: number): Matrix => {
    const out = new Matrix(n, k);
    for (let j = 0; j < k; j++) for (let i = 0; i < n; i++) out.set(i, j, v[j * n + i]);
    return out;
  };
  const orth = (x: Matrix): Matrix => {
    const g = x.transpose().mmul(m).mmul(x);
    const chol = new CholeskyDecomposition(g.add(g.transpose()).mul(0.5));
    return x.mmul(lowerInverse(chol.lowerTriangularMatrix).transpose());
  };
  const qa = orth(toMatrix(a, ka));
  const qb = orth(toMatrix(b, kb));
  const c = qa.transpose().mmul(m).mmul(qb); // ka × kb
  const cct = c.mmul(c.transpose());
  const evd = new EigenvalueDecomposition(cct.add(cct.transpose()).mul(0.5), { assumeSymmetric: true });
  const smallest = Math.min(...evd.realEigenvalues);
  // sin² θ = 1 − cos² θ, taken this way to keep small angles accurate enough for 1e-6
  const sin2 = Math.max(0, 1 - smallest);
  return Math.asin(Math.sqrt(sin2));
}
