import { Matrix } from 'ml-matrix';
import { afterEach, describe, expect, it } from 'vitest';
import { scaledRowsKMajor, subtractTransposedProduct, updateLowerProduct, updateProduct, useSimdTileKernel } from '../../src/sparse/dense-block-kernels.js';
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
