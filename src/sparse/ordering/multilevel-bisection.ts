/**
 * Multilevel vertex separators for nested dissection (Karypis & Kumar, "A fast and high quality
 * multilevel scheme for partitioning irregular graphs", SIAM J. Sci. Comput. 20(1), 1998).
 *
 * A part's subgraph (vertex weights = supervariable sizes, edge weights 1 + number of shared
 * neighbours) is coarsened by heavy-edge matching down to about COARSEST_SIZE vertices. On the
 * coarsest graph several bisections are grown greedily by cut gain from different seeds (the
 * first from a pseudo-peripheral vertex) and refined by edge-cut FM (coarse-bisection.ts); each
 * becomes a vertex separator — the lighter of the two boundary layers — refined by
 * vertex-separator FM (separator-refinement.ts); the lightest wins. Parts of LARGE_PART or more
 * vertices take the lightest of RUNS_ON_LARGE_PARTS independent multilevel runs, parts of
 * HUGE_PART or more of RUNS_ON_HUGE_PARTS: the top separators decide most of the fill (on the
 * 40×32×30 hex solid 8 runs at the top gave 3 % less fill than 3). The separator is then carried back level by level (a fine vertex takes its coarse
 * vertex's label, which keeps A and B apart because a fine A–B edge would be a coarse one) and
 * refined again at every level, where the finer graph offers smaller moves.
 *
 * Result of the ordering: perm[k] = vertex eliminated k-th.
 */
import { inducedSubgraph, type AdjacencyGraph } from './adjacency-graph.js';
import { coarsen, shuffled, type CoarseLevel, type WeightedGraph } from './coarsen-graph.js';
import { startSeparatorRuns } from '../parallel-factor.js';
import { nestedDissectionWith, type DissectionOptions } from './dissection-driver.js';
import { partWeights, PART_A, PART_B, PART_S, refineSeparator } from './separator-refinement.js';
import { greedyGrownBisection, refineEdgeCut } from './coarse-bisection.js';

/** Coarsening stops near this many vertices. */
const COARSEST_SIZE = 120;
/** A level that removes less than this share of the vertices ends the coarsening. */
const MIN_REDUCTION = 0.08;
/** Each side may hold at most this share of the part's weight. */
const MAX_SIDE_FRACTION = 0.52;
/** Parts with at least this many vertices get RUNS_ON_LARGE_PARTS independent runs. */
const LARGE_PART = 2000;
const RUNS_ON_LARGE_PARTS = 3;
/** Parts with at least this many vertices (the top few levels) get RUNS_ON_HUGE_PARTS runs. */
const HUGE_PART = 8000;
const RUNS_ON_HUGE_PARTS = 8;
/** Bisections grown on the coarsest graph. */
const INITIAL_TRIES = 6;

export interface MultilevelOptions extends DissectionOptions {
  /** Seed of the matchings' visiting order (default 1): the result is deterministic. */
  seed?: number;
  /** Threads for the independent runs on large parts (default 1; the result does not depend on it). */
  threads?: number;
}

/** Nested dissection ordering with multilevel vertex separators (perm[k] = k-th pivot). */
export function multilevelNestedDissection(graph: AdjacencyGraph, options: MultilevelOptions = {}): Int32Array {
  const local = new Int32Array(graph.n).fill(-1);
  const affinity = sharedNeighbourWeights(graph);
  let calls = 0;
  const split = (vertices: Int32Array, side: Uint8Array): boolean => {
    const sub = inducedSubgraph(graph, vertices, local);
    const g: WeightedGraph = {
      ...sub,
      edgeWeight: subgraphEdgeWeights(graph, affinity, vertices, local),
      vertexWeight: options.weights ? Int32Array.from(vertices, (v) => options.weights![v]) : new Int32Array(sub.n).fill(1),
      totalWeight: 0,
    };
    for (let k = 0; k < g.n; k++) g.totalWeight += g.vertexWeight[k];
    const runs = g.n >= HUGE_PART ? RUNS_ON_HUGE_PARTS : g.n >= LARGE_PART ? RUNS_ON_LARGE_PARTS : 1;
    const seeds = Array.from({ length: runs }, (_, r) => (options.seed ?? 1) + 7919 * (calls + r));
    calls += runs;
    // the later half of the runs on the helper thread, when there is one
    const half = runs >> 1;
    const theirs = runs > 1 ? startSeparatorRuns(g, seeds.slice(half), options.threads ?? 1) : null;
    const wheres: Uint8Array[] = [];
    for (let r = 0; r < (theirs ? half : runs); r++) wheres.push(multilevelSeparator(g, seeds[r]));
    if (theirs) wheres.push(...theirs());
    let bestScore = Infinity;
    // independent multilevel runs on large parts; the lightest balanced separator wins, the
    // earlier run on a tie (a side above the balance bound counts its excess as separator weight)
    for (let r = 0; r < runs; r++) {
      const where = wheres[r];
      const [a, b, s] = partWeights(g, where);
      const score = s + Math.max(0, Math.max(a, b) - MAX_SIDE_FRACTION * g.totalWeight);
      if (score < bestScore) {
        bestScore = score;
        side.set(where);
      }
    }
    return true;
  };
  return nestedDissectionWith(graph, split, options);
}

/**
 * Edge weight 1 + |N(u) ∩ N(v)| for every edge (u, v): on FE patterns, nodes sharing a face
 * share most neighbours, so heavy-edge matching pairs them first and the coarse graphs keep the
 * mesh's layered structure (unit weights would match at random among the 26 neighbours of a
 * hexahedral node). Aligned with graph.adj.
 */
function sharedNeighbourWeights(graph: AdjacencyGraph): Int32Array {
  const { n, ptr, adj } = graph;
  const weight = new Int32Array(adj.length);
  const mark = new Int32Array(n).fill(-1);
  // for each vertex v, mark N(v) and count marked neighbours of each neighbour u
  for (let v = 0; v < n; v++) {
    for (let p = ptr[v]; p < ptr[v + 1]; p++) mark[adj[p]] = v;
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      const u = adj[p];
      let shared = 1;
      for (let q = ptr[u]; q < ptr[u + 1]; q++) if (mark[adj[q]] === v) shared++;
      weight[p] = shared;
    }
  }
  return weight;
}

/** The edge weights of the subgraph induced by vertices, in inducedSubgraph's order. */
function subgraphEdgeWeights(graph: AdjacencyGraph, weight: Int32Array, vertices: Int32Array, local: Int32Array): Int32Array {
  const out: number[] = [];
  for (let k = 0; k < vertices.length; k++) local[vertices[k]] = k;
  // the same scan as inducedSubgraph: neighbours inside the part, in list order
  for (let k = 0; k < vertices.length; k++) {
    const v = vertices[k];
    for (let p = graph.ptr[v]; p < graph.ptr[v + 1]; p++) if (local[graph.adj[p]] >= 0) out.push(weight[p]);
  }
  for (let k = 0; k < vertices.length; k++) local[vertices[k]] = -1;
  return Int32Array.from(out);
}

/** A/B/S labelling (PART_A, PART_B, PART_S) of g's vertices with no edge between A and B. */
export function multilevelSeparator(g: WeightedGraph, seed = 1): Uint8Array {
  const maxSide = MAX_SIDE_FRACTION * g.totalWeight;
  const levels: CoarseLevel[] = [];
  let coarse = g;
  // coarsen while the graph is large and matching still shrinks it
  while (coarse.n > COARSEST_SIZE) {
    const maxVertexWeight = Math.max(1.5 * (g.totalWeight / COARSEST_SIZE), 1);
    const level = coarsen(coarse, seed + levels.length, maxVertexWeight);
    if (level.graph.n > (1 - MIN_REDUCTION) * coarse.n) break;
    levels.push(level);
    coarse = level.graph;
  }
  let where = initialSeparator(coarse, maxSide, seed);
  // carry the separator back to each finer level and refine it there
  for (let l = levels.length - 1; l >= 0; l--) {
    const fine = l === 0 ? g : levels[l - 1].graph;
    const coarseOf = levels[l].coarseOf;
    const projected = new Uint8Array(fine.n);
    for (let v = 0; v < fine.n; v++) projected[v] = where[coarseOf[v]];
    refineSeparator(fine, projected, maxSide);
    where = projected;
  }
  return where;
}

/** The best of INITIAL_TRIES grown bisections, each turned into a refined vertex separator. */
function initialSeparator(g: WeightedGraph, maxSide: number, seed: number): Uint8Array {
  let best: Uint8Array | undefined;
  let bestScore = Infinity;
  const seeds = shuffled(g.n, seed);
  // one grown bisection per seed; the first grows from a pseudo-peripheral vertex
  for (let t = 0; t < Math.min(INITIAL_TRIES, g.n); t++) {
    const start = t === 0 ? farthestFrom(g, seeds[0]) : seeds[t];
    const where = greedyGrownBisection(g, start);
    refineEdgeCut(g, where, maxSide);
    boundaryToSeparator(g, where);
    const [a, b, s] = refineSeparator(g, where, maxSide);
    // a separator leaving a side empty is useless; over-heavy sides are penalised
    const score = a === 0 || b === 0 ? Infinity : s + Math.max(0, Math.max(a, b) - maxSide);
    if (score < bestScore || !best) {
      bestScore = score;
      best = where;
    }
  }
  return best ?? new Uint8Array(g.n);
}

/** Last vertex reached by a breadth-first search from start (an approximate peripheral vertex). */
function farthestFrom(g: WeightedGraph, start: number): number {
  const order = breadthFirstOrder(g, start);
  return order[order.length - 1];
}

/** Vertices in breadth-first order from start, other components appended in turn. */
function breadthFirstOrder(g: WeightedGraph, start: number): Int32Array {
  const { n, ptr, adj } = g;
  const seen = new Uint8Array(n);
  const queue = new Int32Array(n);
  let head = 0;
  let tail = 0;
  let next = 0;
  queue[tail++] = start;
  seen[start] = 1;
  // breadth-first sweep; restart at the next unseen vertex when a component is exhausted
  while (head < n) {
    if (head === tail) {
      while (seen[next]) next++;
      seen[next] = 1;
      queue[tail++] = next;
    }
    const v = queue[head++];
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      if (!seen[adj[p]]) {
        seen[adj[p]] = 1;
        queue[tail++] = adj[p];
      }
    }
  }
  return queue;
}

/** Moves the lighter boundary layer of a two-sided labelling into the separator. */
function boundaryToSeparator(g: WeightedGraph, where: Uint8Array): void {
  const { n, ptr, adj, vertexWeight } = g;
  const onBoundary = new Uint8Array(n);
  const boundaryWeight = [0, 0];
  // a vertex is on the boundary when a neighbour lies on the other side
  for (let v = 0; v < n; v++) {
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      if (where[adj[p]] !== where[v]) {
        onBoundary[v] = 1;
        boundaryWeight[where[v]] += vertexWeight[v];
        break;
      }
    }
  }
  const layer = boundaryWeight[PART_A] <= boundaryWeight[PART_B] ? PART_A : PART_B;
  for (let v = 0; v < n; v++) if (onBoundary[v] && where[v] === layer) where[v] = PART_S;
}

