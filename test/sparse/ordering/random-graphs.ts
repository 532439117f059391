/**
 * Test-only graph builders for the ordering property tests: a seeded generator, graphs from
 * edge lists, cliques, unions of overlapping cliques, random graphs of high degree, many small
 * components and isolated vertices, and the DOF graph of quadratic (10-node) tetrahedra on a
 * structured grid of cubes.
 */
import type { AdjacencyGraph } from '../../../src/sparse/ordering/adjacency-graph.js';
import type { WeightedGraph } from '../../../src/sparse/ordering/coarsen-graph.js';
import { seededUniform } from '../../../src/dense/seeded-random.js';

/** Seeded uniform generator on [0, 1) (src/dense/seeded-random.ts). */
export const seededRandom = seededUniform;

/** Adds undirected edges to a per-vertex neighbour set list and turns it into a graph. */
export class GraphBuilder {
  private readonly sets: Set<number>[];
  constructor(readonly n: number) {
    this.sets = Array.from({ length: n }, () => new Set<number>());
  }
  edge(u: number, v: number): void {
    if (u === v) return;
    this.sets[u].add(v);
    this.sets[v].add(u);
  }
  clique(vertices: number[]): void {
    for (let a = 0; a < vertices.length; a++) for (let b = a + 1; b < vertices.length; b++) this.edge(vertices[a], vertices[b]);
  }
  build(): AdjacencyGraph {
    const ptr = new Int32Array(this.n + 1);
    for (let v = 0; v < this.n; v++) ptr[v + 1] = ptr[v] + this.sets[v].size;
    const adj = new Int32Array(ptr[this.n]);
    // sorted lists, as adjacencyOfPencil gives them
    for (let v = 0; v < this.n; v++) adj.set(Int32Array.from(this.sets[v]).sort(), ptr[v]);
    return { n: this.n, ptr, adj };
  }
}

/** k random distinct vertices of 0..n−1. */
function sample(n: number, k: number, rnd: () => number): number[] {
  const chosen = new Set<number>();
  while (chosen.size < Math.min(k, n)) chosen.add(Math.floor(rnd() * n));
  return [...chosen];
}

export function cliqueGraph(n: number): AdjacencyGraph {
  const b = new GraphBuilder(n);
  b.clique(Array.from({ length: n }, (_, k) => k));
  return b.build();
}

/** `count` cliques of `size` random vertices each (they overlap), plus a path so most is connected. */
export function overlappingCliques(n: number, count: number, size: number, rnd: () => number): AdjacencyGraph {
  const b = new GraphBuilder(n);
  for (let c = 0; c < count; c++) b.clique(sample(n, size, rnd));
  return b.build();
}

/** Every vertex joined to about `degree` random others. */
export function randomHighDegree(n: number, degree: number, rnd: () => number): AdjacencyGraph {
  const b = new GraphBuilder(n);
  for (let v = 0; v < n; v++) for (const u of sample(n, Math.ceil(degree / 2), rnd)) b.edge(v, u);
  return b.build();
}

/** Isolated vertices, small cliques and paths, and one larger dense piece, shuffled together. */
export function manySmallComponents(n: number, rnd: () => number): AdjacencyGraph {
  const b = new GraphBuilder(n);
  const order = sample(n, n, rnd); // a random permutation, so components interleave in numbering
  let at = 0;
  // one dense piece of a fifth of the vertices, then small pieces of 0..7 edges' worth
  const big = order.slice(0, Math.floor(n / 5));
  for (let k = 0; k < big.length; k++) for (let r = 1; r <= 6 && k + r < big.length; r++) b.edge(big[k], big[k + r]);
  at = big.length;
  while (at < n) {
    const size = 1 + Math.floor(rnd() * 8);
    const piece = order.slice(at, at + size);
    if (rnd() < 0.5) b.clique(piece);
    else for (let k = 1; k < piece.length; k++) b.edge(piece[k - 1], piece[k]);
    at += size;
  }
  return b.build();
}

/**
 * DOF graph of quadratic tetrahedra (4 corner + 6 mid-edge nodes, 3 DOFs each: every element
 * couples its 30 DOFs) on nx×ny×nz cubes, each cube split into the 6 tetrahedra around its main
 * diagonal (every tetrahedron runs corner 000 → one axis → two axes → corner 111).
 */
export function quadraticTetGraph(nx: number, ny: number, nz: number): AdjacencyGraph {
  const corner = (x: number, y: number, z: number): number => x + (nx + 1) * (y + (ny + 1) * z);
  let nodes = (nx + 1) * (ny + 1) * (nz + 1);
  const midNode = new Map<string, number>();
  const mid = (a: number, b: number): number => {
    const key = a < b ? `${a},${b}` : `${b},${a}`;
    let id = midNode.get(key);
    if (id === undefined) midNode.set(key, (id = nodes++));
    return id;
  };
  const elements: number[][] = [];
  const axes = [
    [0, 1, 2],
    [0, 2, 1],
    [1, 0, 2],
    [1, 2, 0],
    [2, 0, 1],
    [2, 1, 0],
  ];
  for (let z = 0; z < nz; z++)
    for (let y = 0; y < ny; y++)
      for (let x = 0; x < nx; x++) {
        for (const [a1, a2] of axes) {
          const p = [x, y, z];
          const c0 = corner(p[0], p[1], p[2]);
          p[a1]++;
          const c1 = corner(p[0], p[1], p[2]);
          p[a2]++;
          const c2 = corner(p[0], p[1], p[2]);
          const c3 = corner(x + 1, y + 1, z + 1);
          const cs = [c0, c1, c2, c3];
          const element = [...cs];
          for (let i = 0; i < 4; i++) for (let j = i + 1; j < 4; j++) element.push(mid(cs[i], cs[j]));
          elements.push(element);
        }
      }
  const b = new GraphBuilder(3 * nodes);
  for (const element of elements) b.clique(element.flatMap((node) => [3 * node, 3 * node + 1, 3 * node + 2]));
  return b.build();
}

/** Unit edge weights and the given (default unit) vertex weights. */
export function weightedGraph(graph: AdjacencyGraph, vertexWeight = new Int32Array(graph.n).fill(1)): WeightedGraph {
  let totalWeight = 0;
  for (const w of vertexWeight) totalWeight += w;
  return { ...graph, edgeWeight: new Int32Array(graph.adj.length).fill(1), vertexWeight, totalWeight };
}

/** Number of edges joining side 0 (A) and side 1 (B): zero for a vertex separator. */
export function edgesBetweenSides(graph: AdjacencyGraph, where: Uint8Array): number {
  let across = 0;
  for (let v = 0; v < graph.n; v++) {
    for (let p = graph.ptr[v]; p < graph.ptr[v + 1]; p++) {
      const s = where[v];
      const t = where[graph.adj[p]];
      if ((s === 0 && t === 1) || (s === 1 && t === 0)) across++;
    }
  }
  return across;
}
