/**
 * Fill of our orderings against outside references: SciPy/SuperLU fill counts computed offline
 * by make_ordering_reference.py (values in ordering-reference.json), and the envelope formula for
 * the natural order of a grid.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { countFactorNonzeros } from '../../../src/sparse/column-counts.js';
import { adjacencyOfPencil } from '../../../src/sparse/ordering/adjacency-graph.js';
import { expandOrdering, findSupervariables } from '../../../src/sparse/ordering/supervariables.js';
import { approximateMinimumDegree } from '../../../src/sparse/ordering/minimum-degree.js';
import { graphNestedDissection } from '../../../src/sparse/ordering/nested-dissection.js';
import { coordinateBisection } from '../../../src/sparse/ordering/coordinate-bisection.js';
import { exactFactorNonzeros } from './exact-fill.js';
import { gridPattern } from './grid-patterns.js';
import { expectPermutation, naturalPerm } from './ordering-helpers.js';

interface ReferenceCase {
  grid: [number, number, number];
  dofsPerNode: number;
  coupling: 'box' | 'faces';
  n: number;
  natural: number;
  mmd: number;
  rcm: number;
}
const reference = JSON.parse(readFileSync(path.join(import.meta.dirname, 'ordering-reference.json'), 'utf8')) as {
  cases: Record<string, ReferenceCase>;
};

function caseGraph(c: ReferenceCase) {
  const g = gridPattern(c.grid[0], c.grid[1], c.grid[2], c.dofsPerNode, c.coupling);
  return { ...g, graph: adjacencyOfPencil(g.matrix) };
}

describe('exact fill counters agree with SuperLU (make_ordering_reference.py)', () => {
  for (const [name, c] of Object.entries(reference.cases)) {
    it(`natural order of ${name}`, () => {
      const { matrix, graph } = caseGraph(c);
      // reference: scipy.sparse.linalg.splu(permc_spec='NATURAL', diag_pivot_thresh=0) L.nnz
      expect(exactFactorNonzeros(graph, naturalPerm(c.n))).toBe(c.natural);
      expect(countFactorNonzeros(matrix, naturalPerm(c.n))).toBe(c.natural);
    });
  }

  it('natural order of a k×k 5-point grid fills its envelope: nnz(L) = n + k(n − k) + k − 1', () => {
    // the factor of a profile matrix fills exactly its envelope; rows of a k×k grid reach back k
    // (George & Liu, Computer Solution of Large Sparse Positive Definite Systems, 1981, ch. 4)
    const k = 30;
    const n = k * k;
    expect(reference.cases['grid2d-30x30-faces'].natural).toBe(n + k * (n - k) + k - 1);
  });
});

describe('approximate minimum degree', () => {
  for (const [name, c] of Object.entries(reference.cases)) {
    it(`on ${name} fills no more than 1.1× SuperLU's multiple minimum degree and less than RCM`, () => {
      const { graph } = caseGraph(c);
      const sv = findSupervariables(graph);
      const perm = expandOrdering(sv, approximateMinimumDegree(sv.graph, { weights: sv.weight }));
      expectPermutation(perm, c.n);
      const nnz = exactFactorNonzeros(graph, perm);
      // references: SuperLU MMD on A+Aᵀ and scipy reverse Cuthill–McKee (make_ordering_reference.py)
      expect(nnz).toBeLessThanOrEqual(1.1 * c.mmd);
      expect(nnz).toBeLessThan(c.rcm);
      // the same ordering without compressing supervariables first
      const plain = approximateMinimumDegree(graph);
      expectPermutation(plain, c.n);
      expect(exactFactorNonzeros(graph, plain)).toBeLessThanOrEqual(1.1 * c.mmd);
    });
  }

  it('leaves halo vertices out of the ordering and orders every other vertex once', () => {
    const { matrix } = gridPattern(12, 12, 1, 1, 'faces');
    const graph = adjacencyOfPencil(matrix);
    const halo = new Uint8Array(graph.n);
    for (let v = 0; v < 12; v++) halo[v] = halo[graph.n - 1 - v] = 1; // first and last grid rows
    const perm = approximateMinimumDegree(graph, { halo });
    expect(perm.length).toBe(graph.n - 24);
    const seen = new Uint8Array(graph.n);
    for (const v of perm) seen[v]++;
    for (let v = 0; v < graph.n; v++) expect(seen[v]).toBe(halo[v] ? 0 : 1);
  });

  it('orders a graph with isolated and dense vertices', () => {
    // a star (vertex 0 joined to all) plus isolated vertices: the centre is dense and goes last
    const n = 400;
    const { matrix } = gridPattern(n, 1, 1, 1, 'faces');
    const graph = adjacencyOfPencil(matrix);
    const perm = approximateMinimumDegree(graph, { denseThreshold: 1 });
    expectPermutation(perm, n);
  });
});

describe('nested dissection', () => {
  it('graph and coordinate dissection of a 3-DOF 14×14×14-node box fill well below natural order', () => {
    const { matrix, coordinates } = gridPattern(14, 14, 14, 3, 'box');
    const graph = adjacencyOfPencil(matrix);
    const sv = findSupervariables(graph, { coordinates });
    const coords = new Float64Array(3 * sv.count);
    for (let s = 0; s < sv.count; s++) {
      const d = sv.members[sv.memberPtr[s]];
      coords.set(coordinates.subarray(3 * d, 3 * d + 3), 3 * s);
    }
    const nd = expandOrdering(sv, graphNestedDissection(sv.graph, { weights: sv.weight }));
    const cb = expandOrdering(sv, coordinateBisection(sv.graph, coords, { weights: sv.weight }));
    expectPermutation(nd, graph.n);
    expectPermutation(cb, graph.n);
    // natural order fills its envelope: bandwidth 3·(k² + k + 1) DOFs, so nnz(L) ≈ n·3k² (common practice)
    const natural = exactFactorNonzeros(graph, naturalPerm(graph.n));
    expect(natural).toBeGreaterThan(0.8 * graph.n * 3 * 14 * 14);
    expect(exactFactorNonzeros(graph, nd)).toBeLessThan(0.75 * natural);
    expect(exactFactorNonzeros(graph, cb)).toBeLessThan(0.6 * natural);
  });

  it('dissection of a 16×16×16 7-point grid fills far less than natural order', () => {
    const { matrix, coordinates } = gridPattern(16, 16, 16, 1, 'faces');
    const graph = adjacencyOfPencil(matrix);
    const cb = coordinateBisection(graph, coordinates, { leafSize: 30 });
    const nd = graphNestedDissection(graph, { leafSize: 30 });
    expectPermutation(cb, graph.n);
    expectPermutation(nd, graph.n);
    const nnzNatural = exactFactorNonzeros(graph, naturalPerm(graph.n));
    // natural order of a k³ grid has bandwidth k², so nnz(L) ≈ n·k² = k⁵ (envelope, common practice)
    expect(nnzNatural).toBeGreaterThan(0.9 * 16 ** 5);
    // nested dissection on a k³ grid: nnz(L) = O(k⁴) (George 1973); bounds from this test's runs
    expect(exactFactorNonzeros(graph, cb)).toBeLessThan(0.4 * nnzNatural);
    expect(exactFactorNonzeros(graph, nd)).toBeLessThan(0.3 * nnzNatural);
  });
});
