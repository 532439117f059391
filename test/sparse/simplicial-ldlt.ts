/**
 * Column-by-column ("up-looking") LDLᵀ of a permuted shifted pair A = K − σM, the simple
 * reference factorization: row k of L is the solution of L(0:k−1, 0:k−1) D y = A(0:k−1, k),
 * whose nonzero pattern is the row subtree of k in the elimination tree. A test oracle for the
 * supernodal factorization (no blocking, no amalgamation), small enough to read at once.
 */
import type { PermutedPair } from '../../src/sparse/permute.js';
import { shiftedEntry, transposePattern } from '../../src/sparse/permute.js';
import type { PivotMonitor } from '../../src/sparse/pivot-monitor.js';

export interface SimplicialFactor {
  n: number;
  /** L by columns, strictly lower part, unit diagonal implied. */
  colPtr: Int32Array;
  rowIdx: Int32Array;
  values: Float64Array;
  d: Float64Array;
}

/** counts[j] = column counts of L incl. diagonal; parent = elimination tree of the pattern. */
export function simplicialLdlt(
  pair: PermutedPair,
  shift: number,
  parent: Int32Array,
  counts: Int32Array,
  monitor: PivotMonitor,
): SimplicialFactor {
  const n = pair.n;
  const { lower: up, map } = transposePattern(pair); // columns of the upper triangle
  const colPtr = new Int32Array(n + 1);
  // strictly lower nonzeros per column
  for (let j = 0; j < n; j++) colPtr[j + 1] = colPtr[j] + counts[j] - 1;
  const rowIdx = new Int32Array(colPtr[n]);
  const values = new Float64Array(colPtr[n]);
  const fill = new Int32Array(n);
  const d = new Float64Array(n);
  const y = new Float64Array(n);
  const pattern = new Int32Array(n);
  const flag = new Int32Array(n).fill(-1);
  // for each row k: sparse triangular solve for L(k, 0:k−1), then d_k
  for (let k = 0; k < n; k++) {
    let top = n;
    flag[k] = k;
    let akk = 0;
    // scatter A(0:k, k) and collect the row subtree of k in topological order
    for (let p = up.colPtr[k]; p < up.colPtr[k + 1]; p++) {
      let i = up.rowIdx[p];
      const q = map[p];
      const v = shiftedEntry(pair, q, shift);
      if (i === k) {
        akk = v;
        continue;
      }
      y[i] += v;
      let len = 0;
      for (; flag[i] !== k; i = parent[i]) {
        pattern[len++] = i;
        flag[i] = k;
      }
      while (len > 0) pattern[--top] = pattern[--len];
    }
    let dk = akk;
    // eliminate with each column i of the row subtree: y −= L(:, i) y_i, L(k, i) = y_i / d_i
    for (; top < n; top++) {
      const i = pattern[top];
      const yi = y[i];
      y[i] = 0;
      const end = colPtr[i] + fill[i];
      for (let p = colPtr[i]; p < end; p++) y[rowIdx[p]] -= values[p] * yi;
      const lki = yi / d[i];
      dk -= lki * yi;
      rowIdx[end] = k;
      values[end] = lki;
      fill[i]++;
    }
    d[k] = monitor.accept(k, dk, akk);
  }
  return { n, colPtr, rowIdx, values, d };
}

/** x ← L⁻ᵀ D⁻¹ L⁻¹ x in the permuted numbering. */
export function simplicialSolveInPlace(f: SimplicialFactor, x: Float64Array): void {
  const { n, colPtr, rowIdx, values, d } = f;
  // forward: L z = x
  for (let j = 0; j < n; j++) {
    const xj = x[j];
    if (xj !== 0) for (let p = colPtr[j]; p < colPtr[j + 1]; p++) x[rowIdx[p]] -= values[p] * xj;
  }
  // diagonal: D w = z
  for (let j = 0; j < n; j++) x[j] /= d[j];
  // backward: Lᵀ x = w
  for (let j = n - 1; j >= 0; j--) {
    let s = x[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) s -= values[p] * x[rowIdx[p]];
    x[j] = s;
  }
}
