/**
 * Storage of the quotient graph used by minimum degree (see minimum-degree.ts): one Int32Array
 * `iw` holds every variable's and element's list; per-vertex arrays hold list starts, lengths,
 * weights, degrees, marks and the doubly linked degree lists. Compaction copies the live lists
 * to a second buffer when the new element would not fit.
 */
import type { AdjacencyGraph } from './adjacency-graph.js';

/** Encodes "absorbed into parent p" in pe[] as a value ≤ −2 (−1 means "no parent"). */
export const flip = (p: number): number => -p - 2;

export interface QuotientGraph {
  n: number;
  iw: Int32Array;
  spare: Int32Array; // second buffer for compaction
  cnz: number; // first free slot of iw
  pe: Int32Array; // list start of a live object, or flip(parent) once absorbed, or −1
  len: Int32Array; // list length
  elen: Int32Array; // variables: # elements in list; −2 element; −1 dead variable
  nv: Int32Array; // supervariable weight (negated while in Lk; 0 when absorbed)
  degree: Int32Array; // variables: approximate external degree; elements: |Le|
  w: Int32Array; // element marks: w[e] − mark = |Le \ Lk|; 0 = dead element
  head: Int32Array; // degree lists
  next: Int32Array;
  last: Int32Array;
  hashHead: Int32Array; // buckets of the indistinguishable-variable test
  chainNext: Int32Array; // vertices eliminated together with a representative, in order
  chainTail: Int32Array;
  mark: number;
  maxElement: number; // largest |Lk| so far (bounds how far marks move per step)
  mindeg: number;
  eliminated: number; // total weight eliminated
  remaining: number; // weight of all listed vertices, halo included (caps the degrees)
  halo: Uint8Array; // 1 = not a pivot now (a halo vertex, or one of a later constraint set)
  group: Int32Array | undefined; // constraint set of each vertex; only equal sets merge
}

export function initialQuotientGraph(graph: AdjacencyGraph, weights: Int32Array | undefined, halo: Uint8Array | undefined): QuotientGraph {
  const { n, ptr, adj } = graph;
  const nnz = ptr[n];
  const size = nnz + Math.floor(nnz / 5) + 2 * n + 16;
  const iw = new Int32Array(size);
  iw.set(adj);
  const nv = new Int32Array(n);
  let total = 0;
  // weights: one per vertex unless given
  for (let i = 0; i < n; i++) total += nv[i] = weights ? weights[i] : 1;
  const q: QuotientGraph = {
    n,
    iw,
    spare: new Int32Array(size),
    cnz: nnz,
    pe: ptr.slice(0, n),
    len: new Int32Array(n),
    elen: new Int32Array(n),
    nv,
    degree: new Int32Array(n),
    w: new Int32Array(n).fill(1),
    head: new Int32Array(total + 1).fill(-1),
    next: new Int32Array(n).fill(-1),
    last: new Int32Array(n).fill(-1),
    hashHead: new Int32Array(n).fill(-1),
    chainNext: new Int32Array(n).fill(-1),
    chainTail: new Int32Array(n),
    mark: 2,
    maxElement: 0,
    mindeg: 0,
    eliminated: 0,
    remaining: 0,
    halo: halo ?? new Uint8Array(n),
    group: undefined,
  };
  // list lengths and the (weighted) degree of each vertex
  for (let i = 0; i < n; i++) {
    q.len[i] = ptr[i + 1] - ptr[i];
    q.chainTail[i] = i;
  }
  recomputeDegrees(q);
  return q;
}

/** degree[i] = Σ weights of i's live neighbours (before any elimination). */
export function recomputeDegrees(q: QuotientGraph): void {
  const { n, iw, pe, len, nv, degree } = q;
  for (let i = 0; i < n; i++) {
    let d = 0;
    for (let p = pe[i], end = pe[i] + len[i]; p < end; p++) d += nv[iw[p]];
    degree[i] = d;
  }
}

/**
 * Lists variable i under degree d. Degrees are weighted and never exceed the total weight
 * (head has total + 1 lists): initially Σ of neighbour weights, later capped by the weight left.
 * A degree outside that range would be written nowhere by the typed array, losing i.
 */
export function insertDegreeList(q: QuotientGraph, i: number, d: number): void {
  const { head, next, last } = q;
  if (!(d >= 0 && d < head.length)) throw new Error(`minimum degree: degree ${d} outside 0..${head.length - 1}`);
  if (head[d] !== -1) last[head[d]] = i;
  next[i] = head[d];
  last[i] = -1;
  head[d] = i;
}

export function removeDegreeList(q: QuotientGraph, i: number): void {
  const { head, next, last, degree } = q;
  if (next[i] !== -1) last[next[i]] = last[i];
  if (last[i] !== -1) next[last[i]] = next[i];
  else head[degree[i]] = next[i];
}

/** Appends vertex j's chain after vertex i's chain. */
export function appendChain(q: QuotientGraph, i: number, j: number): void {
  q.chainNext[q.chainTail[i]] = j;
  q.chainTail[i] = q.chainTail[j];
}

/** Restarts the marks when they approach the Int32 range. */
export function clearMarksIfNeeded(q: QuotientGraph): void {
  if (q.mark + q.maxElement < 0x3fffffff) return;
  const { w } = q;
  for (let i = 0; i < q.n; i++) if (w[i] !== 0) w[i] = 1;
  q.mark = 2;
}

/** Copies every live object to the front of a fresh buffer (garbage collection of iw). */
export function compact(q: QuotientGraph): void {
  const { n, pe, len } = q;
  const from = q.iw;
  const to = q.spare;
  let t = 0;
  // live objects are exactly those whose pe points into iw
  for (let j = 0; j < n; j++) {
    const p = pe[j];
    if (p < 0) continue;
    pe[j] = t;
    to.set(from.subarray(p, p + len[j]), t);
    t += len[j];
  }
  q.iw = to;
  q.spare = from;
  q.cnz = t;
}

/**
 * Makes sure the new element fits at the end of iw: formElement writes at most
 * Σ_{e∈Ek} |Le| + |Ak| entries from cnz on (Lk is a subset of those lists). An element formed in
 * place (no adjacent elements) overwrites k's own list from its start and writes at most one
 * entry per entry read, so it never passes the list's end.
 */
export function ensureRoom(q: QuotientGraph, k: number): void {
  const { iw, pe, len, elen } = q;
  if (elen[k] === 0) return; // formed in place
  let need = len[k] - elen[k];
  // add the list sizes of the elements adjacent to k
  for (let p = pe[k]; p < pe[k] + elen[k]; p++) need += len[iw[p]];
  if (q.cnz + need < q.iw.length) return;
  compact(q);
  if (q.cnz + need >= q.iw.length) {
    // storage theorem says this cannot happen; grow rather than fail
    const bigger = new Int32Array(2 * (q.cnz + need));
    bigger.set(q.iw.subarray(0, q.cnz));
    q.iw = bigger;
    q.spare = new Int32Array(bigger.length);
  }
}
