/**
 * Solves with a supernodal factor L D Lᵀ (pivot order), for a column-major n×k block X in place.
 *
 * Each supernode S (columns f..l−1, rows R = [f..l−1, below]) is visited once per sweep and its
 * block is streamed once for all k right-hand sides:
 *   forward  L Z = X:   Y = X(f..l−1, :);  Y ← L11⁻¹ Y;  X(below, :) −= L21 Y
 *   diagonal D W = Z
 *   backward Lᵀ X = W:  Y = X(f..l−1, :) − L21ᵀ X(below, :);  Y ← L11⁻ᵀ Y
 * The gathered rows of X are held in a small dense workspace (nr × k) so the inner loops run
 * over contiguous memory. From BLOCK_PATH_MIN_K right-hand sides on, the products with L21
 * go through the register-blocked dense kernels, which is what makes a block of k cheaper than
 * k single solves (the factor is read once, and each load feeds several multiply-adds).
 */
import { subtractTransposedProduct, updateProduct } from './dense-block-kernels.js';
import type { SupernodalFactor } from './numeric-ldlt.js';

/** Right-hand sides from which the rows below each supernode go through dense products. */
const BLOCK_PATH_MIN_K = 4;

/** Workspace entries supernodalSolveInPlace needs for k right-hand sides. */
export function solveWorkspaceSize(f: SupernodalFactor, k: number): number {
  return 3 * f.structure.maxRows * k + 1;
}

/** X ← (L D Lᵀ)⁻¹ X; `work` needs solveWorkspaceSize(f, k) entries. */
export function supernodalSolveInPlace(f: SupernodalFactor, x: Float64Array, k: number, work: Float64Array): void {
  const m = f.structure.maxRows * k;
  const y = work.subarray(0, m);
  const w = work.subarray(m, 2 * m);
  const z = work.subarray(2 * m, 3 * m);
  forwardSweep(f, x, k, y, w, z);
  const { d, structure } = f;
  const n = structure.n;
  // diagonal: divide each row by its pivot
  for (let c = 0; c < k; c++) {
    const o = c * n;
    for (let j = 0; j < n; j++) x[o + j] /= d[j];
  }
  backwardSweep(f, x, k, y, w);
}

function forwardSweep(f: SupernodalFactor, x: Float64Array, k: number, y: Float64Array, w: Float64Array, z: Float64Array): void {
  const { structure: s, values } = f;
  const { n, supernodes: ns, superStart, rowPtr, rows, valuePtr } = s;
  const blocked = k >= BLOCK_PATH_MIN_K;
  // supernodes in elimination order
  for (let sn = 0; sn < ns; sn++) {
    const f0 = superStart[sn];
    const nc = superStart[sn + 1] - f0;
    const r0 = rowPtr[sn];
    const nr = rowPtr[sn + 1] - r0;
    const v0 = valuePtr[sn];
    const nb = nr - nc;
    const ld = blocked ? nc : nr; // rows of y per right-hand side
    // y(:, c) = [X(f..l−1, c); 0]
    for (let c = 0; c < k; c++) {
      const yo = c * ld;
      const xo = c * n + f0;
      for (let i = 0; i < nc; i++) y[yo + i] = x[xo + i];
      if (!blocked) y.fill(0, yo + nc, yo + nr);
    }
    // own rows: y ← L11⁻¹ y (and, unblocked, y(below) = −L21 y in the same pass)
    for (let c = 0; c < k; c++) forwardColumns(values, v0, nr, nc, blocked ? nc : nr, y, c * ld);
    for (let c = 0; c < k; c++) x.set(y.subarray(c * ld, c * ld + nc), c * n + f0);
    if (nb === 0) continue;
    if (blocked) {
      // z = −L21 Y by the dense product kernel (Y row-major as its k-major operand)
      for (let t = 0; t < nc; t++) for (let c = 0; c < k; c++) w[t * k + c] = y[c * nc + t];
      z.fill(0, 0, nb * k);
      updateProduct(nb, k, nc, values, v0 + nc, nr, w, z, 0, nb);
      // rows below accumulate
      for (let c = 0; c < k; c++) {
        const zo = c * nb;
        const xo = c * n;
        for (let i = 0; i < nb; i++) x[xo + rows[r0 + nc + i]] += z[zo + i];
      }
    } else {
      for (let c = 0; c < k; c++) {
        const yo = c * nr;
        const xo = c * n;
        for (let i = nc; i < nr; i++) x[xo + rows[r0 + i]] += y[yo + i];
      }
    }
  }
}

function backwardSweep(f: SupernodalFactor, x: Float64Array, k: number, y: Float64Array, g: Float64Array): void {
  const { structure: s, values } = f;
  const { n, supernodes: ns, superStart, rowPtr, rows, valuePtr } = s;
  const blocked = k >= BLOCK_PATH_MIN_K;
  // supernodes in reverse elimination order
  for (let sn = ns - 1; sn >= 0; sn--) {
    const f0 = superStart[sn];
    const nc = superStart[sn + 1] - f0;
    const r0 = rowPtr[sn];
    const nr = rowPtr[sn + 1] - r0;
    const v0 = valuePtr[sn];
    const nb = nr - nc;
    if (blocked) {
      // y = X(f..l−1, :), g = X(below, :) row-major; y −= L21ᵀ g; then y ← L11⁻ᵀ y
      for (let c = 0; c < k; c++) y.set(x.subarray(c * n + f0, c * n + f0 + nc), c * nc);
      for (let i = 0; i < nb; i++) {
        const r = rows[r0 + nc + i];
        for (let c = 0; c < k; c++) g[i * k + c] = x[c * n + r];
      }
      if (nb > 0) subtractTransposedProduct(nb, nc, k, values, v0 + nc, nr, g, y, nc);
      for (let c = 0; c < k; c++) backwardColumns(values, v0, nr, nc, nc, y, c * nc);
      for (let c = 0; c < k; c++) x.set(y.subarray(c * nc, c * nc + nc), c * n + f0);
      continue;
    }
    // y(:, c) = X(R, c) gathered
    for (let c = 0; c < k; c++) {
      const yo = c * nr;
      const xo = c * n;
      for (let i = 0; i < nc; i++) y[yo + i] = x[xo + f0 + i];
      for (let i = nc; i < nr; i++) y[yo + i] = x[xo + rows[r0 + i]];
    }
    // y_j −= L(j+1:, j)ᵀ y(j+1:), last column first
    for (let c = 0; c < k; c++) backwardColumns(values, v0, nr, nc, nr, y, c * nr);
    // own rows back into X
    for (let c = 0; c < k; c++) x.set(y.subarray(c * nr, c * nr + nc), c * n + f0);
  }
}

/** One right-hand side y[yo ..] of one supernode: y(j+1:) −= L(j+1:, j) y_j for j = 0..nc−1. */
function forwardColumns(values: Float64Array, v0: number, nr: number, nc: number, rowEnd: number, y: Float64Array, yo: number): void {
  let j = 0;
  // groups of four columns: solve the 4×4 unit triangle, then one fused pass below it
  for (; j + 4 <= nc; j += 4) {
    const q0 = v0 + j * nr;
    const q1 = q0 + nr;
    const q2 = q1 + nr;
    const q3 = q2 + nr;
    const y0 = y[yo + j];
    const y1 = y[yo + j + 1] - values[q0 + j + 1] * y0;
    const y2 = y[yo + j + 2] - values[q0 + j + 2] * y0 - values[q1 + j + 2] * y1;
    const y3 = y[yo + j + 3] - values[q0 + j + 3] * y0 - values[q1 + j + 3] * y1 - values[q2 + j + 3] * y2;
    y[yo + j + 1] = y1;
    y[yo + j + 2] = y2;
    y[yo + j + 3] = y3;
    for (let i = j + 4; i < rowEnd; i++) {
      y[yo + i] -= values[q0 + i] * y0 + values[q1 + i] * y1 + values[q2 + i] * y2 + values[q3 + i] * y3;
    }
  }
  // remaining columns one at a time
  for (; j < nc; j++) {
    const q0 = v0 + j * nr;
    const y0 = y[yo + j];
    if (y0 !== 0) for (let i = j + 1; i < rowEnd; i++) y[yo + i] -= values[q0 + i] * y0;
  }
}

/** One right-hand side of one supernode: y_j −= L(j+1:, j)ᵀ y(j+1:) for j = nc−1..0. */
function backwardColumns(values: Float64Array, v0: number, nr: number, nc: number, rowEnd: number, y: Float64Array, yo: number): void {
  const groups = nc >> 2;
  // columns beyond the last full group of four, last first
  for (let j = nc - 1; j >= groups * 4; j--) {
    const q0 = v0 + j * nr;
    let sum = 0;
    for (let i = j + 1; i < rowEnd; i++) sum += values[q0 + i] * y[yo + i];
    y[yo + j] -= sum;
  }
  // groups of four, last first: four dot products over the rows below, then the 4×4 triangle
  for (let g = groups - 1; g >= 0; g--) {
    const j = 4 * g;
    const q0 = v0 + j * nr;
    const q1 = q0 + nr;
    const q2 = q1 + nr;
    const q3 = q2 + nr;
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    for (let i = j + 4; i < rowEnd; i++) {
      const yi = y[yo + i];
      s0 += values[q0 + i] * yi;
      s1 += values[q1 + i] * yi;
      s2 += values[q2 + i] * yi;
      s3 += values[q3 + i] * yi;
    }
    const y3 = y[yo + j + 3] - s3;
    const y2 = y[yo + j + 2] - s2 - values[q2 + j + 3] * y3;
    const y1 = y[yo + j + 1] - s1 - values[q1 + j + 2] * y2 - values[q1 + j + 3] * y3;
    const y0 = y[yo + j] - s0 - values[q0 + j + 1] * y1 - values[q0 + j + 2] * y2 - values[q0 + j + 3] * y3;
    y[yo + j] = y0;
    y[yo + j + 1] = y1;
    y[yo + j + 2] = y2;
    y[yo + j + 3] = y3;
  }
}
