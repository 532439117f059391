import { Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { scaledRowsKMajor, updateLowerProduct } from '../../src/sparse/dense-block-kernels.js';
import { seededRandom } from './fe-like-matrices.js';

describe('updateLowerProduct', () => {
  it('equals C − A·D·A(rows)ᵀ from ml-matrix mmul on and below the diagonal (sizes cross the cache blocks)', () => {
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
