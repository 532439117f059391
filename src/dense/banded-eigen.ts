/**
 * Eigenvalues of a symmetric band matrix, and eigenvectors for a chosen index range only: the
 * projected problem of block Lanczos (block tridiagonal = band of the block size), where all Ritz
 * values are wanted each step but Ritz vectors only for the few converged ones.
 *
 *   1. Givens band reduction to tridiagonal T (band-to-tridiagonal.ts), O(n²b),
 *   2. eigenvalues of T by the shifted QR algorithm without vectors (tridiagonal-qr.ts), O(n²),
 *   3. eigenvectors of A itself for values[first … first+count−1] by inverse iteration on the band
 *      (band-inverse-iteration.ts), O(n b²) per vector, clusters orthogonalized.
 *
 * Compare a dense symmetricEigen: O(n³) whatever the band or the number of vectors wanted.
 */
import { bandEigenvectors } from './band-inverse-iteration.js';
import { bandToTridiagonal } from './band-to-tridiagonal.js';
import { bandFromTridiagonal, type SymmetricBand } from './symmetric-band.js';
import { tridiagonalQr } from './tridiagonal-qr.js';

export interface SelectedEigenResult {
  /** All n eigenvalues, ascending. */
  values: Float64Array;
  /** n×count column-major, orthonormal; column c belongs to values[first + c]. */
  vectors: Float64Array;
  first: number;
  count: number;
}

/** All eigenvalues of the band matrix (ascending). */
export function bandEigenvalues(band: SymmetricBand): Float64Array {
  const t = bandToTridiagonal(band);
  tridiagonalQr(t.diagonal, t.offDiagonal, null);
  return t.diagonal.sort();
}

/** All eigenvalues, and the eigenvectors of values[first … first+count−1]. */
export function bandedEigen(band: SymmetricBand, first: number, count: number): SelectedEigenResult {
  checkRange(band.n, first, count);
  const values = bandEigenvalues(band);
  const vectors = bandEigenvectors(band, values.subarray(first, first + count));
  return { values, vectors, first, count };
}

/** The same for a tridiagonal matrix given by its diagonal and off-diagonal. */
export function tridiagonalEigen(
  d: Float64Array,
  e: Float64Array,
  first: number,
  count: number,
): SelectedEigenResult {
  return bandedEigen(bandFromTridiagonal(d, e), first, count);
}

export function checkRange(n: number, first: number, count: number): void {
  if (!Number.isInteger(first) || !Number.isInteger(count) || first < 0 || count < 0 || first + count > n) {
    throw new Error(`eigenvector range ${first} … ${first + count - 1} is outside 0 … ${n - 1}`);
  }
}
