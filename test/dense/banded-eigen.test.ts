import { describe, expect, it } from 'vitest';
import { EigenvalueDecomposition } from 'ml-matrix';
import { bandedEigen, bandEigenvalues, tridiagonalEigen } from '../../src/dense/banded-eigen.js';
import { symmetricEigenRange } from '../../src/dense/selected-eigen.js';
import { bandFromDense, bandwidthOf } from '../../src/dense/symmetric-band.js';
import { maxAbs, maxResidual, orthogonalityError, randomOrthogonal, randomSymmetric, seededRandom, toMatrix, withSpectrum } from './helpers.js';

/** Random symmetric band matrix (dense storage) of bandwidth b. */
function randomBand(n: number, b: number, seed: number): Float64Array {
  const rnd = seededRandom(seed);
  const a = new Float64Array(n * n);
  for (let j = 0; j < n; j++) for (let i = j; i <= Math.min(n - 1, j + b); i++) a[j * n + i] = a[i * n + j] = rnd();
  return a;
}

/** Residual of the selected pairs: max_c ‖A x_c − λ x_c‖ / ‖A‖. */
function selectedResidual(a: Float64Array, n: number, values: Float64Array, vectors: Float64Array, first: number, count: number): number {
  const full = new Float64Array(n * n);
  full.set(vectors.subarray(0, n * count));
  const vals = new Float64Array(n);
  vals.set(values.subarray(first, first + count));
  // columns beyond count are zero and contribute no residual
  return maxResidual(a, n, vals, full) / maxAbs(a);
}

function mlValues(a: Float64Array, n: number): Float64Array {
  // Reference: ml-matrix EigenvalueDecomposition (assumeSymmetric).
  return Float64Array.from(new EigenvalueDecomposition(toMatrix(a, n, n), { assumeSymmetric: true }).realEigenvalues).sort();
}

describe('bandedEigen', () => {
  it.each([
    [1, 1],
    [6, 2],
    [50, 3],
    [120, 6],
    [40, 39],
  ])('matches ml-matrix on a random band matrix n = %i, b = %i', (n, b) => {
    const a = randomBand(n, b, 17 * n + b);
    expect(bandwidthOf(a, n)).toBe(Math.min(b, n - 1));
    const band = bandFromDense(a, n, b);
    const ref = mlValues(a, n);
    const first = Math.max(0, n - 5);
    const r = bandedEigen(band, first, n - first);
    const norm = maxAbs(a);
    for (let i = 0; i < n; i++) expect(Math.abs(r.values[i] - ref[i]) / norm).toBeLessThan(1e-12);
    expect(selectedResidual(a, n, r.values, r.vectors, first, n - first)).toBeLessThan(1e-13 * n);
    expect(orthogonalityError(r.vectors, n, n - first)).toBeLessThan(1e-13 * n);
  });

  it('finds each eigenvalue of a block second-difference matrix with multiplicity = block size', () => {
    // Reference: A = tridiag(−1, 2, −1) ⊗ I_p has eigenvalues 2 − 2cos(kπ/(m+1)), each p times
    // (closed form of the second-difference matrix; Kronecker product with I repeats each value).
    const m = 30;
    const p = 6;
    const n = m * p;
    const a = new Float64Array(n * n);
    for (let blk = 0; blk < m; blk++) {
      for (let c = 0; c < p; c++) {
        const i = blk * p + c;
        a[i * n + i] = 2;
        if (blk + 1 < m) a[i * n + i + p] = a[(i + p) * n + i] = -1;
      }
    }
    const band = bandFromDense(a, n, p);
    const r = bandedEigen(band, 0, 2 * p);
    for (let k = 1; k <= m; k++) {
      const exact = 2 - 2 * Math.cos((k * Math.PI) / (m + 1));
      for (let c = 0; c < p; c++) expect(Math.abs(r.values[(k - 1) * p + c] - exact)).toBeLessThan(1e-13 * 4);
    }
    expect(selectedResidual(a, n, r.values, r.vectors, 0, 2 * p)).toBeLessThan(1e-13 * n);
    expect(orthogonalityError(r.vectors, n, 2 * p)).toBeLessThan(1e-13 * n);
  });

  it('tridiagonalEigen reproduces 2 − 2cos(kπ/(n+1)) with vectors', () => {
    // Reference: textbook closed form of the second-difference matrix tridiag(−1, 2, −1).
    const n = 200;
    const d = new Float64Array(n).fill(2);
    const e = new Float64Array(n - 1).fill(-1);
    const r = tridiagonalEigen(d, e, n - 3, 3);
    for (let k = 1; k <= n; k++) expect(Math.abs(r.values[k - 1] - (2 - 2 * Math.cos((k * Math.PI) / (n + 1))))).toBeLessThan(1e-13 * 4);
    expect(orthogonalityError(r.vectors, n, 3)).toBeLessThan(1e-13 * n);
    // the exact eigenvector of λ_k is sin(ikπ/(n+1)) (up to sign and scale)
    const k = n;
    let dot = 0;
    let nn = 0;
    for (let i = 0; i < n; i++) {
      const s = Math.sin(((i + 1) * k * Math.PI) / (n + 1));
      dot += s * r.vectors[2 * n + i];
      nn += s * s;
    }
    expect(Math.abs(Math.abs(dot) / Math.sqrt(nn) - 1)).toBeLessThan(1e-12);
  });

  it('gives the same values as dense on a graded band', () => {
    // Reference: ml-matrix EigenvalueDecomposition.
    const n = 30;
    const a = randomBand(n, 4, 3);
    for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) a[j * n + i] *= Math.pow(10, (i + j) / 6 - 5);
    const v = bandEigenvalues(bandFromDense(a, n, 4));
    const ref = mlValues(a, n);
    for (let i = 0; i < n; i++) expect(Math.abs(v[i] - ref[i]) / maxAbs(a)).toBeLessThan(1e-12);
  });
});

describe('symmetricEigenRange', () => {
  it('matches ml-matrix and gives orthonormal vectors for a range', () => {
    // Reference: ml-matrix EigenvalueDecomposition.
    const n = 80;
    const a = randomSymmetric(n, 44);
    const r = symmetricEigenRange(a, n, 10, 15);
    const ref = mlValues(a, n);
    for (let i = 0; i < n; i++) expect(Math.abs(r.values[i] - ref[i]) / maxAbs(a)).toBeLessThan(1e-12);
    expect(selectedResidual(a, n, r.values, r.vectors, 10, 15)).toBeLessThan(1e-13 * n);
    expect(orthogonalityError(r.vectors, n, 15)).toBeLessThan(1e-13 * n);
  });

  it('spans a repeated eigenvalue’s space with orthonormal vectors', () => {
    // Reference: constructed A = Q diag(1,1,1,2,2,3) Qᵀ (known spectrum).
    const n = 6;
    const a = withSpectrum(randomOrthogonal(n, 12), [1, 1, 1, 2, 2, 3]);
    const r = symmetricEigenRange(a, n, 0, 5);
    expect(selectedResidual(a, n, r.values, r.vectors, 0, 5)).toBeLessThan(1e-13 * n);
    expect(orthogonalityError(r.vectors, n, 5)).toBeLessThan(1e-13 * n);
    const z = symmetricEigenRange(new Float64Array(9), 3, 1, 2);
    expect(orthogonalityError(z.vectors, 3, 2)).toBe(0);
  });

  it('rejects a range outside the matrix', () => {
    expect(() => symmetricEigenRange(new Float64Array(4), 2, 1, 2)).toThrow(/outside/);
  });
});

describe('close eigenvalue pairs', () => {
  it('separates the nearly equal pairs of the Wilkinson matrix W21+', () => {
    // Reference: ml-matrix EigenvalueDecomposition for the values; W21+ = tridiag(1, |10 − i|, 1),
    // whose largest eigenvalues come in pairs agreeing to about 1e-13 (Wilkinson, The Algebraic
    // Eigenvalue Problem, 1965 — from memory), the hard case for inverse iteration.
    const n = 21;
    const d = Float64Array.from({ length: n }, (_, i) => Math.abs(10 - i));
    const e = new Float64Array(n - 1).fill(1);
    const a = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      a[i * n + i] = d[i];
      if (i + 1 < n) a[i * n + i + 1] = a[(i + 1) * n + i] = 1;
    }
    const r = tridiagonalEigen(d, e, 0, n);
    const ref = mlValues(a, n);
    for (let i = 0; i < n; i++) expect(Math.abs(r.values[i] - ref[i])).toBeLessThan(1e-12 * 11);
    expect(r.values[n - 1] - r.values[n - 2]).toBeLessThan(1e-12);
    expect(selectedResidual(a, n, r.values, r.vectors, 0, n)).toBeLessThan(1e-13 * n);
    expect(orthogonalityError(r.vectors, n, n)).toBeLessThan(1e-13 * n);
  });
});
