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
import { KERNEL_RHS, sweepKernels, type FactorStorage, type SweepKernels } from './simd-sweep-kernels.js';

/** Right-hand sides from which the rows below each supernode go through dense products. */
const BLOCK_PATH_MIN_K = 4;

/** X ← (L D Lᵀ)⁻¹ X over the whole tree. */
export function supernodalSolveInPlace(f: SupernodalFactor, x: Float64Array, k: number, ws: SweepWorkspace = sweepWorkspace(f, k)): void {
  const all: [number, number][] = [[0, f.structure.supernodes - 1]];
  forwardSweepRanges(f, x, k, ws, all);
  diagonalSolve(f, x, k);
  backwardSweepRanges(f, x, k, ws, all);
}

/**
 * Where a sweep over part of the tree sends its updates of rows outside the part: rows with
 * index[row] ≥ 0 are added to acc[c · count + index[row]] instead of X (so threads sweeping
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
  /** SIMD kernels over the factor's memory and this thread's scratch region there, when the factor lives in one. */
  simd: { kernels: SweepKernels; scratch: number } | null;
}

/** This thread's kernels per factor memory (the main thread reuses them from solve to solve). */
const kernelsOf = new WeakMap<FactorStorage, SweepKernels | null>();

/**
 * Gathered rows of X for one supernode (y, z) and its k-major copy (w): maxRows × k each; with
 * the SIMD kernels, scratch region `region` of the factor's memory instead (0 for the main
 * thread, i + 1 for helper i; plain arrays when the memory has no such region).
 */
export function sweepWorkspace(f: SupernodalFactor, k: number, region = 0): SweepWorkspace {
  if (f.storage && region < f.storage.regions) {
    let kernels = kernelsOf.get(f.storage);
    if (kernels === undefined) {
      kernels = sweepKernels(f.storage);
      kernelsOf.set(f.storage, kernels);
    }
    if (kernels !== null) {
      const none = new Float64Array(0);
      return { y: none, w: none, z: none, simd: { kernels, scratch: region * f.storage.scratchDoubles } };
    }
  }
  const m = f.structure.maxRows * k;
  const work = new Float64Array(3 * m + 1);
  return { y: work.subarray(0, m), w: work.subarray(m, 2 * m), z: work.subarray(2 * m, 3 * m), simd: null };
}

/** Forward sweep L Z = X over supernode ranges (inclusive, ascending); all supernodes by default. */
export function forwardSweepRanges(f: SupernodalFactor, x: Float64Array, k: number, ws: SweepWorkspace, ranges: [number, number][], redirect?: RowRedirect): void {
  for (const [lo, hi] of ranges) {
    if (ws.simd) forwardSweepSimd(f, x, k, ws.simd.kernels, ws.simd.scratch, lo, hi + 1, redirect);
    else forwardSweep(f, x, k, ws.y, ws.w, ws.z, lo, hi + 1, redirect);
  }
}

/** Backward sweep Lᵀ X = W over supernode ranges, visited in descending order. */
export function backwardSweepRanges(f: SupernodalFactor, x: Float64Array, k: number, ws: SweepWorkspace, ranges: [number, number][]): void {
  for (let r = ranges.length - 1; r >= 0; r--) {
    if (ws.simd) backwardSweepSimd(f, x, k, ws.simd.kernels, ws.simd.scratch, ranges[r][0], ranges[r][1] + 1);
    else backwardSweep(f, x, k, ws.y, ws.w, ranges[r][0], ranges[r][1] + 1);
  }
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

/** Columns of L11 per panel in the SIMD sweeps: a triangle kernel call, then a product kernel call for the rows below it. */
const SIMD_PANEL = 8;
/** Columns of L per call of the columns kernel (its strips walk across them; our choice by measurement). */
const SIMD_COLUMN_BLOCK = 8;
/** Column pairs of L per round of the dots kernels when the right-hand sides go in two groups (≈ 16 columns stay in cache). */
const SIMD_PAIR_BLOCK = 8;

/**
 * Right-hand sides per kernel call: five or six go as 3 + 2 or 3 + 3 over the same block of L
 * (still in cache for the second group). Five or six at once keep 14–16 vector values live and
 * ran, on cache-resident blocks, at 5.2–6.4 G multiply-adds/s against 9–9.7 for three or four
 * (our measurement; as if spilling every step).
 */
const RHS_GROUPS: readonly (readonly number[])[] = [[], [1], [2], [3], [4], [3, 2], [3, 3]];
function rhsGroups(g: number): readonly number[] {
  return RHS_GROUPS[g];
}

/**
 * Forward sweep with the SIMD kernels, g ≤ KERNEL_RHS right-hand sides at a time. Per supernode,
 * Y = [X(f..l−1, ·); 0] (nr × g, in this thread's scratch region); for each panel of L11,
 * the unit triangle (scalar, in WebAssembly) and  Y(rows below in L11) −= L(·, panel) Y(panel);  then
 * Y(below) −= L21 Y(own) in one call, and Y(below) is added into X (or its redirect).
 */
function forwardSweepSimd(f: SupernodalFactor, x: Float64Array, k: number, kern: SweepKernels, yb: number, from: number, to: number, redirect?: RowRedirect): void {
  const { structure: s } = f;
  const { n, superStart, rowPtr, rows, valuePtr } = s;
  const heap = kern.heap;
  const lBase = kern.storage.valuesOffset;
  const index = redirect?.index;
  // supernodes in elimination order, right-hand sides in groups of up to KERNEL_RHS
  for (let sn = from; sn < to; sn++) {
    const f0 = superStart[sn];
    const nc = superStart[sn + 1] - f0;
    const r0 = rowPtr[sn];
    const nr = rowPtr[sn + 1] - r0;
    const v0 = valuePtr[sn];
    const nb = nr - nc;
    for (let c0 = 0; c0 < k; c0 += KERNEL_RHS) {
      const g = Math.min(KERNEL_RHS, k - c0);
      // Y(:, c) = [X(f..l−1, c0 + c); 0] (one fill for the whole block, then the own rows)
      heap.fill(0, yb, yb + g * nr);
      for (let c = 0; c < g; c++) {
        const yo = yb + c * nr;
        const xo = (c0 + c) * n + f0;
        for (let i = 0; i < nc; i++) heap[yo + i] = x[xo + i];
      }
      // L11 panel by panel
      for (let j = 0; j < nc; j += SIMD_PANEL) {
        const pw = Math.min(SIMD_PANEL, nc - j);
        // unit triangle of the panel, column by column, every right-hand side in one call
        if (pw > 1) kern.triangleForward(8 * (lBase + v0 + j * nr + j), 8 * nr, pw, g, 8 * (yb + j), 8 * nr);
        if (nc - j - pw > 0) columnsProduct(kern, g, nc - j - pw, pw, lBase + v0 + j * nr + j + pw, nr, yb + j, yb + j + pw);
      }
      if (nb > 0) columnsProduct(kern, g, nb, nc, lBase + v0 + nc, nr, yb, yb + nc);
      // own rows back into X
      for (let c = 0; c < g; c++) {
        const yo = yb + c * nr;
        const xo = (c0 + c) * n + f0;
        for (let i = 0; i < nc; i++) x[xo + i] = heap[yo + i];
      }
      // rows below accumulate, row by row (each row's index read once for the group)
      if (index) {
        // rows marked in the redirect go to its accumulator (as scatterRedirected)
        const { acc, count } = redirect!;
        for (let i = nc; i < nr; i++) {
          const r = rows[r0 + i];
          const t = index[r];
          if (t >= 0) for (let c = 0, yo = yb + i, ao = c0 * count + t; c < g; c++, yo += nr, ao += count) acc[ao] += heap[yo];
          else for (let c = 0, yo = yb + i, xo = c0 * n + r; c < g; c++, yo += nr, xo += n) x[xo] += heap[yo];
        }
      } else {
        for (let i = nc; i < nr; i++) {
          const r = rows[r0 + i];
          for (let c = 0, yo = yb + i, xo = c0 * n + r; c < g; c++, yo += nr, xo += n) x[xo] += heap[yo];
        }
      }
    }
  }
}

/**
 * Backward sweep with the SIMD kernels: Y = X(R, ·) gathered; Y(own) −= L21ᵀ Y(below); then the
 * panels of L11 last first: Y(panel) −= L(rows below in L11, panel)ᵀ Y(those rows) and the
 * transposed unit triangle (scalar, in WebAssembly); Y(own) back into X.
 */
function backwardSweepSimd(f: SupernodalFactor, x: Float64Array, k: number, kern: SweepKernels, yb: number, from: number, to: number): void {
  const { structure: s } = f;
  const { n, superStart, rowPtr, rows, valuePtr } = s;
  const heap = kern.heap;
  const lBase = kern.storage.valuesOffset;
  // supernodes in reverse elimination order, right-hand sides in groups
  for (let sn = to - 1; sn >= from; sn--) {
    const f0 = superStart[sn];
    const nc = superStart[sn + 1] - f0;
    const r0 = rowPtr[sn];
    const nr = rowPtr[sn + 1] - r0;
    const v0 = valuePtr[sn];
    const nb = nr - nc;
    for (let c0 = 0; c0 < k; c0 += KERNEL_RHS) {
      const g = Math.min(KERNEL_RHS, k - c0);
      // Y(:, c) = X(R, c0 + c): own rows column by column, rows below row by row
      for (let c = 0; c < g; c++) {
        const yo = yb + c * nr;
        const xo = (c0 + c) * n + f0;
        for (let i = 0; i < nc; i++) heap[yo + i] = x[xo + i];
      }
      for (let i = nc; i < nr; i++) {
        const r = rows[r0 + i];
        for (let c = 0, yo = yb + i, xo = c0 * n + r; c < g; c++, yo += nr, xo += n) heap[yo] = x[xo];
      }
      if (nb > 0) dotsProduct(kern, g, nb, nc, lBase + v0 + nc, nr, yb + nc, yb);
      // L11 panels, last first
      for (let j = Math.floor((nc - 1) / SIMD_PANEL) * SIMD_PANEL; j >= 0; j -= SIMD_PANEL) {
        const pw = Math.min(SIMD_PANEL, nc - j);
        if (nc - j - pw > 0) dotsProduct(kern, g, nc - j - pw, pw, lBase + v0 + j * nr + j + pw, nr, yb + j + pw, yb + j);
        // transposed unit triangle, last column first, every right-hand side in one call
        if (pw > 1) kern.triangleBackward(8 * (lBase + v0 + j * nr + j), 8 * nr, pw, g, 8 * (yb + j), 8 * nr);
      }
      // own rows back into X
      for (let c = 0; c < g; c++) {
        const yo = yb + c * nr;
        const xo = (c0 + c) * n + f0;
        for (let i = 0; i < nc; i++) x[xo + i] = heap[yo + i];
      }
    }
  }
}

/**
 * heap[y + i + c·ld] −= Σ_{t<cols} heap[l + i + t·ld] · heap[xo + t + c·ld] for i < rows, c < g:
 * strips of four rows in the kernel, the last rows in the scalar tail kernel.
 */
function columnsProduct(kern: SweepKernels, g: number, rows: number, cols: number, l: number, ld: number, xo: number, y: number): void {
  const strips = rows >> 2;
  // a few columns of L per call, so one strip's loads touch few pages and every column streams
  if (strips > 0) {
    const groups = rhsGroups(g);
    for (let t0 = 0; t0 < cols; t0 += SIMD_COLUMN_BLOCK) {
      const w = Math.min(SIMD_COLUMN_BLOCK, cols - t0);
      // each group of right-hand sides over the same columns of L
      for (let c = 0, q = 0; q < groups.length; c += groups[q], q++) {
        kern.columns[groups[q]](8 * (l + t0 * ld), 8 * ld, strips, w, 8 * (xo + t0 + c * ld), 8 * ld, 8 * (y + c * ld), 8 * ld);
      }
    }
  }
  // the rows after the last strip, every right-hand side in one call
  if (rows > 4 * strips) kern.columnsTail(8 * (l + 4 * strips), 8 * ld, rows - 4 * strips, cols, 8 * xo, 8 * ld, 8 * (y + 4 * strips), 8 * ld, g);
}

/**
 * heap[y + t + c·ld] −= Σ_{i<rows} heap[l + i + t·ld] · heap[gOff + i + c·ld] for t < cols, c < g:
 * pairs of columns (and a last single one) in the kernels over row pairs, an odd last row in the tail kernel.
 */
function dotsProduct(kern: SweepKernels, g: number, rows: number, cols: number, l: number, ld: number, gOff: number, y: number): void {
  const pairs = rows >> 1;
  const colPairs = cols >> 1;
  const groups = rhsGroups(g);
  // one group: every column pair in one call; two groups: blocks of pairs, each group over the block
  const block = groups.length === 1 ? colPairs : SIMD_PAIR_BLOCK;
  for (let p0 = 0; p0 < colPairs; p0 += block) {
    const count = Math.min(block, colPairs - p0);
    for (let c = 0, q = 0; q < groups.length; c += groups[q], q++) {
      kern.dots2[groups[q]](8 * (l + 2 * p0 * ld), 8 * ld, pairs, count, 8 * (gOff + c * ld), 8 * ld, 8 * (y + 2 * p0 + c * ld), 8 * ld);
    }
  }
  if (cols & 1) {
    for (let c = 0, q = 0; q < groups.length; c += groups[q], q++) {
      kern.dots1[groups[q]](8 * (l + (cols - 1) * ld), 8 * ld, pairs, 1, 8 * (gOff + c * ld), 8 * ld, 8 * (y + cols - 1 + c * ld), 8 * ld);
    }
  }
  // the last row's share of every dot product
  if (rows & 1) kern.dotsTail(8 * (l + rows - 1), 8 * ld, cols, g, 8 * (gOff + rows - 1), 8 * ld, 8 * y, 8 * ld);
}
