/**
 * Column counts of the Cholesky / LDLᵀ factor L of a symmetric matrix C without forming L:
 * count[j] = |{ i ≥ j : L(i, j) ≠ 0 }| (diagonal included), so nnz(L) = Σ count[j].
 *
 * Row-subtree method (Gilbert, Ng and Peyton): the nonzeros of row i of L are the nodes of the
 * "row subtree" of i, the union of the tree paths from each j with C(i, j) ≠ 0 (j < i) up to i.
 * Column j's count is the number of row subtrees containing j. Visiting nodes in postorder, a
 * node j counts +1 for row i when it is a leaf of row i's subtree; the least common ancestor of
 * consecutive leaves gets −1 (that path was already counted); each node's own +1 for its
 * diagonal and −1 passed up to its parent complete the differences, which are then summed
 * up the tree. LCAs use a disjoint-set forest with path compression, O(nnz(C) α(n)) overall.
 */
import type { SymmetricCsc } from './csc.js';
import { eliminationTree } from './etree.js';
import { inversePermutation, permutedUpper, transposePattern, type Pattern } from './permute.js';
import { postorderTree } from './postorder.js';

/**
 * `lower`: lower triangle of C by columns; `parent`: its elimination tree; `post`: a postorder
 * of that tree. Returns count[j] including the diagonal.
 */
function columnCounts(lower: Pattern, parent: Int32Array, post: Int32Array): Int32Array {
  const { n, colPtr, rowIdx } = lower;
  const delta = new Int32Array(n);
  const first = new Int32Array(n).fill(-1);
  const maxFirst = new Int32Array(n).fill(-1);
  const prevLeaf = new Int32Array(n).fill(-1);
  const ancestor = new Int32Array(n);
  // first[j] = postorder number of the first descendant of j; leaves start with delta 1
  for (let k = 0; k < n; k++) {
    let j = post[k];
    delta[j] = first[j] === -1 ? 1 : 0;
    for (; j !== -1 && first[j] === -1; j = parent[j]) first[j] = k;
  }
  // each node starts as its own set
  for (let i = 0; i < n; i++) ancestor[i] = i;
  // in postorder: find where j is a leaf of the row subtrees of the rows i > j of C(:, j)
  for (let k = 0; k < n; k++) {
    const j = post[k];
    if (parent[j] !== -1) delta[parent[j]]--;
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      // j is a leaf of row i's subtree only if no earlier leaf lies in j's subtree
      if (i <= j || first[j] <= maxFirst[i]) continue;
      maxFirst[i] = first[j];
      const jPrev = prevLeaf[i];
      prevLeaf[i] = j;
      delta[j]++;
      if (jPrev === -1) continue; // first leaf of row i
      // q = least common ancestor of the previous leaf and j; its path was counted twice
      let q = jPrev;
      while (q !== ancestor[q]) q = ancestor[q];
      for (let s = jPrev; s !== q; ) {
        const up = ancestor[s];
        ancestor[s] = q;
        s = up;
      }
      delta[q]--;
    }
    if (parent[j] !== -1) ancestor[j] = parent[j];
  }
  // sum the differences up the tree (children have smaller indices than parents)
  for (let j = 0; j < n; j++) if (parent[j] !== -1) delta[parent[j]] += delta[j];
  return delta;
}

/** Elimination tree, postorder and column counts of C = P A Pᵀ (perm[k] = k-th pivot). */
export interface FactorStructureCounts {
  parent: Int32Array;
  post: Int32Array;
  counts: Int32Array;
  nnzL: number;
}

export function factorStructureCounts(a: Pattern, perm: Int32Array): FactorStructureCounts {
  const pinv = inversePermutation(perm);
  const { upper } = permutedUpper(a, pinv);
  const parent = eliminationTree(upper);
  const { lower } = transposePattern(upper);
  const post = postorderTree(parent);
  const counts = columnCounts(lower, parent, post);
  let nnzL = 0;
  // nnz(L) = Σ column counts
  for (let j = 0; j < a.n; j++) nnzL += counts[j];
  return { parent, post, counts, nnzL };
}

/**
 * Exact nnz(L) (unit diagonal included) of the LDLᵀ factor of P A Pᵀ, in O(nnz(A) α(n)) time,
 * for judging orderings before any numeric work. perm[k] = original index of the k-th pivot.
 */
export function countFactorNonzeros(a: SymmetricCsc, perm: Int32Array): number {
  return factorStructureCounts(a, perm).nnzL;
}
