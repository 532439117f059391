/**
 * Nested dissection driver, shared by the graph and the coordinate splitters.
 *
 * A vertex separator S splits a part into A and B with no edge between them. Ordering A, then B,
 * then S keeps all fill of A and B inside their own blocks (George, "Nested dissection of a
 * regular finite element mesh", SIAM J. Numer. Anal. 10(2), 1973); only S's block becomes dense.
 * Recursing on A and B down to small parts, and ordering those by minimum degree, gives
 * nnz(L) = O(n log n) on 2D meshes and O(n^{4/3}) on 3D meshes when separators are O(√n) / O(n^{2/3}).
 *
 * The tree is built one level at a time — every part of a level is split before the next level
 * starts — so a splitter may spread a level's independent parts over threads; the ordering is
 * then read off the tree depth-first, exactly as a recursive dissection would emit it.
 *
 * The graph's connected components are ordered apart (isolated vertices and components of at
 * most leafSize vertices in one minimum-degree leaf), so uncoupled or block-diagonal patterns
 * cost one pass over the edges.
 *
 * Result: perm[k] = vertex eliminated k-th.
 */
import { inducedSubgraph, type AdjacencyGraph } from './adjacency-graph.js';
import { approximateMinimumDegree } from './minimum-degree.js';

/** Side labels a splitter writes, one per vertex of the part. */
export const SIDE_A = 0;
export const SIDE_B = 1;
export const SEPARATOR = 2;

/**
 * Splits the part `vertices` (global ids) by writing SIDE_A / SIDE_B / SEPARATOR into
 * side[k] for vertices[k]. Must guarantee no edge between A and B inside the part.
 * Returns false when it found no useful split (the part is then ordered as a leaf).
 */
export type PartSplitter = (vertices: Int32Array, side: Uint8Array) => boolean;

/**
 * Splits every part of one level of the dissection tree at once (parts[i] → its side labels as
 * for PartSplitter, or null for "no useful split"). The parts are disjoint, so a splitter may
 * hand some of them to another thread. `depth` is the level: 0 for the whole graph.
 */
export type LevelSplitter = (parts: Int32Array[], depth: number) => (Uint8Array | null)[];

export interface DissectionOptions {
  /** Parts with at most this many vertices are ordered by minimum degree (default 64). */
  leafSize?: number;
  /** Vertex weights (supervariable sizes), passed to the leaf orderings. */
  weights?: Int32Array;
  /**
   * Reorder the result by constrained minimum degree (default false): the dissection only
   * fixes which vertices are eliminated in which round — the leaves first, then the separators
   * of height 1, 2, … in the separator tree — and minimum degree orders inside each round.
   * On hexahedral patterns this gave exactly the fill of the plain order (each separator's
   * block is dense once its two sides are eliminated, so its inner order is free), hence off.
   */
  constrainedReorder?: boolean;
}

/** Nested dissection ordering of the whole graph with the given splitter. */
export function nestedDissectionWith(graph: AdjacencyGraph, split: PartSplitter, options: DissectionOptions = {}): Int32Array {
  const splitLevel: LevelSplitter = (parts) =>
    parts.map((vertices) => {
      const side = new Uint8Array(vertices.length);
      return split(vertices, side) ? side : null;
    });
  return nestedDissectionByLevels(graph, splitLevel, options);
}

/**
 * A node of the dissection tree: a leaf part (no children), a split part (its separator and its
 * two sides), or a disconnected part (no separator; one child per large connected component and
 * one leaf holding all its small components and isolated vertices).
 */
interface TreeNode {
  vertices: Int32Array; // the leaf's vertices, or the separator of a split part
  children: number[]; // child node indices, ordered in turn before `vertices`
}

/**
 * Nested dissection ordering, the tree built one level at a time (all parts of a level split
 * together), then ordered depth-first: the children's subtrees, then the separator. The order
 * does not depend on how the levels were computed.
 *
 * Connected components are independent blocks of the factor (no fill between them whatever the
 * order), so a graph that is not connected is not handed to the splitter whole: its components
 * of more than `leafSize` vertices become parts of their own at depth 0, and all smaller ones
 * (isolated vertices included) one leaf ordered by minimum degree. Finding them costs one pass
 * over the edges. Deeper parts that a separator disconnected still go to the splitter whole, as
 * before: the splitters handle them in near-linear time (level structures split off the
 * reached component, multilevel coarsening gives no split where it stalls), and splitting them
 * into components as well moved nnz(L) of the multilevel dissection on the 10³ and 16³
 * 7-point test grids by +0.41 % and −0.26 % (seed noise) instead of keeping it unchanged.
 */
export function nestedDissectionByLevels(graph: AdjacencyGraph, splitLevel: LevelSplitter, options: DissectionOptions = {}): Int32Array {
  const n = graph.n;
  const leafSize = Math.max(2, options.leafSize ?? 64);
  const all = new Int32Array(n);
  // the whole graph is the root part
  for (let v = 0; v < n; v++) all[v] = v;
  const nodes: TreeNode[] = [{ vertices: all, children: [] }];
  const components = new ComponentFinder(graph);
  let level = [0];
  // split the parts of each level; their sides become the next level
  for (let depth = 0; level.length > 0; depth++) {
    const open: number[] = [];
    // parts too large for a leaf go to the splitter; a disconnected whole graph first falls into components
    for (const i of level) {
      const node = nodes[i];
      if (node.vertices.length <= leafSize || depth > 64) continue;
      const pieces = depth === 0 ? components.split(node.vertices, leafSize) : null;
      if (!pieces) {
        open.push(i);
        continue;
      }
      node.vertices = new Int32Array(0);
      for (const piece of pieces.large) {
        node.children.push(nodes.length);
        open.push(nodes.length);
        nodes.push({ vertices: piece, children: [] });
      }
      if (pieces.small.length > 0) {
        node.children.unshift(nodes.length);
        nodes.push({ vertices: pieces.small, children: [] });
      }
    }
    const sides = open.length > 0 ? splitLevel(open.map((i) => nodes[i].vertices), depth) : [];
    if (sides.length !== open.length) throw new Error(`nested dissection: the splitter answered ${sides.length} of ${open.length} parts`);
    const next: number[] = [];
    for (let t = 0; t < open.length; t++) {
      const node = nodes[open[t]];
      const side = sides[t];
      if (!side) continue;
      if (side.length !== node.vertices.length) {
        throw new Error(`nested dissection: the splitter labelled ${side.length} of a part's ${node.vertices.length} vertices`);
      }
      const counts = [0, 0, 0];
      // a label other than A, B or separator is a splitter bug: fail loudly, never drop vertices
      for (let k = 0; k < side.length; k++) {
        const s = side[k];
        if (s > SEPARATOR) throw new Error(`nested dissection: the splitter gave vertex ${node.vertices[k]} the side label ${s}`);
        counts[s]++;
      }
      if (counts[SIDE_A] === 0 || counts[SIDE_B] === 0) continue;
      const parts = [new Int32Array(counts[0]), new Int32Array(counts[1]), new Int32Array(counts[2])];
      const fill = [0, 0, 0];
      // distribute the vertices by side, keeping their relative order
      for (let k = 0; k < side.length; k++) parts[side[k]][fill[side[k]]++] = node.vertices[k];
      node.children.push(nodes.length, nodes.length + 1);
      nodes.push({ vertices: parts[SIDE_A], children: [] }, { vertices: parts[SIDE_B], children: [] });
      node.vertices = parts[SEPARATOR];
      next.push(node.children[0], node.children[1]);
    }
    level = next;
  }

  const perm = new Int32Array(n);
  const local = new Int32Array(n).fill(-1);
  const inPart = new Uint8Array(n);
  const height = new Int32Array(n); // 0 in the leaves, 1 + the children's height in separators
  let out = 0;
  /** Appends a pivot; more pivots than vertices means a vertex was ordered twice. */
  const emit = (v: number): void => {
    if (out >= n) throw new Error('nested dissection: more pivots than vertices (a vertex was ordered twice)');
    perm[out++] = v;
  };

  /**
   * Orders a small part by minimum degree of its subgraph plus its halo: the neighbours outside
   * the part, all in separators ordered later, steer the degrees but are not ordered here.
   */
  const orderLeaf = (vertices: Int32Array): void => {
    if (vertices.length === 0) return;
    const withHalo = partWithHalo(graph, vertices, inPart);
    const sub = inducedSubgraph(graph, withHalo, local);
    const halo = new Uint8Array(withHalo.length).fill(1, vertices.length);
    const weights = options.weights ? gather(options.weights, withHalo) : undefined;
    const order = approximateMinimumDegree(sub, { weights, halo });
    if (order.length !== vertices.length) throw new Error(`nested dissection: minimum degree ordered ${order.length} of a leaf's ${vertices.length} vertices`);
    // translate local pivots back to global vertices
    for (let k = 0; k < order.length; k++) emit(vertices[order[k]]);
  };

  /** Orders a subtree: its children, then the separator (its block is dense, its inner order free); returns its height. */
  const orderNode = (i: number): number => {
    const node = nodes[i];
    if (node.children.length === 0) return orderLeaf(node.vertices), 0;
    let h = 0;
    for (const c of node.children) h = Math.max(h, 1 + orderNode(c));
    const separator = node.vertices;
    // the separator after all children, in its stored order
    for (let k = 0; k < separator.length; k++) {
      emit(separator[k]);
      height[separator[k]] = h;
    }
    return separator.length > 0 ? h : h - 1;
  };

  orderNode(0);
  if (out !== n) throw new Error(`nested dissection: ordered ${out} of ${n} vertices`);
  if (!options.constrainedReorder) return perm;
  return approximateMinimumDegree(graph, { weights: options.weights, constraint: height, denseThreshold: n });
}

/**
 * Connected components of parts, by breadth-first search restricted to the part. Workspaces are
 * n-long and shared by all parts: `stamp` marks the current part's members (a fresh stamp per
 * call, so nothing is cleared), `component` holds each member's component.
 */
class ComponentFinder {
  private readonly stamp: Int32Array;
  private readonly component: Int32Array;
  private readonly queue: Int32Array;
  private calls = 0;

  constructor(private readonly graph: AdjacencyGraph) {
    this.stamp = new Int32Array(graph.n).fill(-1);
    this.component = new Int32Array(graph.n);
    this.queue = new Int32Array(graph.n);
  }

  /**
   * null when the part is connected; otherwise its components of more than `leafSize` vertices
   * (in order of their first vertex in the part) and, in one list, all vertices of the smaller
   * ones. Both keep the part's relative vertex order. O(part size + its vertices' degrees).
   */
  split(vertices: Int32Array, leafSize: number): { large: Int32Array[]; small: Int32Array } | null {
    const { ptr, adj } = this.graph;
    const { stamp, component, queue } = this;
    const m = vertices.length;
    const inPart = 2 * this.calls++;
    const seen = inPart + 1; // stamps stay distinct from every earlier call's
    if (seen >= 0x7fffffff) throw new Error('nested dissection: component stamp overflow');
    for (let k = 0; k < m; k++) stamp[vertices[k]] = inPart;
    const sizes: number[] = [];
    // breadth-first search from every not yet reached vertex of the part
    for (let k = 0; k < m; k++) {
      const root = vertices[k];
      if (stamp[root] !== inPart) continue;
      const c = sizes.length;
      let head = 0;
      let tail = 0;
      stamp[root] = seen;
      component[root] = c;
      queue[tail++] = root;
      while (head < tail) {
        const v = queue[head++];
        for (let p = ptr[v]; p < ptr[v + 1]; p++) {
          const u = adj[p];
          if (stamp[u] !== inPart) continue;
          // each member is stamped `seen` when queued, so at most m vertices are ever queued
          if (tail >= m) throw new Error('nested dissection: component search queued more vertices than the part holds');
          stamp[u] = seen;
          component[u] = c;
          queue[tail++] = u;
        }
      }
      sizes.push(tail);
    }
    if (sizes.length <= 1) return null;
    const large: Int32Array[] = [];
    const slot = new Int32Array(sizes.length).fill(-1); // index in `large`, −1 for a small component
    let smallCount = 0;
    for (let c = 0; c < sizes.length; c++) {
      if (sizes[c] > leafSize) {
        slot[c] = large.length;
        large.push(new Int32Array(sizes[c]));
      } else smallCount += sizes[c];
    }
    const small = new Int32Array(smallCount);
    const fill = new Int32Array(large.length);
    let smallFill = 0;
    // distribute the part's vertices, keeping their relative order
    for (let k = 0; k < m; k++) {
      const v = vertices[k];
      const s = slot[component[v]];
      if (s < 0) small[smallFill++] = v;
      else large[s][fill[s]++] = v;
    }
    return { large, small };
  }
}

/** values[list[k]] for every k. */
function gather(values: Int32Array, list: Int32Array): Int32Array {
  const out = new Int32Array(list.length);
  // one value per list entry
  for (let k = 0; k < list.length; k++) out[k] = values[list[k]];
  return out;
}

/** The part's vertices followed by its outside neighbours (`inPart` is an n-long zeroed workspace). */
function partWithHalo(graph: AdjacencyGraph, vertices: Int32Array, inPart: Uint8Array): Int32Array {
  const { ptr, adj } = graph;
  const m = vertices.length;
  let size = m;
  // flag the part
  for (let k = 0; k < m; k++) inPart[vertices[k]] = 1;
  // count each outside neighbour once (flag 2 marks it as counted)
  for (let k = 0; k < m; k++) {
    const v = vertices[k];
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      if (inPart[adj[p]] === 0) {
        inPart[adj[p]] = 2;
        size++;
      }
    }
  }
  const list = new Int32Array(size);
  list.set(vertices);
  // list them in the order first met (flag 3 marks a listed one): the same vertices, edges and
  // flags as the count above, so exactly size − m are written
  for (let k = 0, t = m; k < m; k++) {
    const v = vertices[k];
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      if (inPart[adj[p]] === 2) {
        inPart[adj[p]] = 3;
        list[t++] = adj[p];
      }
    }
  }
  // clear the flags
  for (let k = 0; k < size; k++) inPart[list[k]] = 0;
  return list;
}

/**
 * Shrinks a separator to the vertices that really separate: a separator vertex with no
 * neighbour in B moves to A, then one with no neighbour in A moves to B.
 * `where` is an n-long workspace of global sides (values for vertices outside the part are
 * 255 and are ignored); it is read and updated together with side[].
 */
export function pruneSeparator(
  graph: AdjacencyGraph,
  vertices: Int32Array,
  side: Uint8Array,
  where: Uint8Array,
): void {
  const { ptr, adj } = graph;
  // two sweeps: towards A, then towards B
  for (const target of [SIDE_A, SIDE_B]) {
    const other = target === SIDE_A ? SIDE_B : SIDE_A;
    for (let k = 0; k < vertices.length; k++) {
      if (side[k] !== SEPARATOR) continue;
      const v = vertices[k];
      let touchesOther = false;
      for (let p = ptr[v]; p < ptr[v + 1] && !touchesOther; p++) touchesOther = where[adj[p]] === other;
      if (!touchesOther) {
        side[k] = target;
        where[v] = target;
      }
    }
  }
}

/**
 * Turns a two-sided labelling into A / B / separator: the boundary vertices of the side whose
 * boundary is lighter become the separator. Returns the separator's weight.
 */
export function separatorFromTwoSides(
  graph: AdjacencyGraph,
  weights: Int32Array | undefined,
  vertices: Int32Array,
  side: Uint8Array,
  where: Uint8Array,
): number {
  const { ptr, adj } = graph;
  const m = vertices.length;
  // publish the sides globally so neighbour tests are O(1)
  for (let k = 0; k < m; k++) where[vertices[k]] = side[k];
  const boundary = new Uint8Array(m);
  const boundaryWeight = [0, 0];
  // boundary[k] = 1 when vertex k has a neighbour on the other side
  for (let k = 0; k < m; k++) {
    const v = vertices[k];
    const other = side[k] === SIDE_A ? SIDE_B : SIDE_A;
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      if (where[adj[p]] === other) {
        boundary[k] = 1;
        boundaryWeight[side[k]] += weights ? weights[v] : 1;
        break;
      }
    }
  }
  return lighterBoundaryToSeparator(graph, weights, vertices, side, where, boundary, boundaryWeight);
}

/**
 * The boundary vertices (boundary[k] = 1) of the side whose boundary weighs less become the
 * separator, which is then pruned; returns the separator's weight. `where` must hold the sides.
 */
export function lighterBoundaryToSeparator(
  graph: AdjacencyGraph,
  weights: Int32Array | undefined,
  vertices: Int32Array,
  side: Uint8Array,
  where: Uint8Array,
  boundary: Uint8Array,
  boundaryWeight: number[],
): number {
  const m = vertices.length;
  const sepSide = boundaryWeight[SIDE_A] <= boundaryWeight[SIDE_B] ? SIDE_A : SIDE_B;
  // the lighter boundary becomes the separator
  for (let k = 0; k < m; k++) {
    if (boundary[k] && side[k] === sepSide) {
      side[k] = SEPARATOR;
      where[vertices[k]] = SEPARATOR;
    }
  }
  pruneSeparator(graph, vertices, side, where);
  let sepWeight = 0;
  // weight of what is left in the separator
  for (let k = 0; k < m; k++) if (side[k] === SEPARATOR) sepWeight += weights ? weights[vertices[k]] : 1;
  return sepWeight;
}
