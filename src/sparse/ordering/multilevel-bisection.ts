/**
 * Multilevel vertex separators for nested dissection (Karypis & Kumar, "A fast and high quality
 * multilevel scheme for partitioning irregular graphs", SIAM J. Sci. Comput. 20(1), 1998).
 *
 * A part's subgraph (vertex weights = supervariable sizes, edge weights 1 + number of shared
 * neighbours) is coarsened by heavy-edge matching down to about COARSEST_SIZE vertices. On the
 * coarsest graph several bisections are grown greedily by cut gain from different seeds (the
 * first from a pseudo-peripheral vertex) and refined by edge-cut FM (coarse-bisection.ts); each
 * becomes a vertex separator — the lighter of the two boundary layers — refined by
 * vertex-separator FM (separator-refinement.ts); the lightest wins. The separator is then
 * carried back level by level (a fine vertex takes its coarse vertex's label, which keeps A and
 * B apart because a fine A–B edge would be a coarse one) and refined again at every level, where
 * the finer graph offers smaller moves. Where matching stops shrinking the graph while it is still
 * large (STALLED_SIZE: hubs such as a star's centre), no separator is made and the part is left
 * to minimum degree: the coarse bisection scans every vertex per step, which on a stalled graph
 * of n vertices cost O(n²) (2.2 s at 5k, 55 s at 20k uncoupled DOFs before the driver split off
 * components).
 *
 * Repeated runs. Parts of LARGE_PART or more vertices take the lightest of RUNS_ON_LARGE_PARTS
 * runs, parts of HUGE_PART or more of RUNS_ON_HUGE_PARTS, the whole graph of RUNS_ON_ROOT: the
 * top separators decide most of the fill (on the 40×32×30 hex solid 8 runs at the top gave 3 %
 * less fill than 3). Coarsening is four fifths of a run, and its first three levels (nine tenths
 * of the coarsening work) hardly differ between seeds, so the runs of a part share them: every
 * run with seed ⌊seed / RUN_SLOTS⌋ = s on the same graph starts from the part coarsened
 * SHARED_LEVELS times with seed s (computed once per graph and thread), coarsens on with its own
 * seed, and carries its separator back through all levels, refining at each. A further run then
 * costs 14 ms instead of 67 ms on the 127k-DOF hex solid. Only finished separators are compared:
 * keeping the better half at each shared level instead cost 2 % fill. Parts of one run (below
 * LARGE_PART) grow SMALL_PART_TRIES bisections on their coarsest graph instead of INITIAL_TRIES,
 * and every trial separator gets TRIAL_SEPARATOR_PASSES FM passes (the chosen one is refined
 * again on every finer level). Together with the 16 runs at the root this kept the fill of the
 * bench solids' dissections within ±1 % (mean over four seeds) at less than half the time.
 *
 * Threads. The dissection tree is built one level at a time (dissection-driver.ts); a level's
 * work — its single-run parts and its large parts' runs in max(2, N) batches — is dealt in groups
 * of N of similar cost, one to each helper thread (separator-jobs.ts over helper-thread.ts, one
 * job in flight per helper) and the last done here. Every separator is a function of its part's
 * graph and its seed alone, so the ordering is the same on any number of threads.
 *
 * Result of the ordering: perm[k] = vertex eliminated k-th.
 */
import type { AdjacencyGraph } from './adjacency-graph.js';
import { coarsen, shuffled, type CoarseLevel, type WeightedGraph } from './coarsen-graph.js';
import { startSeparatorRuns } from '../separator-jobs.js';
import { nestedDissectionByLevels, type DissectionOptions, type LevelSplitter } from './dissection-driver.js';
import { partWeights, PART_A, PART_B, PART_S, refineSeparator } from './separator-refinement.js';
import { greedyGrownBisection, refineEdgeCut } from './coarse-bisection.js';

/** Coarsening stops near this many vertices. */
const COARSEST_SIZE = 120;
/** A level that removes less than this share of the vertices ends the coarsening. */
const MIN_REDUCTION = 0.08;
/**
 * Coarsening that stalls above this many vertices (matching finds too few pairs: hubs of very
 * high degree such as a star's centre, or vertices too heavy to pair) gives no separator: the
 * part is then ordered by minimum degree (dissection-driver.ts). The coarse bisection scans all
 * vertices per step, so this also bounds its cost per part.
 */
const STALLED_SIZE = 4 * COARSEST_SIZE;
/** Each side may hold at most this share of the part's weight. */
const MAX_SIDE_FRACTION = 0.52;
/** Parts with at least this many vertices get RUNS_ON_LARGE_PARTS independent runs. */
const LARGE_PART = 2000;
const RUNS_ON_LARGE_PARTS = 3;
/** Parts with at least this many vertices (the top few levels) get RUNS_ON_HUGE_PARTS runs. */
const HUGE_PART = 8000;
const RUNS_ON_HUGE_PARTS = 8;
/** Runs on the whole graph when it is a huge part: its separator decides the most fill. */
const RUNS_ON_ROOT = 16;
/** Coarsening levels the runs of one part share. */
const SHARED_LEVELS = 3;
/** Bisections grown on the coarsest graph of a part with several runs. */
const INITIAL_TRIES = 6;
/** Bisections grown on the coarsest graph of a part below LARGE_PART vertices (one run). */
const SMALL_PART_TRIES = 3;
/** Separator FM passes on each grown bisection's separator (the winner is refined again on every finer level). */
const TRIAL_SEPARATOR_PASSES = 2;
/** Seeds of one part's runs are partSeed · RUN_SLOTS + r, r < RUN_SLOTS. */
const RUN_SLOTS = 64;

export interface MultilevelOptions extends DissectionOptions {
  /** Seed of the matchings' visiting order (default 1): the result is deterministic. */
  seed?: number;
  /** Threads for the independent runs on large parts (default 1; the result does not depend on it). */
  threads?: number;
}

/** One part of a level being split: its graph, its runs' seeds and their separators. */
interface PartWork {
  g: WeightedGraph;
  seeds: number[];
  wheres: Uint8Array[];
}

/** A batch of runs on one graph: one part's seeds (all, or one half of a large part's). */
interface RunTask {
  part: number;
  from: number;
  to: number;
  cost: number;
}

/** Nested dissection ordering with multilevel vertex separators (perm[k] = k-th pivot). */
export function multilevelNestedDissection(graph: AdjacencyGraph, options: MultilevelOptions = {}): Int32Array {
  const local = new Int32Array(graph.n).fill(-1);
  const affinity = sharedNeighbourWeights(graph);
  const threads = options.threads ?? 1;
  const baseSeed = options.seed ?? 1;
  let calls = 0;
  const splitLevel: LevelSplitter = (parts, depth) => {
    // every part's weighted subgraph and run seeds (parts numbered in level order)
    const work: PartWork[] = parts.map((vertices) => {
      const g = weightedSubgraph(graph, affinity, options.weights, vertices, local);
      const huge = depth === 0 ? RUNS_ON_ROOT : RUNS_ON_HUGE_PARTS;
      const runs = g.n >= HUGE_PART ? huge : g.n >= LARGE_PART ? RUNS_ON_LARGE_PARTS : 1;
      const partSeed = baseSeed + 7919 * calls++;
      const seeds = Array.from({ length: runs }, (_, r) => partSeed * RUN_SLOTS + r);
      return { g, seeds, wheres: new Array<Uint8Array>(runs) };
    });
    runTasks(work, threads);
    // the lightest balanced separator of each part, the earlier run on a tie (a side above
    // the balance bound counts its excess as separator weight)
    return work.map((w) => {
      const maxSide = MAX_SIDE_FRACTION * w.g.totalWeight;
      let best: Uint8Array | null = null;
      let bestScore = Infinity;
      // score every run's separator
      for (let r = 0; r < w.wheres.length; r++) {
        const [a, b, s] = partWeights(w.g, w.wheres[r]);
        const score = s + Math.max(0, Math.max(a, b) - maxSide);
        if (score < bestScore) {
          bestScore = score;
          best = w.wheres[r];
        }
      }
      return best;
    });
  };
  return nestedDissectionByLevels(graph, splitLevel, options);
}

/**
 * Computes every run of the level's parts. Tasks — a single run, or one batch of a large part's
 * runs — go out in decreasing cost, in groups of `threads`: the group's first ones to helpers
 * 0, 1, …, its last computed here meanwhile, then the helpers' results collected (a helper takes
 * one job at a time). Without a helper a task runs here.
 */
function runTasks(work: PartWork[], threads: number): void {
  const tasks: RunTask[] = [];
  const batches = Math.max(2, threads);
  // a large part's runs in batches, a single run as one task; cost ~ entries × runs
  for (let i = 0; i < work.length; i++) {
    const runs = work[i].seeds.length;
    const cost = work[i].g.adj.length + work[i].g.n;
    const count = Math.min(runs, batches);
    // batch b: runs ⌊b·runs/count⌋ … ⌊(b+1)·runs/count⌋ − 1
    for (let b = 0; b < count; b++) {
      const from = Math.floor((b * runs) / count);
      const to = Math.floor(((b + 1) * runs) / count);
      tasks.push({ part: i, from, to, cost: cost * (to - from) });
    }
  }
  tasks.sort((x, y) => y.cost - x.cost || x.part - y.part || x.from - y.from);
  const runHere = (t: RunTask): void => {
    const w = work[t.part];
    // the task's runs, one separator each
    for (let r = t.from; r < t.to; r++) w.wheres[r] = multilevelSeparator(w.g, w.seeds[r]);
  };
  // groups: the helpers' tasks posted, this thread's computed, then the helpers' collected in order
  for (let k = 0; k < tasks.length; k += threads) {
    const group = tasks.slice(k, k + threads);
    const theirs = group.slice(0, -1);
    const waits = theirs.map((t, i) => startSeparatorRuns(work[t.part].g, work[t.part].seeds.slice(t.from, t.to), i));
    runHere(group[group.length - 1]);
    for (let i = 0; i < theirs.length; i++) {
      const t = theirs[i];
      const wait = waits[i];
      if (!wait) {
        runHere(t);
        continue;
      }
      const got = wait();
      for (let r = t.from; r < t.to; r++) work[t.part].wheres[r] = got[r - t.from];
    }
  }
}

/** Per part graph: the levels shared by the runs of its latest shared seed (dropped with the graph). */
const sharedCache = new WeakMap<WeightedGraph, { seed: number; levels: CoarseLevel[] }>();

/** Up to SHARED_LEVELS coarsenings of g (stopping where the multilevel run would stop), cached per graph. */
function sharedLevels(g: WeightedGraph, seed: number): CoarseLevel[] {
  const cached = sharedCache.get(g);
  if (cached && cached.seed === seed) return cached.levels;
  const levels: CoarseLevel[] = [];
  const maxVertexWeight = Math.max(1.5 * (g.totalWeight / COARSEST_SIZE), 1);
  let coarse = g;
  // the same rule as multilevelSeparator's coarsening loop
  while (levels.length < SHARED_LEVELS && coarse.n > COARSEST_SIZE) {
    const level = coarsen(coarse, seed + 104729 * (levels.length + 1), maxVertexWeight);
    if (level.graph.n > (1 - MIN_REDUCTION) * coarse.n) break;
    levels.push(level);
    coarse = level.graph;
  }
  sharedCache.set(g, { seed, levels });
  return levels;
}

/**
 * Carries a separator of levels[count − 1].graph back to g (levels[l] coarsens
 * levels[l − 1].graph, levels[0] coarsens g), refining it at every finer level.
 */
function projectAndRefine(levels: CoarseLevel[], g: WeightedGraph, where: Uint8Array, maxSide: number, count: number): Uint8Array {
  // from the coarsest level to g
  for (let l = count - 1; l >= 0; l--) {
    const fine = l === 0 ? g : levels[l - 1].graph;
    const coarseOf = levels[l].coarseOf;
    const projected = new Uint8Array(fine.n);
    for (let v = 0; v < fine.n; v++) projected[v] = where[coarseOf[v]];
    refineSeparator(fine, projected, maxSide);
    where = projected;
  }
  return where;
}

/**
 * Edge weight 1 + |N(u) ∩ N(v)| for every edge (u, v): on FE patterns, nodes sharing a face
 * share most neighbours, so heavy-edge matching pairs them first and the coarse graphs keep the
 * mesh's layered structure (unit weights would match at random among the 26 neighbours of a
 * hexahedral node). Aligned with graph.adj.
 * Each edge is counted once, from its endpoint of higher rank (degree, then index): with N(v)
 * marked, the list of the lower-ranked endpoint u is scanned, which also finds the position of
 * v in it for the reverse entry. That costs Σ_edges min(deg) = O(|E|^{3/2}) instead of
 * Σ_v deg(v)² (quadratic on a star: its centre's list was scanned once per leaf).
 */
function sharedNeighbourWeights(graph: AdjacencyGraph): Int32Array {
  const { n, ptr, adj } = graph;
  const weight = new Int32Array(adj.length);
  const mark = new Int32Array(n).fill(-1);
  const deg = (v: number): number => ptr[v + 1] - ptr[v];
  const below = (u: number, v: number): boolean => deg(u) < deg(v) || (deg(u) === deg(v) && u < v);
  // for each vertex v, mark N(v) and count the marked neighbours of each lower-ranked neighbour u
  for (let v = 0; v < n; v++) {
    for (let p = ptr[v]; p < ptr[v + 1]; p++) mark[adj[p]] = v;
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      const u = adj[p];
      if (!below(u, v)) continue;
      let shared = 1;
      let reverse = -1;
      for (let q = ptr[u]; q < ptr[u + 1]; q++) {
        const x = adj[q];
        if (x === v) reverse = q;
        else if (mark[x] === v) shared++;
      }
      if (reverse < 0) throw new Error('multilevel dissection: the adjacency graph is not symmetric');
      weight[p] = shared;
      weight[reverse] = shared;
    }
  }
  return weight;
}

/**
 * The weighted subgraph induced by vertices (local index = position in the list), edges in the
 * order of graph's lists. `local` is an n-long workspace holding −1, restored before return.
 */
function weightedSubgraph(
  graph: AdjacencyGraph,
  affinity: Int32Array,
  weights: Int32Array | undefined,
  vertices: Int32Array,
  local: Int32Array,
): WeightedGraph {
  const m = vertices.length;
  // number the part's vertices locally
  for (let k = 0; k < m; k++) local[vertices[k]] = k;
  const ptr = new Int32Array(m + 1);
  // count the neighbours inside the part
  for (let k = 0; k < m; k++) {
    const v = vertices[k];
    let c = 0;
    for (let p = graph.ptr[v]; p < graph.ptr[v + 1]; p++) if (local[graph.adj[p]] >= 0) c++;
    ptr[k + 1] = ptr[k] + c;
  }
  const adj = new Int32Array(ptr[m]);
  const edgeWeight = new Int32Array(ptr[m]);
  // copy them in local numbering with their edge weights
  for (let k = 0, t = 0; k < m; k++) {
    const v = vertices[k];
    for (let p = graph.ptr[v]; p < graph.ptr[v + 1]; p++) {
      const u = local[graph.adj[p]];
      if (u < 0) continue;
      adj[t] = u;
      edgeWeight[t++] = affinity[p];
    }
  }
  const vertexWeight = new Int32Array(m);
  let totalWeight = 0;
  // vertex weights (1 without supervariable weights)
  for (let k = 0; k < m; k++) {
    vertexWeight[k] = weights ? weights[vertices[k]] : 1;
    totalWeight += vertexWeight[k];
  }
  // restore the workspace
  for (let k = 0; k < m; k++) local[vertices[k]] = -1;
  return { n: m, ptr, adj, edgeWeight, vertexWeight, totalWeight };
}

/**
 * A/B/S labelling (PART_A, PART_B, PART_S) of g's vertices with no edge between A and B. On a
 * graph of LARGE_PART or more vertices the first levels are those shared by every seed with the
 * same ⌊seed / RUN_SLOTS⌋ (the runs of one part), computed once per graph. When coarsening stalls
 * above STALLED_SIZE vertices every vertex is labelled A: no useful split (the dissection orders
 * such a part by minimum degree, and its score loses to any real separator of another run).
 */
export function multilevelSeparator(g: WeightedGraph, seed = 1): Uint8Array {
  const maxSide = MAX_SIDE_FRACTION * g.totalWeight;
  const levels = g.n >= LARGE_PART ? sharedLevels(g, Math.floor(seed / RUN_SLOTS)).slice() : [];
  const maxVertexWeight = Math.max(1.5 * (g.totalWeight / COARSEST_SIZE), 1);
  let coarse = levels.length > 0 ? levels[levels.length - 1].graph : g;
  // coarsen while the graph is large and matching still shrinks it
  while (coarse.n > COARSEST_SIZE) {
    const level = coarsen(coarse, seed + levels.length, maxVertexWeight);
    if (level.graph.n > (1 - MIN_REDUCTION) * coarse.n) break;
    levels.push(level);
    coarse = level.graph;
  }
  if (coarse.n > STALLED_SIZE) return new Uint8Array(g.n).fill(PART_A);
  const tries = g.n >= LARGE_PART ? INITIAL_TRIES : SMALL_PART_TRIES;
  const where = initialSeparator(coarse, maxSide, seed, tries);
  return projectAndRefine(levels, g, where, maxSide, levels.length);
}

/** The best of `tries` grown bisections, each turned into a refined vertex separator. */
function initialSeparator(g: WeightedGraph, maxSide: number, seed: number, tries: number): Uint8Array {
  let best: Uint8Array | undefined;
  let bestScore = Infinity;
  const seeds = shuffled(g.n, seed);
  // one grown bisection per seed; the first grows from a pseudo-peripheral vertex
  for (let t = 0; t < Math.min(tries, g.n); t++) {
    const start = t === 0 ? farthestFrom(g, seeds[0]) : seeds[t];
    const where = greedyGrownBisection(g, start);
    refineEdgeCut(g, where, maxSide);
    boundaryToSeparator(g, where);
    const [a, b, s] = refineSeparator(g, where, maxSide, TRIAL_SEPARATOR_PASSES);
    // a separator leaving a side empty is useless; over-heavy sides are penalised
    const score = a === 0 || b === 0 ? Infinity : s + Math.max(0, Math.max(a, b) - maxSide);
    if (score < bestScore || !best) {
      bestScore = score;
      best = where;
    }
  }
  return best ?? new Uint8Array(g.n);
}

/** Last vertex reached by a breadth-first search from start (an approximate peripheral vertex). */
function farthestFrom(g: WeightedGraph, start: number): number {
  const order = breadthFirstOrder(g, start);
  return order[order.length - 1];
}

/** Vertices in breadth-first order from start, other components appended in turn. */
function breadthFirstOrder(g: WeightedGraph, start: number): Int32Array {
  const { n, ptr, adj } = g;
  const seen = new Uint8Array(n);
  const queue = new Int32Array(n);
  let head = 0;
  let tail = 0;
  let next = 0;
  queue[tail++] = start;
  seen[start] = 1;
  // breadth-first sweep; restart at the next unseen vertex when a component is exhausted (a
  // vertex is marked seen when queued, so the queue takes each vertex exactly once)
  while (head < n) {
    if (head === tail) {
      while (seen[next]) next++;
      seen[next] = 1;
      queue[tail++] = next;
    }
    const v = queue[head++];
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      if (!seen[adj[p]]) {
        if (tail >= n) throw new Error('multilevel dissection: breadth-first queue overflow');
        seen[adj[p]] = 1;
        queue[tail++] = adj[p];
      }
    }
  }
  return queue;
}

/** Moves the lighter boundary layer of a two-sided labelling into the separator. */
function boundaryToSeparator(g: WeightedGraph, where: Uint8Array): void {
  const { n, ptr, adj, vertexWeight } = g;
  const onBoundary = new Uint8Array(n);
  const boundaryWeight = [0, 0];
  // a vertex is on the boundary when a neighbour lies on the other side
  for (let v = 0; v < n; v++) {
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      if (where[adj[p]] !== where[v]) {
        onBoundary[v] = 1;
        boundaryWeight[where[v]] += vertexWeight[v];
        break;
      }
    }
  }
  const layer = boundaryWeight[PART_A] <= boundaryWeight[PART_B] ? PART_A : PART_B;
  for (let v = 0; v < n; v++) if (onBoundary[v] && where[v] === layer) where[v] = PART_S;
}
