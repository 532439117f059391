/**
 * Products of thin blocks (rows×p, rows ≫ p, column-major, leading dimension rows) with each other
 * and with small p×q matrices: the dense arithmetic of block eigen-solvers outside the sparse
 * operator.
 *
 *   transposeTimes:       C = AᵀB          (p×q inner products, rows-long)
 *   gram:                 G = AᵀA          (symmetric, half the products)
 *   timesSmall:           C = A S          (rows×q, S p×q)
 *   addTimesSmall:        C ← C + α A S
 *   columnNorms, scaleColumns, axpy, copyColumns: column bookkeeping.
 *
 * Rows are processed in chunks of ROW_CHUNK so the chunk of every column stays in cache while all
 * products over it are formed; inner loops run down contiguous columns. What costs here is not
 * the arithmetic but the typed-array accesses (each a bounds-checked load or store), so the loops
 * are shaped to do as many multiply-adds per access as the registers allow:
 *
 *   - inner products (transposeTimes, gram) in 3×3 tiles: per row, 3 loads of A and 3 of B feed
 *     9 multiply-adds into 9 local sums (larger tiles spill the sums and gain nothing);
 *   - combinations (addTimesSmall, timesSmall, timesSmallInPlace) in panels of PANEL = 6 columns
 *     of A × up to 6 columns of C: per row, 6 loads of A, 6 loads and 6 stores of C, 36
 *     multiply-adds, the 36 coefficients of S hoisted into locals (those that spill are re-read
 *     from the stack, which is cheap next to a typed-array access). One column of C against 4
 *     of A at a time needs 6 accesses for 4 multiply-adds and reads A's chunk q times.
 *
 * Measured on one thread (Zen 4, 127,776 rows, p = 6…140, q = 6 or 30, Node 20), against 2×2
 * tiles and that 4-wide loop: transposeTimes about 1.5×, addTimesSmall, timesSmall and
 * timesSmallInPlace 2.5–2.9× faster.
 *
 * transposeTimes, addTimesSmall, timesSmall and timesSmallInPlace run as WebAssembly SIMD kernels
 * (simd-block-kernels.ts) when the product is not tiny: in place when A lives in a kernel block
 * (the Krylov basis, allocated in a shared WebAssembly memory), else with A's rows staged a chunk
 * at a time when both p and q are wide enough to pay for the copy. The kernels do the same
 * operations in the same order per entry, so the results are bit-identical either way.
 * `region` is the calling thread's staging region in A's block (0 here, t on helper t − 1).
 */
import { kernelPlace, simdAddPanels, simdTransposeTimes } from './simd-block-kernels.js';

const ROW_CHUNK = 512;

/** Columns of A combined per pass over a row chunk (and the widest tile of output columns). */
const PANEL = 6;

/** C = AᵀB, A rows×p, B rows×q; C p×q (written to `out` when given); only rows [rowFrom, rowTo) of A and B when given. */
export function transposeTimes(
  a: Float64Array,
  b: Float64Array,
  rows: number,
  p: number,
  q: number,
  out: Float64Array = new Float64Array(p * q),
  rowFrom = 0,
  rowTo = rows,
  region = 0,
): Float64Array {
  const place = kernelPlace(a, region, rowTo - rowFrom, p, q, 'dots');
  if (place !== null) {
    // writes all of out
    simdTransposeTimes(place, a, b, rows, p, q, out, rowFrom, rowTo);
    return out;
  }
  out.fill(0, 0, p * q);
  for (let r0 = rowFrom; r0 < rowTo; r0 += ROW_CHUNK) {
    const r1 = Math.min(rowTo, r0 + ROW_CHUNK);
    // C(i, j) += A(r0:r1, i)ᵀ B(r0:r1, j) for all i, j; three columns of A stay in L1 while B's chunk passes
    for (let i = 0; i < p; i += 3) {
      for (let j = 0; j < q; j += 3) dots3x3(a, b, rows, r0, r1, i, Math.min(3, p - i), j, Math.min(3, q - j), out, p);
    }
  }
  return out;
}

/** G = AᵀA (p×p symmetric, both triangles filled). */
export function gram(
  a: Float64Array,
  rows: number,
  p: number,
  out: Float64Array = new Float64Array(p * p),
): Float64Array {
  out.fill(0, 0, p * p);
  for (let r0 = 0; r0 < rows; r0 += ROW_CHUNK) {
    const r1 = Math.min(rows, r0 + ROW_CHUNK);
    // G(i, j) += A(r0:r1, i)ᵀ A(r0:r1, j) for i ≤ j (3×3 tiles on or above the diagonal)
    for (let i = 0; i < p; i += 3) {
      for (let j = i; j < p; j += 3) dots3x3(a, a, rows, r0, r1, i, Math.min(3, p - i), j, Math.min(3, p - j), out, p);
    }
  }
  // mirror the upper triangle into the lower
  for (let j = 0; j < p; j++) {
    for (let i = j + 1; i < p; i++) out[j * p + i] = out[i * p + j];
  }
  return out;
}

/**
 * out(i:i+ni, j:j+nj) += A(r0:r1, i:i+ni)ᵀ B(r0:r1, j:j+nj), ni, nj ∈ {1, 2, 3} (out p×q, leading
 * dimension ld). A short tile repeats its last column; the repeated sums are not written.
 */
function dots3x3(
  a: Float64Array,
  b: Float64Array,
  rows: number,
  r0: number,
  r1: number,
  i: number,
  ni: number,
  j: number,
  nj: number,
  out: Float64Array,
  ld: number,
): void {
  const a0 = i * rows;
  const a1 = ni > 1 ? a0 + rows : a0;
  const a2 = ni > 2 ? a1 + rows : a1;
  const b0 = j * rows;
  const b1 = nj > 1 ? b0 + rows : b0;
  const b2 = nj > 2 ? b1 + rows : b1;
  let s00 = 0, s10 = 0, s20 = 0;
  let s01 = 0, s11 = 0, s21 = 0;
  let s02 = 0, s12 = 0, s22 = 0;
  // nine inner products sharing the loads: s_uv += A(r, i+u) B(r, j+v)
  for (let r = r0; r < r1; r++) {
    const y0 = b[b0 + r];
    const y1 = b[b1 + r];
    const y2 = b[b2 + r];
    let x = a[a0 + r];
    s00 += x * y0;
    s01 += x * y1;
    s02 += x * y2;
    x = a[a1 + r];
    s10 += x * y0;
    s11 += x * y1;
    s12 += x * y2;
    x = a[a2 + r];
    s20 += x * y0;
    s21 += x * y1;
    s22 += x * y2;
  }
  const o0 = j * ld + i;
  out[o0] += s00;
  if (ni > 1) out[o0 + 1] += s10;
  if (ni > 2) out[o0 + 2] += s20;
  if (nj > 1) {
    const o1 = o0 + ld;
    out[o1] += s01;
    if (ni > 1) out[o1 + 1] += s11;
    if (ni > 2) out[o1 + 2] += s21;
  }
  if (nj > 2) {
    const o2 = o0 + 2 * ld;
    out[o2] += s02;
    if (ni > 1) out[o2 + 1] += s12;
    if (ni > 2) out[o2 + 2] += s22;
  }
}

/** C = A S, A rows×p, S p×q (column-major, leading dimension p); C rows×q. */
export function timesSmall(
  a: Float64Array,
  rows: number,
  p: number,
  s: Float64Array,
  q: number,
  out: Float64Array = new Float64Array(rows * q),
): Float64Array {
  out.fill(0, 0, rows * q);
  addTimesSmall(out, a, rows, p, s, q, 1);
  return out;
}

/** C ← C + α A S, C rows×q, A rows×p, S p×q, on rows [rowFrom, rowTo) (all by default). C must not overlap A. */
export function addTimesSmall(
  c: Float64Array,
  a: Float64Array,
  rows: number,
  p: number,
  s: Float64Array,
  q: number,
  alpha = 1,
  rowFrom = 0,
  rowTo = rows,
  region = 0,
): void {
  if (p <= 0 || q <= 0) return;
  const t = panelCoefficients(s, p, q, alpha);
  const place = kernelPlace(a, region, rowTo - rowFrom, p, q, 'combine');
  if (place !== null) {
    simdAddPanels(place, c, rows, a, rows, p, t, q, panelStarts(p), rowFrom, rowTo, false);
    return;
  }
  for (let r0 = rowFrom; r0 < rowTo; r0 += ROW_CHUNK) {
    addPanels(c, rows, a, rows, p, t, q, r0, Math.min(rowTo, r0 + ROW_CHUNK));
  }
}

/**
 * A(:, 0:q) ← A S in place (A rows×p, S p×q, q ≤ p), on rows [rowFrom, rowTo): each row of the
 * result depends only on the same row of A, so the rows are done a chunk at a time through a
 * small buffer and written back over the first q columns.
 */
export function timesSmallInPlace(a: Float64Array, rows: number, p: number, s: Float64Array, q: number, rowFrom = 0, rowTo = rows, region = 0): void {
  if (q > p) throw new RangeError(`timesSmallInPlace: ${q} result columns exceed the ${p} of A`);
  if (q <= 0) return;
  const t = panelCoefficients(s, p, q, 1);
  const place = kernelPlace(a, region, rowTo - rowFrom, p, q, 'combine');
  if (place !== null) {
    simdAddPanels(place, a, rows, a, rows, p, t, q, panelStarts(p), rowFrom, rowTo, true);
    return;
  }
  const buf = new Float64Array(ROW_CHUNK * q);
  for (let r0 = rowFrom; r0 < rowTo; r0 += ROW_CHUNK) {
    const r1 = Math.min(rowTo, r0 + ROW_CHUNK);
    const len = r1 - r0;
    buf.fill(0);
    // buf(:, j) = Σ_l S(l, j) A(r0:r1, l), through a view of A from row r0 so every index is ≥ 0
    // (a negative column offset into buf made V8 recompile the kernels slower for every caller)
    addPanels(buf, ROW_CHUNK, a.subarray(r0), rows, p, t, q, 0, len);
    for (let j = 0; j < q; j++) a.set(buf.subarray(j * ROW_CHUNK, j * ROW_CHUNK + len), j * rows + r0);
  }
}

/**
 * α S cut into panels of PANEL rows (columns of A), laid out for addPanels: panel g covers the
 * columns l_g + v (v < PANEL) of A with l_g = min(g·PANEL, p − PANEL), so the last panel overlaps
 * the one before instead of running short; when p < PANEL the panel repeats column p − 1. A
 * column already combined by an earlier panel, or repeated, gets coefficient 0 (and 0 times a
 * finite entry adds exactly nothing). T[(g q + j) PANEL + v] = α S(l_g + v, j), or 0 as said.
 */
function panelCoefficients(s: Float64Array, p: number, q: number, alpha: number): Float64Array {
  const panels = Math.ceil(p / PANEL);
  const t = new Float64Array(panels * q * PANEL);
  for (let g = 0; g < panels; g++) {
    const lg = panelStart(g, p);
    // T(g, j, v) = α S(l_g + v, j) for the columns this panel is the first to reach
    for (let j = 0; j < q; j++) {
      for (let v = 0; v < PANEL; v++) {
        const l = lg + v;
        if (l >= g * PANEL && l < p) t[(g * q + j) * PANEL + v] = alpha * s[j * p + l];
      }
    }
  }
  return t;
}

/** First column of A in panel g (see panelCoefficients). */
function panelStart(g: number, p: number): number {
  return Math.max(0, Math.min(g * PANEL, p - PANEL));
}

/** The first column of every panel (for the combine kernel). */
function panelStarts(p: number): Int32Array {
  return Int32Array.from({ length: Math.ceil(p / PANEL) }, (_, g) => panelStart(g, p));
}

/**
 * C(r, j) += Σ_l T(l, j) A(r, l) for the rows r ∈ [r0, r1) and all q columns of C, with
 * C(r, j) = c[j·ldc + r] (so C may be a chunk-sized buffer) and T from panelCoefficients.
 * Output columns go in tiles of 6, 3, 2 or 1; each tile takes the panels of A one after another,
 * so a tile of C stays in cache while A's chunk passes once per tile.
 */
function addPanels(
  c: Float64Array,
  ldc: number,
  a: Float64Array,
  rows: number,
  p: number,
  t: Float64Array,
  q: number,
  r0: number,
  r1: number,
): void {
  const panels = Math.ceil(p / PANEL);
  const last = p - 1;
  for (let j = 0; j < q; ) {
    const left = q - j;
    const width = left >= 6 ? 6 : left >= 3 ? 3 : left;
    const cj = j * ldc;
    // C(r0:r1, j:j+width) += A(r0:r1, panel g) T(panel g, j:j+width), panel by panel
    for (let g = 0; g < panels; g++) {
      const lg = panelStart(g, p);
      const tg = (g * q + j) * PANEL;
      if (width === 6) panel6x6(c, cj, ldc, a, rows, lg, last, t, tg, r0, r1);
      else if (width === 3) panel6x3(c, cj, ldc, a, rows, lg, last, t, tg, r0, r1);
      else if (width === 2) panel6x2(c, cj, ldc, a, rows, lg, last, t, tg, r0, r1);
      else panel6x1(c, cj, ldc, a, rows, lg, last, t, tg, r0, r1);
    }
    j += width;
  }
}

/*
 * The panel kernels: C(r, u) += Σ_v T(v, u) A(r, l + v) over v < 6 for the rows r ∈ [r0, r1) and
 * the 6, 3, 2 or 1 output columns u, C(r, u) = c[cj + u·ldc + r], T(v, u) = t[tg + u·PANEL + v];
 * column indices past `last` are clamped (their coefficients are 0).
 */

function panel6x6(c: Float64Array, cj: number, ldc: number, a: Float64Array, rows: number, l: number, last: number, t: Float64Array, tg: number, r0: number, r1: number): void {
  const a0 = Math.min(l, last) * rows, a1 = Math.min(l + 1, last) * rows, a2 = Math.min(l + 2, last) * rows;
  const a3 = Math.min(l + 3, last) * rows, a4 = Math.min(l + 4, last) * rows, a5 = Math.min(l + 5, last) * rows;
  const c0 = cj, c1 = c0 + ldc, c2 = c1 + ldc, c3 = c2 + ldc, c4 = c3 + ldc, c5 = c4 + ldc;
  const t00 = t[tg], t10 = t[tg + 1], t20 = t[tg + 2], t30 = t[tg + 3], t40 = t[tg + 4], t50 = t[tg + 5];
  const t01 = t[tg + 6], t11 = t[tg + 7], t21 = t[tg + 8], t31 = t[tg + 9], t41 = t[tg + 10], t51 = t[tg + 11];
  const t02 = t[tg + 12], t12 = t[tg + 13], t22 = t[tg + 14], t32 = t[tg + 15], t42 = t[tg + 16], t52 = t[tg + 17];
  const t03 = t[tg + 18], t13 = t[tg + 19], t23 = t[tg + 20], t33 = t[tg + 21], t43 = t[tg + 22], t53 = t[tg + 23];
  const t04 = t[tg + 24], t14 = t[tg + 25], t24 = t[tg + 26], t34 = t[tg + 27], t44 = t[tg + 28], t54 = t[tg + 29];
  const t05 = t[tg + 30], t15 = t[tg + 31], t25 = t[tg + 32], t35 = t[tg + 33], t45 = t[tg + 34], t55 = t[tg + 35];
  // six columns of C from one load of six columns of A per row
  for (let r = r0; r < r1; r++) {
    const x0 = a[a0 + r], x1 = a[a1 + r], x2 = a[a2 + r], x3 = a[a3 + r], x4 = a[a4 + r], x5 = a[a5 + r];
    c[c0 + r] += t00 * x0 + t10 * x1 + t20 * x2 + t30 * x3 + t40 * x4 + t50 * x5;
    c[c1 + r] += t01 * x0 + t11 * x1 + t21 * x2 + t31 * x3 + t41 * x4 + t51 * x5;
    c[c2 + r] += t02 * x0 + t12 * x1 + t22 * x2 + t32 * x3 + t42 * x4 + t52 * x5;
    c[c3 + r] += t03 * x0 + t13 * x1 + t23 * x2 + t33 * x3 + t43 * x4 + t53 * x5;
    c[c4 + r] += t04 * x0 + t14 * x1 + t24 * x2 + t34 * x3 + t44 * x4 + t54 * x5;
    c[c5 + r] += t05 * x0 + t15 * x1 + t25 * x2 + t35 * x3 + t45 * x4 + t55 * x5;
  }
}

function panel6x3(c: Float64Array, cj: number, ldc: number, a: Float64Array, rows: number, l: number, last: number, t: Float64Array, tg: number, r0: number, r1: number): void {
  const a0 = Math.min(l, last) * rows, a1 = Math.min(l + 1, last) * rows, a2 = Math.min(l + 2, last) * rows;
  const a3 = Math.min(l + 3, last) * rows, a4 = Math.min(l + 4, last) * rows, a5 = Math.min(l + 5, last) * rows;
  const c0 = cj, c1 = c0 + ldc, c2 = c1 + ldc;
  const t00 = t[tg], t10 = t[tg + 1], t20 = t[tg + 2], t30 = t[tg + 3], t40 = t[tg + 4], t50 = t[tg + 5];
  const t01 = t[tg + 6], t11 = t[tg + 7], t21 = t[tg + 8], t31 = t[tg + 9], t41 = t[tg + 10], t51 = t[tg + 11];
  const t02 = t[tg + 12], t12 = t[tg + 13], t22 = t[tg + 14], t32 = t[tg + 15], t42 = t[tg + 16], t52 = t[tg + 17];
  // three columns of C from one load of six columns of A per row
  for (let r = r0; r < r1; r++) {
    const x0 = a[a0 + r], x1 = a[a1 + r], x2 = a[a2 + r], x3 = a[a3 + r], x4 = a[a4 + r], x5 = a[a5 + r];
    c[c0 + r] += t00 * x0 + t10 * x1 + t20 * x2 + t30 * x3 + t40 * x4 + t50 * x5;
    c[c1 + r] += t01 * x0 + t11 * x1 + t21 * x2 + t31 * x3 + t41 * x4 + t51 * x5;
    c[c2 + r] += t02 * x0 + t12 * x1 + t22 * x2 + t32 * x3 + t42 * x4 + t52 * x5;
  }
}

function panel6x2(c: Float64Array, cj: number, ldc: number, a: Float64Array, rows: number, l: number, last: number, t: Float64Array, tg: number, r0: number, r1: number): void {
  const a0 = Math.min(l, last) * rows, a1 = Math.min(l + 1, last) * rows, a2 = Math.min(l + 2, last) * rows;
  const a3 = Math.min(l + 3, last) * rows, a4 = Math.min(l + 4, last) * rows, a5 = Math.min(l + 5, last) * rows;
  const c0 = cj, c1 = c0 + ldc;
  const t00 = t[tg], t10 = t[tg + 1], t20 = t[tg + 2], t30 = t[tg + 3], t40 = t[tg + 4], t50 = t[tg + 5];
  const t01 = t[tg + 6], t11 = t[tg + 7], t21 = t[tg + 8], t31 = t[tg + 9], t41 = t[tg + 10], t51 = t[tg + 11];
  // two columns of C from one load of six columns of A per row
  for (let r = r0; r < r1; r++) {
    const x0 = a[a0 + r], x1 = a[a1 + r], x2 = a[a2 + r], x3 = a[a3 + r], x4 = a[a4 + r], x5 = a[a5 + r];
    c[c0 + r] += t00 * x0 + t10 * x1 + t20 * x2 + t30 * x3 + t40 * x4 + t50 * x5;
    c[c1 + r] += t01 * x0 + t11 * x1 + t21 * x2 + t31 * x3 + t41 * x4 + t51 * x5;
  }
}

function panel6x1(c: Float64Array, cj: number, _ldc: number, a: Float64Array, rows: number, l: number, last: number, t: Float64Array, tg: number, r0: number, r1: number): void {
  const a0 = Math.min(l, last) * rows, a1 = Math.min(l + 1, last) * rows, a2 = Math.min(l + 2, last) * rows;
  const a3 = Math.min(l + 3, last) * rows, a4 = Math.min(l + 4, last) * rows, a5 = Math.min(l + 5, last) * rows;
  const t0 = t[tg], t1 = t[tg + 1], t2 = t[tg + 2], t3 = t[tg + 3], t4 = t[tg + 4], t5 = t[tg + 5];
  // one column of C from six columns of A
  for (let r = r0; r < r1; r++) {
    c[cj + r] += t0 * a[a0 + r] + t1 * a[a1 + r] + t2 * a[a2 + r] + t3 * a[a3 + r] + t4 * a[a4 + r] + t5 * a[a5 + r];
  }
}

/** y ← y + α x over `length` entries (offsets allow columns of blocks). */
export function axpy(
  y: Float64Array,
  alpha: number,
  x: Float64Array,
  length = y.length,
  yAt = 0,
  xAt = 0,
): void {
  // y_i += α x_i
  for (let i = 0; i < length; i++) y[yAt + i] += alpha * x[xAt + i];
}

/** ‖A(:, j)‖₂ for each column j of the rows×cols block A. */
export function columnNorms(a: Float64Array, rows: number, cols: number): Float64Array {
  const norms = new Float64Array(cols);
  for (let j = 0; j < cols; j++) {
    const cj = j * rows;
    let s = 0;
    // Σ_i a_ij²
    for (let i = 0; i < rows; i++) s += a[cj + i] * a[cj + i];
    norms[j] = Math.sqrt(s);
  }
  return norms;
}

/** A(:, j) ← f_j A(:, j). */
export function scaleColumns(a: Float64Array, rows: number, factors: ArrayLike<number>): void {
  for (let j = 0; j < factors.length; j++) {
    const f = factors[j];
    const cj = j * rows;
    // a_ij *= f_j
    for (let i = 0; i < rows; i++) a[cj + i] *= f;
  }
}

/** The columns `columns` (in that order) of the rows×? block A, as a new rows×columns.length block. */
export function copyColumns(a: Float64Array, rows: number, columns: ArrayLike<number>): Float64Array {
  const out = new Float64Array(rows * columns.length);
  // out(:, k) = A(:, columns[k])
  for (let k = 0; k < columns.length; k++) {
    out.set(a.subarray(columns[k] * rows, columns[k] * rows + rows), k * rows);
  }
  return out;
}
