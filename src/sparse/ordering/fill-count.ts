/**
 * Exact nnz(L) of the Cholesky / LDLᵀ factor of P A Pᵀ read straight off the adjacency graph of
 * A, for ranking orderings: no permuted copy of the pattern and no transpose are built, which
 * takes about 40 % off the generic count (src/sparse/column-counts.ts): 188 → 118 ms on the
 * 120k-DOF bench hex box.
 *
 * With pinv the inverse permutation (vertex v is pivot pinv[v]), column k of P A Pᵀ holds the
 * pivots pinv[u] of the neighbours u of perm[k]; both triangles are at hand because the graph
 * lists every edge from both ends.
 *  1. Elimination tree (Liu): for k = 0, 1, …, every neighbour pivot i < k lies in a subtree
 *     whose current root becomes a child of k; path compression to k keeps it near-linear.
 *  2. A postorder of the tree (children before parents, subtrees contiguous).
 *  3. Column counts by row subtrees (Gilbert, Ng & Peyton, "An efficient algorithm to compute
 *     row and column counts for sparse Cholesky factorization", SIAM J. Matrix Anal. Appl.
 *     15(4), 1994): row i of L is the union of the tree paths from each j < i with A(i, j) ≠ 0
 *     up to i. In postorder, j is a leaf of row i's subtree when no earlier column of the row
 *     lies in j's subtree (j's first descendant comes after the row's last leaf); a leaf adds
 *     +1 at j, the least common ancestor of j and the row's previous leaf (a disjoint-set forest
 *     over the finished subtrees) gets −1; a tree leaf adds +1 for its own row and every node
 *     passes −1 to its parent, where its own row ends. Summing the differences up the tree gives
 *     count[j] = |L(:, j)| (diagonal included), and nnz(L) = Σ count[j].
 * O(|adj| α(n)) time.
 *
 * (Counting on the supervariable graph instead is exact only when every member of a neighbour
 * supervariable couples to the node and the node blocks are full or their parts see the same
 * neighbours; exported FE matrices drop exact zeros inside node blocks — 25 714 of the 42 592
 * nodes of the 127k-DOF hex solid — so the DOF graph is counted.)
 */
import type { AdjacencyGraph } from './adjacency-graph.js';
import { postorderTree } from '../postorder.js';
import { columnFlops } from '../symbolic.js';
import type { FactorStructureCounts } from '../column-counts.js';

/** Exact nnz(L), unit diagonal included, of P A Pᵀ with A of the graph's pattern (perm[k] = k-th pivot). */
export function factorNonzerosOfGraph(graph: AdjacencyGraph, perm: Int32Array): number {
  return factorCountsOfGraph(graph, perm).nnzL;
}

/** What an ordering costs: nnz(L) and the flops of the numeric factorization, from the same column counts. */
export interface FactorCounts {
  nnzL: number;
  /**
   * Σ over columns of r + r(r + 1), r = the column's entries below the diagonal (r divisions and
   * r(r+1)/2 multiply-adds): the count symbolic.ts makes per supernode, here per column.
   */
  flops: number;
  /**
   * The elimination tree of P A Pᵀ, its postorder and the column counts (diagonal included) the
   * figures were summed from: what symbolic.ts would otherwise compute again for the winner.
   */
  tree: FactorStructureCounts;
}

/** nnz(L) and factorization flops of P A Pᵀ (see factorNonzerosOfGraph). */
export function factorCountsOfGraph(graph: AdjacencyGraph, perm: Int32Array): FactorCounts {
  const { n, ptr, adj } = graph;
  const pinv = new Int32Array(n);
  // pivot position of every vertex
  for (let k = 0; k < n; k++) pinv[perm[k]] = k;
  const parent = new Int32Array(n).fill(-1);
  const ancestor = new Int32Array(n).fill(-1);
  // elimination tree: link the subtree roots of the earlier pivots adjacent to pivot k
  for (let k = 0; k < n; k++) {
    const v = perm[k];
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      let i = pinv[adj[p]];
      // climb from i to the root of its subtree, compressing the path to k
      while (i < k) {
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
  const post = postorderTree(parent);
  const delta = new Int32Array(n);
  const first = new Int32Array(n).fill(-1);
  // first[j] = postorder position of j's first descendant; a tree leaf starts with its own row
  for (let k = 0; k < n; k++) {
    let j = post[k];
    delta[j] = first[j] === -1 ? 1 : 0;
    for (; j !== -1 && first[j] === -1; j = parent[j]) first[j] = k;
  }
  // per row i: the largest first[] among its leaves so far (ancestor is free again), its previous leaf
  const maxFirst = ancestor.fill(-1);
  const prevLeaf = new Int32Array(n).fill(-1);
  const set = new Int32Array(n);
  // every node starts as its own set
  for (let j = 0; j < n; j++) set[j] = j;
  // in postorder: find the rows i > j whose row subtree has j as a leaf
  for (let k = 0; k < n; k++) {
    const j = post[k];
    if (parent[j] !== -1) delta[parent[j]]--;
    const v = perm[j];
    const fj = first[j];
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      const i = pinv[adj[p]];
      if (i <= j || fj <= maxFirst[i]) continue;
      maxFirst[i] = fj;
      const jPrev = prevLeaf[i];
      prevLeaf[i] = j;
      delta[j]++;
      if (jPrev === -1) continue;
      // q = least common ancestor of the previous leaf and j: that path was counted twice
      let q = jPrev;
      while (q !== set[q]) q = set[q];
      // compress the path from the previous leaf to q
      for (let s = jPrev; s !== q; ) {
        const up = set[s];
        set[s] = q;
        s = up;
      }
      delta[q]--;
    }
    if (parent[j] !== -1) set[j] = parent[j];
  }
  let nnz = 0;
  let flops = 0;
  // sum the differences up the tree (a parent's pivot is later than its children's)
  for (let j = 0; j < n; j++) {
    if (parent[j] !== -1) delta[parent[j]] += delta[j];
    nnz += delta[j];
    flops += columnFlops(delta[j] - 1);
  }
  return { nnzL: nnz, flops, tree: { parent, post, counts: delta, nnzL: nnz } };
}
