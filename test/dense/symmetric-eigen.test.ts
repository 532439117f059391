import { describe, expect, it } from 'vitest';
import { EigenvalueDecomposition } from 'ml-matrix';
import { symmetricEigen, symmetricEigenvalues } from '../../src/dense/symmetric-eigen.js';
import { tridiagonalize } from '../../src/dense/tridiagonalize.js';
import { tridiagonalEigenvalues } from '../../src/dense/tridiagonal-qr.js';
import {
  maxAbs,
  maxResidual,
  multiply,
  orthogonalityError,
  randomOrthogonal,
  randomSymmetric,
  seededRandom,
  toMatrix,
  transposed,
  withSpectrum,
} from './helpers.js';

/** Checks every eigen-decomposition must pass: residual, orthonormality, ascending order. */
function checkDecomposition(a: Float64Array, n: number) {
  const { values, vectors } = symmetricEigen(a, n);
  const norm = Math.max(maxAbs(a), Number.MIN_VALUE);
  expect(maxResidual(a, n, values, vectors) / norm).toBeLessThan(1e-13 * Math.max(n, 1));
  expect(orthogonalityError(vectors, n, n)).toBeLessThan(1e-13 * Math.max(n, 1));
  for (let i = 1; i < n; i++) expect(values[i]).toBeGreaterThanOrEqual(values[i - 1]);
  return { values, vectors, norm };
}

describe('symmetricEigen', () => {
  // Reference: ml-matrix EigenvalueDecomposition (assumeSymmetric), a general-purpose library.
  it.each([1, 2, 5, 50, 200])('matches ml-matrix on a random symmetric matrix of size %i', (n) => {
    const a = randomSymmetric(n, 1000 + n);
    const { values, norm } = checkDecomposition(a, n);
    const ref = new EigenvalueDecomposition(toMatrix(a, n, n), { assumeSymmetric: true });
    const refValues = Float64Array.from(ref.realEigenvalues).sort();
    for (let i = 0; i < n; i++) expect(Math.abs(values[i] - refValues[i]) / norm).toBeLessThan(1e-12);
  });

  it('reproduces the second-difference matrix spectrum 2 − 2cos(kπ/(n+1))', () => {
    // Reference: closed form for tridiag(−1, 2, −1) (textbook, e.g. Strang, Linear Algebra).
    for (const n of [1, 7, 100]) {
      const a = new Float64Array(n * n);
      for (let i = 0; i < n; i++) {
        a[i * n + i] = 2;
        if (i + 1 < n) a[i * n + i + 1] = a[(i + 1) * n + i] = -1;
      }
      const { values } = checkDecomposition(a, n);
      for (let k = 1; k <= n; k++) {
        expect(Math.abs(values[k - 1] - (2 - 2 * Math.cos((k * Math.PI) / (n + 1))))).toBeLessThan(1e-13 * 4);
      }
    }
  });

  it('keeps repeated eigenvalues with full multiplicity and the right subspaces', () => {
    // Reference: constructed A = Q diag(1,1,1,2,2,3) Qᵀ, so the spectrum and eigenspaces are known.
    const n = 6;
    const q = randomOrthogonal(n, 7);
    const lambda = [1, 1, 1, 2, 2, 3];
    const a = withSpectrum(q, lambda);
    const { values, vectors } = checkDecomposition(a, n);
    for (let i = 0; i < n; i++) expect(Math.abs(values[i] - lambda[i])).toBeLessThan(1e-13 * 3);
    // each computed eigenvector lies in its eigenspace: ‖(I − Q_s Q_sᵀ) v‖ small
    const spaces: Array<[number, number]> = [[0, 3], [3, 5], [5, 6]];
    for (const [lo, hi] of spaces) {
      const qs = q.slice(lo * n, hi * n);
      const vs = vectors.slice(lo * n, hi * n);
      const proj = multiply(qs, multiply(transposed(qs, n, hi - lo), vs, hi - lo, n, hi - lo), n, hi - lo, hi - lo);
      let worst = 0;
      for (let i = 0; i < proj.length; i++) worst = Math.max(worst, Math.abs(proj[i] - vs[i]));
      expect(worst).toBeLessThan(1e-12);
    }
  });

  it('handles a diagonal matrix and the zero matrix exactly', () => {
    // Reference: the eigenvalues of a diagonal matrix are its diagonal entries (definition).
    const n = 5;
    const diag = [3, -1, 0, 7, -1];
    const a = new Float64Array(n * n);
    diag.forEach((v, i) => (a[i * n + i] = v));
    const { values } = checkDecomposition(a, n);
    expect(Array.from(values)).toEqual([...diag].sort((x, y) => x - y));
    const zero = symmetricEigen(new Float64Array(16), 4);
    expect(Array.from(zero.values)).toEqual([0, 0, 0, 0]);
    expect(orthogonalityError(zero.vectors, 4, 4)).toBe(0);
  });

  it('handles graded matrices with entries spanning 1e-10 .. 1e10', () => {
    // Reference: ml-matrix EigenvalueDecomposition; tolerance relative to ‖A‖ as for any backward-stable method.
    const n = 12;
    const rnd = seededRandom(99);
    const g = Array.from({ length: n }, (_, i) => Math.pow(10, -5 + (10 * i) / (n - 1)));
    const a = new Float64Array(n * n);
    for (let j = 0; j < n; j++) for (let i = j; i < n; i++) a[j * n + i] = a[i * n + j] = rnd() * g[i] * g[j];
    const { values, norm } = checkDecomposition(a, n);
    const ref = Float64Array.from(new EigenvalueDecomposition(toMatrix(a, n, n), { assumeSymmetric: true }).realEigenvalues).sort();
    for (let i = 0; i < n; i++) expect(Math.abs(values[i] - ref[i]) / norm).toBeLessThan(1e-12);
  });

  it('gives the same values without vectors', () => {
    // Reference: ml-matrix EigenvalueDecomposition.
    const n = 40;
    const a = randomSymmetric(n, 5);
    const v = symmetricEigenvalues(a, n);
    const ref = Float64Array.from(new EigenvalueDecomposition(toMatrix(a, n, n), { assumeSymmetric: true }).realEigenvalues).sort();
    for (let i = 0; i < n; i++) expect(Math.abs(v[i] - ref[i])).toBeLessThan(1e-12 * maxAbs(a));
  });

  it('rejects a non-finite entry', () => {
    const a = new Float64Array([1, NaN, NaN, 1]);
    expect(() => symmetricEigen(a, 2)).toThrow(/non-finite/);
  });
});

describe('tridiagonalize and tridiagonal QR', () => {
  it('produces T = QᵀAQ with Q orthogonal', () => {
    // Reference: the defining identity of the reduction, checked by explicit products.
    const n = 30;
    const a = randomSymmetric(n, 8);
    const t = tridiagonalize(a, n, true);
    const q = t.q as Float64Array;
    expect(orthogonalityError(q, n, n)).toBeLessThan(1e-13 * n);
    const qtaq = multiply(transposed(q, n, n), multiply(a, q, n, n, n), n, n, n);
    for (let j = 0; j < n; j++) {
      for (let i = 0; i < n; i++) {
        const expected = i === j ? t.diagonal[i] : i === j + 1 ? t.offDiagonal[j] : j === i + 1 ? t.offDiagonal[i] : 0;
        expect(Math.abs(qtaq[j * n + i] - expected)).toBeLessThan(1e-13 * n);
      }
    }
  });

  it('gives the second-difference eigenvalues from (d, e) directly', () => {
    // Reference: textbook closed form 2 − 2cos(kπ/(n+1)) of tridiag(−1, 2, −1).
    const n = 500;
    const v = tridiagonalEigenvalues(new Float64Array(n).fill(2), new Float64Array(n - 1).fill(-1));
    for (let k = 1; k <= n; k++) expect(Math.abs(v[k - 1] - (2 - 2 * Math.cos((k * Math.PI) / (n + 1))))).toBeLessThan(1e-13 * 4);
  });

  it('is unaffected by scaling near the ends of the floating-point range', () => {
    // Reference: λ(cA) = c·λ(A) (definition), against the unscaled decomposition.
    const n = 8;
    const a = randomSymmetric(n, 21);
    const base = symmetricEigen(a, n).values;
    for (const c of [1e-300, 1e300]) {
      const v = symmetricEigen(a.map((x) => x * c), n).values;
      for (let i = 0; i < n; i++) expect(Math.abs(v[i] / c - base[i])).toBeLessThan(1e-13 * n);
    }
  });
});
