/**
 * Edge bisection of a small (coarsest-level) weighted graph: greedy graph growing, then
 * Fiduccia–Mattheyses edge-cut refinement.
 *
 * Growing (Karypis & Kumar, SIAM J. Sci. Comput. 20(1), 1998, §3.2): starting from a seed, A
 * repeatedly takes the boundary vertex whose move lowers the cut most, gain(v) =
 * w(edges from v into A) − w(edges from v to the rest), until A holds half the weight. The front
 * stays flat rather than ball-shaped, which a breadth-first growth cannot ensure on 27-point
 * patterns (their breadth-first levels are cube shells).
 * Refinement (Fiduccia & Mattheyses, DAC 1982): passes of best-gain single-vertex moves under a
 * balance bound, each vertex moved once per pass, rolled back to the lightest cut seen.
 * The coarsest graph has a few hundred vertices, so gains are found by plain scans.
 */
import type { WeightedGraph } from './coarsen-graph.js';
import { PART_A, PART_B } from './separator-refinement.js';

/** Non-improving moves an edge-refinement pass makes before it gives up. */
const MAX_FRUITLESS_MOVES = 40;

/** Gain of moving each vertex to the other side: cut edges it removes minus those it creates. */
function moveGains(g: WeightedGraph, where: Uint8Array): Float64Array {
  const gain = new Float64Array(g.n);
  // external minus internal edge weight of every vertex
  for (let v = 0; v < g.n; v++) {
    for (let p = g.ptr[v]; p < g.ptr[v + 1]; p++) gain[v] += where[g.adj[p]] === where[v] ? -g.edgeWeight[p] : g.edgeWeight[p];
  }
  return gain;
}

/** Moves v to the other side and updates the gains of v and its neighbours. */
function flipVertex(g: WeightedGraph, where: Uint8Array, gain: Float64Array, v: number): void {
  where[v] = 1 - where[v];
  gain[v] = -gain[v];
  // an edge to v turns internal (gain falls) or external (gain rises) for each neighbour
  for (let p = g.ptr[v]; p < g.ptr[v + 1]; p++) {
    const u = g.adj[p];
    gain[u] += where[u] === where[v] ? -2 * g.edgeWeight[p] : 2 * g.edgeWeight[p];
  }
}

/** A grown by best cut gain from seed until it holds half the weight; B the rest. */
export function greedyGrownBisection(g: WeightedGraph, seed: number): Uint8Array {
  const { n, ptr, adj, vertexWeight } = g;
  const where = new Uint8Array(n).fill(PART_B);
  const gain = moveGains(g, where);
  const frontier = new Uint8Array(n);
  let next = seed;
  let grown = 0;
  let firstB = 0; // no vertex below firstB is in B (growth only moves vertices from B to A)
  // add the frontier vertex of best gain (any B vertex when the frontier is empty)
  while (next >= 0 && 2 * grown < g.totalWeight) {
    flipVertex(g, where, gain, next);
    grown += vertexWeight[next];
    for (let p = ptr[next]; p < ptr[next + 1]; p++) frontier[adj[p]] = 1;
    next = -1;
    for (let v = 0; v < n; v++) {
      if (where[v] === PART_B && frontier[v] && (next < 0 || gain[v] > gain[next])) next = v;
    }
    if (next >= 0) continue;
    // frontier exhausted (the grown part is a whole component): restart at the first B vertex
    while (firstB < n && where[firstB] !== PART_B) firstB++;
    next = firstB < n ? firstB : -1;
  }
  return where;
}

/** FM passes on the edge cut, each side kept within maxSide; returns the final cut weight. */
export function refineEdgeCut(g: WeightedGraph, where: Uint8Array, maxSide: number, maxPasses = 6): number {
  const { n, vertexWeight } = g;
  const weight = [0, 0];
  for (let v = 0; v < n; v++) weight[where[v]] += vertexWeight[v];
  const gain = moveGains(g, where);
  let cut = 0;
  for (let v = 0; v < n; v++) if (where[v] === PART_A) cut += (gain[v] + degreeWeight(g, v)) / 2;
  const locked = new Uint8Array(n);
  // Move log of one pass: every move locks its vertex, so a pass makes at most n moves. A vertex
  // has two sides and is moved at most once per pass, so at rollback where[v] is exactly the side
  // its move took it to and flipping it back restores the state before the move (nothing else
  // changes side in a pass: edge moves pull no neighbours along).
  const moved = new Int32Array(n);
  for (let pass = 0; pass < maxPasses; pass++) {
    locked.fill(0);
    let moves = 0;
    let bestMoves = 0;
    let current = cut;
    let best = cut;
    // move the unlocked vertex of best gain whose side change keeps the balance
    while (moves - bestMoves < MAX_FRUITLESS_MOVES) {
      let v = -1;
      for (let u = 0; u < n; u++) {
        const to = 1 - where[u];
        if (locked[u] || (weight[to] + vertexWeight[u] > maxSide && weight[to] + vertexWeight[u] > weight[where[u]])) continue;
        if (v < 0 || gain[u] > gain[v]) v = u;
      }
      if (v < 0) break;
      current -= gain[v];
      weight[where[v]] -= vertexWeight[v];
      flipVertex(g, where, gain, v);
      weight[where[v]] += vertexWeight[v];
      locked[v] = 1;
      if (moves >= n) throw new Error('edge-cut refinement: more moves than vertices in one pass');
      moved[moves++] = v;
      if (current < best) {
        best = current;
        bestMoves = moves;
      }
    }
    // roll back to the best cut of the pass
    for (let m = moves - 1; m >= bestMoves; m--) {
      const v = moved[m];
      weight[where[v]] -= vertexWeight[v];
      flipVertex(g, where, gain, v);
      weight[where[v]] += vertexWeight[v];
    }
    cut = best;
    if (bestMoves === 0) break;
  }
  return cut;
}

/** Total weight of v's edges. */
function degreeWeight(g: WeightedGraph, v: number): number {
  let c = 0;
  for (let p = g.ptr[v]; p < g.ptr[v + 1]; p++) c += g.edgeWeight[p];
  return c;
}
