/**
 * Fill-reducing ordering of the pencil (K, M): build the adjacency graph of the union pattern,
 * compress DOFs of one node into supervariables (by node label, else by coordinates, else by
 * pattern), order the compressed graph, expand.
 *
 * With `ordering: 'auto'` the cheap candidates (natural, approximate minimum degree, and
 * coordinate bisection when coordinates are given) are computed first, then the graph nested
 * dissection with multilevel separators unless the factorization is too small for it to pay
 * (below), and the one with the smallest predicted nnz(L) — exact symbolic count, no numeric
 * work, read straight off the DOF graph (fill-count.ts) — wins.
 * The factor's storage and, roughly, the flop count (Σ colcount²) follow nnz(L), so the
 * prediction is the cost model.
 *
 * The graph dissection is by far the dearest candidate (10–30× minimum degree), and on
 * mid-size models it costs more than it can save: on the 26k-DOF quadratic-tet bracket it took
 * 2.1 s for 9 % less fill (20 % fewer flops) than minimum degree, about a factorization's time
 * (0.6–0.9 s) it could save over the two factorizations of a solve; on the 10k and 31k hex bars
 * coordinate bisection came within 0.2 % of it (measured 2026-12-05, test/bench/modes-bench.ts
 * models). So it runs only when the best cheap candidate's factorization needs at least
 * DISSECTION_MIN_FLOPS; there (the 60k frame, 4e10 flops and 30 % less fill than minimum
 * degree; the 100k tet, 5e10 and 19 % less than coordinate bisection) it pays.
 *
 * Convention: perm[k] = original DOF index of the k-th pivot (P A Pᵀ has row k = row perm[k] of A).
 */
import type { SymmetricCsc } from '../csc.js';
import type { OrderingCandidate, OrderingName } from '../factor-types.js';
import { adjacencyOfPencil, type AdjacencyGraph } from './adjacency-graph.js';
import { expandOrdering, findSupervariables, type Supervariables } from './supervariables.js';
import { approximateMinimumDegree } from './minimum-degree.js';
import { multilevelNestedDissection } from './multilevel-bisection.js';
import { graphNestedDissection } from './nested-dissection.js';
import { coordinateBisection } from './coordinate-bisection.js';
import { factorCountsOfGraph } from './fill-count.js';
import type { FactorStructureCounts } from '../column-counts.js';

export interface ChooseOrderingOptions {
  ordering?: 'auto' | OrderingName;
  /** Node coordinates per DOF, interleaved x, y, z (length 3n); enables coordinate bisection. */
  coordinates?: Float64Array;
  /** Node of each DOF (DofMap.node): the DOFs of one node are ordered together. */
  nodeOfDof?: Int32Array;
  /** nnz(L) of P A Pᵀ for a permutation; default: exact count on the union pattern of K and M. */
  predictNnzL?: (perm: Int32Array) => number;
  /** Parts of at most this many supervariables end the dissection (default 64). */
  leafSize?: number;
  /** Threads the orderings may use (default 1; with N ≥ 2 the multilevel dissection deals its repeated runs to N − 1 helper threads, with the same result). */
  threads?: number;
  /**
   * With 'auto': compute the graph nested dissection only when the best cheap candidate's
   * factorization needs at least this many flops (default DISSECTION_MIN_FLOPS; 0 always).
   */
  dissectionMinFlops?: number;
}

/**
 * Factorization flops below which 'auto' does not compute the graph dissection (our choice, see
 * the module comment): about 2 s of factorization on this project's 2-core bench machine, where
 * a fifth fewer flops in each of a solve's two factorizations starts to repay the dissection's
 * 1–3 s. The 31k hex bar's factorization needs 1.3e10, the 60k frame's 4e10.
 */
export const DISSECTION_MIN_FLOPS = 2e10;

export interface OrderingChoice {
  /** perm[k] = original DOF of the k-th pivot. */
  perm: Int32Array;
  name: OrderingName;
  predictedNnzL: number;
  candidates: OrderingCandidate[];
  /** Number of supervariables the DOFs were compressed into. */
  supervariables: number;
  /** Time to build the adjacency graph and find supervariables, ms. */
  graphMs: number;
  /** Why 'auto' left the graph nested dissection out, when it did. */
  skipped?: string;
  /** Elimination tree, postorder and column counts of the union pattern under `perm` (absent with a caller's predictNnzL). */
  tree?: FactorStructureCounts;
}

/** The union pattern of K and M as a lower-storage SymmetricCsc with unit values (for counting). */
export function patternOfGraph(graph: AdjacencyGraph): SymmetricCsc {
  const { n, ptr, adj } = graph;
  const colPtr = new Int32Array(n + 1);
  // column j: the diagonal and the neighbours below it (lists are sorted)
  for (let j = 0; j < n; j++) {
    let c = 1;
    for (let p = ptr[j]; p < ptr[j + 1]; p++) if (adj[p] > j) c++;
    colPtr[j + 1] = colPtr[j] + c;
  }
  const rowIdx = new Int32Array(colPtr[n]);
  for (let j = 0, t = 0; j < n; j++) {
    rowIdx[t++] = j;
    for (let p = ptr[j]; p < ptr[j + 1]; p++) if (adj[p] > j) rowIdx[t++] = adj[p];
  }
  return { n, colPtr, rowIdx, values: new Float64Array(rowIdx.length).fill(1) };
}

/** Coordinates of each supervariable: those of its first member DOF. */
function supervariableCoordinates(sv: Supervariables, coordinates: Float64Array): Float64Array {
  const out = new Float64Array(3 * sv.count);
  for (let s = 0; s < sv.count; s++) {
    const d = sv.members[sv.memberPtr[s]];
    out[3 * s] = coordinates[3 * d];
    out[3 * s + 1] = coordinates[3 * d + 1];
    out[3 * s + 2] = coordinates[3 * d + 2];
  }
  return out;
}

function naturalOrder(n: number): Int32Array {
  return Int32Array.from({ length: n }, (_, k) => k);
}

/**
 * Graph nested dissection: multilevel separators and breadth-first level structures, the one of
 * less predicted fill. Multilevel wins on hexahedral solids (4.19 vs 2.97 × less fill than
 * natural order on the 40×32×30 bench solid), level structures on beam lattices, whose
 * breadth-first levels are already flat planes (5.90 vs 4.32 on the 22×22×21 bench frame).
 */
function bestGraphDissection(sv: Supervariables, options: ChooseOrderingOptions, predict: (perm: Int32Array) => number): Int32Array {
  const weights = sv.weight;
  const leafSize = options.leafSize;
  const multilevel = expandOrdering(sv, multilevelNestedDissection(sv.graph, { weights, leafSize, threads: options.threads }));
  const levels = expandOrdering(sv, graphNestedDissection(sv.graph, { weights, leafSize }));
  return predict(levels) < predict(multilevel) ? levels : multilevel;
}

/** Computes one ordering of the compressed graph and expands it to DOFs. */
function orderingOf(
  name: OrderingName,
  sv: Supervariables,
  options: ChooseOrderingOptions,
  predict: (perm: Int32Array) => number,
): Int32Array {
  const weights = sv.weight;
  const leafSize = options.leafSize;
  switch (name) {
    case 'natural':
      return naturalOrder(sv.members.length);
    case 'amd':
      return expandOrdering(sv, approximateMinimumDegree(sv.graph, { weights }));
    case 'nested-dissection':
      return bestGraphDissection(sv, options, predict);
    case 'coordinate-bisection': {
      const coords = supervariableCoordinates(sv, options.coordinates!);
      return expandOrdering(sv, coordinateBisection(sv.graph, coords, { weights, leafSize }));
    }
  }
}

/** Fill-reducing ordering of K (and M), chosen by predicted nnz(L) when `ordering` is 'auto'. */
export function chooseOrdering(
  stiffness: SymmetricCsc,
  mass: SymmetricCsc | undefined,
  options: ChooseOrderingOptions = {},
): OrderingChoice {
  const n = stiffness.n;
  const requested = options.ordering ?? 'auto';
  if (options.coordinates && options.coordinates.length !== 3 * n) {
    throw new RangeError(`coordinates hold ${options.coordinates.length} values for ${n} DOFs (need 3 each)`);
  }
  if (requested === 'coordinate-bisection' && !options.coordinates) {
    throw new RangeError('coordinate bisection needs node coordinates (a DOF map)');
  }
  const t0 = performance.now();
  const graph = adjacencyOfPencil(stiffness, mass);
  const sv = findSupervariables(graph, { nodeOfVertex: options.nodeOfDof, coordinates: options.coordinates });
  const graphMs = performance.now() - t0;
  // exact count straight off the DOF graph (fill-count.ts): no permuted copy of the pattern
  const counted = new Map<Int32Array, { nnzL: number; flops: number; tree?: FactorStructureCounts }>();
  // each permutation is counted once, however often it is compared (flops unknown with a caller's predictor)
  const counts = (perm: Int32Array): { nnzL: number; flops: number; tree?: FactorStructureCounts } => {
    if (!counted.has(perm)) counted.set(perm, options.predictNnzL ? { nnzL: options.predictNnzL(perm), flops: Infinity } : factorCountsOfGraph(graph, perm));
    return counted.get(perm)!;
  };
  const predict = (perm: Int32Array): number => counts(perm).nnzL;
  const cheap: OrderingName[] = ['natural', 'amd', ...(options.coordinates ? (['coordinate-bisection'] as const) : [])];
  const candidates: OrderingCandidate[] = [];
  let best: { perm: Int32Array; name: OrderingName; nnzL: number } | undefined;
  const tryOrdering = (name: OrderingName): void => {
    const t = performance.now();
    const perm = orderingOf(name, sv, options, predict);
    const ms = performance.now() - t;
    const nnzL = predict(perm);
    candidates.push({ name, nnzL, ms });
    if (!best || nnzL < best.nnzL) best = { perm, name, nnzL };
  };
  let skipped: string | undefined;
  if (requested !== 'auto') tryOrdering(requested);
  else {
    // the cheap candidates, then the dissection when the factorization is large enough to repay it
    for (const name of cheap) tryOrdering(name);
    const flops = counts(best!.perm).flops;
    const minFlops = options.dissectionMinFlops ?? DISSECTION_MIN_FLOPS;
    if (flops >= minFlops) tryOrdering('nested-dissection');
    else skipped = `nested dissection not computed: ${best!.name} needs ${flops.toExponential(2)} flops, below ${minFlops.toExponential(0)}`;
  }
  const tree = counts(best!.perm).tree;
  return {
    perm: best!.perm,
    name: best!.name,
    predictedNnzL: best!.nnzL,
    candidates,
    supervariables: sv.count,
    graphMs,
    ...(skipped ? { skipped } : {}),
    ...(tree ? { tree } : {}),
  };
}
