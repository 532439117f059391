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

/**
 * Lower-triangle CSC from triplets of a symmetric matrix (the usual FE-assembly convention:
 * repeated entries are summed). Entries above the diagonal are mirrored to (max, min), so
 * callers must pass each off-diagonal pair once (either triangle), never both.
 *
 * Two counting-sort passes: bucket by row, then stably by column, which leaves rows
 * sorted inside each column; adjacent equal rows are then summed.
 */
export function assembleSymmetric(n: number, t: TripletList): AssembledSymmetric {
  const m = t.length;
  const lo = new Int32Array(m); // row in lower triangle
  const hi = new Int32Array(m); // column in lower triangle
  for (let k = 0; k < m; k++) {
    const r = t.rows[k];
    const c = t.cols[k];
    if (r >= c) {
      lo[k] = r;
      hi[k] = c;
    } else {
      lo[k] = c;
      hi[k] = r;
    }
  }
  // pass 1: order triplets by row
  const rowStart = new Int32Array(n + 1);
  for (let k = 0; k < m; k++) rowStart[lo[k] + 1]++;
  for (let i = 0; i < n; i++) rowStart[i + 1] += rowStart[i];
  const byRow = new Int32Array(m);
  {
    const next = rowStart.slice(0, n);
    for (let k = 0; k < m; k++) byRow[next[lo[k]]++] = k;
  }
  // pass 2: stable by column -> rows ascending within each column
  const colStart = new Int32Array(n + 1);
  for (let k = 0; k < m; k++) colStart[hi[k] + 1]++;
  for (let j = 0; j < n; j++) colStart[j + 1] += colStart[j];
  const order = new Int32Array(m);
  {
    const next = colStart.slice(0, n);
    for (let q = 0; q < m; q++) {
      const k = byRow[q];
      order[next[hi[k]]++] = k;
    }
  }
  // pass 3: sum duplicates (equal row adjacent within a column)
  const colPtr = new Int32Array(n + 1);
  let unique = 0;
  for (let j = 0; j < n; j++) {
    let last = -1;
    for (let q = colStart[j]; q < colStart[j + 1]; q++) {
      const r = lo[order[q]];
      if (r !== last) {
        unique++;
        last = r;
      }
    }
    colPtr[j + 1] = unique;
  }
  const rowIdx = new Int32Array(unique);
  const values = new Float64Array(unique);
  let p = -1;
  for (let j = 0; j < n; j++) {
    let last = -1;
    for (let q = colStart[j]; q < colStart[j + 1]; q++) {
      const k = order[q];
      const r = lo[k];
      if (r !== last) {
        p++;
        rowIdx[p] = r;
        values[p] = t.vals[k];
        last = r;
      } else {
        values[p] += t.vals[k];
      }
    }
  }
  return { matrix: { n, colPtr, rowIdx, values }, duplicatesSummed: m - unique };
}
