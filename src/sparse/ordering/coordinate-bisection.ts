/**
 * Geometric nested dissection: split each part at the median of one coordinate.
 *
 * For a part, each axis with nonzero extent is tried: A = vertices with coordinate < c,
 * B = the rest, c the median coordinate. The cut band is then turned into a true vertex
 * separator — the vertices of one side that have a neighbour on the other side (whichever
 * side gives the lighter set) — so no edge joins A and B whatever the mesh looks like. The
 * axis with the lightest separator wins. On a structured hexahedral grid this cuts along one
 * node plane, the separator shape nested dissection needs for O(n^{4/3}) fill in 3D.
 *
 * Coordinates are per graph vertex, interleaved x, y, z (length 3·n).
 * Result: perm[k] = vertex eliminated k-th.
 */
import type { AdjacencyGraph } from './adjacency-graph.js';
import { nestedDissectionWith, separatorFromTwoSides, SIDE_A, SIDE_B, type DissectionOptions } from './dissection-driver.js';

const OUTSIDE = 255;

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

/** Tries the median cut along each axis and keeps the one with the lightest separator. */
function splitAtBestMedian(
  graph: AdjacencyGraph,
  coordinates: Float64Array,
  weights: Int32Array | undefined,
  vertices: Int32Array,
  side: Uint8Array,
  where: Uint8Array,
): boolean {
  const m = vertices.length;
  const trial = new Uint8Array(m);
  const keys = new Float64Array(m);
  let bestWeight = Infinity;
  // one median cut per axis
  for (let axis = 0; axis < 3; axis++) {
    for (let k = 0; k < m; k++) keys[k] = coordinates[3 * vertices[k] + axis];
    const cut = medianCut(keys);
    if (cut === undefined) continue;
    // A below the cut, B at or above it
    for (let k = 0; k < m; k++) trial[k] = keys[k] < cut ? SIDE_A : SIDE_B;
    const sepWeight = separatorFromTwoSides(graph, weights, vertices, trial, where);
    for (let k = 0; k < m; k++) where[vertices[k]] = OUTSIDE;
    if (sepWeight < bestWeight) {
      bestWeight = sepWeight;
      side.set(trial);
    }
  }
  return bestWeight < Infinity;
}

/** A cut value c with some keys below it and some at or above it, as near the median as possible. */
function medianCut(keys: Float64Array): number | undefined {
  const sorted = Float64Array.from(keys).sort();
  const m = sorted.length;
  if (sorted[0] === sorted[m - 1]) return undefined;
  const mid = sorted[m >> 1];
  if (mid > sorted[0]) return mid;
  // the lower half is all at the minimum: cut just above it instead
  let k = m >> 1;
  while (sorted[k] === mid) k++;
  return sorted[k];
}
