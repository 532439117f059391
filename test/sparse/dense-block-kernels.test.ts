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
});
