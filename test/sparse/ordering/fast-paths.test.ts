/**
 * The faster paths of the ordering phase against slower references: the fill count read off the
 * adjacency graph (fill-count.ts) against Liu's row-by-row count (exact-fill.ts) and the generic
 * column counts; the level-by-level dissection driver against a plain recursive one; coordinate
 * bisection's edge-free boundary test against separatorFromTwoSides; the shared-level runs of
 * the multilevel separator (same separator whatever ran before).
 */
import { describe, expect, it } from 'vitest';
import { adjacencyOfPencil, type AdjacencyGraph } from '../../../src/sparse/ordering/adjacency-graph.js';
import { countFactorNonzeros } from '../../../src/sparse/column-counts.js';
import { patternOfGraph } from '../../../src/sparse/ordering/choose-ordering.js';
import { factorNonzerosOfGraph } from '../../../src/sparse/ordering/fill-count.js';
import { approximateMinimumDegree } from '../../../src/sparse/ordering/minimum-degree.js';
import { coordinateBisection } from '../../../src/sparse/ordering/coordinate-bisection.js';
import { graphNestedDissection } from '../../../src/sparse/ordering/nested-dissection.js';
import { multilevelNestedDissection } from '../../../src/sparse/ordering/multilevel-bisection.js';
import {
  nestedDissectionWith,
  separatorFromTwoSides,
  SEPARATOR,
  SIDE_A,
  SIDE_B,
  type PartSplitter,
} from '../../../src/sparse/ordering/dissection-driver.js';
import { inducedSubgraph } from '../../../src/sparse/ordering/adjacency-graph.js';
import { expandOrdering, findSupervariables } from '../../../src/sparse/ordering/supervariables.js';
import { exactFactorNonzeros } from './exact-fill.js';
import { gridPattern } from './grid-patterns.js';
import { expectPermutation, naturalPerm } from './ordering-helpers.js';

/** Deterministic pseudo-random permutation (LCG-driven Fisher–Yates). */
function randomPerm(n: number, seed: number): Int32Array {
  const p = naturalPerm(n);
  let s = seed >>> 0;
  for (let k = n - 1; k > 0; k--) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    const r = s % (k + 1);
    const t = p[k];
    p[k] = p[r];
    p[r] = t;
  }
  return p;
}

/** A graph with dropped entries: every edge (u, v) with (u + 2v) % 7 = 0 removed. */
function thinned(graph: AdjacencyGraph): AdjacencyGraph {
  const keep = (u: number, v: number): boolean => (Math.min(u, v) + 2 * Math.max(u, v)) % 7 !== 0;
  const ptr = new Int32Array(graph.n + 1);
  const adj: number[] = [];
  for (let v = 0; v < graph.n; v++) {
    for (let p = graph.ptr[v]; p < graph.ptr[v + 1]; p++) if (keep(v, graph.adj[p])) adj.push(graph.adj[p]);
    ptr[v + 1] = adj.length;
  }
  return { n: graph.n, ptr, adj: Int32Array.from(adj) };
}

describe('fill count straight off the adjacency graph', () => {
  const cases: [string, AdjacencyGraph][] = [
    ['3-DOF 6×5×4 hex pattern', adjacencyOfPencil(gridPattern(6, 5, 4, 3, 'box').matrix)],
    ['the same with dropped entries', thinned(adjacencyOfPencil(gridPattern(6, 5, 4, 3, 'box').matrix))],
    ['9×9 five-point grid', adjacencyOfPencil(gridPattern(9, 9, 1, 1, 'faces').matrix)],
  ];
  for (const [name, graph] of cases) {
    it(`equals Liu's row count and the column counts for natural, random and minimum-degree orders: ${name}`, () => {
      const perms = [naturalPerm(graph.n), randomPerm(graph.n, 7), randomPerm(graph.n, 99), approximateMinimumDegree(graph)];
      for (const perm of perms) {
        const fast = factorNonzerosOfGraph(graph, perm);
        expect(fast).toBe(exactFactorNonzeros(graph, perm));
        expect(fast).toBe(countFactorNonzeros(patternOfGraph(graph), perm));
      }
    });
  }

  it('counts a graph with isolated vertices and several components', () => {
    // two disjoint paths 0-1-2 and 3-4, vertex 5 alone
    const graph: AdjacencyGraph = { n: 6, ptr: Int32Array.from([0, 1, 3, 4, 5, 6, 6]), adj: Int32Array.from([1, 0, 2, 1, 4, 3]) };
    for (const perm of [naturalPerm(6), Int32Array.from([5, 1, 3, 0, 4, 2])]) {
      expect(factorNonzerosOfGraph(graph, perm)).toBe(exactFactorNonzeros(graph, perm));
    }
  });
});

/** The former driver: recursive, A's subtree, B's subtree, then the separator, leaves by AMD with halo. */
function recursiveDissection(graph: AdjacencyGraph, split: PartSplitter, leafSize: number): Int32Array {
  const perm = new Int32Array(graph.n);
  const local = new Int32Array(graph.n).fill(-1);
  let out = 0;
  const leaf = (vertices: Int32Array): void => {
    const inPart = new Set(vertices);
    const halo: number[] = [];
    for (const v of vertices) {
      for (let p = graph.ptr[v]; p < graph.ptr[v + 1]; p++) {
        const u = graph.adj[p];
        if (!inPart.has(u)) {
          inPart.add(u);
          halo.push(u);
        }
      }
    }
    const withHalo = Int32Array.from([...vertices, ...halo]);
    const sub = inducedSubgraph(graph, withHalo, local);
    const order = approximateMinimumDegree(sub, { halo: new Uint8Array(withHalo.length).fill(1, vertices.length) });
    for (const k of order) perm[out++] = vertices[k];
  };
  const part = (vertices: Int32Array, depth: number): void => {
    const side = new Uint8Array(vertices.length);
    if (vertices.length <= leafSize || depth > 64 || !split(vertices, side)) return leaf(vertices);
    const sides = [SIDE_A, SIDE_B, SEPARATOR].map((s) => vertices.filter((_, k) => side[k] === s));
    if (sides[0].length === 0 || sides[1].length === 0) return leaf(vertices);
    part(sides[0], depth + 1);
    part(sides[1], depth + 1);
    for (const v of sides[2]) perm[out++] = v;
  };
  part(naturalPerm(graph.n), 0);
  return perm;
}

describe('level-by-level dissection driver', () => {
  it('emits exactly the order of a recursive dissection with the same splits', () => {
    const { matrix, coordinates } = gridPattern(12, 10, 9, 1, 'box');
    const graph = adjacencyOfPencil(matrix);
    const where = new Uint8Array(graph.n).fill(255);
    // split at the median of the widest axis, the lighter boundary becoming the separator
    const split: PartSplitter = (vertices, side) => {
      let best = 0;
      let extent = -1;
      for (let a = 0; a < 3; a++) {
        const xs = Array.from(vertices, (v) => coordinates[3 * v + a]);
        const e = Math.max(...xs) - Math.min(...xs);
        if (e > extent) [best, extent] = [a, e];
      }
      const sorted = Array.from(vertices, (v) => coordinates[3 * v + best]).sort((x, y) => x - y);
      const cut = sorted[sorted.length >> 1];
      for (let k = 0; k < vertices.length; k++) side[k] = coordinates[3 * vertices[k] + best] < cut ? SIDE_A : SIDE_B;
      separatorFromTwoSides(graph, undefined, vertices, side, where);
      for (const v of vertices) where[v] = 255;
      return true;
    };
    const byLevels = nestedDissectionWith(graph, split, { leafSize: 20 });
    expectPermutation(byLevels, graph.n);
    expect(Array.from(byLevels)).toEqual(Array.from(recursiveDissection(graph, split, 20)));
  });
});

describe('coordinate bisection boundary from neighbour coordinate ranges', () => {
  it('orders exactly as cuts turned into separators by separatorFromTwoSides', () => {
    const { matrix, coordinates } = gridPattern(9, 8, 7, 3, 'box');
    const dofGraph = thinned(adjacencyOfPencil(matrix));
    const sv = findSupervariables(dofGraph, { coordinates });
    const graph = sv.graph;
    const coords = new Float64Array(3 * sv.count);
    for (let s = 0; s < sv.count; s++) coords.set(coordinates.subarray(3 * sv.members[sv.memberPtr[s]], 3 * sv.members[sv.memberPtr[s]] + 3), 3 * s);
    // the former splitter: every candidate cut through separatorFromTwoSides
    const where = new Uint8Array(graph.n).fill(255);
    const quantiles = [0.5, 0.47, 0.53, 0.44, 0.56];
    const split: PartSplitter = (vertices, side) => {
      const m = vertices.length;
      let bestScore = Infinity;
      for (let axis = 0; axis < 3; axis++) {
        const keys = Float64Array.from(vertices, (v) => coords[3 * v + axis]);
        const sorted = Float64Array.from(keys).sort();
        const tried = new Set<number>();
        for (const q of quantiles) {
          if (sorted[0] === sorted[m - 1]) continue;
          let k = Math.min(m - 1, Math.floor(q * m));
          const at = sorted[k];
          let cut = at;
          if (!(at > sorted[0])) {
            while (sorted[k] === at) k++;
            cut = sorted[k];
          }
          if (tried.has(cut)) continue;
          tried.add(cut);
          const trial = Uint8Array.from(keys, (x) => (x < cut ? SIDE_A : SIDE_B));
          const w = separatorFromTwoSides(graph, sv.weight, vertices, trial, where);
          for (const v of vertices) where[v] = 255;
          if (w === 0 && q !== 0.5) continue;
          const score = w * (1 + 4 * Math.abs(q - 0.5));
          if (score < bestScore) {
            bestScore = score;
            side.set(trial);
          }
        }
      }
      return bestScore < Infinity;
    };
    const reference = nestedDissectionWith(graph, split, { weights: sv.weight, leafSize: 16 });
    const fast = coordinateBisection(graph, coords, { weights: sv.weight, leafSize: 16 });
    expect(Array.from(fast)).toEqual(Array.from(reference));
  });
});

describe('multilevel dissection with shared coarsening', () => {
  it('orders a 3-DOF hex pattern deterministically, as a permutation, with less fill than level structures', () => {
    const { matrix, coordinates } = gridPattern(16, 15, 14, 3, 'box');
    const graph = adjacencyOfPencil(matrix);
    const sv = findSupervariables(graph, { coordinates });
    // 3360 nodes: the root and its sides have several runs sharing their first levels
    const a = multilevelNestedDissection(sv.graph, { weights: sv.weight });
    const b = multilevelNestedDissection(sv.graph, { weights: sv.weight });
    expect(Array.from(a)).toEqual(Array.from(b));
    const ml = expandOrdering(sv, a);
    expectPermutation(ml, graph.n);
    const levels = expandOrdering(sv, graphNestedDissection(sv.graph, { weights: sv.weight }));
    expect(factorNonzerosOfGraph(graph, ml)).toBeLessThan(factorNonzerosOfGraph(graph, levels));
  });
});
