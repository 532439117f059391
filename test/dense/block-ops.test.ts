import { describe, expect, it } from 'vitest';
import {
  addTimesSmall,
  axpy,
  columnNorms,
  copyColumns,
  gram,
  scaleColumns,
  timesSmall,
  transposeTimes,
} from '../../src/dense/block-ops.js';
import { fromMatrix, maxAbs, randomBlock, toMatrix } from './helpers.js';

describe('block products', () => {
  // Reference: ml-matrix Matrix.mmul / transpose (general-purpose library).
  it.each([
    [1, 1, 1],
    [7, 3, 2],
    [2500, 5, 6],
    [3000, 9, 4],
  ])('transposeTimes and gram match ml-matrix for %i rows, %i and %i columns', (rows, p, q) => {
    const a = randomBlock(rows, p, rows + p);
    const b = randomBlock(rows, q, rows + q + 1);
    const ref = fromMatrix(toMatrix(a, rows, p).transpose().mmul(toMatrix(b, rows, q)));
    const c = transposeTimes(a, b, rows, p, q);
    expect(maxAbs(c.map((v, i) => v - ref[i]))).toBeLessThan(1e-13 * rows);
    const g = gram(a, rows, p);
    const gref = fromMatrix(toMatrix(a, rows, p).transpose().mmul(toMatrix(a, rows, p)));
    expect(maxAbs(g.map((v, i) => v - gref[i]))).toBeLessThan(1e-13 * rows);
    for (let j = 0; j < p; j++) for (let i = 0; i < p; i++) expect(g[j * p + i]).toBe(g[i * p + j]);
  });

  it.each([
    [1, 1, 1],
    [9, 3, 2],
    [2100, 9, 5],
    [1500, 4, 7],
  ])('timesSmall and addTimesSmall match ml-matrix for %i rows, p = %i, q = %i', (rows, p, q) => {
    const a = randomBlock(rows, p, 3 * rows);
    const s = randomBlock(p, q, 7 + p);
    const ref = fromMatrix(toMatrix(a, rows, p).mmul(toMatrix(s, p, q)));
    const c = timesSmall(a, rows, p, s, q);
    expect(maxAbs(c.map((v, i) => v - ref[i]))).toBeLessThan(1e-13 * p);
    const base = randomBlock(rows, q, 5);
    const upd = Float64Array.from(base);
    addTimesSmall(upd, a, rows, p, s, q, -2);
    expect(maxAbs(upd.map((v, i) => v - (base[i] - 2 * ref[i])))).toBeLessThan(1e-13 * p);
  });

  it('does column bookkeeping', () => {
    // Reference: ml-matrix Matrix column norms (norm of getColumnVector).
    const rows = 10;
    const a = randomBlock(rows, 3, 1);
    const norms = columnNorms(a, rows, 3);
    const m = toMatrix(a, rows, 3);
    for (let j = 0; j < 3; j++) expect(norms[j]).toBeCloseTo(m.getColumnVector(j).norm(), 14);
    const scaled = Float64Array.from(a);
    scaleColumns(scaled, rows, [2, 0, -1]);
    expect(Math.abs(scaled[rows + 4])).toBe(0);
    expect(scaled[2 * rows + 1]).toBe(-a[2 * rows + 1]);
    const picked = copyColumns(a, rows, [2, 0]);
    expect(Array.from(picked.subarray(0, rows))).toEqual(Array.from(a.subarray(2 * rows, 3 * rows)));
    const y = new Float64Array(rows);
    axpy(y, 3, a, rows, 0, rows);
    expect(y[5]).toBe(3 * a[rows + 5]);
  });
});
