/**
 * Symmetric adjacency graph of a sparse symmetric pattern, in compressed sparse row form.
 *
 * Vertex v's neighbours are adj[ptr[v] .. ptr[v+1]-1], sorted ascending, without v itself.
 * For the pencil (K, M) the graph is that of the union pattern of K and M: every matrix
 * K − σM has its nonzeros inside that pattern, so one ordering serves every shift.
 */
import type { SymmetricCsc } from '../csc.js';

export interface AdjacencyGraph {
  readonly n: number;
  readonly ptr: Int32Array; // length n + 1
  readonly adj: Int32Array; // length ptr[n] (each edge appears twice)
}

/**
 * Calls visit(i, j) once for every off-diagonal stored entry (i > j) of the union pattern of
 * a and b (both lower storage, rows sorted), column by column in ascending j.
 */
function forEachUnionEntry(a: SymmetricCsc, b: SymmetricCsc | undefined, visit: (i: number, j: number) => void): void {
  for (let j = 0; j < a.n; j++) {
    // merge the sorted row lists of column j of a and b, skipping the diagonal
    let p = a.colPtr[j];
    const pEnd = a.colPtr[j + 1];
    let q = b ? b.colPtr[j] : 0;
    const qEnd = b ? b.colPtr[j + 1] : 0;
    while (p < pEnd || q < qEnd) {
      const ia = p < pEnd ? a.rowIdx[p] : 0x7fffffff;
      const ib = q < qEnd ? b!.rowIdx[q] : 0x7fffffff;
      const i = ia < ib ? ia : ib;
      if (ia === i) p++;
      if (ib === i) q++;
      if (i > j) visit(i, j);
    }
  }
}

/** Adjacency graph (no self loops) of the union pattern of stiffness and, if given, mass. */
export function adjacencyOfPencil(stiffness: SymmetricCsc, mass?: SymmetricCsc): AdjacencyGraph {
  const n = stiffness.n;
  if (mass && mass.n !== n) throw new Error(`adjacencyOfPencil: stiffness has ${n} rows, mass has ${mass.n}`);
  const ptr = new Int32Array(n + 1);
  // degree of each vertex: one per union entry in its row and one per entry in its column
  forEachUnionEntry(stiffness, mass, (i, j) => {
    ptr[i + 1]++;
    ptr[j + 1]++;
  });
  // prefix sums give each vertex's first slot
  for (let v = 0; v < n; v++) ptr[v + 1] += ptr[v];
  const adj = new Int32Array(ptr[n]);
  const fill = ptr.slice(0, n);
  // scatter both directions; ascending j keeps every list sorted (smaller neighbours arrive first)
  forEachUnionEntry(stiffness, mass, (i, j) => {
    adj[fill[i]++] = j;
    adj[fill[j]++] = i;
  });
  return { n, ptr, adj };
}

/**
 * Subgraph induced by the vertices list (local index = position in the list).
 * `local` is an n-long workspace that must hold -1 everywhere; it is restored before return.
 */
export function inducedSubgraph(graph: AdjacencyGraph, vertices: Int32Array, local: Int32Array): AdjacencyGraph {
  const m = vertices.length;
  // number the chosen vertices locally
  for (let k = 0; k < m; k++) local[vertices[k]] = k;
  const ptr = new Int32Array(m + 1);
  // count neighbours that are inside the subset
  for (let k = 0; k < m; k++) {
    const v = vertices[k];
    let c = 0;
    for (let p = graph.ptr[v]; p < graph.ptr[v + 1]; p++) if (local[graph.adj[p]] >= 0) c++;
    ptr[k + 1] = ptr[k] + c;
  }
  const adj = new Int32Array(ptr[m]);
  // copy those neighbours in local numbering
  for (let k = 0, t = 0; k < m; k++) {
    const v = vertices[k];
    for (let p = graph.ptr[v]; p < graph.ptr[v + 1]; p++) {
      const u = local[graph.adj[p]];
      if (u >= 0) adj[t++] = u;
    }
  }
  for (let k = 0; k < m; k++) local[vertices[k]] = -1;
  return { n: m, ptr, adj };
}
