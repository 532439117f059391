/**
 * Test-only exact symbolic fill counter: nnz(L) (diagonal included) of the Cholesky factor of
 * P A Pᵀ for the pattern of an adjacency graph, perm[k] = original vertex of the k-th pivot.
 *
 * Row i of L is the set of vertices reached from each j < i adjacent to i by climbing the
 * elimination tree until a vertex already reached from row i (Liu, "The role of elimination
 * trees in sparse factorization", SIAM J. Matrix Anal. Appl. 11(1), 1990). The tree is built
 * on the way: a climb that ends at a vertex without parent makes i its parent. Cost O(nnz(L)).
 */
import type { AdjacencyGraph } from '../../../src/sparse/ordering/adjacency-graph.js';

export function exactFactorNonzeros(graph: AdjacencyGraph, perm: Int32Array): number {
  const { n, ptr, adj } = graph;
  const inverse = new Int32Array(n);
  for (let k = 0; k < n; k++) inverse[perm[k]] = k;
  const parent = new Int32Array(n).fill(-1);
  const reached = new Int32Array(n).fill(-1);
  let nnz = n;
  // row i of L (new numbering): climb from every earlier neighbour
  for (let i = 0; i < n; i++) {
    reached[i] = i;
    const v = perm[i];
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      let j = inverse[adj[p]];
      if (j >= i) continue;
      // climb until a vertex already in row i
      while (reached[j] !== i) {
        reached[j] = i;
        nnz++;
        if (parent[j] === -1) {
          parent[j] = i;
          break;
        }
        j = parent[j];
      }
    }
  }
  return nnz;
}
