/**
 * Dense kernels for the supernodal LDLᵀ, over column-major Float64Array blocks.
 *
 * A supernode's block holds nr rows × nc columns, column-major with leading dimension nr; its
 * top nc×nc part is the diagonal block (lower triangle used), the rest the rows below.
 *
 * The work is C −= A Wᵀ (A m×k column-major, W n×k), often only for the blocks of C on or below
 * the diagonal, register blocked 4 rows × 4 columns: per step over t, 4 entries of A's column t
 * and 4 of W's row t feed 16 multiply-adds into local accumulators, so the inner loop is
 * arithmetic, not memory traffic. Two paths:
 *  - `stripUpdate` / `inPlaceUpdate` (the factor lives in a WebAssembly memory): A is read where
 *    it is by the strip kernels of wasm-tile-kernel.ts, W is packed in 4-column panels
 *    (`scaledRowsPanels`), C is the block itself or scratch in the same memory;
 *  - `updateLowerProduct` / `updateProduct` (plain Float64Arrays, W stored k-major: W[t·n + j]):
 *    packed copies through the kernel's private memory, or the TypeScript tiles.
 */
import { createTileKernel, type StripKernels } from './wasm-tile-kernel.js';

const ROW_BLOCK = 256;
const DEPTH_BLOCK = 128;

/**
 * C[i, j] −= Σ_t A[i, t] · W[j, t] for 0 ≤ j < n, j − 3 ≤ i < m (the lower part in 4×4 tiles;
 * a few entries just above the diagonal of C are also written — callers never read them).
 * A[i, t] = a[aOff + i + t·lda]; W[j, t] = w[t·n + j]; C[i, j] = c[cOff + i + j·ldc].
 * Rows and the inner dimension are cut into cache-sized blocks.
 */
export function updateLowerProduct(
  m: number,
  n: number,
  k: number,
  a: Float64Array,
  aOff: number,
  lda: number,
  w: Float64Array,
  c: Float64Array,
  cOff: number,
  ldc: number,
): void {
  if (n >= 4 && k >= 4 && m >= 8) {
    packedProduct(true, m, n, k, a, aOff, lda, w, c, cOff, ldc);
    return;
  }
  // cache blocks: ROW_BLOCK rows of A and C, DEPTH_BLOCK steps of the inner dimension
  for (let i0 = 0; i0 < m; i0 += ROW_BLOCK) {
    const i1 = Math.min(m, i0 + ROW_BLOCK);
    const nb = Math.min(n, i1); // columns with a diagonal at or above row i1
    for (let t0 = 0; t0 < k; t0 += DEPTH_BLOCK) {
      productBlock(true, i0, i1, t0, Math.min(k, t0 + DEPTH_BLOCK), nb, n, a, aOff, lda, w, c, cOff, ldc);
    }
  }
}

/** Rows of A and depth steps per packed block (packed A block: 128 × 128 doubles = 128 KiB). */
const PACK_ROWS = 128;
const PACK_DEPTH = 256;
/** Packed operands live in the SIMD kernel's memory when it is available (offsets in doubles). */
const simdKernel = createTileKernel();
let simdEnabled = true;

/**
 * Turns the WebAssembly SIMD tile kernel on or off (default on when the runtime has it); the
 * plain TypeScript tiles compute the same sums. Returns whether the SIMD kernel is in use now.
 * For tests and benchmarks of the fallback path.
 */
export function useSimdTileKernel(on: boolean): boolean {
  simdEnabled = on;
  return on && simdKernel !== null;
}

/** Whether the packed products run in the WebAssembly SIMD tile kernel now. */
export function simdTileKernelInUse(): boolean {
  return simdEnabled && simdKernel !== null;
}
const TILE_OUT = PACK_ROWS * PACK_DEPTH;
const PACKED_W = TILE_OUT + 512;
let plainBuffer = new Float64Array(PACKED_W + 64 * PACK_DEPTH);

/**
 * updateLowerProduct (lower = true) or updateProduct on packed copies: per depth block, W's
 * columns in 4-wide panels and A's rows in 4-high panels, each panel t-major (entry t of the
 * panel's 4 rows/columns side by side, zero padded), so the 4×4 inner loop reads both operands
 * sequentially.
 */
function packedProduct(
  lower: boolean,
  m: number,
  n: number,
  k: number,
  a: Float64Array,
  aOff: number,
  lda: number,
  w: Float64Array,
  c: Float64Array,
  cOff: number,
  ldc: number,
): void {
  const nt = (n + 3) >> 2;
  const need = PACKED_W + nt * 4 * PACK_DEPTH;
  const simd = simdEnabled && simdKernel !== null && need <= simdKernel.memory.length ? simdKernel : null;
  if (simd === null && plainBuffer.length < need) plainBuffer = new Float64Array(need);
  const buf = simd !== null ? simd.memory : plainBuffer;
  // depth blocks of the inner dimension
  for (let t0 = 0; t0 < k; t0 += PACK_DEPTH) {
    const kb = Math.min(PACK_DEPTH, k - t0);
    // W panels: buf[PACKED_W + (jt·kb + t)·4 + jj] = W[4jt + jj, t0 + t], zero beyond n
    for (let t = 0; t < kb; t++) packPanels(w, (t0 + t) * n, n, buf, PACKED_W + 4 * t, 4 * kb);
    // row blocks of A and C
    for (let i0 = 0; i0 < m; i0 += PACK_ROWS) {
      const i1 = Math.min(m, i0 + PACK_ROWS);
      const mt = (i1 - i0 + 3) >> 2;
      const rowsHere = i1 - i0;
      // A panels: buf[(it·kb + t)·4 + ii] = A[i0 + 4it + ii, t0 + t], zero beyond i1
      for (let t = 0; t < kb; t++) packPanels(a, aOff + i0 + (t0 + t) * lda, rowsHere, buf, 4 * t, 4 * kb);
      const nb = lower ? Math.min(n, i1) : n;
      // column panels with a diagonal at or above row i1, row panels from the diagonal down (lower)
      for (let j = 0; j < nb; j += 4) {
        const itStart = lower && j > i0 ? (j - i0) >> 2 : 0;
        const pw = PACKED_W + (j >> 2) * kb * 4;
        const nc = Math.min(4, n - j);
        // the column of tiles in one SIMD call (sums side by side at TILE_OUT), or tile by tile
        if (simd !== null && mt > itStart) simd.tiles(8 * itStart * kb * 4, 8 * pw, kb, 8 * TILE_OUT, mt - itStart);
        for (let it = itStart; it < mt; it++) {
          const q = cOff + i0 + 4 * it + j * ldc;
          const mr = Math.min(4, rowsHere - 4 * it);
          if (simd !== null) subtractTile(buf, TILE_OUT + 16 * (it - itStart), c, q, ldc, mr, nc);
          else tile4x4(buf, it * kb * 4, buf, pw, kb, c, q, ldc, mr, nc);
        }
      }
    }
  }
}

/**
 * Step t of every 4-wide panel: len contiguous entries src[so ..] go to dst[do + p·stride + 0..3]
 * for panel p = entry / 4, zero padded to a multiple of 4.
 */
function packPanels(src: Float64Array, so: number, len: number, dst: Float64Array, dOff: number, stride: number): void {
  const full = len >> 2;
  let q = dOff;
  // whole groups of four
  for (let p = 0; p < full; p++, so += 4, q += stride) {
    dst[q] = src[so];
    dst[q + 1] = src[so + 1];
    dst[q + 2] = src[so + 2];
    dst[q + 3] = src[so + 3];
  }
  const rest = len - 4 * full;
  if (rest === 0) return;
  // last, partial group
  for (let r = 0; r < 4; r++) dst[q + r] = r < rest ? src[so + r] : 0;
}

/** C(tile at q) −= the 4×4 column-major sums at s[o], only mr rows × nc columns. */
function subtractTile(s: Float64Array, o: number, c: Float64Array, q: number, ldc: number, mr: number, nc: number): void {
  if (mr === 4 && nc === 4) {
    // full tile, column by column
    for (let jj = 0; jj < 4; jj++, q += ldc, o += 4) {
      c[q] -= s[o]; c[q + 1] -= s[o + 1]; c[q + 2] -= s[o + 2]; c[q + 3] -= s[o + 3];
    }
    return;
  }
  // edge tile: only the rows and columns inside C
  for (let jj = 0; jj < nc; jj++) for (let ii = 0; ii < mr; ii++) c[q + ii + jj * ldc] -= s[o + ii + 4 * jj];
}

/** C(4×4 tile at q) −= Σ_t A-panel(t) W-panel(t)ᵀ over kb steps; only mr rows × nc columns stored. */
function tile4x4(
  ap: Float64Array,
  pa: number,
  wp: Float64Array,
  pw: number,
  kb: number,
  c: Float64Array,
  q: number,
  ldc: number,
  mr: number,
  nc: number,
): void {
  let s00 = 0, s10 = 0, s20 = 0, s30 = 0;
  let s01 = 0, s11 = 0, s21 = 0, s31 = 0;
  let s02 = 0, s12 = 0, s22 = 0, s32 = 0;
  let s03 = 0, s13 = 0, s23 = 0, s33 = 0;
  const end = pa + 4 * kb;
  // Σ over the inner dimension, both panels read in order
  for (; pa < end; pa += 4, pw += 4) {
    const a0 = ap[pa], a1 = ap[pa + 1], a2 = ap[pa + 2], a3 = ap[pa + 3];
    const w0 = wp[pw], w1 = wp[pw + 1], w2 = wp[pw + 2], w3 = wp[pw + 3];
    s00 += a0 * w0; s10 += a1 * w0; s20 += a2 * w0; s30 += a3 * w0;
    s01 += a0 * w1; s11 += a1 * w1; s21 += a2 * w1; s31 += a3 * w1;
    s02 += a0 * w2; s12 += a1 * w2; s22 += a2 * w2; s32 += a3 * w2;
    s03 += a0 * w3; s13 += a1 * w3; s23 += a2 * w3; s33 += a3 * w3;
  }
  if (mr === 4 && nc === 4) {
    c[q] -= s00; c[q + 1] -= s10; c[q + 2] -= s20; c[q + 3] -= s30;
    q += ldc;
    c[q] -= s01; c[q + 1] -= s11; c[q + 2] -= s21; c[q + 3] -= s31;
    q += ldc;
    c[q] -= s02; c[q + 1] -= s12; c[q + 2] -= s22; c[q + 3] -= s32;
    q += ldc;
    c[q] -= s03; c[q + 1] -= s13; c[q + 2] -= s23; c[q + 3] -= s33;
    return;
  }
  const s = [s00, s10, s20, s30, s01, s11, s21, s31, s02, s12, s22, s32, s03, s13, s23, s33];
  // edge tile: only the rows and columns inside C
  for (let jj = 0; jj < nc; jj++) for (let ii = 0; ii < mr; ii++) c[q + ii + jj * ldc] -= s[4 * jj + ii];
}

/** C −= A Wᵀ over the whole m×n rectangle (same storage as updateLowerProduct). */
export function updateProduct(
  m: number,
  n: number,
  k: number,
  a: Float64Array,
  aOff: number,
  lda: number,
  w: Float64Array,
  c: Float64Array,
  cOff: number,
  ldc: number,
): void {
  if (n >= 4 && k >= 4 && m >= 8) {
    packedProduct(false, m, n, k, a, aOff, lda, w, c, cOff, ldc);
    return;
  }
  // same cache blocks, every tile
  for (let i0 = 0; i0 < m; i0 += ROW_BLOCK) {
    const i1 = Math.min(m, i0 + ROW_BLOCK);
    for (let t0 = 0; t0 < k; t0 += DEPTH_BLOCK) {
      productBlock(false, i0, i1, t0, Math.min(k, t0 + DEPTH_BLOCK), n, n, a, aOff, lda, w, c, cOff, ldc);
    }
  }
}

/**
 * Y[j, c] −= Σ_i A[i, j] G[i, c] for j < n, c < k: A (m×n) column-major at a[aOff], ld lda;
 * G (m×k) row-major (g[i·k + c]); Y column-major with leading dimension ldy.
 * Two columns of A and four right-hand sides per pass: 8 multiply-adds per 6 loads; two leftover
 * right-hand sides share one pass (6 of a block of 6 take two passes over A, not three).
 */
export function subtractTransposedProduct(
  m: number,
  n: number,
  k: number,
  a: Float64Array,
  aOff: number,
  lda: number,
  g: Float64Array,
  y: Float64Array,
  ldy: number,
): void {
  let j = 0;
  // pairs of columns of A
  for (; j + 2 <= n; j += 2) {
    const q0 = aOff + j * lda;
    const q1 = q0 + lda;
    let c = 0;
    for (; c + 4 <= k; c += 4) {
      let s00 = 0, s01 = 0, s02 = 0, s03 = 0, s10 = 0, s11 = 0, s12 = 0, s13 = 0;
      for (let i = 0, gi = c; i < m; i++, gi += k) {
        const a0 = a[q0 + i], a1 = a[q1 + i];
        const g0 = g[gi], g1 = g[gi + 1], g2 = g[gi + 2], g3 = g[gi + 3];
        s00 += a0 * g0; s01 += a0 * g1; s02 += a0 * g2; s03 += a0 * g3;
        s10 += a1 * g0; s11 += a1 * g1; s12 += a1 * g2; s13 += a1 * g3;
      }
      y[c * ldy + j] -= s00; y[(c + 1) * ldy + j] -= s01; y[(c + 2) * ldy + j] -= s02; y[(c + 3) * ldy + j] -= s03;
      y[c * ldy + j + 1] -= s10; y[(c + 1) * ldy + j + 1] -= s11; y[(c + 2) * ldy + j + 1] -= s12; y[(c + 3) * ldy + j + 1] -= s13;
    }
    // two leftover right-hand sides in one pass
    if (c + 2 <= k) {
      let s00 = 0, s01 = 0, s10 = 0, s11 = 0;
      for (let i = 0, gi = c; i < m; i++, gi += k) {
        const a0 = a[q0 + i], a1 = a[q1 + i];
        const g0 = g[gi], g1 = g[gi + 1];
        s00 += a0 * g0; s01 += a0 * g1;
        s10 += a1 * g0; s11 += a1 * g1;
      }
      y[c * ldy + j] -= s00; y[(c + 1) * ldy + j] -= s01;
      y[c * ldy + j + 1] -= s10; y[(c + 1) * ldy + j + 1] -= s11;
      c += 2;
    }
    // a last leftover right-hand side
    for (; c < k; c++) {
      let s0 = 0, s1 = 0;
      for (let i = 0, gi = c; i < m; i++, gi += k) {
        s0 += a[q0 + i] * g[gi];
        s1 += a[q1 + i] * g[gi];
      }
      y[c * ldy + j] -= s0;
      y[c * ldy + j + 1] -= s1;
    }
  }
  // last column when n is odd
  for (; j < n; j++) {
    const q0 = aOff + j * lda;
    for (let c = 0; c < k; c++) {
      let s0 = 0;
      for (let i = 0, gi = c; i < m; i++, gi += k) s0 += a[q0 + i] * g[gi];
      y[c * ldy + j] -= s0;
    }
  }
}

/** Rows i0..i1−1, inner steps t0..t1−1, columns 0..nb−1 (W has n columns) of updateLowerProduct. */
function productBlock(
  lower: boolean,
  i0: number,
  i1: number,
  t0: number,
  t1: number,
  nb: number,
  n: number,
  a: Float64Array,
  aOff: number,
  lda: number,
  w: Float64Array,
  c: Float64Array,
  cOff: number,
  ldc: number,
): void {
  let j = 0;
  // column tiles of width 4
  for (; j + 4 <= nb; j += 4) {
    const c0 = cOff + j * ldc;
    let i = lower && j > i0 ? j : i0;
    // row tiles of height 4 from the diagonal down
    for (; i + 4 <= i1; i += 4) {
      let s00 = 0, s10 = 0, s20 = 0, s30 = 0;
      let s01 = 0, s11 = 0, s21 = 0, s31 = 0;
      let s02 = 0, s12 = 0, s22 = 0, s32 = 0;
      let s03 = 0, s13 = 0, s23 = 0, s33 = 0;
      let pa = aOff + i + t0 * lda;
      let pw = t0 * n + j;
      // Σ over the inner dimension
      for (let t = t0; t < t1; t++, pa += lda, pw += n) {
        const a0 = a[pa], a1 = a[pa + 1], a2 = a[pa + 2], a3 = a[pa + 3];
        const w0 = w[pw], w1 = w[pw + 1], w2 = w[pw + 2], w3 = w[pw + 3];
        s00 += a0 * w0; s10 += a1 * w0; s20 += a2 * w0; s30 += a3 * w0;
        s01 += a0 * w1; s11 += a1 * w1; s21 += a2 * w1; s31 += a3 * w1;
        s02 += a0 * w2; s12 += a1 * w2; s22 += a2 * w2; s32 += a3 * w2;
        s03 += a0 * w3; s13 += a1 * w3; s23 += a2 * w3; s33 += a3 * w3;
      }
      let q = c0 + i;
      c[q] -= s00; c[q + 1] -= s10; c[q + 2] -= s20; c[q + 3] -= s30;
      q += ldc;
      c[q] -= s01; c[q + 1] -= s11; c[q + 2] -= s21; c[q + 3] -= s31;
      q += ldc;
      c[q] -= s02; c[q + 1] -= s12; c[q + 2] -= s22; c[q + 3] -= s32;
      q += ldc;
      c[q] -= s03; c[q + 1] -= s13; c[q + 2] -= s23; c[q + 3] -= s33;
    }
    // leftover rows (fewer than 4) of this column tile
    for (; i < i1; i++) {
      let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
      let pa = aOff + i + t0 * lda;
      let pw = t0 * n + j;
      for (let t = t0; t < t1; t++, pa += lda, pw += n) {
        const a0 = a[pa];
        s0 += a0 * w[pw]; s1 += a0 * w[pw + 1]; s2 += a0 * w[pw + 2]; s3 += a0 * w[pw + 3];
      }
      const q = c0 + i;
      c[q] -= s0; c[q + ldc] -= s1; c[q + 2 * ldc] -= s2; c[q + 3 * ldc] -= s3;
    }
  }
  // leftover columns (fewer than 4): one column at a time, rows from its diagonal
  for (; j < nb; j++) {
    const c0 = cOff + j * ldc;
    let i = lower && j > i0 ? j : i0;
    for (; i + 4 <= i1; i += 4) {
      let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
      let pa = aOff + i + t0 * lda;
      let pw = t0 * n + j;
      for (let t = t0; t < t1; t++, pa += lda, pw += n) {
        const wv = w[pw];
        s0 += a[pa] * wv; s1 += a[pa + 1] * wv; s2 += a[pa + 2] * wv; s3 += a[pa + 3] * wv;
      }
      const q = c0 + i;
      c[q] -= s0; c[q + 1] -= s1; c[q + 2] -= s2; c[q + 3] -= s3;
    }
    for (; i < i1; i++) {
      let s = 0;
      let pa = aOff + i + t0 * lda;
      let pw = t0 * n + j;
      for (let t = t0; t < t1; t++, pa += lda, pw += n) s += a[pa] * w[pw];
      c[c0 + i] -= s;
    }
  }
}

/**
 * W = (rows r0..r0+n−1 of the block's columns) · D, stored k-major: w[t·n + j] = A[r0 + j, t]·d_t.
 * A[i, t] = a[aOff + i + t·lda]; d_t = d[dOff + t].
 */
export function scaledRowsKMajor(
  n: number,
  k: number,
  a: Float64Array,
  aOff: number,
  lda: number,
  d: Float64Array,
  dOff: number,
  w: Float64Array,
): void {
  // each column t of the block, scaled by its pivot
  for (let t = 0; t < k; t++) {
    const dt = d[dOff + t];
    const src = aOff + t * lda;
    const dst = t * n;
    for (let j = 0; j < n; j++) w[dst + j] = a[src + j] * dt;
  }
}

/**
 * W in 4-column panels for the in-place kernels: w[wOff + (jt·k + t)·4 + jj] = A[r + 4jt + jj, t]·d_t
 * for the n rows r0 … r0+n−1 (A[i, t] = a[aOff + i + t·lda] from row r0 = 0), zero past n.
 * Panel jt is the k steps of columns 4jt … 4jt+3 of Wᵀ, read in order by the strip kernels.
 */
export function scaledRowsPanels(
  n: number,
  k: number,
  a: Float64Array,
  aOff: number,
  lda: number,
  d: Float64Array,
  dOff: number,
  w: Float64Array,
  wOff: number,
): void {
  const full = n >> 2;
  const rest = n - 4 * full;
  const stride = 4 * k;
  // each column t of the block, scaled by its pivot, into step t of every panel
  for (let t = 0; t < k; t++) {
    const dt = d[dOff + t];
    let src = aOff + t * lda;
    let q = wOff + 4 * t;
    for (let p = 0; p < full; p++, src += 4, q += stride) {
      w[q] = a[src] * dt;
      w[q + 1] = a[src + 1] * dt;
      w[q + 2] = a[src + 2] * dt;
      w[q + 3] = a[src + 3] * dt;
    }
    if (rest > 0) for (let r = 0; r < 4; r++) w[q + r] = r < rest ? a[src + r] * dt : 0;
  }
}

/** Rows per block and steps per depth block of the in-place products (A's block ≈ 128 × 256 doubles in cache). */
const STRIP_ROWS = 128;
const STRIP_DEPTH = 256;

/**
 * C −= A Wᵀ (or, with `put`, C ← −A Wᵀ) by the in-place strip kernels, everything in the
 * kernels' memory and addressed in bytes: A m×k column-major at pA (column stride lda), W as
 * panels from scaledRowsPanels at pW, C at pC (column stride ldc). With `lower`, only the
 * 4×4 tiles on or below the diagonal (a few entries just above it are written too).
 * Rows go in strips of 4 and columns in panels of 4: when m or n is not a multiple of 4 the
 * last strip reads A's rows past m and writes C's rows past m, and the last panel writes C's
 * columns past n — only for scratch C with that room (inPlaceUpdate handles C inside a block).
 */
export function stripUpdate(
  kern: StripKernels,
  lower: boolean,
  put: boolean,
  m: number,
  n: number,
  k: number,
  pA: number,
  lda: number,
  pW: number,
  pC: number,
  ldc: number,
): void {
  // depth blocks, then row blocks, then the column panels against one row block of A
  for (let t0 = 0; t0 < k; t0 += STRIP_DEPTH) {
    const kb = Math.min(STRIP_DEPTH, k - t0);
    const strips = put && t0 === 0 ? kern.putStrips : kern.subStrips;
    for (let i0 = 0; i0 < m; i0 += STRIP_ROWS) {
      const i1 = Math.min(m, i0 + STRIP_ROWS);
      const count = (i1 - i0 + 3) >> 2;
      const nb = lower ? Math.min(n, i1) : n;
      for (let j = 0; j < nb; j += 4) {
        const first = lower && j > i0 ? (j - i0) >> 2 : 0;
        const r = i0 + 4 * first;
        strips(pA + 8 * r + t0 * lda, lda, kb, pW + 32 * ((j >> 2) * k + t0), pC + 8 * r + j * ldc, ldc, count - first);
      }
    }
  }
}

/**
 * C −= A Wᵀ with C inside a factor block (nothing past its m rows and n columns may be
 * written): the whole strips and panels by stripUpdate, the last m mod 4 rows and n mod 4
 * columns by the edge kernel (which writes only C's own rows and columns, each sum over the
 * whole depth at once). A, W, C as for stripUpdate, but given as doubles of the kernels' memory
 * at aOff, wOff, cOff with strides lda, ldc in doubles. With `lower`, the edge columns are
 * written from their 4-row strip through the diagonal down (a few entries above the diagonal
 * too, as stripUpdate's diagonal tiles).
 */
export function inPlaceUpdate(
  kern: StripKernels,
  lower: boolean,
  m: number,
  n: number,
  k: number,
  aOff: number,
  lda: number,
  wOff: number,
  cOff: number,
  ldc: number,
): void {
  const m4 = m & ~3;
  const n4 = n & ~3;
  if (m4 > 0 && n4 > 0) stripUpdate(kern, lower, false, m4, n4, k, 8 * aOff, 8 * lda, 8 * wOff, 8 * cOff, 8 * ldc);
  // rows m4 … m−1 of the whole panels: one partial strip per panel
  if (m > m4) {
    for (let j = 0; j < n4; j += 4) kern.edgeStrips(8 * (aOff + m4), 8 * lda, k, 8 * (wOff + j * k), 8 * (cOff + m4 + j * ldc), 8 * ldc, 1, m - m4, 4);
  }
  // columns n4 … n−1 (the last, zero-padded panel of W): rows from its diagonal strip (lower) or from 0
  if (n > n4) {
    const r0 = lower ? n4 : 0;
    const strips = (m - r0 + 3) >> 2;
    if (strips > 0) kern.edgeStrips(8 * (aOff + r0), 8 * lda, k, 8 * (wOff + n4 * k), 8 * (cOff + r0 + n4 * ldc), 8 * ldc, strips, m - r0 - 4 * (strips - 1), n - n4);
  }
}
