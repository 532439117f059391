/**
 * Property tests of the separator refinement and the nested dissection on densely connected
 * graphs (seeded random, no extra dependency): cliques, unions of overlapping cliques, the DOF
 * graph of quadratic tetrahedra (10 nodes × 3 DOFs per element, one 30-clique each), random
 * graphs of high degree, and graphs with isolated vertices and many small components.
 *
 * Properties, from the definitions: a vertex separator labels every vertex A, B or S with no
 * edge between A and B (George, "Nested dissection of a regular finite element mesh", SIAM J.
 * Numer. Anal. 10(2), 1973); the weights returned are those of the labelling; an ordering is a
 * permutation of 0..n−1; the predicted nnz(L) equals an independent symbolic count (Liu,
 * SIAM J. Matrix Anal. Appl. 11(1), 1990, in exact-fill.ts).
 *
 * Dense graphs make a refinement pass pull vertices into the separator more often than there
 * are vertices, and pull a vertex that was already moved (and locked) back in: the cases where
 * the former fixed-size pull log and the rollback that re-read labels gave label 255.
 */
import { describe, expect, it } from 'vitest';
import { inducedSubgraph, type AdjacencyGraph } from '../../../src/sparse/ordering/adjacency-graph.js';
import { partWeights, PART_A, PART_B, PART_S, refineSeparator } from '../../../src/sparse/ordering/separator-refinement.js';
import { multilevelNestedDissection, multilevelSeparator } from '../../../src/sparse/ordering/multilevel-bisection.js';
import { graphNestedDissection } from '../../../src/sparse/ordering/nested-dissection.js';
import { nestedDissectionByLevels, type LevelSplitter } from '../../../src/sparse/ordering/dissection-driver.js';
import { chooseOrdering, patternOfGraph } from '../../../src/sparse/ordering/choose-ordering.js';
import { exactFactorNonzeros } from './exact-fill.js';
import { expectPermutation } from './ordering-helpers.js';
import {
  cliqueGraph,
  edgesBetweenSides,
  manySmallComponents,
  overlappingCliques,
  quadraticTetGraph,
  randomHighDegree,
  seededRandom,
  weightedGraph,
} from './random-graphs.js';

interface Case {
  name: string;
  graph: AdjacencyGraph;
}

/** The seeded cases: a few of each family, sizes drawn from the seed. */
function cases(): Case[] {
  const out: Case[] = [];
  for (let seed = 1; seed <= 4; seed++) {
    const rnd = seededRandom(seed);
    const pick = (lo: number, hi: number): number => lo + Math.floor(rnd() * (hi - lo + 1));
    out.push({ name: `clique #${seed}`, graph: cliqueGraph(pick(20, 90)) });
    const n = pick(120, 300);
    out.push({ name: `overlapping cliques #${seed}`, graph: overlappingCliques(n, pick(15, 50), pick(8, 30), rnd) });
    const m = pick(60, 200);
    out.push({ name: `random high degree #${seed}`, graph: randomHighDegree(m, pick(Math.floor(m / 6), Math.floor(m / 2)), rnd) });
    out.push({ name: `small components and isolated vertices #${seed}`, graph: manySmallComponents(pick(200, 700), rnd) });
  }
  out.push({ name: 'quadratic tetrahedra 1×1×1', graph: quadraticTetGraph(1, 1, 1) });
  out.push({ name: 'quadratic tetrahedra 2×2×1', graph: quadraticTetGraph(2, 2, 1) });
  out.push({ name: 'quadratic tetrahedra 2×2×2', graph: quadraticTetGraph(2, 2, 2) });
  out.push({ name: 'quadratic tetrahedra 4×3×2', graph: quadraticTetGraph(4, 3, 2) });
  return out;
}
const allCases = cases();

/** Every label is A, B or S and no edge joins A and B. */
function expectSeparator(graph: AdjacencyGraph, where: Uint8Array): void {
  let bad = 0;
  for (const s of where) if (s !== PART_A && s !== PART_B && s !== PART_S) bad++;
  expect(bad).toBe(0);
  expect(edgesBetweenSides(graph, where)).toBe(0);
}

/** A valid starting separator: random sides, then A's vertices with a B neighbour join S. */
function randomSeparator(graph: AdjacencyGraph, rnd: () => number): Uint8Array {
  const side = Uint8Array.from({ length: graph.n }, () => (rnd() < 0.5 ? PART_A : PART_B));
  const where = side.slice();
  for (let v = 0; v < graph.n; v++) {
    if (side[v] !== PART_A) continue;
    for (let p = graph.ptr[v]; p < graph.ptr[v + 1]; p++) if (side[graph.adj[p]] === PART_B) where[v] = PART_S;
  }
  return where;
}

describe('separator refinement on densely connected graphs', () => {
  for (const { name, graph } of allCases) {
    it(`keeps a valid separator with consistent weights: ${name}`, () => {
      const rnd = seededRandom(graph.n * 31 + 7);
      // unit and random vertex weights (supervariables of 1..6 DOFs)
      for (const unit of [true, false]) {
        const weights = Int32Array.from({ length: graph.n }, () => (unit ? 1 : 1 + Math.floor(rnd() * 6)));
        const g = weightedGraph(graph, weights);
        for (const fraction of [0.5, 0.52, 0.6, 0.75]) {
          const where = randomSeparator(graph, rnd);
          const total = partWeights(g, where);
          const result = refineSeparator(g, where, fraction * g.totalWeight, 8);
          expectSeparator(graph, where);
          // the returned weights are those of the final labelling, and nothing was lost
          expect(result).toEqual(partWeights(g, where));
          expect(result[0] + result[1] + result[2]).toBe(total[0] + total[1] + total[2]);
        }
      }
    });
  }
});

describe('multilevel separators and the dissection on densely connected graphs', () => {
  for (const { name, graph } of allCases) {
    it(`labels every level's parts validly and orders a permutation: ${name}`, () => {
      const local = new Int32Array(graph.n).fill(-1);
      let splits = 0;
      // the real driver with the real multilevel separator, each level's labels checked
      const splitLevel: LevelSplitter = (parts, depth) =>
        parts.map((vertices, t) => {
          const sub = inducedSubgraph(graph, vertices, local);
          const where = multilevelSeparator(weightedGraph(sub), 1 + 64 * (depth * 97 + t));
          expect(where.length).toBe(vertices.length);
          expectSeparator(sub, where);
          splits++;
          return where;
        });
      const perm = nestedDissectionByLevels(graph, splitLevel, { leafSize: 12 });
      expectPermutation(perm, graph.n);
      if (graph.n > 12) expect(splits).toBeGreaterThan(0);
      // the library's own orderings, weighted and not
      const weights = Int32Array.from({ length: graph.n }, (_, v) => 1 + (v % 3));
      for (const order of [
        multilevelNestedDissection(graph, { leafSize: 8 }),
        multilevelNestedDissection(graph, { leafSize: 8, weights }),
        graphNestedDissection(graph, { leafSize: 8, weights }),
      ]) {
        expectPermutation(order, graph.n);
      }
    });

    it(`chooses a permutation whose predicted fill is exact: ${name}`, () => {
      const choice = chooseOrdering(patternOfGraph(graph), undefined, { ordering: 'auto', leafSize: 16 });
      expectPermutation(choice.perm, graph.n);
      expect(choice.predictedNnzL).toBe(exactFactorNonzeros(graph, choice.perm));
      // the chosen order fills no more than any candidate, natural order included
      for (const c of choice.candidates) expect(choice.predictedNnzL).toBeLessThanOrEqual(c.nnzL);
    });
  }
});
