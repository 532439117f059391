import { describe, expect, it } from 'vitest';
import type { AdjacencyGraph } from '../../../src/sparse/ordering/adjacency-graph.js';
import { approximateMinimumDegree } from '../../../src/sparse/ordering/minimum-degree.js';
import { graphNestedDissection } from '../../../src/sparse/ordering/nested-dissection.js';
import { coordinateBisection } from '../../../src/sparse/ordering/coordinate-bisection.js';
import { adjacencyOfPencil } from '../../../src/sparse/ordering/adjacency-graph.js';
import { gridPattern } from './grid-patterns.js';
import { exactFactorNonzeros } from './exact-fill.js';
import { expectPermutation } from './ordering-helpers.js';

const empty: AdjacencyGraph = { n: 0, ptr: new Int32Array(1), adj: new Int32Array(0) };
const single: AdjacencyGraph = { n: 1, ptr: new Int32Array(2), adj: new Int32Array(0) };

/** k disjoint copies of a graph. */
function copies(g: AdjacencyGraph, k: number): AdjacencyGraph {
  const n = g.n * k;
  const ptr = new Int32Array(n + 1);
  const adj = new Int32Array(g.ptr[g.n] * k);
  for (let c = 0, t = 0; c < k; c++) {
    for (let v = 0; v < g.n; v++) {
      for (let p = g.ptr[v]; p < g.ptr[v + 1]; p++) adj[t++] = g.adj[p] + c * g.n;
      ptr[c * g.n + v + 1] = t;
    }
  }
  return { n, ptr, adj };
}

describe('orderings on degenerate graphs', () => {
  it('order empty and one-vertex graphs', () => {
    for (const g of [empty, single]) {
      expectPermutation(approximateMinimumDegree(g), g.n);
      expectPermutation(graphNestedDissection(g), g.n);
      expectPermutation(coordinateBisection(g, new Float64Array(3 * g.n)), g.n);
    }
  });

  it('order a graph of many disconnected pieces with no fill between them', () => {
    const { matrix, coordinates } = gridPattern(6, 6, 1, 1, 'faces');
    const piece = adjacencyOfPencil(matrix);
    const g = copies(piece, 12);
    const coords = new Float64Array(3 * g.n);
    for (let c = 0; c < 12; c++) coords.set(coordinates, 3 * c * piece.n); // pieces on top of each other
    const ownFill = exactFactorNonzeros(piece, approximateMinimumDegree(piece));
    for (const perm of [graphNestedDissection(g, { leafSize: 10 }), coordinateBisection(g, coords, { leafSize: 10 }), approximateMinimumDegree(g)]) {
      expectPermutation(perm, g.n);
      // each piece fills like itself alone at worst a little more (different inner order)
      expect(exactFactorNonzeros(g, perm)).toBeLessThan(12 * 1.6 * ownFill);
    }
  });

  it('falls back to minimum degree when all coordinates coincide', () => {
    const { matrix } = gridPattern(10, 10, 1, 1, 'faces');
    const g = adjacencyOfPencil(matrix);
    const perm = coordinateBisection(g, new Float64Array(3 * g.n), { leafSize: 10 });
    expectPermutation(perm, g.n);
    expect(exactFactorNonzeros(g, perm)).toBe(exactFactorNonzeros(g, approximateMinimumDegree(g)));
  });
});
