/**
 * Vertex-separator refinement in the manner of Fiduccia & Mattheyses ("A linear-time heuristic
 * for improving network partitions", DAC 1982), applied to vertex separators as in multilevel
 * nested dissection (Karypis & Kumar, SIAM J. Sci. Comput. 20(1), 1998, §4).
 *
 * A labelling puts each vertex in A, B or the separator S with no edge between A and B.
 * Moving a separator vertex v to A keeps that property only if its B-neighbours N_B(v) join S,
 * so the separator weight changes by −gain_A(v) with
 *   gain_A(v) = w(v) − Σ_{u ∈ N_B(v)} w(u)      (and symmetrically gain_B(v)).
 * One pass repeatedly makes the best-gain move that keeps the receiving side within
 * `maxSideWeight` (or lighter than the other side), locks the moved vertex, and also accepts
 * non-improving moves so it can climb out of local minima; at the end the pass rolls back to the
 * lightest separator it saw (ties: the better balanced). Passes repeat while they improve.
 */
import { GainHeap } from './gain-heap.js';
import type { WeightedGraph } from './coarsen-graph.js';

export const PART_A = 0;
export const PART_B = 1;
export const PART_S = 2;

/** Non-improving moves a pass makes before it gives up. */
const MAX_FRUITLESS_MOVES = 80;

/** Weights of A, B and S for a labelling. */
export function partWeights(g: WeightedGraph, where: Uint8Array): [number, number, number] {
  const w: [number, number, number] = [0, 0, 0];
  for (let v = 0; v < g.n; v++) w[where[v]] += g.vertexWeight[v];
  return w;
}

/** Refines the separator of `where` in place; returns the weights of A, B and S. */
export function refineSeparator(
  g: WeightedGraph,
  where: Uint8Array,
  maxSideWeight: number,
  maxPasses = 8,
): [number, number, number] {
  const { n, ptr, adj, vertexWeight: vw } = g;
  const weight = partWeights(g, where);
  const toSide = [new GainHeap(n), new GainHeap(n)];
  const neighbourWeight = [new Float64Array(n), new Float64Array(n)]; // w(N_A(v)), w(N_B(v)) for v in S
  const locked = new Uint8Array(n);
  const movedVertex = new Int32Array(n);
  const pulledPtr = new Int32Array(n + 1);
  const pulled = new Int32Array(n);

  /** Recomputes v's neighbour weights and its two gains. */
  const enqueue = (v: number): void => {
    let a = 0;
    let b = 0;
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      const s = where[adj[p]];
      if (s === PART_A) a += vw[adj[p]];
      else if (s === PART_B) b += vw[adj[p]];
    }
    neighbourWeight[PART_A][v] = a;
    neighbourWeight[PART_B][v] = b;
    if (locked[v]) return;
    toSide[PART_A].set(v, vw[v] - b);
    toSide[PART_B].set(v, vw[v] - a);
  };
  /** Separator neighbours of y see y's weight enter (sign +1) or leave (−1) side s. */
  const shiftNeighbours = (y: number, s: number, sign: number): void => {
    const other = 1 - s;
    for (let p = ptr[y]; p < ptr[y + 1]; p++) {
      const x = adj[p];
      if (where[x] !== PART_S) continue;
      neighbourWeight[s][x] += sign * vw[y];
      if (!locked[x]) toSide[other].set(x, vw[x] - neighbourWeight[s][x]);
    }
  };
  const feasible = (v: number, t: number): boolean =>
    weight[t] + vw[v] <= maxSideWeight || weight[t] + vw[v] <= weight[1 - t];

  for (let pass = 0; pass < maxPasses; pass++) {
    locked.fill(0);
    toSide[0].clear();
    toSide[1].clear();
    // queue every separator vertex with its two gains
    for (let v = 0; v < n; v++) if (where[v] === PART_S) enqueue(v);
    let moves = 0;
    let bestMoves = 0;
    let bestSep = weight[PART_S];
    let bestImbalance = Math.abs(weight[PART_A] - weight[PART_B]);
    // best feasible move each step, until the queues empty or too many moves were fruitless
    while (moves - bestMoves < MAX_FRUITLESS_MOVES) {
      let t = -1;
      let v = -1;
      for (const s of [PART_A, PART_B]) {
        const c = toSide[s].top();
        if (c < 0 || !feasible(c, s)) continue;
        const better =
          t < 0 ||
          toSide[s].gainOf(c) > toSide[t].gainOf(v) ||
          (toSide[s].gainOf(c) === toSide[t].gainOf(v) && weight[s] < weight[t]);
        if (better) {
          t = s;
          v = c;
        }
      }
      if (t < 0) break;
      const other = 1 - t;
      toSide[0].remove(v);
      toSide[1].remove(v);
      locked[v] = 1;
      movedVertex[moves] = v;
      pulledPtr[moves + 1] = pulledPtr[moves];
      where[v] = t;
      weight[t] += vw[v];
      weight[PART_S] -= vw[v];
      shiftNeighbours(v, t, +1);
      // v's neighbours on the other side join the separator
      for (let p = ptr[v]; p < ptr[v + 1]; p++) {
        const u = adj[p];
        if (where[u] !== other) continue;
        where[u] = PART_S;
        weight[other] -= vw[u];
        weight[PART_S] += vw[u];
        pulled[pulledPtr[moves + 1]++] = u;
        shiftNeighbours(u, other, -1);
        enqueue(u);
      }
      moves++;
      const imbalance = Math.abs(weight[PART_A] - weight[PART_B]);
      if (weight[PART_S] < bestSep || (weight[PART_S] === bestSep && imbalance < bestImbalance)) {
        bestSep = weight[PART_S];
        bestImbalance = imbalance;
        bestMoves = moves;
      }
    }
    // undo the moves after the best state, newest first
    for (let m = moves - 1; m >= bestMoves; m--) {
      const v = movedVertex[m];
      const t = where[v];
      for (let q = pulledPtr[m]; q < pulledPtr[m + 1]; q++) {
        const u = pulled[q];
        where[u] = 1 - t;
        weight[1 - t] += vw[u];
        weight[PART_S] -= vw[u];
      }
      where[v] = PART_S;
      weight[t] -= vw[v];
      weight[PART_S] += vw[v];
    }
    if (bestMoves === 0) break;
  }
  return weight;
}
