/**
 * Solves with a supernodal factor L D Lᵀ (pivot order), for a column-major n×k block X in place.
 *
 * Each supernode S (columns f..l−1, rows R = [f..l−1, below]) is visited once per sweep and its
 * block is streamed once for all k right-hand sides:
 *   forward  L Z = X:   Y = X(f..l−1, :);  Y ← L11⁻¹ Y;  X(below, :) −= L21 Y
 *   diagonal D W = Z
 *   backward Lᵀ X = W:  Y = X(f..l−1, :) − L21ᵀ X(below, :);  Y ← L11⁻ᵀ Y
 * The gathered rows of X are held in a small dense workspace (nr × k) so the inner loops run
 * over contiguous memory.
 */
import type { SupernodalFactor } from './numeric-ldlt.js';

/** X ← (L D Lᵀ)⁻¹ X; `work` needs maxRows · k entries. */
export function supernodalSolveInPlace(f: SupernodalFactor, x: Float64Array, k: number, work: Float64Array): void {
  forwardSweep(f, x, k, work);
  const { d, structure } = f;
  const n = structure.n;
  // diagonal: divide each row by its pivot
  for (let c = 0; c < k; c++) {
    const o = c * n;
    for (let j = 0; j < n; j++) x[o + j] /= d[j];
  }
  backwardSweep(f, x, k, work);
}

function forwardSweep(f: SupernodalFactor, x: Float64Array, k: number, y: Float64Array): void {
  const { structure: s, values } = f;
  const { n, supernodes: ns, superStart, rowPtr, rows, valuePtr } = s;
  // supernodes in elimination order
  for (let sn = 0; sn < ns; sn++) {
    const f0 = superStart[sn];
    const nc = superStart[sn + 1] - f0;
    const r0 = rowPtr[sn];
    const nr = rowPtr[sn + 1] - r0;
    const v0 = valuePtr[sn];
    // y(:, c) = [X(f..l−1, c); 0] — local copy, rows of S
    for (let c = 0; c < k; c++) {
      const yo = c * nr;
      const xo = c * n + f0;
      for (let i = 0; i < nc; i++) y[yo + i] = x[xo + i];
      y.fill(0, yo + nc, yo + nr);
    }
    // y ← L(R, cols)⁻¹-style elimination: column j subtracts L(j+1:, j) y_j
    for (let j = 0; j < nc; j++) {
      const lj = v0 + j * nr;
      for (let c = 0; c < k; c++) {
        const yo = c * nr;
        const yj = y[yo + j];
        if (yj === 0) continue;
        for (let i = j + 1; i < nr; i++) y[yo + i] -= values[lj + i] * yj;
      }
    }
    // write back: own rows directly, rows below accumulate
    for (let c = 0; c < k; c++) {
      const yo = c * nr;
      const xo = c * n;
      for (let i = 0; i < nc; i++) x[xo + f0 + i] = y[yo + i];
      for (let i = nc; i < nr; i++) x[xo + rows[r0 + i]] += y[yo + i];
    }
  }
}

function backwardSweep(f: SupernodalFactor, x: Float64Array, k: number, y: Float64Array): void {
  const { structure: s, values } = f;
  const { n, supernodes: ns, superStart, rowPtr, rows, valuePtr } = s;
  // supernodes in reverse elimination order
  for (let sn = ns - 1; sn >= 0; sn--) {
    const f0 = superStart[sn];
    const nc = superStart[sn + 1] - f0;
    const r0 = rowPtr[sn];
    const nr = rowPtr[sn + 1] - r0;
    const v0 = valuePtr[sn];
    // y(:, c) = X(R, c) gathered
    for (let c = 0; c < k; c++) {
      const yo = c * nr;
      const xo = c * n;
      for (let i = 0; i < nc; i++) y[yo + i] = x[xo + f0 + i];
      for (let i = nc; i < nr; i++) y[yo + i] = x[xo + rows[r0 + i]];
    }
    // y_j −= L(j+1:, j)ᵀ y(j+1:), last column first
    for (let j = nc - 1; j >= 0; j--) {
      const lj = v0 + j * nr;
      for (let c = 0; c < k; c++) {
        const yo = c * nr;
        let sum = 0;
        for (let i = j + 1; i < nr; i++) sum += values[lj + i] * y[yo + i];
        y[yo + j] -= sum;
      }
    }
    // own rows back into X
    for (let c = 0; c < k; c++) {
      const yo = c * nr;
      const xo = c * n + f0;
      for (let i = 0; i < nc; i++) x[xo + i] = y[yo + i];
    }
  }
}
