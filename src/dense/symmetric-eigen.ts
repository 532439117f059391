/**
 * Full eigen-decomposition of a dense symmetric matrix: A = V Λ Vᵀ, Λ ascending, VᵀV = I.
 *
 *   1. scale: A ← A / s with s = max|a_ij| (keeps the reduction clear of overflow/underflow),
 *   2. Householder reduction T = QᵀAQ (tridiagonalize.ts),
 *   3. implicitly shifted QR on T with the rotations accumulated into Q (tridiagonal-qr.ts),
 *   4. undo the scale, sort ascending and permute the columns of V alike.
 *
 * Only the lower triangle's values matter in exact arithmetic; the input is assumed symmetric
 * (the caller symmetrizes projected matrices before calling).
 */
import { tridiagonalize } from './tridiagonalize.js';
import { tridiagonalQr } from './tridiagonal-qr.js';

export interface SymmetricEigenResult {
  /** Eigenvalues, ascending. */
  values: Float64Array;
  /** Eigenvectors as columns, n×n column-major, orthonormal; column j belongs to values[j]. */
  vectors: Float64Array;
}

/** Eigenvalues (ascending) and orthonormal eigenvectors of symmetric A (n×n column-major). */
export function symmetricEigen(a: Float64Array, n: number): SymmetricEigenResult {
  checkSize(a, n);
  const scale = maxAbs(a, n * n);
  if (scale === 0 || n === 0) return zeroResult(n);
  const scaled = new Float64Array(n * n);
  // A / s
  for (let i = 0; i < n * n; i++) scaled[i] = a[i] / scale;
  const t = tridiagonalize(scaled, n, true);
  const q = t.q as Float64Array;
  tridiagonalQr(t.diagonal, t.offDiagonal, q, n);
  return sortedPairs(t.diagonal, q, n, scale);
}

/** Eigenvalues only, ascending (no vectors: about a third of the work). */
export function symmetricEigenvalues(a: Float64Array, n: number): Float64Array {
  checkSize(a, n);
  const scale = maxAbs(a, n * n);
  if (scale === 0 || n === 0) return new Float64Array(n);
  const scaled = new Float64Array(n * n);
  // A / s
  for (let i = 0; i < n * n; i++) scaled[i] = a[i] / scale;
  const t = tridiagonalize(scaled, n, false);
  tridiagonalQr(t.diagonal, t.offDiagonal, null);
  const values = t.diagonal.sort();
  // undo the scale
  for (let i = 0; i < n; i++) values[i] *= scale;
  return values;
}

/** Values ascending with their vectors permuted alike; values multiplied back by the scale. */
function sortedPairs(
  raw: Float64Array,
  v: Float64Array,
  n: number,
  scale = 1,
): SymmetricEigenResult {
  const order = Array.from({ length: n }, (_, i) => i).sort((i, j) => raw[i] - raw[j]);
  const values = new Float64Array(n);
  const vectors = new Float64Array(n * n);
  // column j of the result is column order[j] of v
  for (let j = 0; j < n; j++) {
    values[j] = raw[order[j]] * scale;
    vectors.set(v.subarray(order[j] * n, order[j] * n + n), j * n);
  }
  return { values, vectors };
}

function zeroResult(n: number): SymmetricEigenResult {
  const vectors = new Float64Array(n * n);
  // the identity: every vector is an eigenvector of the zero matrix
  for (let i = 0; i < n; i++) vectors[i * n + i] = 1;
  return { values: new Float64Array(n), vectors };
}

function maxAbs(a: Float64Array, len: number): number {
  let m = 0;
  // max |a_ij|, propagating NaN
  for (let i = 0; i < len; i++) {
    const v = Math.abs(a[i]);
    if (v > m || Number.isNaN(v)) m = v;
  }
  if (!Number.isFinite(m)) throw new Error('symmetricEigen: matrix has a non-finite entry');
  return m;
}

function checkSize(a: Float64Array, n: number): void {
  if (!Number.isInteger(n) || n < 0 || a.length < n * n) {
    throw new Error(`symmetricEigen: need an n×n array, got length ${a.length} for n = ${n}`);
  }
}
