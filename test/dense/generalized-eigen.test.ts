import { describe, expect, it } from 'vitest';
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { generalizedSymmetricEigen } from '../../src/dense/generalized-eigen.js';
import { jacobiGeneralizedEigen } from '../../src/dense/jacobi-generalized.js';
import { NotPositiveDefiniteError } from '../../src/dense/cholesky.js';
import { maxAbs, multiply, orthogonalityError, randomBlock, randomSymmetric, seededRandom, toMatrix, transposed } from './helpers.js';

/** SPD matrix B Bᵀ + shift·I from a random square B. */
function randomSpd(n: number, seed: number, shift = 1): Float64Array {
  const b = randomBlock(n, n, seed);
  const a = multiply(b, transposed(b, n, n), n, n, n);
  for (let i = 0; i < n; i++) a[i * n + i] += shift;
  for (let j = 0; j < n; j++) for (let i = j + 1; i < n; i++) a[i * n + j] = a[j * n + i];
  return a;
}

/** D A D for diagonal D given as an array. */
function scaled(a: Float64Array, n: number, d: number[]): Float64Array {
  const out = new Float64Array(n * n);
  for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) out[j * n + i] = a[j * n + i] * d[i] * d[j];
  return out;
}

/**
 * Reference eigenvalues of (K, M) from ml-matrix through the reversed pencil (M, K − σM):
 * with K − σM = LLᵀ (ml-matrix CholeskyDecomposition) and μ the eigenvalues of L⁻¹ M L⁻ᵀ
 * (ml-matrix EigenvalueDecomposition), λ = σ + 1/μ. This avoids factoring a badly scaled M
 * (CRITERIA.md §8, [V]: the Cholesky-of-M reference lost accuracy on badly scaled masses).
 */
function referenceByReversedPencil(k: Float64Array, m: Float64Array, n: number, sigma: number): Float64Array {
  const shifted = new Float64Array(n * n);
  for (let i = 0; i < n * n; i++) shifted[i] = k[i] - sigma * m[i];
  const chol = new CholeskyDecomposition(toMatrix(shifted, n, n));
  expect(chol.isPositiveDefinite()).toBe(true);
  const l = chol.lowerTriangularMatrix;
  // C = L⁻¹ M L⁻ᵀ by two forward substitutions with ml-matrix's L
  const mm = toMatrix(m, n, n);
  const y = solveLowerMatrix(l, mm); // L⁻¹ M
  const c = solveLowerMatrix(l, y.transpose()); // L⁻¹ (L⁻¹ M)ᵀ
  const sym = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) sym.set(i, j, 0.5 * (c.get(i, j) + c.get(j, i)));
  const mu = new EigenvalueDecomposition(sym, { assumeSymmetric: true }).realEigenvalues;
  return Float64Array.from(mu.map((v) => sigma + 1 / v)).sort();
}

function solveLowerMatrix(l: Matrix, b: Matrix): Matrix {
  const n = l.rows;
  const x = b.clone();
  for (let c = 0; c < b.columns; c++) {
    for (let i = 0; i < n; i++) {
      let s = x.get(i, c);
      for (let p = 0; p < i; p++) s -= l.get(i, p) * x.get(p, c);
      x.set(i, c, s / l.get(i, i));
    }
  }
  return x;
}

/** Residual max_j ‖K x_j − λ_j M x_j‖ / (‖K‖ + |λ_j|‖M‖) and M-orthonormality. */
function check(k: Float64Array, m: Float64Array, n: number, values: Float64Array, x: Float64Array, residualTol = 1e-13 * n) {
  const kx = multiply(k, x, n, n, n);
  const mx = multiply(m, x, n, n, n);
  let worst = 0;
  for (let j = 0; j < n; j++) {
    let s = 0;
    let xn = 0;
    for (let i = 0; i < n; i++) {
      s += (kx[j * n + i] - values[j] * mx[j * n + i]) ** 2;
      xn += x[j * n + i] ** 2;
    }
    worst = Math.max(worst, Math.sqrt(s / xn) / (maxAbs(k) + Math.abs(values[j]) * maxAbs(m)));
  }
  expect(worst).toBeLessThan(residualTol);
  expect(orthogonalityError(x, n, n, m)).toBeLessThan(1e-12 * n);
  for (let i = 1; i < n; i++) expect(values[i]).toBeGreaterThanOrEqual(values[i - 1]);
}

describe('generalizedSymmetricEigen', () => {
  it.each(['cholesky', 'jacobi'] as const)('matches ml-matrix on random pencils (%s)', (method) => {
    // Reference: ml-matrix CholeskyDecomposition + EigenvalueDecomposition (reversed pencil).
    for (const n of [1, 2, 5, 30]) {
      const k = randomSpd(n, 10 + n, 0.1);
      const m = randomSpd(n, 20 + n, 1);
      const r = generalizedSymmetricEigen(k, m, n, { method });
      check(k, m, n, r.values, r.vectors);
      const ref = referenceByReversedPencil(k, m, n, -1);
      for (let i = 0; i < n; i++) expect(Math.abs(r.values[i] - ref[i]) / Math.abs(ref[n - 1])).toBeLessThan(1e-11);
    }
  });

  it.each(['cholesky', 'jacobi', 'auto'] as const)('handles a badly scaled mass (diagonal 1e-6 .. 1) (%s)', (method) => {
    // Reference: ml-matrix through the reversed pencil, as CRITERIA.md §8 advises for badly scaled M [V].
    const n = 10;
    const d = Array.from({ length: n }, (_, i) => Math.pow(10, -3 + (3 * i) / (n - 1))); // √(1e-6 .. 1)
    const m = scaled(randomSpd(n, 3, 5), n, d);
    const k = randomSpd(n, 4, 0.5);
    const r = generalizedSymmetricEigen(k, m, n, { method });
    // the Cholesky reduction is backward stable relative to λ_max only (see generalized-eigen.ts)
    check(k, m, n, r.values, r.vectors, method === 'cholesky' ? 1e-11 : 1e-13 * n);
    const ref = referenceByReversedPencil(k, m, n, -0.01 * r.values[0]);
    for (let i = 0; i < n; i++) expect(Math.abs(r.values[i] - ref[i]) / ref[i]).toBeLessThan(1e-10);
  });

  it('Jacobi converges quickly on a nearly diagonal pencil and agrees with the Cholesky route', () => {
    // Reference: ml-matrix reversed pencil; and quadratic convergence (few sweeps) as stated by Bathe,
    // Finite Element Procedures, §11.3.2 (from memory).
    const n = 20;
    const rnd = seededRandom(5);
    const k = new Float64Array(n * n);
    const m = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      k[i * n + i] = (i + 1) * (i + 1);
      m[i * n + i] = 1 + 0.1 * rnd();
    }
    for (let j = 0; j < n; j++) for (let i = j + 1; i < n; i++) {
      k[j * n + i] = k[i * n + j] = 1e-3 * rnd();
      m[j * n + i] = m[i * n + j] = 1e-4 * rnd();
    }
    const jr = jacobiGeneralizedEigen(k, m, n);
    expect(jr.converged).toBe(true);
    expect(jr.sweeps).toBeLessThanOrEqual(6);
    check(k, m, n, jr.values, jr.vectors);
    const cr = generalizedSymmetricEigen(k, m, n, { method: 'cholesky' });
    const ref = referenceByReversedPencil(k, m, n, -0.5);
    for (let i = 0; i < n; i++) {
      expect(Math.abs(jr.values[i] - ref[i]) / ref[i]).toBeLessThan(1e-12);
      expect(Math.abs(cr.values[i] - ref[i]) / ref[i]).toBeLessThan(1e-12);
    }
  });

  it('keeps a repeated eigenvalue of the pencil with an M-orthonormal basis', () => {
    // Reference: constructed pencil K = M·diag-similar with known values (K = M X Λ X⁻¹ form):
    // K = M V Λ Vᵀ M with VᵀMV = I gives (K, M) eigenvalues Λ exactly (definition of the pencil).
    const n = 6;
    const m = randomSpd(n, 31, 1);
    const eig = generalizedSymmetricEigen(new Float64Array(n * n), m, n); // K = 0: V M-orthonormal
    const v = eig.vectors;
    const lambda = [0.5, 0.5, 0.5, 2, 2, 9];
    const mv = multiply(m, v, n, n, n);
    const ml = new Float64Array(n * n);
    for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) ml[j * n + i] = mv[j * n + i] * lambda[j];
    const k = multiply(ml, transposed(mv, n, n), n, n, n);
    for (let j = 0; j < n; j++) for (let i = j + 1; i < n; i++) k[i * n + j] = k[j * n + i];
    for (const method of ['cholesky', 'jacobi'] as const) {
      const r = generalizedSymmetricEigen(k, m, n, { method });
      check(k, m, n, r.values, r.vectors);
      for (let i = 0; i < n; i++) expect(Math.abs(r.values[i] - lambda[i])).toBeLessThan(1e-12 * 9);
    }
  });

  it('reports a mass that is not positive definite', () => {
    const n = 3;
    const k = randomSymmetric(n, 1);
    const m = new Float64Array([1, 2, 0, 2, 1, 0, 0, 0, 1]); // eigenvalues −1, 1, 3
    expect(() => generalizedSymmetricEigen(k, m, n)).toThrow(NotPositiveDefiniteError);
  });
});

describe('singular stiffness (rigid-body directions)', () => {
  it.each(['cholesky', 'jacobi', 'auto'] as const)('returns zero eigenvalues for the null space of K (%s)', (method) => {
    // Reference: K = Bᵀ B with B 6×9 has a 3-dimensional null space, so (K, M) has exactly three
    // zero eigenvalues (definition); the others are checked against ml-matrix via the reversed pencil.
    const n = 9;
    const b = randomBlock(6, n, 77);
    const k = multiply(transposed(b, 6, n), b, n, 6, n);
    for (let j = 0; j < n; j++) for (let i = j + 1; i < n; i++) k[i * n + j] = k[j * n + i];
    const m = randomSpd(n, 78, 1);
    const r = generalizedSymmetricEigen(k, m, n, { method });
    check(k, m, n, r.values, r.vectors);
    const scale = r.values[n - 1];
    for (let i = 0; i < 3; i++) expect(Math.abs(r.values[i]) / scale).toBeLessThan(1e-13);
    expect(r.values[3] / scale).toBeGreaterThan(1e-6);
    const ref = referenceByReversedPencil(k, m, n, -0.1 * r.values[3]);
    for (let i = 3; i < n; i++) expect(Math.abs(r.values[i] - ref[i]) / scale).toBeLessThan(1e-12);
  });
});
