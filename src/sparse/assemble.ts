import type { SymmetricCsc } from './csc.js';

/**
 * Growable list of (row, column, value) triplets over typed arrays, 0-based indices.
 * Used by FE assembly (many element contributions to the same entry) and by readers.
 */
export class TripletList {
  rows: Int32Array;
  cols: Int32Array;
  vals: Float64Array;
  length = 0;

  constructor(initialCapacity = 1024) {
    const c = Math.max(16, initialCapacity);
    this.rows = new Int32Array(c);
    this.cols = new Int32Array(c);
    this.vals = new Float64Array(c);
  }

  push(row: number, col: number, value: number): void {
    if (this.length === this.rows.length) this.grow(this.length * 2);
    const k = this.length++;
    this.rows[k] = row;
    this.cols[k] = col;
    this.vals[k] = value;
  }

  grow(capacity: number): void {
    const r = new Int32Array(capacity);
    r.set(this.rows.subarray(0, this.length));
    const c = new Int32Array(capacity);
    c.set(this.cols.subarray(0, this.length));
    const v = new Float64Array(capacity);
    v.set(this.vals.subarray(0, this.length));
    this.rows = r;
    this.cols = c;
    this.vals = v;
  }
}

export interface AssembledSymmetric {
  matrix: SymmetricCsc;
  /** Triplets that landed on an entry already present and were summed into it. */
  duplicatesSummed: number;
}

/** What assembling a `general` (both triangles) input found about its symmetry. */
export interface MirrorComparison {
  /** max |a_ij − a_ji| over all pairs (a missing partner counts as 0). */
  maxAbsoluteAsymmetry: number;
  /** Where: 0-based lower-triangle position (row ≥ col) and both values; row −1 when none. */
  worstRow: number;
  worstCol: number;
  lowerValue: number;
  upperValue: number;
  /** max |a_ij| over all summed entries of both triangles. */
  maxAbsEntry: number;
}

export interface AssembledInPlace extends AssembledSymmetric {
  /** Present when `compareMirrors` was set. */
  mirrors?: MirrorComparison;
}

/**
 * Lower-triangle CSC from triplets of a symmetric matrix (the usual FE-assembly convention:
 * repeated entries are summed). Entries above the diagonal are mirrored to (max, min), so
 * callers must pass each off-diagonal pair once (either triangle), never both.
 * The triplet list is left unchanged (its arrays are copied once).
 */
export function assembleSymmetric(n: number, t: TripletList): AssembledSymmetric {
  const m = t.length;
  return assembleSymmetricInPlace(n, t.rows.slice(0, m), t.cols.slice(0, m), t.vals.slice(0, m), m);
}

/**
 * As assembleSymmetric, but consumes the list's arrays (no copy; the list is emptied).
 * Use it for large models where the triplets are not needed afterwards.
 */
export function assembleSymmetricConsuming(n: number, t: TripletList): AssembledSymmetric {
  const { rows, cols, vals, length } = t;
  t.rows = new Int32Array(16);
  t.cols = new Int32Array(16);
  t.vals = new Float64Array(16);
  t.length = 0;
  return assembleSymmetricInPlace(n, rows, cols, vals, length);
}

/**
 * Lower-triangle CSC built inside the given triplet arrays (they are overwritten; the result
 * may share `rows`/`vals` storage). Extra memory: colPtr (n + 1 ints) plus, only when
 * duplicates were summed, one exact-size copy of the result.
 *
 * Each entry gets the key 2·max(i,j) + f, col = min(i,j), where f = 1 marks an entry that came
 * from above the diagonal when `compareMirrors` is set (a `general` file): then a_ij and a_ji
 * are summed separately, compared, and stored as their mean a_ij + (a_ji − a_ij)/2 (exact when
 * equal). Without it both triangles are summed into one entry (f = 0).
 *
 * Steps: (1) keys; (2) if not already in (column, key) order, a stable counting sort by column
 * applied as an in-place permutation (destinations in `cols`, cycles followed by swaps);
 * (3) columns whose keys are not ascending are sorted; (4) equal keys are summed, compacting.
 * Indices must satisfy 0 ≤ i, j < n < 2^30.
 */
export function assembleSymmetricInPlace(
  n: number,
  rows: Int32Array,
  cols: Int32Array,
  vals: Float64Array,
  m: number,
  options: { compareMirrors?: boolean } = {},
): AssembledInPlace {
  const flagUpper = options.compareMirrors ? 1 : 0;
  const colPtr = groupByColumn(n, rows, cols, vals, m, flagUpper);
  return flagUpper ? mergeMirrors(n, rows, vals, m, colPtr) : mergeSummed(n, rows, vals, m, colPtr);
}

/** (2) Stable counting sort by column, applied in place: entry k moves to dest[k]. */
function permuteByColumn(n: number, keys: Int32Array, cols: Int32Array, vals: Float64Array, m: number, colPtr: Int32Array): void {
  const next = colPtr.slice(0, n);
  // destination of each entry: the next free slot of its column, in input order
  for (let k = 0; k < m; k++) cols[k] = next[cols[k]]++;
  const dest = cols;
  // follow each permutation cycle: swap entry k into its place until k holds its own entry
  for (let k = 0; k < m; k++) {
    let d = dest[k];
    while (d !== k) {
      const key = keys[d];
      keys[d] = keys[k];
      keys[k] = key;
      const v = vals[d];
      vals[d] = vals[k];
      vals[k] = v;
      dest[k] = dest[d];
      dest[d] = d;
      d = dest[k];
    }
  }
}

/** Sort keys[lo, hi) ascending with their values: insertion sort when short, else heapsort. */
function sortSegment(keys: Int32Array, vals: Float64Array, lo: number, hi: number): void {
  let sorted = true;
  // already ascending? (the common case for files written column by column)
  for (let p = lo + 1; p < hi; p++) {
    if (keys[p] < keys[p - 1]) {
      sorted = false;
      break;
    }
  }
  if (sorted) return;
  if (hi - lo <= 24) {
    // insertion sort: grow a sorted prefix one entry at a time
    for (let p = lo + 1; p < hi; p++) {
      const key = keys[p];
      const v = vals[p];
      let q = p - 1;
      while (q >= lo && keys[q] > key) {
        keys[q + 1] = keys[q];
        vals[q + 1] = vals[q];
        q--;
      }
      keys[q + 1] = key;
      vals[q + 1] = v;
    }
    return;
  }
  const len = hi - lo;
  // heapsort: build a max-heap, then move the maximum to the end repeatedly
  for (let i = (len >> 1) - 1; i >= 0; i--) siftDown(keys, vals, lo, i, len);
  for (let end = len - 1; end > 0; end--) {
    swap(keys, vals, lo, lo + end);
    siftDown(keys, vals, lo, 0, end);
  }
}

function siftDown(keys: Int32Array, vals: Float64Array, base: number, i: number, len: number): void {
  // restore the heap property below node i of the heap keys[base, base + len)
  for (;;) {
    let c = 2 * i + 1;
    if (c >= len) return;
    if (c + 1 < len && keys[base + c + 1] > keys[base + c]) c++;
    if (keys[base + c] <= keys[base + i]) return;
    swap(keys, vals, base + i, base + c);
    i = c;
  }
}

function swap(keys: Int32Array, vals: Float64Array, a: number, b: number): void {
  const k = keys[a];
  keys[a] = keys[b];
  keys[b] = k;
  const v = vals[a];
  vals[a] = vals[b];
  vals[b] = v;
}

/** (4) Sum runs of equal keys, writing rows (= key / 2) and values compactly. */
function mergeSummed(n: number, keys: Int32Array, vals: Float64Array, m: number, colPtr: Int32Array): AssembledInPlace {
  let w = 0;
  let q = 0;
  // column j: each distinct key becomes one stored entry
  for (let j = 0; j < n; j++) {
    const end = colPtr[j + 1];
    colPtr[j] = w;
    while (q < end) {
      const key = keys[q];
      let sum = vals[q++];
      while (q < end && keys[q] === key) sum += vals[q++];
      keys[w] = key >> 1;
      vals[w++] = sum;
    }
  }
  colPtr[n] = w;
  return finish(n, keys, vals, m, w, colPtr);
}

/** (4) For `general` input: sum each triangle separately, compare a_ij with a_ji, store the mean. */
function mergeMirrors(n: number, keys: Int32Array, vals: Float64Array, m: number, colPtr: Int32Array): AssembledInPlace {
  const mirrors: MirrorComparison = {
    maxAbsoluteAsymmetry: 0, worstRow: -1, worstCol: -1, lowerValue: 0, upperValue: 0, maxAbsEntry: 0,
  };
  let w = 0;
  let q = 0;
  let duplicates = 0;
  // column j: each distinct row becomes one entry; lower and upper sums are compared
  for (let j = 0; j < n; j++) {
    const end = colPtr[j + 1];
    colPtr[j] = w;
    while (q < end) {
      const row = keys[q] >> 1;
      let lower = 0, upper = 0, nLower = 0, nUpper = 0;
      // the run of this row: lower-triangle entries (even key) then mirrored ones (odd key)
      while (q < end && keys[q] >> 1 === row) {
        if (keys[q] & 1) {
          upper += vals[q];
          nUpper++;
        } else {
          lower += vals[q];
          nLower++;
        }
        q++;
      }
      duplicates += Math.max(0, nLower - 1) + Math.max(0, nUpper - 1);
      let value = lower;
      if (row !== j) {
        const diff = Math.abs(lower - upper);
        if (diff > mirrors.maxAbsoluteAsymmetry) {
          Object.assign(mirrors, { maxAbsoluteAsymmetry: diff, worstRow: row, worstCol: j, lowerValue: lower, upperValue: upper });
        }
        value = lower + (upper - lower) / 2;
      }
      const big = Math.max(Math.abs(lower), Math.abs(upper));
      if (big > mirrors.maxAbsEntry) mirrors.maxAbsEntry = big;
      keys[w] = row;
      vals[w++] = value;
    }
  }
  colPtr[n] = w;
  const out = finish(n, keys, vals, m, w, colPtr);
  out.duplicatesSummed = duplicates;
  out.mirrors = mirrors;
  return out;
}

/** Exact-size result: the input arrays themselves when nothing was merged, else copies. */
function finish(n: number, keys: Int32Array, vals: Float64Array, m: number, w: number, colPtr: Int32Array): AssembledInPlace {
  const rowIdx = w === keys.length ? keys : keys.slice(0, w);
  const values = w === vals.length ? vals : vals.slice(0, w);
  return { matrix: { n, colPtr, rowIdx, values }, duplicatesSummed: m - w };
}

/**
 * Sum triplets with the same (row, column) in place, keeping their orientation (an entry
 * above the diagonal stays above it, so a later `compareMirrors` assembly still sees both
 * triangles); returns the new count m′ ≤ m. The survivors come out in (column of the lower
 * triangle, row) order. Readers call it while the triplet arrays grow, so a file repeating
 * entries needs memory for its distinct entries, not for its lines.
 * Extra memory: n + 1 ints.
 */
export function sumDuplicateTriplets(n: number, rows: Int32Array, cols: Int32Array, vals: Float64Array, m: number): number {
  // keys 2·max(i, j) + [i < j], grouped by min(i, j), as in assembleSymmetricInPlace
  const colPtr = groupByColumn(n, rows, cols, vals, m, 1);
  let w = 0;
  let q = 0;
  // column j of the lower triangle: each distinct key becomes one triplet again
  for (let j = 0; j < n; j++) {
    const end = colPtr[j + 1];
    while (q < end) {
      const key = rows[q];
      let sum = vals[q++];
      while (q < end && rows[q] === key) sum += vals[q++];
      const big = key >> 1;
      const upper = key & 1;
      rows[w] = upper ? j : big;
      cols[w] = upper ? big : j;
      vals[w++] = sum;
    }
  }
  return w;
}

/**
 * Steps (1)–(3) shared by the assemblies: rows[k] ← key 2·max(i, j) + flagUpper·[i < j],
 * cols[k] ← min(i, j) (the column in the lower triangle); then, unless the triplets already come
 * in (column, key) order, a stable counting sort by column applied in place and a sort of each
 * column's keys. Returns the column starts.
 */
function groupByColumn(n: number, rows: Int32Array, cols: Int32Array, vals: Float64Array, m: number, flagUpper: 0 | 1): Int32Array {
  const colPtr = new Int32Array(n + 1);
  let ordered = true;
  let prevCol = -1;
  let prevKey = -1;
  // (1) keys; count entries per column
  for (let k = 0; k < m; k++) {
    const r = rows[k];
    const c = cols[k];
    const key = r >= c ? 2 * r : 2 * c + flagUpper;
    const col = r >= c ? c : r;
    rows[k] = key;
    cols[k] = col;
    colPtr[col + 1]++;
    if (col < prevCol || (col === prevCol && key < prevKey)) ordered = false;
    prevCol = col;
    prevKey = key;
  }
  // column starts from counts
  for (let j = 0; j < n; j++) colPtr[j + 1] += colPtr[j];
  if (!ordered) {
    // (2) group by column, (3) sort the keys of each column
    permuteByColumn(n, rows, cols, vals, m, colPtr);
    for (let j = 0; j < n; j++) sortSegment(rows, vals, colPtr[j], colPtr[j + 1]);
  }
  return colPtr;
}
