import { describe, expect, it } from 'vitest';
import {
  addTimesSmall,
  axpy,
  columnNorms,
  copyColumns,
  gram,
  scaleColumns,
  timesSmall,
  timesSmallInPlace,
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

  // The kernels cut A into panels of 6 columns (the last one overlapping the one before, or
  // repeating a column when p < 6), C into tiles of 6, 3, 2, 1 columns and AᵀB into 3×3 tiles, all
  // over row chunks of 512: these shapes reach every short panel, tile and chunk.
  const edgeShapes: Array<[number, number, number]> = [
    [1100, 1, 1],
    [1100, 2, 3],
    [1100, 5, 4],
    [1100, 6, 6],
    [1100, 7, 5],
    [1100, 11, 7],
    [1100, 13, 13],
    [1100, 20, 8],
  ];

  it.each(edgeShapes)('addTimesSmall and timesSmall match ml-matrix on rows × p = %i × %i, q = %i, also on a row range', (rows, p, q) => {
    const a = randomBlock(rows, p, 11 * p + q);
    const s = randomBlock(p, q, 13 * q + p);
    const ref = fromMatrix(toMatrix(a, rows, p).mmul(toMatrix(s, p, q)));
    const c = timesSmall(a, rows, p, s, q);
    expect(maxAbs(c.map((v, i) => v - ref[i]))).toBeLessThan(1e-13 * p);
    // C ← C + α A S on rows [517, 1093) only: the other rows stay as they were
    const base = randomBlock(rows, q, 17);
    const upd = Float64Array.from(base);
    const [from, to] = [517, 1093];
    addTimesSmall(upd, a, rows, p, s, q, 0.75, from, to);
    let worst = 0;
    for (let j = 0; j < q; j++) {
      for (let r = 0; r < rows; r++) {
        const i = j * rows + r;
        const want = r >= from && r < to ? base[i] + 0.75 * ref[i] : base[i];
        worst = Math.max(worst, Math.abs(upd[i] - want));
      }
    }
    expect(worst).toBeLessThan(1e-13 * p);
  });

  it.each(edgeShapes)('transposeTimes and gram match ml-matrix on rows × p = %i × %i, q = %i, also on a row range', (rows, p, q) => {
    const a = randomBlock(rows, p, 19 * p + q);
    const b = randomBlock(rows, q, 23 * q + p);
    const ref = fromMatrix(toMatrix(a, rows, p).transpose().mmul(toMatrix(b, rows, q)));
    expect(maxAbs(transposeTimes(a, b, rows, p, q).map((v, i) => v - ref[i]))).toBeLessThan(1e-13 * rows);
    // rows [300, 1031) only, into a given output that is overwritten
    const [from, to] = [300, 1031];
    const part = fromMatrix(toMatrix(a, rows, p).subMatrix(from, to - 1, 0, p - 1).transpose().mmul(toMatrix(b, rows, q).subMatrix(from, to - 1, 0, q - 1)));
    const out = new Float64Array(p * q).fill(7);
    transposeTimes(a, b, rows, p, q, out, from, to);
    expect(maxAbs(out.map((v, i) => v - part[i]))).toBeLessThan(1e-13 * rows);
    const g = gram(a, rows, p);
    const gref = fromMatrix(toMatrix(a, rows, p).transpose().mmul(toMatrix(a, rows, p)));
    expect(maxAbs(g.map((v, i) => v - gref[i]))).toBeLessThan(1e-13 * rows);
    for (let j = 0; j < p; j++) for (let i = 0; i < p; i++) expect(g[j * p + i]).toBe(g[i * p + j]);
  });

  it.each([
    [1100, 1, 1],
    [1100, 7, 5],
    [1100, 13, 13],
    [1100, 20, 8],
  ])('timesSmallInPlace matches ml-matrix on rows × p = %i × %i, q = %i, on a row range', (rows, p, q) => {
    const a = randomBlock(rows, p, 29 * p + q);
    const s = randomBlock(p, q, 31 * q + p);
    const ref = fromMatrix(toMatrix(a, rows, p).mmul(toMatrix(s, p, q)));
    const v = Float64Array.from(a);
    const [from, to] = [3, 1030];
    timesSmallInPlace(v, rows, p, s, q, from, to);
    let worst = 0;
    for (let j = 0; j < p; j++) {
      for (let r = 0; r < rows; r++) {
        const i = j * rows + r;
        // columns 0:q on the row range become A S; the rest of A is untouched
        const want = j < q && r >= from && r < to ? ref[i] : a[i];
        worst = Math.max(worst, Math.abs(v[i] - want));
      }
    }
    expect(worst).toBeLessThan(1e-13 * p);
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
