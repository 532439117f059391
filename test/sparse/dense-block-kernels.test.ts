import { Matrix } from 'ml-matrix';
import { afterEach, describe, expect, it } from 'vitest';
import { inPlaceUpdate, scaledRowsKMajor, scaledRowsPanels, stripUpdate, subtractTransposedProduct, updateLowerProduct, updateProduct, useSimdTileKernel } from '../../src/sparse/dense-block-kernels.js';
import { stripKernels } from '../../src/sparse/wasm-tile-kernel.js';
import { seededRandom } from './fe-like-matrices.js';

describe.each([
  ['WebAssembly SIMD tiles', true],
  ['plain TypeScript tiles', false],
])('updateLowerProduct with %s', (_label, simd) => {
  afterEach(() => {
    useSimdTileKernel(true);
  });
  it('equals C − A·D·A(rows)ᵀ from ml-matrix mmul on and below the diagonal (sizes cross the cache blocks)', () => {
    const active = useSimdTileKernel(simd);
    // Node 20 has WebAssembly SIMD, so the first case really runs the SIMD kernel
    expect(active).toBe(simd);
    const rnd = seededRandom(5);
    for (const [m, n, k] of [[601, 70, 301], [9, 7, 3], [260, 64, 129]]) {
      const lda = m + 3;
      const a = new Float64Array(lda * k).map(() => rnd() - 0.5);
      const d = new Float64Array(k).map(() => rnd() + 0.5);
      const w = new Float64Array(n * k);
      scaledRowsKMajor(n, k, a, 0, lda, d, 0, w);
      const c = new Float64Array(m * n).map(() => rnd());
      const c0 = c.slice();
      updateLowerProduct(m, n, k, a, 0, lda, w, c, 0, m);
      // reference: ml-matrix dense product A · diag(d) · A(0:n, :)ᵀ
      const am = new Matrix(m, k);
      for (let i = 0; i < m; i++) for (let t = 0; t < k; t++) am.set(i, t, a[i + t * lda]);
      const bm = new Matrix(n, k);
      for (let j = 0; j < n; j++) for (let t = 0; t < k; t++) bm.set(j, t, a[j + t * lda] * d[t]);
      const p = am.mmul(bm.transpose());
      for (let j = 0; j < n; j++)
        for (let i = j; i < m; i++) expect(Math.abs(c[i + j * m] - (c0[i + j * m] - p.get(i, j)))).toBeLessThan(1e-12);
    }
  });
});

describe.each([
  ['WebAssembly SIMD tiles', true],
  ['plain TypeScript tiles', false],
])('updateProduct and subtractTransposedProduct with %s', (_label, simd) => {
  afterEach(() => {
    useSimdTileKernel(true);
  });
  it('equal the full products from ml-matrix mmul', () => {
    expect(useSimdTileKernel(simd)).toBe(simd);
    const rnd = seededRandom(8);
    const [m, n, k] = [301, 9, 137];
    const a = new Float64Array(m * k).map(() => rnd() - 0.5); // m×k column-major
    const w = new Float64Array(n * k).map(() => rnd() - 0.5); // W (n×k) k-major
    const c = new Float64Array(m * n);
    updateProduct(m, n, k, a, 0, m, w, c, 0, m);
    const am = new Matrix(m, k);
    for (let i = 0; i < m; i++) for (let t = 0; t < k; t++) am.set(i, t, a[i + t * m]);
    const wm = new Matrix(n, k);
    for (let j = 0; j < n; j++) for (let t = 0; t < k; t++) wm.set(j, t, w[t * n + j]);
    // reference: ml-matrix dense products
    const p = am.mmul(wm.transpose());
    for (let j = 0; j < n; j++) for (let i = 0; i < m; i++) expect(Math.abs(c[i + j * m] + p.get(i, j))).toBeLessThan(1e-12);
    // right-hand side counts that exercise the groups of four, the pair and the single leftover
    for (const rhs of [n, 6, 7, 2, 1]) {
      const g = new Float64Array(m * rhs).map(() => rnd() - 0.5); // G (m×rhs) row-major
      const y = new Float64Array(k * rhs);
      subtractTransposedProduct(m, k, rhs, a, 0, m, g, y, k);
      const gm = new Matrix(m, rhs);
      for (let i = 0; i < m; i++) for (let q = 0; q < rhs; q++) gm.set(i, q, g[i * rhs + q]);
      // reference: ml-matrix Aᵀ G
      const q2 = am.transpose().mmul(gm);
      for (let q = 0; q < rhs; q++) for (let j = 0; j < k; j++) expect(Math.abs(y[q * k + j] + q2.get(j, q))).toBeLessThan(1e-12);
    }
  });
});

/** The WebAssembly name used here (the project's lib settings do not include it). */
declare const WebAssembly: { Memory: new (d: { initial: number; maximum: number; shared: boolean }) => { buffer: SharedArrayBuffer } };

describe('in-place strip products over a WebAssembly memory', () => {
  it('inPlaceUpdate equals C − A·D·Bᵀ from ml-matrix mmul inside a block (edges of 1–3 rows and columns), lower and whole', () => {
    const memory = new WebAssembly.Memory({ initial: 64, maximum: 64, shared: true });
    const k4 = stripKernels(memory)!;
    // Node 20 has WebAssembly SIMD and shared memory, so the kernels exist here
    expect(k4).not.toBeNull();
    const heap = new Float64Array(memory.buffer);
    const rnd = seededRandom(11);
    for (const [m, n, k, lower] of [[301, 47, 263, true], [130, 12, 5, false], [9, 7, 3, true], [6, 4, 300, false], [10, 6, 4, true], [3, 3, 5, true], [7, 2, 9, false], [13, 5, 40, false]] as [number, number, number, boolean][]) {
      const lda = m + n + 5; // A's column j holds the rows of W first (as in a supernode block), then C's rows
      const aOff = 16;
      const wOff = aOff + lda * k + 8;
      const cOff = wOff + 4 * k * Math.ceil(n / 4) + 8;
      const ldc = m + 2;
      for (let i = 0; i < lda * k; i++) heap[aOff + i] = rnd() - 0.5;
      const d = new Float64Array(k).map(() => rnd() + 0.5);
      // W = rows 0..n−1 of A scaled by D, C = the m×n block at cOff
      scaledRowsPanels(n, k, heap, aOff, lda, d, 0, heap, wOff);
      for (let i = 0; i < ldc * n; i++) heap[cOff + i] = rnd();
      const c0 = heap.slice(cOff, cOff + ldc * n);
      const guard = heap[cOff + ldc * n];
      inPlaceUpdate(k4, lower, m, n, k, aOff + n, lda, wOff, cOff, ldc);
      // reference: ml-matrix dense product A(n:n+m, :) · diag(d) · A(0:n, :)ᵀ
      const am = new Matrix(m, k);
      for (let i = 0; i < m; i++) for (let t = 0; t < k; t++) am.set(i, t, heap[aOff + n + i + t * lda]);
      const bm = new Matrix(n, k);
      for (let j = 0; j < n; j++) for (let t = 0; t < k; t++) bm.set(j, t, heap[aOff + j + t * lda] * d[t]);
      const p = am.mmul(bm.transpose());
      for (let j = 0; j < n; j++) {
        for (let i = lower ? j : 0; i < m; i++) expect(Math.abs(heap[cOff + i + j * ldc] - (c0[i + j * ldc] - p.get(i, j)))).toBeLessThan(1e-12);
        // rows past m in the block's column stride are never written
        for (let i = m; i < ldc; i++) expect(heap[cOff + i + j * ldc]).toBe(c0[i + j * ldc]);
      }
      expect(heap[cOff + ldc * n]).toBe(guard);
    }
  });
  it('stripUpdate with put writes −A·Wᵀ into padded scratch, over several depth and row blocks', () => {
    const memory = new WebAssembly.Memory({ initial: 256, maximum: 256, shared: true });
    const k4 = stripKernels(memory)!;
    const heap = new Float64Array(memory.buffer);
    const rnd = seededRandom(12);
    const [m, n, k] = [270, 62, 520];
    const aOff = 0;
    const wOff = m * k + 8;
    const ldc = (m + 3) & ~3;
    const cOff = wOff + 4 * k * 16;
    for (let i = 0; i < m * k + 4; i++) heap[aOff + i] = rnd() - 0.5;
    const wt = new Float64Array(n * k).map(() => rnd() - 0.5); // Wᵀ rows, k-major
    const ones = new Float64Array(k).fill(1);
    scaledRowsPanels(n, k, wt, 0, n, ones, 0, heap, wOff);
    heap.fill(Number.NaN, cOff, cOff + ldc * 64);
    stripUpdate(k4, true, true, m, n, k, 8 * aOff, 8 * m, 8 * wOff, 8 * cOff, 8 * ldc);
    const am = new Matrix(m, k);
    for (let i = 0; i < m; i++) for (let t = 0; t < k; t++) am.set(i, t, heap[aOff + i + t * m]);
    const wm = new Matrix(n, k);
    for (let j = 0; j < n; j++) for (let t = 0; t < k; t++) wm.set(j, t, wt[j + t * n]);
    // reference: ml-matrix dense product, on and below the diagonal
    const p = am.mmul(wm.transpose());
    for (let j = 0; j < n; j++) for (let i = j; i < m; i++) expect(Math.abs(heap[cOff + i + j * ldc] + p.get(i, j))).toBeLessThan(1e-11);
  });

  it('scatterAdd adds C by runs of consecutive target rows, and subScaled / scale round as the plain loops', () => {
    const memory = new WebAssembly.Memory({ initial: 4, maximum: 4, shared: true });
    const k4 = stripKernels(memory)!;
    const heap = new Float64Array(memory.buffer);
    const heap32 = new Int32Array(memory.buffer);
    const rnd = seededRandom(13);
    // C: m rows × cols columns at cOff (ld ldc); the rows' target positions rel (increasing, runs of 1–4), target columns of ld ldt at tOff
    const m = 23;
    const cols = 5;
    const g0 = 2; // C's column j starts at row g0 + j
    const ldc = 24;
    const cOff = 64;
    const rel: number[] = [];
    for (let i = 0, r = 1; i < m; i++) rel.push((r += rnd() < 0.4 ? 2 : 1));
    const ldt = rel[m - 1] + 3;
    const tOff = cOff + ldc * cols + 8;
    const colAt = [0, 2, 3, 6, 7];
    for (let i = 0; i < ldc * cols; i++) heap[cOff + i] = rnd() - 0.5;
    for (let i = 0; i < ldt * 8; i++) heap[tOff + i] = rnd();
    const before = heap.slice(tOff, tOff + ldt * 8);
    // run table (start, byte shift) and column table in i32, after the target
    const runsAt = 2 * (tOff + ldt * 8 + 2);
    let runs = 0;
    for (let i = 0; i < m; i++) {
      if (i > 0 && rel[i] === rel[i - 1] + 1) continue;
      heap32[runsAt + 2 * runs] = i;
      heap32[runsAt + 2 * runs + 1] = 8 * (rel[i] - i);
      runs++;
    }
    heap32[runsAt + 2 * runs] = m;
    const columnsAt = runsAt + 2 * runs + 2;
    for (let j = 0; j < cols; j++) heap32[columnsAt + j] = 8 * (tOff + colAt[j] * ldt);
    k4.scatterAdd(8 * (cOff - g0), 8 * ldc, cols, g0, 4 * runsAt, runs, 4 * columnsAt);
    // expected: target(rel[i], colAt[j]) += C(i − g0, j) for i ≥ g0 + j, nothing else touched
    const expected = before.slice();
    for (let j = 0; j < cols; j++) for (let i = g0 + j; i < m; i++) expected[colAt[j] * ldt + rel[i]] += heap[cOff + j * ldc + i - g0];
    for (let q = 0; q < ldt * 8; q++) expect(heap[tOff + q]).toBe(expected[q]);
    // y −= c·x and y ·= c over odd and even lengths, bit for bit against the same TypeScript loops
    for (const rows of [0, 1, 6, 7]) {
      const y0 = Array.from({ length: rows + 1 }, () => rnd() - 0.5);
      const x = Array.from({ length: rows }, () => rnd() - 0.5);
      const c = rnd() + 0.1;
      heap.set(y0, 8);
      heap.set(x, 32);
      heap[0] = c;
      k4.subScaled(64, 256, rows, 0);
      for (let i = 0; i < rows; i++) expect(heap[8 + i]).toBe(y0[i] - c * x[i]);
      expect(heap[8 + rows]).toBe(y0[rows]);
      heap.set(y0, 8);
      k4.scale(64, rows, 0);
      for (let i = 0; i < rows; i++) expect(heap[8 + i]).toBe(y0[i] * c);
      expect(heap[8 + rows]).toBe(y0[rows]);
    }
  });
});
