/**
 * Orderings of uncoupled DOFs, block-diagonal patterns, stars and paths: correctness only (the
 * times are in the ordering bench, ORDERING_BENCH_MODEL=uncoupled). These used to take
 * quadratic time: the multilevel bisection grew its initial bisection by scanning every vertex
 * per step on graphs whose coarsening had stalled.
 *
 * Expected fill, from the structure of the factor (George & Liu, Computer Solution of Large
 * Sparse Positive Definite Systems, 1981, ch. 2 and 6; common practice): the Cholesky factor of
 * a block-diagonal matrix is block-diagonal under any order that keeps each block's order, and
 * a dense k×k block fills its whole lower triangle, k(k+1)/2 entries, in any order; so a
 * diagonal matrix has nnz(L) = n, a union of cliques Σ k(k+1)/2 whatever the order. A tree
 * (star, path) has an elimination order without fill, leaves first, giving nnz(L) = n + (n − 1)
 * (Rose, "Triangulated graphs and the elimination process", J. Math. Anal. Appl. 32, 1970).
 */
import { describe, expect, it } from 'vitest';
import { adjacencyOfPencil, type AdjacencyGraph } from '../../../src/sparse/ordering/adjacency-graph.js';
import { chooseOrdering, patternOfGraph } from '../../../src/sparse/ordering/choose-ordering.js';
import { multilevelNestedDissection, multilevelSeparator } from '../../../src/sparse/ordering/multilevel-bisection.js';
import { graphNestedDissection } from '../../../src/sparse/ordering/nested-dissection.js';
import { approximateMinimumDegree } from '../../../src/sparse/ordering/minimum-degree.js';
import { PART_A } from '../../../src/sparse/ordering/separator-refinement.js';
import type { OrderingName } from '../../../src/sparse/factor-types.js';
import { exactFactorNonzeros } from './exact-fill.js';
import { gridPattern } from './grid-patterns.js';
import { expectPermutation } from './ordering-helpers.js';
import { GraphBuilder, seededRandom, weightedGraph } from './random-graphs.js';

const NAMES: OrderingName[] = ['natural', 'amd', 'nested-dissection'];

/** Every ordering of the graph: the library's three candidates alone, the automatic choice, the two dissections directly. */
function everyOrdering(graph: AdjacencyGraph): [string, Int32Array][] {
  const pattern = patternOfGraph(graph);
  const out: [string, Int32Array][] = NAMES.map((name) => [name, chooseOrdering(pattern, undefined, { ordering: name }).perm]);
  out.push(['auto', chooseOrdering(pattern, undefined, { ordering: 'auto' }).perm]);
  out.push(['multilevel dissection', multilevelNestedDissection(graph)]);
  out.push(['level-structure dissection', graphNestedDissection(graph)]);
  out.push(['minimum degree', approximateMinimumDegree(graph)]);
  return out;
}

function star(n: number): AdjacencyGraph {
  const b = new GraphBuilder(n);
  for (let v = 1; v < n; v++) b.edge(0, v);
  return b.build();
}

function path(n: number): AdjacencyGraph {
  const b = new GraphBuilder(n);
  for (let v = 1; v < n; v++) b.edge(v - 1, v);
  return b.build();
}

describe('orderings of uncoupled and block-diagonal patterns', () => {
  it('order a diagonal pattern (uncoupled DOFs) as a permutation with no fill', () => {
    const n = 3000;
    const graph = new GraphBuilder(n).build();
    for (const [name, perm] of everyOrdering(graph)) {
      expectPermutation(perm, n);
      // diagonal: L = I, nnz(L) = n (George & Liu 1981)
      expect(exactFactorNonzeros(graph, perm), name).toBe(n);
    }
  });

  it('order many small cliques in shuffled numbering with fill Σ k(k+1)/2 and no fill between them', () => {
    const rnd = seededRandom(11);
    const n = 2400;
    const order = Int32Array.from({ length: n }, (_, k) => k);
    // shuffle, so the blocks interleave in the numbering
    for (let k = n - 1; k > 0; k--) {
      const r = Math.floor(rnd() * (k + 1));
      [order[k], order[r]] = [order[r], order[k]];
    }
    const b = new GraphBuilder(n);
    let expected = 0;
    for (let at = 0; at < n; ) {
      const k = Math.min(1 + Math.floor(rnd() * 12), n - at);
      b.clique(Array.from(order.subarray(at, at + k)));
      expected += (k * (k + 1)) / 2; // a dense block fills its lower triangle
      at += k;
    }
    const graph = b.build();
    for (const [name, perm] of everyOrdering(graph)) {
      expectPermutation(perm, n);
      expect(exactFactorNonzeros(graph, perm), name).toBe(expected);
    }
  });

  it('order a star with no fill (the centre last)', () => {
    const n = 3000;
    const graph = star(n);
    for (const [name, perm] of everyOrdering(graph)) {
      expectPermutation(perm, n);
      if (name === 'natural') continue; // the centre is vertex 0: natural order fills completely
      // a tree has a fill-free order, leaves first (Rose 1970): nnz(L) = n + (n − 1)
      expect(exactFactorNonzeros(graph, perm), name).toBe(2 * n - 1);
    }
  });

  it('gives no split, rather than a grown bisection, where coarsening stalls (a star)', () => {
    // heavy-edge matching pairs the centre with one leaf only; the part is left to minimum degree
    const where = multilevelSeparator(weightedGraph(star(2000)));
    expect(where.every((s) => s === PART_A)).toBe(true);
  });

  it('order a path as a permutation; the automatic choice has no fill', () => {
    const n = 3000;
    const graph = path(n);
    for (const [name, perm] of everyOrdering(graph)) {
      expectPermutation(perm, n);
      // a path is a tree: natural order and minimum degree have no fill (Rose 1970)
      if (name === 'auto' || name === 'natural' || name === 'amd' || name === 'minimum degree') expect(exactFactorNonzeros(graph, perm), name).toBe(2 * n - 1);
      // dissection: once a vertex's side pieces are eliminated it is joined only to the nearest
      // later pivots on either side along the path, so each column of L has at most 2 entries
      // below the diagonal (reasoned from the elimination graph, as in Rose 1970)
      else expect(exactFactorNonzeros(graph, perm), name).toBeLessThanOrEqual(3 * n);
    }
  });

  it('order a mesh with interleaved isolated DOFs exactly as the mesh alone', () => {
    const mesh = adjacencyOfPencil(gridPattern(12, 11, 10, 1, 'box').matrix);
    const isolated = 700;
    const n = mesh.n + isolated;
    // mesh vertex v becomes vertex position[v]; the others are isolated, spread through the numbering
    const position = Int32Array.from({ length: mesh.n }, (_, v) => v + Math.floor((v * isolated) / mesh.n));
    const b = new GraphBuilder(n);
    for (let v = 0; v < mesh.n; v++) for (let p = mesh.ptr[v]; p < mesh.ptr[v + 1]; p++) b.edge(position[v], position[mesh.adj[p]]);
    const graph = b.build();
    for (const [name, order] of [
      ['multilevel', multilevelNestedDissection],
      ['level structures', graphNestedDissection],
    ] as const) {
      const perm = order(graph, {});
      expectPermutation(perm, n);
      // components are independent blocks: each isolated DOF adds its diagonal, the mesh its own fill
      expect(exactFactorNonzeros(graph, perm), name).toBe(exactFactorNonzeros(mesh, order(mesh, {})) + isolated);
    }
  });
});
