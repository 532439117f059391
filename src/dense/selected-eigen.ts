/**
 * Dense symmetric A: all eigenvalues, and eigenvectors for an index range only.
 *
 *   1. scale by s = max|a_ij|, Householder reduction T = QᵀAQ without forming Q
 *      (tridiagonalize.ts), 4/3·n³ flops,
 *   2. eigenvalues of T by the shifted QR algorithm without vectors, O(n²),
 *   3. eigenvectors y of T for the wanted values by inverse iteration (b = 1 band),
 *   4. x = Q y by applying the stored reflectors, O(n²) per vector.
 *
 * About a third of symmetricEigen's work when only a few vectors are wanted.
 */
import { bandEigenvectors } from './band-inverse-iteration.js';
import { checkRange, type SelectedEigenResult } from './banded-eigen.js';
import { bandFromTridiagonal } from './symmetric-band.js';
import { applyReductionQ, tridiagonalize } from './tridiagonalize.js';
import { tridiagonalQr } from './tridiagonal-qr.js';

/** All eigenvalues (ascending) of symmetric A (n×n column-major) and the vectors of values[first … first+count−1]. */
export function symmetricEigenRange(
  a: Float64Array,
  n: number,
  first: number,
  count: number,
): SelectedEigenResult {
  checkRange(n, first, count);
  let scale = 0;
  // s = max |a_ij|
  for (let i = 0; i < n * n; i++) scale = Math.max(scale, Math.abs(a[i]));
  if (!Number.isFinite(scale)) throw new Error('symmetricEigenRange: matrix has a non-finite entry');
  if (scale === 0) return zeroRange(n, first, count);
  const scaled = new Float64Array(n * n);
  // A / s
  for (let i = 0; i < n * n; i++) scaled[i] = a[i] / scale;
  const t = tridiagonalize(scaled, n, false);
  const band = bandFromTridiagonal(t.diagonal, t.offDiagonal);
  const d = Float64Array.from(t.diagonal);
  const e = Float64Array.from(t.offDiagonal);
  tridiagonalQr(d, e, null);
  const sortedValues = d.sort();
  const vectors = bandEigenvectors(band, sortedValues.subarray(first, first + count));
  applyReductionQ(t, vectors, count);
  const values = sortedValues.map((v) => v * scale);
  return { values, vectors, first, count };
}

function zeroRange(n: number, first: number, count: number): SelectedEigenResult {
  const vectors = new Float64Array(n * count);
  // unit vectors e_first …
  for (let c = 0; c < count; c++) vectors[c * n + first + c] = 1;
  return { values: new Float64Array(n), vectors, first, count };
}
