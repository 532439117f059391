import { Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { symMultiplyBlock, symMultiplyColumns } from '../../src/sparse/csc.js';
import { denseOf, hexGridPair } from './fe-like-matrices.js';

describe('symmetric CSC (lower storage) times a block', () => {
  const { stiffness } = hexGridPair(3, 3, 2, 9);
  const n = stiffness.n;
  // reference: ml-matrix dense product of the full symmetric matrix
  const dense = new Matrix(denseOf(stiffness));

  it.each([1, 2, 3, 4, 5, 6, 7, 9])('equals the ml-matrix dense product for %i columns', (k) => {
    const x = new Float64Array(n * k).map((_, i) => Math.sin(0.7 * i) - 0.2);
    const y = symMultiplyBlock(stiffness, x, k);
    const xm = new Matrix(n, k);
    for (let c = 0; c < k; c++) for (let i = 0; i < n; i++) xm.set(i, c, x[c * n + i]);
    const ref = dense.mmul(xm);
    const scale = Math.max(...ref.to1DArray().map(Math.abs));
    for (let c = 0; c < k; c++) for (let i = 0; i < n; i++) expect(Math.abs(y[c * n + i] - ref.get(i, c))).toBeLessThan(1e-13 * scale);
  });

  it('two calls on disjoint column ranges into two outputs sum to the whole product', () => {
    const k = 6;
    const x = new Float64Array(n * k).map((_, i) => Math.cos(0.3 * i));
    const whole = symMultiplyBlock(stiffness, x, k);
    const lo = new Float64Array(n * k);
    const hi = new Float64Array(n * k);
    const mid = Math.floor(n / 3);
    symMultiplyColumns(stiffness, x, k, lo, 0, mid);
    symMultiplyColumns(stiffness, x, k, hi, mid, n);
    // the upper range touches only rows from its first column on
    for (let c = 0; c < k; c++) for (let i = 0; i < mid; i++) expect(hi[c * n + i]).toBe(0);
    const scale = Math.max(...Array.from(whole, Math.abs));
    for (let i = 0; i < n * k; i++) expect(Math.abs(lo[i] + hi[i] - whole[i])).toBeLessThan(1e-13 * scale);
  });
});
