/**
 * Splitting the supernodal elimination tree between threads.
 *
 * Supernode S's parent is the supernode of its first row below its own columns. Two subtrees
 * that are disjoint (neither root an ancestor of the other) touch disjoint columns of L and
 * update disjoint blocks, so they can be factored at the same time; what remains — the
 * ancestors of the chosen subtrees, an ancestor-closed "top" — is factored afterwards, with the
 * subtrees' pending updates. With a postordered tree every subtree is a contiguous range of
 * supernode numbers [first descendant, root], which is how the parts are handed out.
 *
 * Choice: start from the roots and repeatedly replace the heaviest candidate subtree by its
 * children (its root joins the top); after each step deal the candidates to the threads
 * heaviest first, each to the least loaded thread (longest-processing-time rule), and keep the
 * step whose modelled time — the longest thread plus the shared top — is least. Weight = the
 * supernode's flop estimate Σ_c (nr − c)² over its columns (the dense work it does and sends up).
 * The deal is a function of the tree and the thread count alone (ties go to the lower thread).
 */
import type { SupernodalStructure } from './symbolic.js';

export interface SubtreeSplit {
  /** Per thread: inclusive supernode ranges [first, last], ascending. */
  parts: [number, number][][];
  /** Supernodes left for after the parts (ancestors of every part), ascending. */
  top: [number, number][];
  /** Estimated time of the split factorization over the serial one (ideal threads). */
  timeRatio: number;
}

/** Split for `threads` threads, or null when the tree is not postordered or has too few subtrees. */
export function splitSubtrees(s: SupernodalStructure, threads: number): SubtreeSplit | null {
  const ns = s.supernodes;
  if (threads < 2 || ns < 2) return null;
  const { superStart, superOf, rowPtr, rows } = s;
  const parent = new Int32Array(ns).fill(-1);
  const weight = new Float64Array(ns);
  // parent and own weight of every supernode (subtree weights are summed below)
  for (let sn = 0; sn < ns; sn++) {
    const nc = superStart[sn + 1] - superStart[sn];
    const nr = rowPtr[sn + 1] - rowPtr[sn];
    if (nr > nc) parent[sn] = superOf[rows[rowPtr[sn] + nc]];
    for (let c = 0; c < nc; c++) weight[sn] += (nr - c) * (nr - c);
  }
  const first = Int32Array.from({ length: ns }, (_, i) => i);
  const size = new Int32Array(ns).fill(1);
  // subtree weight, first descendant and size, children before parents (postorder: child < parent)
  for (let sn = 0; sn < ns; sn++) {
    const p = parent[sn];
    if (p < 0) continue;
    if (p <= sn) return null;
    weight[p] += weight[sn];
    size[p] += size[sn];
    if (first[sn] < first[p]) first[p] = first[sn];
  }
  // a postordered subtree is exactly [first, root]
  for (let sn = 0; sn < ns; sn++) if (sn - first[sn] + 1 !== size[sn]) return null;
  const children: number[][] = Array.from({ length: ns }, () => []);
  const roots: number[] = [];
  for (let sn = 0; sn < ns; sn++) (parent[sn] < 0 ? roots : children[parent[sn]]).push(sn);
  let total = 0;
  for (const r of roots) total += weight[r];
  // open the heaviest candidate step by step; keep the split of least modelled time
  let candidates = roots.slice();
  const topSet: number[] = [];
  let best: SubtreeSplit | null = null;
  for (let step = 0; step < OPENINGS_PER_THREAD * threads; step++) {
    const split = deal(candidates, threads, weight, first, topSet, total);
    if (split !== null && (best === null || split.timeRatio < best.timeRatio)) best = split;
    let heaviest = -1;
    for (let i = 0; i < candidates.length; i++) {
      if (children[candidates[i]].length > 0 && (heaviest < 0 || weight[candidates[i]] > weight[candidates[heaviest]])) heaviest = i;
    }
    if (heaviest < 0) break;
    const h = candidates[heaviest];
    topSet.push(h);
    candidates = candidates.filter((_, i) => i !== heaviest).concat(children[h]);
  }
  return best;
}

/** How many subtree roots may be moved to the top while searching, per thread (our choice: 64 served two threads). */
const OPENINGS_PER_THREAD = 32;
/**
 * Share of the top's work that its shared supernodes spread over the threads
 * (src/sparse/split-factor.ts); the rest (small top supernodes, each panel's own column loop)
 * stays on one thread. On two threads the top took about 0.6 of its serial time (our
 * measurement), 1 − p + p/2 = 0.6 gives p = 0.8; more threads are modelled as Amdahl's law on
 * that p (an estimate: the top's products on many threads are also bound by memory bandwidth).
 */
const TOP_PARALLEL_SHARE = 0.8;

/** Modelled time of the top on `threads` threads per unit of its serial work. */
function topTimeFactor(threads: number): number {
  return 1 - TOP_PARALLEL_SHARE + TOP_PARALLEL_SHARE / threads;
}

/** Longest-processing-time deal of the candidate subtrees to the threads, and its modelled time. */
function deal(candidates: number[], threads: number, weight: Float64Array, first: Int32Array, topSet: number[], total: number): SubtreeSplit | null {
  if (candidates.length < threads) return null;
  const sorted = candidates.slice().sort((a, b) => weight[b] - weight[a]);
  const load = new Float64Array(threads);
  const assigned: number[][] = Array.from({ length: threads }, () => []);
  // each subtree to the least loaded thread, heaviest first
  for (const r of sorted) {
    let t = 0;
    for (let i = 1; i < threads; i++) if (load[i] < load[t]) t = i;
    load[t] += weight[r];
    assigned[t].push(r);
  }
  const parallel = load.reduce((a, b) => a + b, 0);
  const longest = Math.max(...load);
  return {
    parts: assigned.map((list) => list.map((r) => [first[r], r] as [number, number]).sort((a, b) => a[0] - b[0])),
    top: runsOf(topSet.slice().sort((a, b) => a - b)),
    timeRatio: (longest + topTimeFactor(threads) * (total - parallel)) / total,
  };
}

/** Ascending supernode numbers as inclusive runs. */
function runsOf(sorted: number[]): [number, number][] {
  const out: [number, number][] = [];
  for (const v of sorted) {
    const last = out[out.length - 1];
    if (last && last[1] === v - 1) last[1] = v;
    else out.push([v, v]);
  }
  return out;
}
