/**
 * Symmetric band matrices: A(i, j) = 0 for |i − j| > bandwidth. Storage keeps the lower band by
 * columns, (bandwidth+1) entries per column:
 *
 *   lower[j·(b+1) + (i − j)] = A(i, j),   0 ≤ i − j ≤ b   (entries past row n−1 are zero).
 *
 * The projected matrix of block Lanczos with block size p is block tridiagonal, a band matrix of
 * bandwidth p; a tridiagonal matrix is the case b = 1.
 */

export interface SymmetricBand {
  n: number;
  bandwidth: number;
  lower: Float64Array;
}

/** The band of a dense symmetric n×n column-major matrix (its lower triangle is read). */
export function bandFromDense(a: Float64Array, n: number, bandwidth: number): SymmetricBand {
  const b = bandwidth;
  const lower = new Float64Array((b + 1) * n);
  // lower(i − j, j) = A(i, j) for j ≤ i ≤ min(j + b, n − 1)
  for (let j = 0; j < n; j++) {
    const last = Math.min(j + b, n - 1);
    for (let i = j; i <= last; i++) lower[j * (b + 1) + i - j] = a[j * n + i];
  }
  return { n, bandwidth: b, lower };
}

/** The tridiagonal (d, e) as a band of width 1. */
export function bandFromTridiagonal(d: Float64Array, e: Float64Array): SymmetricBand {
  const n = d.length;
  const lower = new Float64Array(2 * n);
  // column j: (d_j, e_j)
  for (let j = 0; j < n; j++) {
    lower[2 * j] = d[j];
    if (j + 1 < n) lower[2 * j + 1] = e[j];
  }
  return { n, bandwidth: 1, lower };
}

/** Smallest b with A(i, j) = 0 for |i − j| > b (lower triangle read). */
export function bandwidthOf(a: Float64Array, n: number): number {
  let b = 0;
  // farthest nonzero below the diagonal in each column
  for (let j = 0; j < n; j++) {
    for (let i = n - 1; i > j + b; i--) {
      if (a[j * n + i] !== 0) {
        b = i - j;
        break;
      }
    }
  }
  return b;
}

/** max over rows of Σ_j |A(i, j)| (the ∞-norm, = 1-norm for symmetric A). */
export function bandNormInf(band: SymmetricBand): number {
  const { n, bandwidth: b, lower } = band;
  const rowSums = new Float64Array(n);
  // each stored entry counts in its row and, off the diagonal, in its mirror's row
  for (let j = 0; j < n; j++) {
    const last = Math.min(j + b, n - 1);
    for (let i = j; i <= last; i++) {
      const v = Math.abs(lower[j * (b + 1) + i - j]);
      rowSums[i] += v;
      if (i !== j) rowSums[j] += v;
    }
  }
  let m = 0;
  for (let i = 0; i < n; i++) m = Math.max(m, rowSums[i]);
  return m;
}
