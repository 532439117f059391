/**
 * Symbolic analysis of the shifted pair: from a fill-reducing order of K + M to the supernodal
 * structure of L, computed once and reused for every shift σ.
 *
 * 1. elimination tree of P(K + M)Pᵀ, its postorder folded into P (same fill, contiguous chains);
 * 2. exact column counts → nnz(L) and the flop count before any numeric work;
 * 3. fundamental supernodes, relaxed amalgamation (see supernodes.ts);
 * 4. row structure of each supernode: its own columns, then the union of the rows below them in
 *    A(:, cols) and in its children's structures (Liu: struct L(:,j) = A(j:,j) ∪ children);
 * 5. value offsets of the dense blocks and the workspace sizes the numeric phase needs.
 */
import type { SymmetricCsc } from './csc.js';
import { factorStructureCounts, type FactorStructureCounts } from './column-counts.js';
import { permutedPair, unionPattern, type PermutedPair } from './permute.js';
import { relabelTree } from './postorder.js';
import { fundamentalSupernodes, relaxSupernodes } from './supernodes.js';

export interface SupernodalStructure {
  n: number;
  /** perm[k] = original DOF of pivot k (fill-reducing order followed by the tree postorder). */
  perm: Int32Array;
  /** The union pattern of K and M in pivot order, each entry pointing at its values in K and M. */
  pair: PermutedPair;
  /** Exact nnz(L) incl. diagonal (no amalgamation zeros). */
  nnzL: number;
  /** Entries stored in the supernode blocks (nnzL plus amalgamation zeros). */
  storedEntries: number;
  /** Flops of the numeric phase on the stored (amalgamated) structure. */
  flops: number;
  supernodes: number;
  /** superStart[s] .. superStart[s+1] − 1 are the columns of supernode s. */
  superStart: Int32Array;
  superOf: Int32Array;
  /** rows[rowPtr[s] .. rowPtr[s+1] − 1]: row structure of s, its own columns first, ascending. */
  rowPtr: Int32Array;
  rows: Int32Array;
  /** Offset of supernode s's block (nr × nc, column-major) in the factor's value array. */
  valuePtr: Float64Array;
  /** Largest update block (rows × columns) one supernode sends to another. */
  maxUpdateEntries: number;
  /** Largest nr · nc over supernodes, largest nr and largest nc. */
  maxBlockEntries: number;
  maxRows: number;
  maxColumns: number;
}

/**
 * `tree`: the elimination tree, its postorder and the column counts of the union pattern under
 * `order` when the caller has them already (the ordering counts them, ordering/fill-count.ts);
 * otherwise they are computed here. `allocatePair` makes the pair's index arrays (shared
 * memory when helper threads may factor, so they need no second copy).
 */
export function analyzeShiftedPair(
  stiffness: SymmetricCsc,
  mass: SymmetricCsc,
  order: Int32Array,
  tree?: FactorStructureCounts,
  allocatePair?: (length: number) => Int32Array,
): SupernodalStructure {
  const n = stiffness.n;
  // the tree and counts of the first order need the union pattern only
  const first = tree ?? factorStructureCounts(unionPattern(stiffness, mass), order);
  const perm = new Int32Array(n);
  const counts = new Int32Array(n);
  let nnzL = 0;
  // fold the postorder into the ordering; relabel counts
  for (let k = 0; k < n; k++) {
    perm[k] = order[first.post[k]];
    counts[k] = first.counts[first.post[k]];
    nnzL += counts[k];
  }
  const parent = relabelTree(first.parent, first.post);
  const pair = permutedPair(stiffness, mass, perm, allocatePair);
  const fundamental = fundamentalSupernodes(parent, counts);
  const fundamentalRows = supernodeRows(pair, fundamental, superOfColumns(fundamental, n), parent);
  const superStart = relaxSupernodes(fundamental, parent, fundamentalRows.rowPtr, fundamentalRows.rows);
  const ns = superStart.length - 1;
  const superOf = superOfColumns(superStart, n);
  const { rowPtr, rows } = supernodeRows(pair, superStart, superOf, parent);
  return { n, perm, pair, nnzL, supernodes: ns, superStart, superOf, rowPtr, rows, ...blockSizes(superStart, superOf, rowPtr, rows) };
}

/** Supernode of each column. */
function superOfColumns(superStart: Int32Array, n: number): Int32Array {
  const superOf = new Int32Array(n);
  // each supernode's column range
  for (let s = 0; s + 1 < superStart.length; s++) superOf.fill(s, superStart[s], superStart[s + 1]);
  return superOf;
}

/** Row structures of all supernodes, children before parents (postorder). */
function supernodeRows(pair: PermutedPair, superStart: Int32Array, superOf: Int32Array, parent: Int32Array) {
  const ns = superStart.length - 1;
  const n = pair.n;
  const childHead = new Int32Array(ns).fill(-1);
  const childNext = new Int32Array(ns).fill(-1);
  // child lists of the supernodal tree
  for (let s = ns - 1; s >= 0; s--) {
    const p = parent[superStart[s + 1] - 1];
    if (p === -1) continue;
    const ps = superOf[p];
    childNext[s] = childHead[ps];
    childHead[ps] = s;
  }
  const mark = new Int32Array(n).fill(-1);
  let rowPtr = new Int32Array(ns + 1);
  let rows = new Int32Array(Math.max(16, 2 * pair.colPtr[n]));
  let top = 0;
  const below = new Int32Array(n);
  // structure of s = own columns ∪ rows ≥ l of A(:, f..l−1) ∪ rows ≥ l of each child
  for (let s = 0; s < ns; s++) {
    const f = superStart[s];
    const l = superStart[s + 1];
    let cnt = 0;
    for (let j = f; j < l; j++) {
      for (let p = pair.colPtr[j]; p < pair.colPtr[j + 1]; p++) {
        const i = pair.rowIdx[p];
        if (i >= l && mark[i] !== s) {
          mark[i] = s;
          below[cnt++] = i;
        }
      }
    }
    for (let c = childHead[s]; c !== -1; c = childNext[c]) {
      for (let p = rowPtr[c]; p < rowPtr[c + 1]; p++) {
        const i = rows[p];
        if (i >= l && mark[i] !== s) {
          mark[i] = s;
          below[cnt++] = i;
        }
      }
    }
    const need = top + (l - f) + cnt;
    if (need > rows.length) {
      const grown = new Int32Array(Math.max(need, 2 * rows.length));
      grown.set(rows.subarray(0, top));
      rows = grown;
    }
    for (let j = f; j < l; j++) rows[top++] = j;
    rows.set(below.subarray(0, cnt), top);
    rows.subarray(top, top + cnt).sort();
    top += cnt;
    rowPtr[s + 1] = top;
  }
  return { rowPtr, rows: rows.slice(0, top) };
}

/** Value offsets, stored entries, flops and workspace bounds. */
function blockSizes(superStart: Int32Array, superOf: Int32Array, rowPtr: Int32Array, rows: Int32Array) {
  const ns = superStart.length - 1;
  const valuePtr = new Float64Array(ns + 1);
  let flops = 0;
  let maxUpdateEntries = 0;
  let maxBlockEntries = 0;
  let maxRows = 0;
  let maxColumns = 0;
  // each supernode: block size, flops of its columns, sizes of the updates it sends
  for (let s = 0; s < ns; s++) {
    const nc = superStart[s + 1] - superStart[s];
    const nr = rowPtr[s + 1] - rowPtr[s];
    valuePtr[s + 1] = valuePtr[s] + nr * nc;
    maxBlockEntries = Math.max(maxBlockEntries, nr * nc);
    maxRows = Math.max(maxRows, nr);
    maxColumns = Math.max(maxColumns, nc);
    for (let c = 0; c < nc; c++) flops += columnFlops(nr - c - 1);
    // runs of rows falling in one target supernode: ndrow1 (in the run) × ndrow2 (run and below)
    for (let p = rowPtr[s] + nc; p < rowPtr[s + 1]; ) {
      const target = superOf[rows[p]];
      let q = p;
      while (q < rowPtr[s + 1] && superOf[rows[q]] === target) q++;
      maxUpdateEntries = Math.max(maxUpdateEntries, (q - p) * (rowPtr[s + 1] - p));
      p = q;
    }
  }
  return { valuePtr, storedEntries: valuePtr[ns], flops, maxUpdateEntries, maxBlockEntries, maxRows, maxColumns };
}

/**
 * Flops of eliminating one column with r rows below its diagonal: r divisions and r(r+1)/2
 * multiply-adds of its update (two flops each). The ordering's fill count (ordering/fill-count.ts)
 * counts with the same formula, so its choice and the factor's own figure agree.
 */
export function columnFlops(r: number): number {
  return r + r * (r + 1);
}
