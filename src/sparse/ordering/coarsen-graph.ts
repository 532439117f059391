/**
 * Graph coarsening by heavy-edge matching, the first phase of multilevel bisection.
 *
 * A weighted graph G = (V, E, w_V, w_E) is contracted along a matching: each matched pair
 * (u, v) becomes one coarse vertex of weight w(u) + w(v), parallel edges merge with summed
 * weights, and the edge (u, v) disappears. Visiting vertices in random order and matching each
 * to the unmatched neighbour joined by the heaviest edge (heavy-edge matching; Karypis & Kumar,
 * "A fast and high quality multilevel scheme for partitioning irregular graphs", SIAM J. Sci.
 * Comput. 20(1), 1998) removes much edge weight per level, so the coarse graph's cuts stay
 * close to the fine graph's: a cut of the coarse graph is a cut of the fine one of equal weight.
 */

/** A graph with vertex and edge weights; adjacency lists as in AdjacencyGraph (no self loops). */
export interface WeightedGraph {
  n: number;
  ptr: Int32Array;
  adj: Int32Array;
  /** Weight of edge adj[p]. */
  edgeWeight: Int32Array;
  vertexWeight: Int32Array;
  totalWeight: number;
}

/** One coarsening step: the coarse graph and the coarse vertex of each fine vertex. */
export interface CoarseLevel {
  graph: WeightedGraph;
  coarseOf: Int32Array;
}

/** Deterministic pseudo-random permutation of 0..n−1 (xorshift-driven Fisher–Yates). */
export function shuffled(n: number, seed: number): Int32Array {
  const order = new Int32Array(n);
  // the identity, then shuffled
  for (let k = 0; k < n; k++) order[k] = k;
  let s = (seed * 2654435761) >>> 0 || 1;
  // swap each position with a random earlier one
  for (let k = n - 1; k > 0; k--) {
    s ^= s << 13;
    s >>>= 0;
    s ^= s >>> 17;
    s ^= s << 5;
    s >>>= 0;
    const r = s % (k + 1);
    const t = order[k];
    order[k] = order[r];
    order[r] = t;
  }
  return order;
}

/**
 * Heavy-edge matching: mate[v] = matched partner (v itself when unmatched). Pairs heavier than
 * maxVertexWeight are not formed, so no coarse vertex dominates a side.
 */
function heavyEdgeMatching(g: WeightedGraph, seed: number, maxVertexWeight: number): Int32Array {
  const { n, ptr, adj, edgeWeight, vertexWeight } = g;
  const mate = new Int32Array(n).fill(-1);
  const order = shuffled(n, seed);
  // each unmatched vertex takes its unmatched neighbour of heaviest edge (lighter vertex on ties)
  for (let t = 0; t < n; t++) {
    const v = order[t];
    if (mate[v] >= 0) continue;
    let best = -1;
    let bestEdge = -1;
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      const u = adj[p];
      if (mate[u] >= 0 || vertexWeight[u] + vertexWeight[v] > maxVertexWeight) continue;
      const e = edgeWeight[p];
      if (e > bestEdge || (e === bestEdge && vertexWeight[u] < vertexWeight[best])) {
        best = u;
        bestEdge = e;
      }
    }
    mate[v] = best >= 0 ? best : v;
    if (best >= 0) mate[best] = v;
  }
  return mate;
}

/** Contracts g along a heavy-edge matching. */
export function coarsen(g: WeightedGraph, seed: number, maxVertexWeight: number): CoarseLevel {
  const { n, ptr, adj, edgeWeight, vertexWeight } = g;
  const mate = heavyEdgeMatching(g, seed, maxVertexWeight);
  const coarseOf = new Int32Array(n).fill(-1);
  let nc = 0;
  // number the pairs (and singletons) in vertex order
  for (let v = 0; v < n; v++) {
    if (coarseOf[v] >= 0) continue;
    coarseOf[v] = nc;
    coarseOf[mate[v]] = nc;
    nc++;
  }
  const cPtr = new Int32Array(nc + 1);
  // at most one coarse entry per fine entry scanned below (each fine list is scanned once, by its
  // coarse vertex), so ptr[n] slots suffice
  const cAdj = new Int32Array(ptr[n]);
  const cEdge = new Int32Array(ptr[n]);
  const cWeight = new Int32Array(nc);
  // slot[cu] = position of coarse neighbour cu in the list being built; positions of earlier
  // lists are below that list's start, so `slot[cu] >= start` alone says "already listed"
  const slot = new Int32Array(nc).fill(-1);
  let fill = 0;
  let c = 0;
  // build each coarse vertex's list from the lists of its one or two fine vertices (v, then its mate)
  for (let v = 0; v < n; v++) {
    if (coarseOf[v] !== c) continue;
    const start = fill;
    const members = mate[v] === v ? 1 : 2;
    for (let r = 0; r < members; r++) {
      const x = r === 0 ? v : mate[v];
      cWeight[c] += vertexWeight[x];
      for (let p = ptr[x]; p < ptr[x + 1]; p++) {
        const cu = coarseOf[adj[p]];
        if (cu === c) continue;
        const at = slot[cu];
        if (at >= start) cEdge[at] += edgeWeight[p];
        else {
          if (fill >= cAdj.length) throw new Error('coarsening: more coarse edges than fine ones');
          slot[cu] = fill;
          cAdj[fill] = cu;
          cEdge[fill++] = edgeWeight[p];
        }
      }
    }
    cPtr[++c] = fill;
  }
  const graph: WeightedGraph = {
    n: nc,
    ptr: cPtr,
    adj: cAdj.subarray(0, fill),
    edgeWeight: cEdge.subarray(0, fill),
    vertexWeight: cWeight,
    totalWeight: g.totalWeight,
  };
  return { graph, coarseOf };
}
