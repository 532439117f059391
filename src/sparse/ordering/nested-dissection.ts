/**
 * Graph nested dissection: vertex separators from breadth-first level structures.
 *
 * For a part, a pseudo-peripheral vertex r is found by repeated breadth-first search (restart
 * from a least-degree vertex of the last level while the eccentricity grows; Gibbs, Poole &
 * Stockmeyer, SIAM J. Numer. Anal. 13(2), 1976; the last round's search is reused as r's).
 * Every level Lℓ of the structure rooted at r separates L<ℓ from L>ℓ; the lightest level among
 * those leaving at least `minSideFraction` of the weight on each side is taken, pruned to the
 * vertices that touch L>ℓ, and improved by greedy single-vertex moves: moving separator vertex v to side A pulls its B-neighbours N_B(v)
 * into the separator, which pays when w(N_B(v)) < w(v) and the sides stay balanced.
 * A part that breadth-first search does not cover is split into reached / unreached with no
 * separator at all.
 *
 * Result: perm[k] = vertex eliminated k-th.
 */
import type { AdjacencyGraph } from './adjacency-graph.js';
import {
  nestedDissectionWith,
  pruneSeparator,
  SEPARATOR,
  SIDE_A,
  SIDE_B,
  type DissectionOptions,
} from './dissection-driver.js';

const OUTSIDE = 255;
const IN_PART = 3;
/** Each side keeps at least this share of the part's weight when a level is chosen. */
const MIN_SIDE_FRACTION = 0.3;
/** A side may grow to this share of the part's weight during refinement. */
const MAX_SIDE_FRACTION = 0.6;

interface Workspace {
  graph: AdjacencyGraph;
  weights: Int32Array | undefined;
  where: Uint8Array; // side of each vertex of the current part, OUTSIDE elsewhere
  level: Int32Array; // breadth-first level, −1 when unvisited
  queue: Int32Array;
  position: Int32Array; // index of each vertex in the current part's list
}

/** Graph nested dissection ordering of the graph's vertices (perm[k] = k-th pivot). */
export function graphNestedDissection(graph: AdjacencyGraph, options: DissectionOptions = {}): Int32Array {
  const ws: Workspace = {
    graph,
    weights: options.weights,
    where: new Uint8Array(graph.n).fill(OUTSIDE),
    level: new Int32Array(graph.n).fill(-1),
    queue: new Int32Array(graph.n),
    position: new Int32Array(graph.n),
  };
  return nestedDissectionWith(graph, (vertices, side) => splitByLevels(ws, vertices, side), options);
}

const weightOf = (ws: Workspace, v: number): number => (ws.weights ? ws.weights[v] : 1);

/**
 * Breadth-first search inside the part from root; fills level[] and queue[0..count-1].
 * Returns the number of vertices reached.
 */
function breadthFirst(ws: Workspace, vertices: Int32Array, root: number): number {
  const { graph, where, level, queue } = ws;
  const { ptr, adj } = graph;
  for (let k = 0; k < vertices.length; k++) level[vertices[k]] = -1;
  let head = 0;
  let tail = 0;
  queue[tail++] = root;
  level[root] = 0;
  // visit level by level, staying inside the part; a vertex gets its level when queued, so each
  // member of the part (level reset to −1 above) is queued at most once: tail ≤ part size ≤ n
  while (head < tail) {
    const v = queue[head++];
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      const u = adj[p];
      if (where[u] !== OUTSIDE && level[u] < 0) {
        if (tail >= vertices.length) throw new Error('level-structure dissection: search queued more vertices than the part holds');
        level[u] = level[v] + 1;
        queue[tail++] = u;
      }
    }
  }
  return tail;
}

/**
 * A root of (nearly) maximal eccentricity in the start vertex's component, and the number of
 * vertices its breadth-first search reached when level[] and queue[] already hold that search
 * (the usual case: the last round's root is returned), else −1.
 */
function pseudoPeripheral(ws: Workspace, vertices: Int32Array): [number, number] {
  const { graph, level, queue } = ws;
  let root = vertices[0];
  let eccentricity = -1;
  // restart from a least-degree vertex of the deepest level while the depth grows
  for (let round = 0; round < 8; round++) {
    const reached = breadthFirst(ws, vertices, root);
    const depth = level[queue[reached - 1]];
    if (depth <= eccentricity) return [root, reached];
    eccentricity = depth;
    let best = queue[reached - 1];
    for (let t = reached - 1; t >= 0 && level[queue[t]] === depth; t--) {
      const v = queue[t];
      if (graph.ptr[v + 1] - graph.ptr[v] < graph.ptr[best + 1] - graph.ptr[best]) best = v;
    }
    root = best;
  }
  return [root, -1];
}

/**
 * Candidate splits of a connected part, each pruned and improved; the lightest separator wins:
 * the lightest balanced level seen from each end of a pseudo-diameter (r₁, r₂). (A median cut
 * of d(r₁, v) − d(r₂, v) was tried too: lighter separators, but more fill on 3D grids.)
 */
function splitByLevels(ws: Workspace, vertices: Int32Array, side: Uint8Array): boolean {
  const m = vertices.length;
  const { where, level, queue } = ws;
  const enterPart = (): void => {
    for (let k = 0; k < m; k++) where[vertices[k]] = IN_PART;
  };
  enterPart();
  for (let k = 0; k < m; k++) ws.position[vertices[k]] = k;
  const [r1, searched] = pseudoPeripheral(ws, vertices);
  const reached = searched >= 0 ? searched : breadthFirst(ws, vertices, r1);
  if (reached < m) {
    // disconnected part: the root's component against the rest, nothing to separate
    for (let k = 0; k < m; k++) side[k] = level[vertices[k]] >= 0 ? SIDE_A : SIDE_B;
    for (let k = 0; k < m; k++) where[vertices[k]] = OUTSIDE;
    return true;
  }
  const d1 = new Int32Array(m);
  // distance of each vertex from r₁
  for (let k = 0; k < m; k++) d1[k] = level[vertices[k]];
  const r2 = queue[reached - 1];
  breadthFirst(ws, vertices, r2);
  const d2 = new Int32Array(m);
  // distance of each vertex from r₂
  for (let k = 0; k < m; k++) d2[k] = level[vertices[k]];
  const trial = new Uint8Array(m);
  let best = Infinity;
  /** Refines the trial labelling, keeps it if its separator is the lightest so far. */
  const consider = (): void => {
    pruneSeparator(ws.graph, vertices, trial, where);
    const refined = improveSeparator(ws, vertices, trial);
    if (refined < best) {
      best = refined;
      side.set(trial);
    }
    enterPart();
  };
  // level structures from both ends of the pseudo-diameter
  for (const d of [d1, d2]) {
    const cut = lightestBalancedLevel(ws, vertices, d);
    for (let k = 0; k < m; k++) trial[k] = d[k] < cut ? SIDE_A : d[k] === cut ? SEPARATOR : SIDE_B;
    for (let k = 0; k < m; k++) where[vertices[k]] = trial[k];
    consider();
  }
  for (let k = 0; k < m; k++) where[vertices[k]] = OUTSIDE;
  return true;
}

/** The level of least weight that leaves at least MIN_SIDE_FRACTION of the weight on each side. */
function lightestBalancedLevel(ws: Workspace, vertices: Int32Array, level: Int32Array): number {
  let depth = 0;
  for (let k = 0; k < vertices.length; k++) depth = Math.max(depth, level[k]);
  const levelWeight = new Float64Array(depth + 1);
  let total = 0;
  // weight of each level (level[k] belongs to vertices[k])
  for (let k = 0; k < vertices.length; k++) {
    const w = weightOf(ws, vertices[k]);
    levelWeight[level[k]] += w;
    total += w;
  }
  let best = -1;
  let median = 0;
  let below = 0;
  // scan levels keeping the lightest balanced one; remember the median level as fallback
  for (let l = 0; l <= depth; l++) {
    const above = total - below - levelWeight[l];
    if (below < total / 2) median = l;
    const balanced = below >= MIN_SIDE_FRACTION * total && above >= MIN_SIDE_FRACTION * total;
    if (balanced && (best < 0 || levelWeight[l] < levelWeight[best])) best = l;
    below += levelWeight[l];
  }
  return best >= 0 ? best : median;
}

/**
 * Greedy passes of single separator-vertex moves that lighten the separator within balance.
 * Returns the final separator weight (Infinity when a side ended up empty).
 */
function improveSeparator(ws: Workspace, vertices: Int32Array, side: Uint8Array): number {
  const { graph, where } = ws;
  const { ptr, adj } = graph;
  const m = vertices.length;
  const sideWeight = [0, 0, 0];
  for (let k = 0; k < m; k++) sideWeight[side[k]] += weightOf(ws, vertices[k]);
  const total = sideWeight[0] + sideWeight[1] + sideWeight[2];
  const position = ws.position;
  for (let pass = 0; pass < 4; pass++) {
    let moved = 0;
    // try every separator vertex towards each side
    for (let k = 0; k < m; k++) {
      if (side[k] !== SEPARATOR) continue;
      const v = vertices[k];
      const wv = weightOf(ws, v);
      const pull = [0, 0]; // weight of v's neighbours in A, in B
      for (let p = ptr[v]; p < ptr[v + 1]; p++) {
        const s = where[adj[p]];
        if (s === SIDE_A || s === SIDE_B) pull[s] += weightOf(ws, adj[p]);
      }
      const target = pull[SIDE_B] <= pull[SIDE_A] ? SIDE_A : SIDE_B;
      const other = 1 - target;
      if (pull[other] >= wv || sideWeight[target] + wv > MAX_SIDE_FRACTION * total) continue;
      // move v to target; its neighbours on the other side join the separator
      side[k] = target;
      where[v] = target;
      sideWeight[target] += wv;
      sideWeight[SEPARATOR] += pull[other] - wv;
      sideWeight[other] -= pull[other];
      for (let p = ptr[v]; p < ptr[v + 1]; p++) {
        const u = adj[p];
        if (where[u] !== other) continue;
        where[u] = SEPARATOR;
        side[position[u]] = SEPARATOR;
      }
      moved++;
    }
    if (moved === 0) break;
  }
  return sideWeight[SIDE_A] > 0 && sideWeight[SIDE_B] > 0 ? sideWeight[SEPARATOR] : Infinity;
}
