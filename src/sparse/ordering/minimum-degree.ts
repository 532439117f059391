/**
 * Approximate minimum degree ordering on a (weighted) quotient graph.
 *
 * Method (Amestoy, Davis & Duff, "An approximate minimum degree ordering algorithm",
 * SIAM J. Matrix Anal. Appl. 17(4), 1996): eliminating a variable k turns it and its
 * neighbourhood into an element (a clique stored only as its member list Lk). Every object
 * lives in one Int32Array `iw`: a variable's list holds its adjacent elements (first elen
 * entries) then its adjacent variables; an element's list holds its variables. Elements met
 * while forming Lk are absorbed into k, so storage never exceeds that of the original graph.
 *
 * The exact external degree is replaced by the bound
 *   d̄ᵢ = min( n − eliminated − |i|,  d̄ᵢ(old) + |Lk \ i|,  |Aᵢ \ i| + |Lk \ i| + Σ_{e∈Eᵢ\k} |Le \ Lk| ),
 * where |Le \ Lk| for all elements e near Lk comes from one scan over Lk.
 * Variables whose lists become identical (indistinguishable) merge into one supervariable;
 * a variable whose external degree drops to zero is eliminated with k (mass elimination);
 * an element e with Le ⊆ Lk is absorbed into k (aggressive absorption).
 *
 * Vertex weights let the caller pass a graph already compressed into supervariables: a vertex
 * of weight w counts w in every degree. Vertices of very high degree (dense rows) are set
 * aside and ordered last.
 *
 * Result: perm[k] = vertex eliminated k-th (halo vertices, if any, left out).
 */
import type { AdjacencyGraph } from './adjacency-graph.js';
import {
  appendChain,
  clearMarksIfNeeded,
  ensureRoom,
  flip,
  initialQuotientGraph,
  insertDegreeList,
  recomputeDegrees,
  removeDegreeList,
  type QuotientGraph,
} from './quotient-graph.js';

export interface MinimumDegreeOptions {
  /** Weight (number of original unknowns) of each vertex; default 1. */
  weights?: Int32Array;
  /** Absorb elements whose variables all lie in the new element (default true). */
  aggressiveAbsorption?: boolean;
  /** Vertices with more neighbours than this are ordered last (default max(16, 10·√n)). */
  denseThreshold?: number;
  /**
   * Halo: vertices (flag 1) that shape the degrees but are never pivots and are left out of the
   * result — the boundary of a part whose neighbours are eliminated later by someone else.
   */
  halo?: Uint8Array;
  /**
   * Constraint set of each vertex (small non-negative integers): every vertex of set s is
   * eliminated before any of a larger set, minimum degree deciding inside a set (constrained
   * minimum degree, as used after nested dissection to order domains, then separators).
   */
  constraint?: Int32Array;
}

/** Approximate minimum degree permutation of the graph's vertices (perm[k] = k-th pivot). */
export function approximateMinimumDegree(graph: AdjacencyGraph, options: MinimumDegreeOptions = {}): Int32Array {
  const n = graph.n;
  const perm = new Int32Array(n);
  if (n === 0) return perm;
  const aggressive = options.aggressiveAbsorption ?? true;
  const dense = options.denseThreshold ?? Math.max(16, Math.floor(10 * Math.sqrt(n)));
  const constraint = options.constraint;
  let currentSet = 0;
  const held = new Uint8Array(n); // flag: halo for now, listed when its constraint set comes up
  if (constraint) {
    for (let i = 0; i < n; i++) currentSet = i === 0 ? constraint[i] : Math.min(currentSet, constraint[i]);
    for (let i = 0; i < n; i++) held[i] = options.halo?.[i] || constraint[i] > currentSet ? 1 : 0;
  }
  const q = initialQuotientGraph(graph, options.weights, constraint ? held : options.halo);
  q.group = constraint;
  let out = 0;
  const denseList: number[] = [];
  let live = 0;
  // classify vertices: isolated ones are eliminated at once, dense ones set aside, others listed
  for (let i = 0; i < n; i++) {
    if (q.len[i] > dense && n > 2) {
      denseList.push(i);
      q.nv[i] = 0;
      q.elen[i] = -1;
      q.pe[i] = -1;
    }
  }
  if (denseList.length > 0) recomputeDegrees(q);
  for (let i = 0; i < n; i++) {
    if (q.elen[i] === -1) continue;
    if (q.degree[i] === 0) {
      if (!options.halo?.[i]) perm[out++] = i;
      q.elen[i] = -2;
      q.pe[i] = -1;
      q.w[i] = 0;
      q.nv[i] = 0;
    } else {
      q.remaining += q.nv[i];
      if (q.halo[i]) continue;
      live += q.nv[i];
      insertDegreeList(q, i, q.degree[i]);
    }
  }
  // eliminate supervariables of least approximate degree until every weight is used
  for (;;) {
    while (q.eliminated < live) {
      const k = selectPivot(q);
      eliminate(q, k, aggressive);
      // k and everything merged or mass-eliminated with it take the next pivot positions
      for (let v = k; v !== -1; v = q.chainNext[v]) perm[out++] = v;
    }
    if (!constraint) break;
    const added = listNextSet(q, constraint, options.halo, currentSet);
    if (added.set < 0) break;
    currentSet = added.set;
    live += added.weight;
  }
  for (const i of denseList) if (!options.halo?.[i]) perm[out++] = i;
  // every vertex is listed once (eliminated, merged into a pivot's chain, or dense): more pivots
  // than vertices means a pivot was written twice and writes past the end were dropped
  if (out > n) throw new Error(`minimum degree: ${out} pivots for ${n} vertices`);
  return out === n ? perm : perm.slice(0, out);
}

/**
 * Lists the live variables of the smallest constraint set above `current` (halo excluded);
 * returns that set (−1 when none is left) and the weight it adds.
 */
function listNextSet(
  q: QuotientGraph,
  constraint: Int32Array,
  halo: Uint8Array | undefined,
  current: number,
): { set: number; weight: number } {
  const alive = (i: number): boolean => q.nv[i] > 0 && q.elen[i] >= 0 && !halo?.[i];
  let set = -1;
  // the smallest set above the current one that still has live variables
  for (let i = 0; i < q.n; i++) {
    if (alive(i) && constraint[i] > current && (set < 0 || constraint[i] < set)) set = constraint[i];
  }
  let weight = 0;
  // release its variables into the degree lists
  for (let i = 0; set >= 0 && i < q.n; i++) {
    if (!alive(i) || constraint[i] !== set) continue;
    q.halo[i] = 0;
    insertDegreeList(q, i, q.degree[i]);
    weight += q.nv[i];
  }
  q.mindeg = 0;
  return { set, weight };
}

function selectPivot(q: QuotientGraph): number {
  const { head } = q;
  // the first non-empty degree list from the current minimum up (one is non-empty while weight
  // is left to eliminate; running off the end would read undefined and pivot on garbage)
  while (head[q.mindeg] === -1) q.mindeg++;
  if (q.mindeg >= head.length) throw new Error('minimum degree: no listed variable left to pivot on');
  const k = head[q.mindeg];
  removeDegreeList(q, k);
  return k;
}

/** One pivot step: form element k, update its variables' degrees, merge twins, relist them. */
function eliminate(q: QuotientGraph, k: number, aggressive: boolean): void {
  q.eliminated += q.nv[k];
  ensureRoom(q, k);
  const { pk1, pk2 } = formElement(q, k);
  clearMarksIfNeeded(q);
  measureSetDifferences(q, pk1, pk2);
  updateDegrees(q, k, pk1, pk2, aggressive);
  q.maxElement = Math.max(q.maxElement, q.degree[k]);
  q.mark += q.maxElement;
  clearMarksIfNeeded(q);
  mergeIndistinguishable(q, pk1, pk2);
  finalizeElement(q, k, pk1, pk2);
}

/** Lk = (Ak ∪ ⋃_{e∈Ek} Le) \ k; absorbs every e ∈ Ek into k; returns where Lk sits in iw. */
function formElement(q: QuotientGraph, k: number): { pk1: number; pk2: number } {
  const { iw, pe, len, elen, nv, w } = q;
  const elenk = elen[k];
  const pk = pe[k];
  const pk1 = elenk === 0 ? pk : q.cnz;
  let pk2 = pk1;
  let dk = 0;
  nv[k] = -nv[k]; // k is "in Lk" so it is skipped below
  // gather the live variables of each adjacent element, then of k's own variable list
  for (let t = 0; t <= elenk; t++) {
    const e = t < elenk ? iw[pk + t] : k;
    let p = t < elenk ? pe[e] : pk + elenk;
    const end = t < elenk ? pe[e] + len[e] : pk + len[k];
    for (; p < end; p++) {
      const i = iw[p];
      const nvi = nv[i];
      if (nvi <= 0) continue; // dead, or already in Lk
      dk += nvi;
      nv[i] = -nvi;
      iw[pk2++] = i;
      if (!q.halo[i]) removeDegreeList(q, i); // halo vertices are never listed
    }
    if (e !== k) {
      pe[e] = flip(k); // element e absorbed into k
      w[e] = 0;
    }
  }
  if (elenk !== 0) q.cnz = pk2;
  q.degree[k] = dk;
  pe[k] = pk1;
  len[k] = pk2 - pk1;
  elen[k] = -2;
  return { pk1, pk2 };
}

/** For every element e adjacent to a variable of Lk: w[e] − mark = |Le \ Lk| (weighted). */
function measureSetDifferences(q: QuotientGraph, pk1: number, pk2: number): void {
  const { iw, pe, elen, nv, w, degree } = q;
  const mark = q.mark;
  for (let pk = pk1; pk < pk2; pk++) {
    const i = iw[pk];
    const eln = elen[i];
    if (eln <= 0) continue;
    const nvi = -nv[i];
    // subtract |i| from each adjacent element's outside size, starting from |Le| the first time
    for (let p = pe[i], end = pe[i] + eln; p < end; p++) {
      const e = iw[p];
      if (w[e] >= mark) w[e] -= nvi;
      else if (w[e] !== 0) w[e] = degree[e] + mark - nvi;
    }
  }
}

/** Prunes each i ∈ Lk's lists, bounds its degree, mass-eliminates it if nothing is left outside. */
function updateDegrees(q: QuotientGraph, k: number, pk1: number, pk2: number, aggressive: boolean): void {
  const { iw, pe, len, elen, nv, w, degree, next, last, hashHead } = q;
  const n = q.n;
  const mark = q.mark;
  let dk = degree[k];
  for (let pk = pk1; pk < pk2; pk++) {
    const i = iw[pk];
    const p1 = pe[i];
    const p2 = p1 + elen[i];
    let pn = p1;
    let d = 0;
    let h = 0;
    // elements: Σ |Le \ Lk|, keeping only those with something outside Lk
    for (let p = p1; p < p2; p++) {
      const e = iw[p];
      if (w[e] === 0) continue;
      const dext = w[e] - mark;
      if (dext > 0 || !aggressive) {
        if (dext > 0) d += dext;
        iw[pn++] = e;
        h += e;
      } else {
        pe[e] = flip(k); // Le ⊆ Lk: aggressive absorption
        w[e] = 0;
      }
    }
    elen[i] = pn - p1 + 1; // + k, inserted below
    const p3 = pn;
    // variables: keep those alive and outside Lk
    for (let p = p2, end = p1 + len[i]; p < end; p++) {
      const j = iw[p];
      const nvj = nv[j];
      if (nvj <= 0) continue;
      d += nvj;
      iw[pn++] = j;
      h += j;
    }
    if (d === 0 && !q.halo[i]) {
      // nothing outside Lk: i is eliminated together with k
      pe[i] = flip(k);
      const nvi = -nv[i];
      dk -= nvi;
      nv[k] -= nvi; // nv[k] is negative while k is being eliminated
      q.eliminated += nvi;
      nv[i] = 0;
      elen[i] = -1;
      appendChain(q, k, i);
      continue;
    }
    degree[i] = Math.min(degree[i], d);
    // put k first in i's element list: the displaced entries move to the ends of their parts
    iw[pn] = iw[p3];
    iw[p3] = iw[p1];
    iw[p1] = k;
    len[i] = pn - p1 + 1;
    const bucket = h % n;
    next[i] = hashHead[bucket];
    hashHead[bucket] = i;
    last[i] = bucket;
  }
  degree[k] = dk;
}

/** Merges variables of Lk whose element and variable lists are identical (same hash bucket first). */
function mergeIndistinguishable(q: QuotientGraph, pk1: number, pk2: number): void {
  const { pe, len, elen, nv, w, next, last, hashHead } = q;
  for (let pk = pk1; pk < pk2; pk++) {
    const iw = q.iw;
    const start = iw[pk];
    if (nv[start] >= 0) continue; // dead or already merged
    const bucket = last[start];
    let i = hashHead[bucket];
    hashHead[bucket] = -1;
    // compare every pair in the bucket; j identical to i is absorbed into i
    for (; i !== -1 && next[i] !== -1; i = next[i], q.mark++) {
      const mark = q.mark;
      const ln = len[i];
      const eln = elen[i];
      for (let p = pe[i] + 1; p < pe[i] + ln; p++) w[iw[p]] = mark;
      let jPrev = i;
      for (let j = next[i]; j !== -1; ) {
        let same = len[j] === ln && elen[j] === eln && q.halo[j] === q.halo[i] && (!q.group || q.group[j] === q.group[i]);
        for (let p = pe[j] + 1; same && p < pe[j] + ln; p++) same = w[iw[p]] === mark;
        if (same) {
          pe[j] = flip(i);
          nv[i] += nv[j]; // both negative while in Lk
          nv[j] = 0;
          elen[j] = -1;
          appendChain(q, i, j);
          j = next[j];
          next[jPrev] = j;
        } else {
          jPrev = j;
          j = next[j];
        }
      }
    }
  }
}

/** Restores the weights of Lk's survivors, relists them by degree, and stores Lk compactly. */
function finalizeElement(q: QuotientGraph, k: number, pk1: number, pk2: number): void {
  const { iw, pe, len, nv, w, degree } = q;
  const dk = degree[k];
  let p = pk1;
  for (let pk = pk1; pk < pk2; pk++) {
    const i = iw[pk];
    const nvi = -nv[i];
    if (nvi <= 0) continue; // merged away or mass-eliminated
    nv[i] = nvi;
    // external degree bound: previous bound + |Lk \ i|, capped by what is left
    const d = Math.max(0, Math.min(degree[i] + dk - nvi, q.remaining - q.eliminated - nvi));
    degree[i] = d;
    if (!q.halo[i]) insertDegreeList(q, i, d);
    if (d < q.mindeg) q.mindeg = d;
    iw[p++] = i;
  }
  nv[k] = -nv[k];
  len[k] = p - pk1;
  if (len[k] === 0) {
    pe[k] = -1; // a root of the assembly tree
    w[k] = 0;
  }
  if (q.cnz === pk2) q.cnz = p; // give back the unused tail of Lk
}
