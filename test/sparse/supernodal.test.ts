import { CholeskyDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { factorStructureCounts } from '../../src/sparse/column-counts.js';
import { supernodalLdlt } from '../../src/sparse/numeric-ldlt.js';
import { chooseOrdering } from '../../src/sparse/ordering/choose-ordering.js';
import { permuteSymmetric, shiftedEntry } from '../../src/sparse/permute.js';
import { PivotMonitor } from '../../src/sparse/pivot-monitor.js';
import { simplicialLdlt } from './simplicial-ldlt.js';
import { analyzeShiftedPair } from '../../src/sparse/symbolic.js';
import { denseOf, hexGridPair } from './fe-like-matrices.js';

describe('elimination tree and column counts', () => {
  it('match the pattern of a dense Cholesky factor (ml-matrix CholeskyDecomposition)', () => {
    const { stiffness } = hexGridPair(2, 2, 1, 4);
    const n = stiffness.n;
    const perm = chooseOrdering(stiffness, undefined, { ordering: 'amd' }).perm;
    const c = permuteSymmetric(stiffness, perm);
    const identity = Int32Array.from({ length: n }, (_, i) => i);
    const s = factorStructureCounts(c, identity);
    // reference: ml-matrix dense L; parent(j) = first nonzero below the diagonal of column j
    const l = new CholeskyDecomposition(new Matrix(denseOf(c))).lowerTriangularMatrix;
    for (let j = 0; j < n; j++) {
      let first = -1;
      let count = 1;
      for (let i = n - 1; i > j; i--) {
        if (l.get(i, j) !== 0) {
          first = i;
          count++;
        }
      }
      expect(s.parent[j]).toBe(first);
      expect(s.counts[j]).toBe(count);
    }
  });
});

describe('supernodal structure and numeric factor', () => {
  const { stiffness, mass } = hexGridPair(5, 4, 4, 21);
  const order = chooseOrdering(stiffness, mass, { ordering: 'nested-dissection' }).perm;
  const s = analyzeShiftedPair(stiffness, mass, order);

  it('has contiguous supernodes whose row lists start with their own columns', () => {
    expect(s.superStart[0]).toBe(0);
    expect(s.superStart[s.supernodes]).toBe(s.n);
    for (let sn = 0; sn < s.supernodes; sn++) {
      const f = s.superStart[sn];
      const nc = s.superStart[sn + 1] - f;
      for (let c = 0; c < nc; c++) expect(s.rows[s.rowPtr[sn] + c]).toBe(f + c);
      for (let p = s.rowPtr[sn] + 1; p < s.rowPtr[sn + 1]; p++) expect(s.rows[p]).toBeGreaterThan(s.rows[p - 1]);
    }
    // amalgamation stores some explicit zeros, but only a bounded share (our rule)
    expect(s.storedEntries).toBeGreaterThanOrEqual(s.nnzL);
    expect(s.storedEntries).toBeLessThan(2 * s.nnzL);
    expect(s.supernodes).toBeLessThan(s.n / 3);
  });

  it('gives the same pivots as the column-by-column LDLᵀ', () => {
    const shift = 1.7;
    const sup = supernodalLdlt(s, shift, new PivotMonitor(1e-13, 1));
    const identity = Int32Array.from({ length: s.n }, (_, i) => i);
    const pattern = { n: s.n, colPtr: s.pair.colPtr, rowIdx: s.pair.rowIdx };
    const t = factorStructureCounts(pattern, identity);
    const ref = simplicialLdlt(s.pair, shift, t.parent, t.counts, new PivotMonitor(1e-13, 1));
    expect(t.nnzL).toBe(s.nnzL);
    for (let j = 0; j < s.n; j++) expect(Math.abs(sup.d[j] - ref.d[j])).toBeLessThanOrEqual(1e-10 * Math.abs(ref.d[j]));
  });

  it('gives the pivots d_j = L_jj² of ml-matrix CholeskyDecomposition on the permuted K + M (σ = −1)', () => {
    const sup = supernodalLdlt(s, -1, new PivotMonitor(1e-13, 1));
    const dense = new Matrix(s.n, s.n);
    // the permuted pair's lower storage, both triangles filled
    for (let j = 0; j < s.n; j++) {
      for (let p = s.pair.colPtr[j]; p < s.pair.colPtr[j + 1]; p++) {
        const v = shiftedEntry(s.pair, p, -1);
        dense.set(s.pair.rowIdx[p], j, v);
        dense.set(j, s.pair.rowIdx[p], v);
      }
    }
    // reference: ml-matrix dense Cholesky A = G Gᵀ; with A = L D Lᵀ, g_jj² = d_j
    const chol = new CholeskyDecomposition(dense);
    expect(chol.isPositiveDefinite()).toBe(true);
    const g = chol.lowerTriangularMatrix;
    for (let j = 0; j < s.n; j++) expect(Math.abs(sup.d[j] - g.get(j, j) ** 2)).toBeLessThanOrEqual(1e-10 * g.get(j, j) ** 2);
  });
});
