import { describe, expect, it } from 'vitest';
import { QR } from 'ml-matrix';
import { applyQ, applyQTransposed, householderQr, thinQr } from '../../src/dense/householder-qr.js';
import { maxAbs, multiply, orthogonalityError, randomBlock, toMatrix } from './helpers.js';

describe('householderQr / thinQr', () => {
  it.each([
    [1, 1],
    [5, 2],
    [50, 5],
    [200, 12],
    [30, 30],
  ])('factors a random %i×%i block like ml-matrix QR', (rows, cols) => {
    // Reference: ml-matrix QR (Householder); R is unique up to the signs of its rows.
    const a = randomBlock(rows, cols, rows * 31 + cols);
    const { q, r, rank } = thinQr(a, rows, cols);
    expect(rank).toBe(cols);
    expect(orthogonalityError(q, rows, cols)).toBeLessThan(1e-13 * rows);
    const qr = multiply(q, r, rows, cols, cols);
    for (let i = 0; i < a.length; i++) expect(Math.abs(qr[i] - a[i])).toBeLessThan(1e-13 * rows);
    for (let j = 0; j < cols; j++) for (let i = j + 1; i < cols; i++) expect(r[j * cols + i]).toBe(0);
    const ref = new QR(toMatrix(a, rows, cols)).upperTriangularMatrix;
    for (let i = 0; i < cols; i++) {
      for (let j = i; j < cols; j++) {
        expect(Math.abs(Math.abs(r[j * cols + i]) - Math.abs(ref.get(i, j)))).toBeLessThan(1e-12 * rows);
      }
    }
  });

  it('reports dependent and zero columns and still returns an orthonormal Q', () => {
    // Reference: constructed rank — column 2 = column 0 + column 1, column 4 = 0 (definition of rank).
    const rows = 40;
    const cols = 6;
    const a = randomBlock(rows, cols, 3);
    for (let i = 0; i < rows; i++) {
      a[2 * rows + i] = a[i] + a[rows + i];
      a[4 * rows + i] = 0;
    }
    const { q, r, rank, tinyColumns, minAbsDiagonal } = thinQr(a, rows, cols);
    expect(rank).toBe(4);
    expect(Array.from(tinyColumns)).toEqual([2, 4]);
    expect(minAbsDiagonal).toBeLessThan(1e-13);
    expect(orthogonalityError(q, rows, cols)).toBeLessThan(1e-13 * rows);
    const qr = multiply(q, r, rows, cols, cols);
    for (let i = 0; i < a.length; i++) expect(Math.abs(qr[i] - a[i])).toBeLessThan(1e-13 * rows);
  });

  it('applies Qᵀ and Q to blocks consistently', () => {
    // Reference: QᵀA = [R; 0] by definition of the factorization, and Q(QᵀB) = B (orthogonality).
    const rows = 25;
    const cols = 4;
    const a = randomBlock(rows, cols, 9);
    const f = householderQr(a, rows, cols);
    const qta = Float64Array.from(a);
    applyQTransposed(f, qta, cols);
    for (let j = 0; j < cols; j++) {
      for (let i = 0; i < rows; i++) {
        if (i > j) expect(Math.abs(qta[j * rows + i])).toBeLessThan(1e-13 * rows);
        else expect(Math.abs(qta[j * rows + i] - f.factors[j * rows + i])).toBeLessThan(1e-13 * rows);
      }
    }
    const b = randomBlock(rows, 3, 10);
    const round = Float64Array.from(b);
    applyQTransposed(f, round, 3);
    applyQ(f, round, 3);
    expect(maxAbs(round.map((v, i) => v - b[i]))).toBeLessThan(1e-13 * rows);
    // the thin Q is the first cols columns of the full Q: Q [I; 0]
    const e = new Float64Array(rows * cols);
    for (let j = 0; j < cols; j++) e[j * rows + j] = 1;
    applyQ(f, e, cols);
    const thin = thinQr(a, rows, cols).q;
    expect(maxAbs(e.map((v, i) => v - thin[i]))).toBeLessThan(1e-14 * rows);
  });

  it('rejects a wide block', () => {
    expect(() => householderQr(new Float64Array(6), 2, 3)).toThrow(/rows ≥ cols/);
  });
});
