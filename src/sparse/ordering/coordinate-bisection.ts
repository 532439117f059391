/**
 * Geometric nested dissection: split each part at the median of one coordinate.
 *
 * For a part, each axis with nonzero extent is tried at a few cut values c near the median
 * (the coordinates at the quantiles in CUT_QUANTILES, so each side keeps 44–56 % of the
 * vertices): A = vertices with coordinate < c, B = the rest. The cut band is then turned into a true vertex
 * separator — the vertices of one side that have a neighbour on the other side (whichever
 * side gives the lighter set) — so no edge joins A and B whatever the mesh looks like. The
 * separator of least weight × (1 + 4·|quantile − ½|) wins (ties: the earlier candidate, the
 * median first): an off-median plane must be clearly lighter (up to 24 % at the outer
 * candidates), which on graded or holed meshes finds a thinner plane than the median. An empty
 * off-median separator (a cut between components) is not taken: on the 40×32×30 hex solid
 * those cuts cost 0.6 % more fill than the median plane. On a structured hexahedral grid this cuts along one
 * node plane, the separator shape nested dissection needs for O(n^{4/3}) fill in 3D.
 *
 * The boundary of a cut needs no pass over the edges: with hi_a(v) / lo_a(v) the largest and
 * smallest coordinate a among v's neighbours in the part (one pass for all three axes), a vertex
 * of A = {a < c} touches B iff hi_a(v) ≥ c, a vertex of B touches A iff lo_a(v) < c. Only the
 * pruning of each candidate separator looks at edges, those of its vertices.
 *
 * Coordinates are per graph vertex, interleaved x, y, z (length 3·n).
 * Result: perm[k] = vertex eliminated k-th.
 */
import type { AdjacencyGraph } from './adjacency-graph.js';
import { lighterBoundaryToSeparator, nestedDissectionWith, SIDE_A, SIDE_B, type DissectionOptions } from './dissection-driver.js';

const OUTSIDE = 255;
const IN_PART = 3;

/** Coordinate nested dissection ordering of the graph's vertices (perm[k] = k-th pivot). */
export function coordinateBisection(
  graph: AdjacencyGraph,
  coordinates: Float64Array,
  options: DissectionOptions = {},
): Int32Array {
  if (coordinates.length < 3 * graph.n) {
    throw new Error(`coordinateBisection: ${coordinates.length} coordinates for ${graph.n} vertices (need 3 each)`);
  }
  const where = new Uint8Array(graph.n).fill(OUTSIDE);
  const weights = options.weights;
  const split = (vertices: Int32Array, side: Uint8Array): boolean =>
    splitAtBestMedian(graph, coordinates, weights, vertices, side, where);
  return nestedDissectionWith(graph, split, options);
}

/** Quantiles of the candidate cuts along each axis, the median first. */
const CUT_QUANTILES = [0.5, 0.47, 0.53, 0.44, 0.56];

/** Tries cuts near the median along each axis and keeps the one with the lightest separator. */
function splitAtBestMedian(
  graph: AdjacencyGraph,
  coordinates: Float64Array,
  weights: Int32Array | undefined,
  vertices: Int32Array,
  side: Uint8Array,
  where: Uint8Array,
): boolean {
  const { ptr, adj } = graph;
  const m = vertices.length;
  const trial = new Uint8Array(m);
  const keys = new Float64Array(m);
  // per axis, the largest and smallest coordinate among each vertex's neighbours in the part
  const highest = [new Float64Array(m), new Float64Array(m), new Float64Array(m)];
  const lowest = [new Float64Array(m), new Float64Array(m), new Float64Array(m)];
  let bestWeight = Infinity;
  // mark the part
  for (let k = 0; k < m; k++) where[vertices[k]] = IN_PART;
  // one pass over the part's edges gives the neighbour ranges of all three axes
  for (let k = 0; k < m; k++) {
    const v = vertices[k];
    let hx = -Infinity;
    let hy = -Infinity;
    let hz = -Infinity;
    let lx = Infinity;
    let ly = Infinity;
    let lz = Infinity;
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      const u = adj[p];
      if (where[u] === OUTSIDE) continue;
      const x = coordinates[3 * u];
      const y = coordinates[3 * u + 1];
      const z = coordinates[3 * u + 2];
      if (x > hx) hx = x;
      if (x < lx) lx = x;
      if (y > hy) hy = y;
      if (y < ly) ly = y;
      if (z > hz) hz = z;
      if (z < lz) lz = z;
    }
    highest[0][k] = hx;
    highest[1][k] = hy;
    highest[2][k] = hz;
    lowest[0][k] = lx;
    lowest[1][k] = ly;
    lowest[2][k] = lz;
  }
  // candidate cuts along each axis
  for (let axis = 0; axis < 3; axis++) {
    for (let k = 0; k < m; k++) keys[k] = coordinates[3 * vertices[k] + axis];
    const sorted = Float64Array.from(keys).sort();
    const tried = new Set<number>();
    for (const quantile of CUT_QUANTILES) {
      const cut = cutNear(sorted, quantile);
      if (cut === undefined || tried.has(cut)) continue;
      tried.add(cut);
      // A below the cut, B at or above it
      for (let k = 0; k < m; k++) trial[k] = keys[k] < cut ? SIDE_A : SIDE_B;
      const sepWeight = separatorAtCut(graph, weights, vertices, trial, where, keys, highest[axis], lowest[axis], cut);
      // back to plain part marks for the next cut
      for (let k = 0; k < m; k++) where[vertices[k]] = IN_PART;
      // an empty off-median separator only splits off a component: the median split does better
      if (sepWeight === 0 && quantile !== 0.5) continue;
      const score = sepWeight * (1 + 4 * Math.abs(quantile - 0.5));
      if (score < bestWeight) {
        bestWeight = score;
        side.set(trial);
      }
    }
  }
  // unmark the part
  for (let k = 0; k < m; k++) where[vertices[k]] = OUTSIDE;
  return bestWeight < Infinity;
}

/**
 * separatorFromTwoSides for the cut A = {key < cut}: a vertex of A lies on the boundary when
 * its largest neighbour key reaches the cut, one of B when its smallest is below it, so the
 * boundary needs no pass over the edges. Returns the separator's weight.
 */
function separatorAtCut(
  graph: AdjacencyGraph,
  weights: Int32Array | undefined,
  vertices: Int32Array,
  side: Uint8Array,
  where: Uint8Array,
  keys: Float64Array,
  highest: Float64Array,
  lowest: Float64Array,
  cut: number,
): number {
  const m = vertices.length;
  const boundaryWeight = [0, 0];
  const boundary = new Uint8Array(m);
  // publish the sides globally for the pruning; mark and weigh both boundaries
  for (let k = 0; k < m; k++) {
    where[vertices[k]] = side[k];
    if (keys[k] < cut ? highest[k] >= cut : lowest[k] < cut) {
      boundary[k] = 1;
      boundaryWeight[side[k]] += weights ? weights[vertices[k]] : 1;
    }
  }
  return lighterBoundaryToSeparator(graph, weights, vertices, side, where, boundary, boundaryWeight);
}

/**
 * A cut value c with some keys below it and some at or above it, as near the given quantile of
 * the sorted keys as possible.
 */
function cutNear(sorted: Float64Array, quantile: number): number | undefined {
  const m = sorted.length;
  if (sorted[0] === sorted[m - 1]) return undefined;
  let k = Math.min(m - 1, Math.floor(quantile * m));
  const at = sorted[k];
  if (at > sorted[0]) return at;
  // everything below this position sits at the minimum: cut just above it instead
  while (sorted[k] === at) k++;
  return sorted[k];
}
