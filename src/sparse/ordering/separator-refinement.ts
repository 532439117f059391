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
  // a label other than A, B or S (such as 255 from a bad rollback) must not vanish silently
  for (let v = 0; v < g.n; v++) {
    if (where[v] > PART_S) throw new Error(`separator refinement: vertex ${v} has side label ${where[v]}`);
    w[where[v]] += g.vertexWeight[v];
  }
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
  const toA = new GainHeap(n); // separator vertices by gain of a move to A
  const toB = new GainHeap(n);
  const weightInA = new Float64Array(n); // w(N_A(v)) for v in S
  const weightInB = new Float64Array(n); // w(N_B(v)) for v in S
  const locked = new Uint8Array(n);
  // Move log of one pass. Every move locks its vertex, so a pass makes at most n moves; a move of
  // v pulls at most deg(v) vertices into S, and as the moved vertices are distinct the pulls of a
  // pass number at most Σ deg = adj.length. A vertex can be pulled more than once in a pass (it
  // may be moved out of S again, and even a locked vertex is pulled when a neighbour moves to the
  // other side), so the side a vertex was moved to is logged, never re-read at rollback.
  const movedVertex = new Int32Array(n);
  const movedTo = new Uint8Array(n);
  const pulledPtr = new Int32Array(n + 1);
  const pulled = new Int32Array(Math.max(1, adj.length));

  /** Recomputes v's neighbour weights and its two gains. */
  const enqueue = (v: number): void => {
    let a = 0;
    let b = 0;
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      const u = adj[p];
      const s = where[u];
      if (s === PART_A) a += vw[u];
      else if (s === PART_B) b += vw[u];
    }
    weightInA[v] = a;
    weightInB[v] = b;
    if (locked[v]) return;
    toA.set(v, vw[v] - b);
    toB.set(v, vw[v] - a);
  };
  /** Separator neighbours of y see y's weight enter (delta = +w(y)) or leave (−w(y)) side A. */
  const shiftA = (y: number, delta: number): void => {
    for (let p = ptr[y]; p < ptr[y + 1]; p++) {
      const x = adj[p];
      if (where[x] !== PART_S) continue;
      const w = (weightInA[x] += delta);
      if (!locked[x]) toB.set(x, vw[x] - w);
    }
  };
  /** The same for side B. */
  const shiftB = (y: number, delta: number): void => {
    for (let p = ptr[y]; p < ptr[y + 1]; p++) {
      const x = adj[p];
      if (where[x] !== PART_S) continue;
      const w = (weightInB[x] += delta);
      if (!locked[x]) toA.set(x, vw[x] - w);
    }
  };

  for (let pass = 0; pass < maxPasses; pass++) {
    locked.fill(0);
    toA.clear();
    toB.clear();
    // queue every separator vertex with its two gains
    for (let v = 0; v < n; v++) if (where[v] === PART_S) enqueue(v);
    let moves = 0;
    let bestMoves = 0;
    let bestSep = weight[PART_S];
    let bestImbalance = Math.abs(weight[PART_A] - weight[PART_B]);
    // best feasible move each step, until the queues empty or too many moves were fruitless
    while (moves - bestMoves < MAX_FRUITLESS_MOVES) {
      // the top of each queue, if its side can take it (within the bound, or lighter than the other)
      const a = toA.top();
      const b = toB.top();
      const okA = a >= 0 && (weight[PART_A] + vw[a] <= maxSideWeight || weight[PART_A] + vw[a] <= weight[PART_B]);
      const okB = b >= 0 && (weight[PART_B] + vw[b] <= maxSideWeight || weight[PART_B] + vw[b] <= weight[PART_A]);
      if (!okA && !okB) break;
      // the larger gain wins; on equal gains the lighter side
      const t = !okB || (okA && (toA.gainOf(a) > toB.gainOf(b) || (toA.gainOf(a) === toB.gainOf(b) && weight[PART_A] <= weight[PART_B]))) ? PART_A : PART_B;
      const v = t === PART_A ? a : b;
      const other = 1 - t;
      toA.remove(v);
      toB.remove(v);
      locked[v] = 1;
      if (moves >= n) throw new Error('separator refinement: more moves than vertices in one pass');
      movedVertex[moves] = v;
      movedTo[moves] = t;
      pulledPtr[moves + 1] = pulledPtr[moves];
      where[v] = t;
      weight[t] += vw[v];
      weight[PART_S] -= vw[v];
      if (t === PART_A) shiftA(v, vw[v]);
      else shiftB(v, vw[v]);
      // v's neighbours on the other side join the separator
      for (let p = ptr[v]; p < ptr[v + 1]; p++) {
        const u = adj[p];
        if (where[u] !== other) continue;
        where[u] = PART_S;
        weight[other] -= vw[u];
        weight[PART_S] += vw[u];
        if (pulledPtr[moves + 1] >= pulled.length) throw new Error('separator refinement: pull log overflow');
        pulled[pulledPtr[moves + 1]++] = u;
        if (other === PART_A) shiftA(u, -vw[u]);
        else shiftB(u, -vw[u]);
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
    // undo the moves after the best state, newest first: each undo restores exactly the labels
    // its move changed (v from S to t, its pulled neighbours from 1 − t to S)
    for (let m = moves - 1; m >= bestMoves; m--) {
      const v = movedVertex[m];
      const t = movedTo[m];
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
