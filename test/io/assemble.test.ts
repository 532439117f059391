/**
 * Lower-triangle assembly (src/sparse/assemble.ts) against a dense reference built here
 * entry by entry: A_ij = Σ of the triplets at (i, j) or (j, i) — the FE assembly rule
 * (common practice). Small cases only (dense n×n is allowed in tests of small cases).
 */
import { describe, expect, it } from 'vitest';
import { TripletList, assembleSymmetric, assembleSymmetricConsuming, assembleSymmetricInPlace } from '../../src/sparse/assemble.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';

function dense(a: SymmetricCsc): number[][] {
  const d = Array.from({ length: a.n }, () => new Array<number>(a.n).fill(0));
  for (let j = 0; j < a.n; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      d[a.rowIdx[p]][j] = a.values[p];
      d[j][a.rowIdx[p]] = a.values[p];
    }
  }
  return d;
}

function checkSortedLower(a: SymmetricCsc): void {
  for (let j = 0; j < a.n; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      expect(a.rowIdx[p]).toBeGreaterThanOrEqual(j);
      if (p > a.colPtr[j]) expect(a.rowIdx[p]).toBeGreaterThan(a.rowIdx[p - 1]);
    }
  }
}

describe('assembleSymmetric', () => {
  it('random triplets in both triangles with many duplicates (long columns → heapsort)', () => {
    const n = 40;
    const ref = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    const t = new TripletList(4);
    let s = 7;
    const rnd = (): number => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648);
    // element-like contributions: integers so sums are exact in any order
    for (let k = 0; k < 3000; k++) {
      const i = Math.floor(rnd() * n), j = Math.floor(rnd() * n);
      const v = Math.floor(rnd() * 200) - 100;
      t.push(i, j, v);
      ref[i][j] += v;
      if (i !== j) ref[j][i] += v;
    }
    const copy = t.rows.slice(0, t.length);
    const { matrix, duplicatesSummed } = assembleSymmetric(n, t);
    expect(Array.from(t.rows.subarray(0, t.length))).toEqual(Array.from(copy)); // input untouched
    checkSortedLower(matrix);
    expect(dense(matrix)).toEqual(ref);
    expect(duplicatesSummed).toBe(3000 - matrix.colPtr[n]);
    const consumed = assembleSymmetricConsuming(n, t);
    expect(dense(consumed.matrix)).toEqual(ref);
    expect(t.length).toBe(0);
  });

  it('compareMirrors: a_ij and a_ji summed apart, compared and averaged', () => {
    const rows = Int32Array.from([0, 1, 0, 1, 2, 2]);
    const cols = Int32Array.from([0, 0, 1, 1, 0, 2]);
    const vals = Float64Array.from([4, -1, -1.5, 5, 0.25, 6]);
    const r = assembleSymmetricInPlace(3, rows, cols, vals, 6, { compareMirrors: true });
    expect(Array.from(r.matrix.values)).toEqual([4, -1.25, 0.125, 5, 6]); // a one-sided entry is averaged with its missing (zero) mirror
    expect(r.mirrors).toMatchObject({ maxAbsoluteAsymmetry: 0.5, worstRow: 1, worstCol: 0, lowerValue: -1, upperValue: -1.5, maxAbsEntry: 6 });
    expect(r.duplicatesSummed).toBe(0);
  });
});
