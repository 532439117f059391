/**
 * Elimination tree of a symmetric matrix C (already permuted): parent[j] is the row index of
 * the first off-diagonal nonzero of column j of its Cholesky factor L, or −1 for a root.
 *
 * Liu's algorithm: processing columns k in order, every entry C(i, k) with i < k means that
 * k is an ancestor of i in the tree; walking from i to the current root of its subtree and
 * linking that root to k builds the tree. Path compression through `ancestor` keeps the total
 * cost near O(nnz(C)).
 */
import type { Pattern } from './permute.js';

/** `upper`: the upper triangle of C by columns (rows i ≤ k of column k, any order). */
export function eliminationTree(upper: Pattern): Int32Array {
  const { n, colPtr, rowIdx } = upper;
  const parent = new Int32Array(n).fill(-1);
  const ancestor = new Int32Array(n).fill(-1);
  // for each column k: link the roots of the subtrees holding the rows i < k of C(:, k)
  for (let k = 0; k < n; k++) {
    for (let p = colPtr[k]; p < colPtr[k + 1]; p++) {
      let i = rowIdx[p];
      // climb from i to the root of its current subtree, compressing the path to k
      while (i !== -1 && i < k) {
        const next = ancestor[i];
        ancestor[i] = k;
        if (next === -1) {
          parent[i] = k;
          break;
        }
        i = next;
      }
    }
  }
  return parent;
}
