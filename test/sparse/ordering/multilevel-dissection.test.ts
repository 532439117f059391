/**
 * Multilevel nested dissection and its pieces: gain heap, heavy-edge coarsening, vertex-separator
 * refinement, the multilevel separator, constrained minimum degree, coordinate cuts near the
 * median. Checks against facts outside the project: a k×k plane is a vertex separator of a k³
 * grid (George, SIAM J. Numer. Anal. 10(2), 1973), nnz(L) of a k³ grid under nested dissection
 * grows like k⁴ (same source), and the exact fill counter of exact-fill.ts (Liu 1990).
 */
import { describe, expect, it } from 'vitest';
import { adjacencyOfPencil, type AdjacencyGraph } from '../../../src/sparse/ordering/adjacency-graph.js';
import { coarsen, type WeightedGraph } from '../../../src/sparse/ordering/coarsen-graph.js';
import { GainHeap } from '../../../src/sparse/ordering/gain-heap.js';
import { multilevelNestedDissection, multilevelSeparator } from '../../../src/sparse/ordering/multilevel-bisection.js';
import { partWeights, PART_A, PART_B, PART_S, refineSeparator } from '../../../src/sparse/ordering/separator-refinement.js';
import { graphNestedDissection } from '../../../src/sparse/ordering/nested-dissection.js';
import { coordinateBisection } from '../../../src/sparse/ordering/coordinate-bisection.js';
import { approximateMinimumDegree } from '../../../src/sparse/ordering/minimum-degree.js';
import { expandOrdering, findSupervariables } from '../../../src/sparse/ordering/supervariables.js';
import { chooseOrdering } from '../../../src/sparse/ordering/choose-ordering.js';
import { exactFactorNonzeros } from './exact-fill.js';
import { gridPattern } from './grid-patterns.js';
import { expectPermutation, naturalPerm } from './ordering-helpers.js';

function weighted(graph: AdjacencyGraph, vertexWeight = new Int32Array(graph.n).fill(1)): WeightedGraph {
  let totalWeight = 0;
  for (const w of vertexWeight) totalWeight += w;
  return { ...graph, edgeWeight: new Int32Array(graph.adj.length).fill(1), vertexWeight, totalWeight };
}

/** Number of edges joining A and B (must be 0 for a vertex separator). */
function edgesAcross(g: { n: number; ptr: Int32Array; adj: Int32Array }, where: Uint8Array): number {
  let across = 0;
  for (let v = 0; v < g.n; v++) {
    for (let p = g.ptr[v]; p < g.ptr[v + 1]; p++) {
      const u = g.adj[p];
      if ((where[v] === PART_A && where[u] === PART_B) || (where[v] === PART_B && where[u] === PART_A)) across++;
    }
  }
  return across;
}

describe('gain heap', () => {
  it('pops vertices in descending gain after inserts, updates and removals', () => {
    const heap = new GainHeap(50);
    const gains = new Map<number, number>();
    // deterministic pseudo-random keys
    for (let v = 0; v < 50; v++) {
      const g = ((v * 37) % 23) - 11;
      heap.set(v, g);
      gains.set(v, g);
    }
    for (let v = 0; v < 50; v += 3) {
      heap.set(v, gains.get(v)! + 7 - (v % 5) * 3);
      gains.set(v, gains.get(v)! + 7 - (v % 5) * 3);
    }
    for (let v = 1; v < 50; v += 7) {
      heap.remove(v);
      gains.delete(v);
    }
    const popped: number[] = [];
    while (heap.size > 0) {
      const v = heap.top();
      popped.push(heap.gainOf(v));
      heap.remove(v);
    }
    // reference: the same keys sorted descending by Array.prototype.sort
    expect(popped).toEqual([...gains.values()].sort((a, b) => b - a));
  });
});

describe('heavy-edge coarsening', () => {
  it('keeps the total vertex weight and the cut weights of a 3D grid', () => {
    const graph = adjacencyOfPencil(gridPattern(8, 8, 8, 1, 'box').matrix);
    const fine = weighted(graph);
    const { graph: coarse, coarseOf } = coarsen(fine, 3, 4);
    expect(coarse.n).toBeLessThan(0.6 * fine.n);
    let weight = 0;
    for (const w of coarse.vertexWeight) weight += w;
    expect(weight).toBe(fine.totalWeight);
    // a coarse labelling cuts exactly the fine edge weight it cuts when projected
    const coarseSide = Uint8Array.from({ length: coarse.n }, (_, c) => c % 2);
    let coarseCut = 0;
    for (let c = 0; c < coarse.n; c++)
      for (let p = coarse.ptr[c]; p < coarse.ptr[c + 1]; p++) if (coarseSide[coarse.adj[p]] !== coarseSide[c]) coarseCut += coarse.edgeWeight[p];
    let fineCut = 0;
    for (let v = 0; v < fine.n; v++)
      for (let p = fine.ptr[v]; p < fine.ptr[v + 1]; p++) if (coarseSide[coarseOf[fine.adj[p]]] !== coarseSide[coarseOf[v]]) fineCut++;
    expect(coarseCut).toBe(fineCut);
  });
});

describe('vertex-separator refinement', () => {
  it('thins a three-plane separator of a 12³ 7-point grid to about one plane', () => {
    const k = 12;
    const graph = adjacencyOfPencil(gridPattern(k, k, k, 1, 'faces').matrix);
    const g = weighted(graph);
    const where = new Uint8Array(g.n);
    // x < 5 → A, 5 ≤ x ≤ 7 → separator, x > 7 → B (vertex id = x + k(y + kz))
    for (let v = 0; v < g.n; v++) where[v] = v % k < 5 ? PART_A : v % k <= 7 ? PART_S : PART_B;
    expect(edgesAcross(g, where)).toBe(0);
    const [a, b, s] = refineSeparator(g, where, 0.55 * g.totalWeight);
    expect(edgesAcross(g, where)).toBe(0);
    expect(partWeights(g, where)).toEqual([a, b, s]);
    // a k×k plane separates the k³ grid (George 1973): the refinement should reach it
    expect(s).toBeLessThanOrEqual(k * k);
    expect(Math.max(a, b)).toBeLessThanOrEqual(0.55 * g.totalWeight);
  });
});

describe('multilevel separator', () => {
  it('separates a 14³ 27-point grid by little more than a plane, both sides balanced', () => {
    const k = 14;
    const graph = adjacencyOfPencil(gridPattern(k, k, k, 1, 'box').matrix);
    const g = weighted(graph);
    // the three runs the dissection makes on a part of this size (seeds partSeed · 64 + r)
    let lightest = Infinity;
    for (let r = 0; r < 3; r++) {
      const where = multilevelSeparator(g, 5 * 64 + r);
      const [a, b, s] = partWeights(g, where);
      expect(edgesAcross(g, where)).toBe(0);
      expect(Math.min(a, b)).toBeGreaterThan(0.4 * g.totalWeight);
      lightest = Math.min(lightest, s);
    }
    // a k×k plane is the ideal separator (George 1973); allow 30 % above it for the lightest run
    expect(lightest).toBeLessThanOrEqual(1.3 * k * k);
  });

  it('gives the same separator for a seed whether or not other runs of the part came first', () => {
    const k = 14;
    const g = weighted(adjacencyOfPencil(gridPattern(k, k, k, 1, 'box').matrix));
    multilevelSeparator(g, 5 * 64);
    const after = multilevelSeparator(g, 5 * 64 + 1);
    // a fresh copy of the graph: the shared levels are computed anew
    const fresh = multilevelSeparator({ ...g }, 5 * 64 + 1);
    expect(Array.from(fresh)).toEqual(Array.from(after));
  });

  it('splits a disconnected graph without a separator', () => {
    // two separate 6×6 grids side by side: vertices 0..35 and 36..71
    const one = adjacencyOfPencil(gridPattern(6, 6, 1, 1, 'faces').matrix);
    const n = 2 * one.n;
    const ptr = new Int32Array(n + 1);
    const adj = new Int32Array(2 * one.adj.length);
    for (let v = 0; v < n; v++) ptr[v + 1] = ptr[v] + (one.ptr[(v % one.n) + 1] - one.ptr[v % one.n]);
    for (let v = 0; v < n; v++) {
      const base = v < one.n ? 0 : one.n;
      for (let p = one.ptr[v % one.n], t = ptr[v]; p < one.ptr[(v % one.n) + 1]; p++) adj[t++] = one.adj[p] + base;
    }
    const g = weighted({ n, ptr, adj });
    const where = multilevelSeparator(g, 1);
    expect(edgesAcross(g, where)).toBe(0);
    const [a, b, s] = partWeights(g, where);
    expect(a).toBeGreaterThan(0);
    expect(b).toBeGreaterThan(0);
    expect(s).toBeLessThanOrEqual(6);
  });
});

describe('multilevel nested dissection', () => {
  it('orders a 3-DOF 14³-node hex pattern with less fill than the level-structure dissection', () => {
    const { matrix, coordinates } = gridPattern(14, 14, 14, 3, 'box');
    const graph = adjacencyOfPencil(matrix);
    const sv = findSupervariables(graph, { coordinates });
    const ml = expandOrdering(sv, multilevelNestedDissection(sv.graph, { weights: sv.weight }));
    const levels = expandOrdering(sv, graphNestedDissection(sv.graph, { weights: sv.weight }));
    expectPermutation(ml, graph.n);
    const fillMl = exactFactorNonzeros(graph, ml);
    // natural order fills its envelope, nnz(L) ≈ n·3k² (common practice)
    expect(fillMl).toBeLessThan(0.6 * exactFactorNonzeros(graph, naturalPerm(graph.n)));
    // bound from this test's runs: the old single-level dissection is clearly worse
    expect(fillMl).toBeLessThan(0.9 * exactFactorNonzeros(graph, levels));
  });

  it("chooseOrdering's nested dissection keeps the better of multilevel and level structures", () => {
    // a beam-lattice-like pattern: 6 DOFs per node, face neighbours only
    const { matrix } = gridPattern(8, 8, 8, 6, 'faces');
    const graph = adjacencyOfPencil(matrix);
    const chosen = chooseOrdering(matrix, undefined, { ordering: 'nested-dissection' });
    expectPermutation(chosen.perm, graph.n);
    const sv = findSupervariables(graph);
    const ml = exactFactorNonzeros(graph, expandOrdering(sv, multilevelNestedDissection(sv.graph, { weights: sv.weight })));
    const levels = exactFactorNonzeros(graph, expandOrdering(sv, graphNestedDissection(sv.graph, { weights: sv.weight })));
    // the exact counter of exact-fill.ts (Liu 1990) as the independent check
    expect(exactFactorNonzeros(graph, chosen.perm)).toBe(Math.min(ml, levels));
  });

  it('is deterministic for a given seed', () => {
    const graph = adjacencyOfPencil(gridPattern(9, 9, 9, 1, 'box').matrix);
    const first = multilevelNestedDissection(graph, { leafSize: 40, seed: 4 });
    expectPermutation(first, graph.n);
    expect(multilevelNestedDissection(graph, { leafSize: 40, seed: 4 })).toEqual(first);
  });
});

describe('constrained minimum degree', () => {
  it('eliminates every vertex of a lower constraint set before any of a higher one', () => {
    const graph = adjacencyOfPencil(gridPattern(10, 10, 1, 1, 'faces').matrix);
    // three sets by column band: x ≥ 7 first (set 0), x < 3 next, the middle last
    const constraint = Int32Array.from({ length: graph.n }, (_, v) => (v % 10 >= 7 ? 0 : v % 10 < 3 ? 1 : 2));
    const perm = approximateMinimumDegree(graph, { constraint });
    expectPermutation(perm, graph.n);
    for (let k = 1; k < perm.length; k++) expect(constraint[perm[k]]).toBeGreaterThanOrEqual(constraint[perm[k - 1]]);
  });
});

describe('coordinate cuts near the median', () => {
  it('moves the top separator off a heavy median plane', () => {
    const k = 12;
    const { matrix, coordinates } = gridPattern(k, k, k, 1, 'faces');
    const graph = adjacencyOfPencil(matrix);
    // the plane x = 6 (the median cut's separator side) weighs 5 per vertex, every other vertex 1
    const weights = Int32Array.from({ length: graph.n }, (_, v) => (v % k === 5 || v % k === 6 ? 5 : 1));
    const perm = coordinateBisection(graph, coordinates, { weights, leafSize: 50 });
    expectPermutation(perm, graph.n);
    // the last k² pivots are the top separator: one plane, not at x = 5 or 6
    const top = Array.from(perm.subarray(graph.n - k * k), (v) => v % k);
    expect(new Set(top).size).toBe(1);
    expect([5, 6]).not.toContain(top[0]);
  });
});
