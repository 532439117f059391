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

/** X ← (L D Lᵀ)⁻¹ X over the whole tree. */
export function supernodalSolveInPlace(f: SupernodalFactor, x: Float64Array, k: number, ws: SweepWorkspace = sweepWorkspace(f, k)): void {
  forwardSweep(f, x, k, ws.y, ws.w, ws.z);
  diagonalSolve(f, x, k);
  backwardSweep(f, x, k, ws.y, ws.w);
}

/**
 * Where a sweep over part of the tree sends its updates of rows outside the part: rows with
 * index[row] ≥ 0 are added to acc[c · count + index[row]] instead of X (so two threads sweeping
 * disjoint subtrees never write the same entry of X).
 */
export interface RowRedirect {
  index: Int32Array;
  count: number;
  acc: Float64Array;
}

export interface SweepWorkspace {
  y: Float64Array;
  w: Float64Array;
  z: Float64Array;
}

/** Gathered rows of X for one supernode (y, z) and its k-major copy (w): maxRows × k each. */
export function sweepWorkspace(f: SupernodalFactor, k: number): SweepWorkspace {
  const m = f.structure.maxRows * k;
  const work = new Float64Array(3 * m + 1);
  return { y: work.subarray(0, m), w: work.subarray(m, 2 * m), z: work.subarray(2 * m, 3 * m) };
}

/** Forward sweep L Z = X over supernode ranges (inclusive, ascending); all supernodes by default. */
export function forwardSweepRanges(f: SupernodalFactor, x: Float64Array, k: number, ws: SweepWorkspace, ranges: [number, number][], redirect?: RowRedirect): void {
  for (const [lo, hi] of ranges) forwardSweep(f, x, k, ws.y, ws.w, ws.z, lo, hi + 1, redirect);
}

/** Backward sweep Lᵀ X = W over supernode ranges, visited in descending order. */
export function backwardSweepRanges(f: SupernodalFactor, x: Float64Array, k: number, ws: SweepWorkspace, ranges: [number, number][]): void {
  for (let r = ranges.length - 1; r >= 0; r--) backwardSweep(f, x, k, ws.y, ws.w, ranges[r][0], ranges[r][1] + 1);
}

/** X ← D⁻¹ X on all rows. */
export function diagonalSolve(f: SupernodalFactor, x: Float64Array, k: number): void {
  const { d, structure } = f;
  const n = structure.n;
  // divide each row by its pivot
  for (let c = 0; c < k; c++) {
    const o = c * n;
    for (let j = 0; j < n; j++) x[o + j] /= d[j];
  }
}

function forwardSweep(
  f: SupernodalFactor,
  x: Float64Array,
  k: number,
  y: Float64Array,
  w: Float64Array,
  z: Float64Array,
  from = 0,
  to = f.structure.supernodes,
  redirect?: RowRedirect,
): void {
  const { structure: s, values } = f;
  const { n, superStart, rowPtr, rows, valuePtr } = s;
  const blocked = k >= BLOCK_PATH_MIN_K;
  const index = redirect?.index;
  // supernodes in elimination order
  for (let sn = from; sn < to; sn++) {
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
      if (index) scatterRedirected(x, n, k, z, nb, rows, r0 + nc, redirect!);
      else {
        for (let c = 0; c < k; c++) {
          const zo = c * nb;
          const xo = c * n;
          for (let i = 0; i < nb; i++) x[xo + rows[r0 + nc + i]] += z[zo + i];
        }
      }
    } else if (index) {
      // unblocked: y(nc:nr, c) holds the updates; same scatter with stride nr
      for (let c = 0; c < k; c++) scatterRedirected(x.subarray(c * n), n, 1, y.subarray(c * nr + nc), nr - nc, rows, r0 + nc, redirect!, c);
    } else {
      for (let c = 0; c < k; c++) {
        const yo = c * nr;
        const xo = c * n;
        for (let i = nc; i < nr; i++) x[xo + rows[r0 + i]] += y[yo + i];
      }
    }
  }
}

/** X(rows[p0 + i], c) += u(i, c) (u: count × k column-major), rows marked in the redirect go to its accumulator. */
function scatterRedirected(
  x: Float64Array,
  n: number,
  k: number,
  u: Float64Array,
  count: number,
  rows: Int32Array,
  p0: number,
  redirect: RowRedirect,
  column0 = 0,
): void {
  const { index, acc } = redirect;
  const m = redirect.count;
  for (let c = 0; c < k; c++) {
    const uo = c * count;
    const xo = c * n;
    const ao = (column0 + c) * m;
    for (let i = 0; i < count; i++) {
      const r = rows[p0 + i];
      const t = index[r];
      if (t >= 0) acc[ao + t] += u[uo + i];
      else x[xo + r] += u[uo + i];
    }
  }
}

function backwardSweep(f: SupernodalFactor, x: Float64Array, k: number, y: Float64Array, g: Float64Array, from = 0, to = f.structure.supernodes): void {
  const { structure: s, values } = f;
  const { n, superStart, rowPtr, rows, valuePtr } = s;
  const blocked = k >= BLOCK_PATH_MIN_K;
  // supernodes in reverse elimination order
  for (let sn = to - 1; sn >= from; sn--) {
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
