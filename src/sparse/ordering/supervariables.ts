/**
 * Supervariables: groups of vertices (DOFs) ordered as one, normally the DOFs of one node.
 *
 * In an FE model the DOFs of one node couple to the same DOFs, so the 3 (solid) or 6 (beam,
 * shell) DOFs of a node can be ordered as one vertex of weight 3 or 6: the compressed graph has
 * 1/3 … 1/6 of the vertices and 1/9 … 1/36 of the edges. When their closed neighbourhoods
 * N[v] = adj(v) ∪ {v} are identical, eliminating one member makes the others indistinguishable,
 * so nothing is lost; when they differ by a few dropped zeros, the node block is filled anyway
 * as soon as the node's first DOF is eliminated, so little is lost.
 *
 * Groups come from, in order of preference: a node label per vertex (DOF map), equal
 * coordinates, or the pattern alone — identical closed neighbourhoods (hash
 * h(v) = Σ_{u∈N[v]} mix(u), buckets by hash, exact comparison by marking N[v]) joined with runs
 * of consecutive, nearly identical vertices.
 */
import type { AdjacencyGraph } from './adjacency-graph.js';

export interface Supervariables {
  /** Number of supervariables. */
  readonly count: number;
  /** Supervariable of each original vertex. */
  readonly ofVertex: Int32Array;
  /** Members of supervariable s: members[memberPtr[s] .. memberPtr[s+1]-1], ascending. */
  readonly memberPtr: Int32Array;
  readonly members: Int32Array;
  /** Size of each supervariable (= memberPtr[s+1] − memberPtr[s]). */
  readonly weight: Int32Array;
  /** Graph between supervariables (no self loops). */
  readonly graph: AdjacencyGraph;
}

/** A cheap integer mixer (multiplicative hashing), so sums of mixed ids rarely collide. */
function mix(u: number): number {
  return Math.imul(u + 1, 0x9e3779b1) >>> 0;
}

/** Hash of each vertex's closed neighbourhood, reduced to a bucket index 0..n−1. */
function neighbourhoodHashes(graph: AdjacencyGraph): Uint32Array {
  const { n, ptr, adj } = graph;
  const hash = new Uint32Array(n);
  // h(v) = mix(v) + Σ_{u ∈ adj(v)} mix(u)   (mod 2³²)
  for (let v = 0; v < n; v++) {
    let h = mix(v);
    for (let p = ptr[v]; p < ptr[v + 1]; p++) h = (h + mix(adj[p])) >>> 0;
    hash[v] = h;
  }
  return hash;
}

/** Supervariable id of every vertex (ids numbered by their smallest member, ascending). */
function groupIdentical(graph: AdjacencyGraph): { count: number; ofVertex: Int32Array } {
  const { n, ptr, adj } = graph;
  const hash = neighbourhoodHashes(graph);
  const bucketHead = new Int32Array(n).fill(-1);
  const bucketNext = new Int32Array(n);
  // chain vertices into buckets by hash mod n, in descending order so chains run ascending
  for (let v = n - 1; v >= 0; v--) {
    const b = hash[v] % n;
    bucketNext[v] = bucketHead[b];
    bucketHead[b] = v;
  }
  const ofVertex = new Int32Array(n).fill(-1);
  const mark = new Int32Array(n).fill(-1);
  let count = 0;
  // each unassigned vertex v founds a supervariable and collects its twins from its bucket
  for (let v = 0; v < n; v++) {
    if (ofVertex[v] >= 0) continue;
    const s = count++;
    ofVertex[v] = s;
    const deg = ptr[v + 1] - ptr[v];
    let marked = false;
    for (let w = bucketNext[v]; w !== -1; w = bucketNext[w]) {
      if (ofVertex[w] >= 0 || hash[w] !== hash[v] || ptr[w + 1] - ptr[w] !== deg) continue;
      if (!marked) {
        // mark N[v] with stamp v
        mark[v] = v;
        for (let p = ptr[v]; p < ptr[v + 1]; p++) mark[adj[p]] = v;
        marked = true;
      }
      // N[w] = N[v]  ⇔  |N[w]| = |N[v]| and every element of N[w] is marked
      let same = mark[w] === v;
      for (let p = ptr[w]; same && p < ptr[w + 1]; p++) same = mark[adj[p]] === v;
      if (same) ofVertex[w] = s;
    }
  }
  return { count, ofVertex };
}

export interface SupervariableOptions {
  /** Node of each vertex (e.g. DofMap.node): vertices of one node form one supervariable. */
  nodeOfVertex?: Int32Array;
  /** Interleaved x, y, z per vertex: vertices at one point form one supervariable. */
  coordinates?: Float64Array;
}

/**
 * Compresses the graph into supervariables. Without options: vertices of identical closed
 * neighbourhood, plus runs of consecutive vertices that share nearly all neighbours (exported matrices often drop exact zeros inside a node's block, so the DOFs of
 * one node differ by a few entries). With a node label or coordinates per vertex: the vertices
 * of one node. Any grouping gives a valid ordering; the grouping only decides its quality.
 */
export function findSupervariables(graph: AdjacencyGraph, options: SupervariableOptions = {}): Supervariables {
  const n = graph.n;
  const { count, ofVertex } = options.nodeOfVertex
    ? groupByLabel(options.nodeOfVertex)
    : options.coordinates
      ? groupByLabel(pointLabels(options.coordinates, n))
      : mergeGroups(groupIdentical(graph).ofVertex, nearlyIdenticalRuns(graph));
  const memberPtr = new Int32Array(count + 1);
  // size of each supervariable
  for (let v = 0; v < n; v++) memberPtr[ofVertex[v] + 1]++;
  const weight = new Int32Array(count);
  for (let s = 0; s < count; s++) weight[s] = memberPtr[s + 1];
  for (let s = 0; s < count; s++) memberPtr[s + 1] += memberPtr[s];
  const members = new Int32Array(n);
  const fill = memberPtr.slice(0, count);
  // members listed in ascending vertex order
  for (let v = 0; v < n; v++) members[fill[ofVertex[v]]++] = v;
  return { count, ofVertex, memberPtr, members, weight, graph: compressedGraph(graph, count, ofVertex, memberPtr, members) };
}

/** Largest run merged by the near-identity test (6 DOFs make a beam or shell node). */
const MAX_RUN = 6;
/**
 * Consecutive vertices merge when they share at least this fraction of the larger closed
 * neighbourhood. Measured on generated hex solids (zeros dropped): DOFs of one node share
 * ≥ 0.74 (median 0.91), DOFs of neighbouring nodes ≤ 0.68; 27-point scalar grids share 0.67.
 */
const MIN_SHARED = 0.72;

/** Label per vertex: the first vertex of its run of nearly identical consecutive vertices. */
function nearlyIdenticalRuns(graph: AdjacencyGraph): Int32Array {
  const { n, ptr, adj } = graph;
  const runOf = new Int32Array(n);
  const mark = new Int32Array(n).fill(-1);
  let runLength = 1;
  // v joins v−1's run when |N[v] ∩ N[v−1]| ≥ MIN_SHARED · max(|N[v]|, |N[v−1]|)
  for (let v = 0; v < n; v++) {
    runOf[v] = v;
    if (v === 0 || runLength >= MAX_RUN) {
      runLength = 1;
      continue;
    }
    const u = v - 1;
    // mark N[u], then count the marked members of N[v]
    mark[u] = v;
    for (let p = ptr[u]; p < ptr[u + 1]; p++) mark[adj[p]] = v;
    let shared = mark[v] === v ? 1 : 0;
    for (let p = ptr[v]; p < ptr[v + 1]; p++) if (mark[adj[p]] === v) shared++;
    const larger = 1 + Math.max(ptr[v + 1] - ptr[v], ptr[u + 1] - ptr[u]);
    if (shared >= MIN_SHARED * larger) {
      runOf[v] = runOf[u];
      runLength++;
    } else {
      runLength = 1;
    }
  }
  return runOf;
}

/** Connected classes of two labellings (a vertex's class joins both of its labels), numbered 0.. */
function mergeGroups(a: Int32Array, b: Int32Array): { count: number; ofVertex: Int32Array } {
  const n = a.length;
  const parent = Int32Array.from({ length: n }, (_, v) => v);
  const find = (v: number): number => {
    while (parent[v] !== v) v = parent[v] = parent[parent[v]];
    return v;
  };
  const firstOfA = new Int32Array(n).fill(-1);
  // union each vertex with the first vertex of its class in a, and with its label in b
  for (let v = 0; v < n; v++) {
    if (firstOfA[a[v]] < 0) firstOfA[a[v]] = v;
    parent[find(v)] = find(firstOfA[a[v]]);
    const r1 = find(v);
    const r2 = find(b[v]);
    if (r1 !== r2) parent[Math.max(r1, r2)] = Math.min(r1, r2);
  }
  for (let v = 0; v < n; v++) a[v] = find(v);
  return groupByLabel(a);
}

/** Groups of equal label, numbered in order of first appearance. */
function groupByLabel(label: Int32Array): { count: number; ofVertex: Int32Array } {
  const n = label.length;
  let maxLabel = 0;
  for (let v = 0; v < n; v++) maxLabel = Math.max(maxLabel, label[v]);
  if (maxLabel >= 4 * n + 16) return groupByLabel(compactLabels(label));
  const id = new Int32Array(maxLabel + 1).fill(-1);
  const ofVertex = new Int32Array(n);
  let count = 0;
  // number each label when first met
  for (let v = 0; v < n; v++) {
    const l = label[v];
    if (id[l] < 0) id[l] = count++;
    ofVertex[v] = id[l];
  }
  return { count, ofVertex };
}

/** Replaces sparse labels (e.g. node ids) by the smallest vertex carrying each label. */
function compactLabels(label: Int32Array): Int32Array {
  const n = label.length;
  const order = Int32Array.from({ length: n }, (_, v) => v);
  order.sort((u, v) => label[u] - label[v] || u - v);
  const out = new Int32Array(n);
  // within a run of equal labels the first vertex is the smallest
  for (let k = 0; k < n; k++) {
    const v = order[k];
    out[v] = k > 0 && label[order[k - 1]] === label[v] ? out[order[k - 1]] : v;
  }
  return out;
}

/** Label per vertex: the first vertex (in coordinate order) at the same point. */
function pointLabels(coordinates: Float64Array, n: number): Int32Array {
  const order = Int32Array.from({ length: n }, (_, v) => v);
  const c = coordinates;
  // sort by (x, y, z) so coincident vertices are neighbours in the order
  order.sort((u, v) => c[3 * u] - c[3 * v] || c[3 * u + 1] - c[3 * v + 1] || c[3 * u + 2] - c[3 * v + 2]);
  const label = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const v = order[k];
    const u = k > 0 ? order[k - 1] : -1;
    const same = u >= 0 && c[3 * u] === c[3 * v] && c[3 * u + 1] === c[3 * v + 1] && c[3 * u + 2] === c[3 * v + 2];
    label[v] = same ? label[u] : v;
  }
  return label;
}

/** Graph between supervariables: s ~ t iff some member of s is adjacent to some member of t. */
function compressedGraph(
  graph: AdjacencyGraph,
  count: number,
  ofVertex: Int32Array,
  memberPtr: Int32Array,
  members: Int32Array,
): AdjacencyGraph {
  const { ptr, adj } = graph;
  const mark = new Int32Array(count).fill(-1);
  const cptr = new Int32Array(count + 1);
  /** Calls visit(t) once per supervariable t ≠ s adjacent to some member of s. */
  const forEachNeighbour = (s: number, visit: (t: number) => void): void => {
    mark[s] = s;
    for (let q = memberPtr[s]; q < memberPtr[s + 1]; q++) {
      const v = members[q];
      for (let p = ptr[v]; p < ptr[v + 1]; p++) {
        const t = ofVertex[adj[p]];
        if (mark[t] !== s) {
          mark[t] = s;
          visit(t);
        }
      }
    }
  };
  // pass 1 counts the distinct neighbouring supervariables
  for (let s = 0; s < count; s++) {
    let c = 0;
    forEachNeighbour(s, () => c++);
    cptr[s + 1] = cptr[s] + c;
  }
  const cadj = new Int32Array(cptr[count]);
  mark.fill(-1);
  // pass 2 writes them, in the order first met
  for (let s = 0; s < count; s++) {
    let t0 = cptr[s];
    forEachNeighbour(s, (t) => (cadj[t0++] = t));
    if (t0 !== cptr[s + 1]) throw new Error('supervariables: the two passes over a neighbourhood disagree');
  }
  return { n: count, ptr: cptr, adj: cadj };
}

/** Expands an ordering of supervariables (perm[k] = k-th supervariable) to one of the vertices. */
export function expandOrdering(sv: Supervariables, compressedPerm: Int32Array): Int32Array {
  const perm = new Int32Array(sv.members.length);
  if (compressedPerm.length !== sv.count) {
    throw new Error(`expandOrdering: an ordering of ${compressedPerm.length} supervariables for ${sv.count}`);
  }
  let k = 0;
  // each supervariable contributes its members consecutively, in ascending order
  for (let q = 0; q < compressedPerm.length; q++) {
    const s = compressedPerm[q];
    for (let p = sv.memberPtr[s]; p < sv.memberPtr[s + 1]; p++) perm[k++] = sv.members[p];
  }
  // a repeated supervariable would overrun perm, its writes silently dropped
  if (k !== perm.length) throw new Error(`expandOrdering: ${k} pivots for ${perm.length} vertices`);
  return perm;
}
