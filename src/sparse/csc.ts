/**
 * Symmetric sparse matrices in compressed sparse column (CSC) form, lower triangle stored.
 *
 * Column j holds rows rowIdx[colPtr[j] .. colPtr[j+1]-1], all >= j, sorted ascending, no
 * duplicates; when present the diagonal is the first entry of its column. The full matrix is
 * A = L + Lᵀ − diag(A), where L is what is stored.
 */
export interface SymmetricCsc {
  readonly n: number;
  readonly colPtr: Int32Array; // length n + 1
  readonly rowIdx: Int32Array; // length nnz (stored)
  readonly values: Float64Array; // length nnz (stored)
}

/** Stored entries (lower triangle including the diagonal). */
export function storedNonzeros(a: SymmetricCsc): number {
  return a.colPtr[a.n];
}

/** Entries of the full symmetric matrix: 2·stored − diagonal entries. */
export function fullNonzeros(a: SymmetricCsc): number {
  let diag = 0;
  for (let j = 0; j < a.n; j++) {
    const p = a.colPtr[j];
    if (p < a.colPtr[j + 1] && a.rowIdx[p] === j) diag++;
  }
  return 2 * a.colPtr[a.n] - diag;
}

/** The diagonal of A (zero where no entry is stored). */
export function diagonalOf(a: SymmetricCsc): Float64Array {
  const d = new Float64Array(a.n);
  for (let j = 0; j < a.n; j++) {
    const p = a.colPtr[j];
    if (p < a.colPtr[j + 1] && a.rowIdx[p] === j) d[j] = a.values[p];
  }
  return d;
}

/** y = A x for symmetric A stored as its lower triangle. y is overwritten. */
export function symMultiply(a: SymmetricCsc, x: Float64Array, y: Float64Array = new Float64Array(a.n)): Float64Array {
  const { n, colPtr, rowIdx, values } = a;
  y.fill(0);
  for (let j = 0; j < n; j++) {
    const xj = x[j];
    let sum = 0;
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      const v = values[p];
      if (i === j) {
        sum += v * xj; // diagonal counted once
      } else {
        y[i] += v * xj; // lower part:  y_i += a_ij x_j
        sum += v * x[i]; // mirrored upper part: y_j += a_ij x_i
      }
    }
    y[j] += sum;
  }
  return y;
}

/**
 * Y = A X for a column-major n×k block X. One pass over A serves all k columns,
 * so the matrix is streamed once per block rather than once per vector.
 */
export function symMultiplyBlock(
  a: SymmetricCsc,
  x: Float64Array,
  k: number,
  y: Float64Array = new Float64Array(a.n * k),
): Float64Array {
  if (k === 1) return symMultiply(a, x, y);
  y.fill(0);
  symMultiplyColumns(a, x, k, y, 0, a.n);
  return y;
}

/** This thread's row-major copies of X and Y for symMultiplyColumns (grown on demand, reused). */
let rowMajor = new Float64Array(0);
/**
 * Columns of X per row-major copy: wider blocks go in slices of this many, which bounds the kept
 * copies at 2 · n · 6 doubles per thread (a Rayleigh–Ritz product of 60 columns would otherwise
 * keep 120 n doubles alive for the rest of the run). A is streamed once per three columns anyway.
 */
const ROW_MAJOR_COLUMNS = 6;

/**
 * Y += (the part of A X carried by the stored columns [colFrom, colTo)): each stored a_ij of those
 * columns adds a_ij x_j to y_i and, off the diagonal, a_ij x_i to y_j. Two calls on disjoint
 * column ranges into two outputs sum to A X. Only rows from colFrom on are touched (lower storage).
 * The k columns are worked on row-major (x_i's k entries side by side) and three at a time, so
 * each stored entry reads and writes short contiguous runs, and x_j's three entries and y_j's
 * running sums stay in locals across column j (about twice as fast as column-major on the hex
 * solids' K and M for k = 6).
 */
export function symMultiplyColumns(a: SymmetricCsc, x: Float64Array, k: number, y: Float64Array, colFrom: number, colTo: number): void {
  const n = a.n;
  if (k > ROW_MAJOR_COLUMNS) {
    // slices of columns, each its own row-major product
    for (let c0 = 0; c0 < k; c0 += ROW_MAJOR_COLUMNS) {
      const w = Math.min(ROW_MAJOR_COLUMNS, k - c0);
      symMultiplyColumns(a, x.subarray(c0 * n, (c0 + w) * n), w, y.subarray(c0 * n, (c0 + w) * n), colFrom, colTo);
    }
    return;
  }
  const rows = n - colFrom;
  if (rowMajor.length < 2 * rows * k) rowMajor = new Float64Array(2 * rows * k);
  const xr = rowMajor;
  const yr = rowMajor.subarray(rows * k, 2 * rows * k);
  yr.fill(0);
  // xr[(i − colFrom)·k + c] = X(i, c)
  for (let c = 0; c < k; c++) for (let i = colFrom, o = c * n + colFrom, q = c; i < n; i++, o++, q += k) xr[q] = x[o];
  const shift = colFrom * k;
  const full = k - (k % 3);
  for (let c = 0; c < full; c += 3) threeColumns(a, xr, yr, k, shift, c, colFrom, colTo);
  if (full < k) leftoverColumns(a, xr, yr, k, shift, full, colFrom, colTo);
  // Y(i, c) += yr
  for (let c = 0; c < k; c++) for (let i = colFrom, o = c * n + colFrom, q = c; i < n; i++, o++, q += k) y[o] += yr[q];
}

/** Columns c, c+1, c+2 of the row-major product (entry (i, c) at i·k − shift + c). */
function threeColumns(a: SymmetricCsc, xr: Float64Array, yr: Float64Array, k: number, shift: number, c: number, colFrom: number, colTo: number): void {
  const { colPtr, rowIdx, values } = a;
  for (let j = colFrom; j < colTo; j++) {
    const jo = j * k - shift + c;
    const x0 = xr[jo];
    const x1 = xr[jo + 1];
    const x2 = xr[jo + 2];
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      const v = values[p];
      if (i === j) {
        s0 += v * x0;
        s1 += v * x1;
        s2 += v * x2;
      } else {
        // y_i += a_ij x_j and the mirrored y_j += a_ij x_i
        const io = i * k - shift + c;
        yr[io] += v * x0;
        yr[io + 1] += v * x1;
        yr[io + 2] += v * x2;
        s0 += v * xr[io];
        s1 += v * xr[io + 1];
        s2 += v * xr[io + 2];
      }
    }
    yr[jo] += s0;
    yr[jo + 1] += s1;
    yr[jo + 2] += s2;
  }
}

/** Columns from..k−1 (one or two) of the row-major product, in one pass over A. */
function leftoverColumns(a: SymmetricCsc, xr: Float64Array, yr: Float64Array, k: number, shift: number, from: number, colFrom: number, colTo: number): void {
  const { colPtr, rowIdx, values } = a;
  for (let j = colFrom; j < colTo; j++) {
    const jo = j * k - shift;
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      const v = values[p];
      if (i === j) {
        for (let c = from; c < k; c++) yr[jo + c] += v * xr[jo + c];
      } else {
        const io = i * k - shift;
        for (let c = from; c < k; c++) {
          yr[io + c] += v * xr[jo + c];
          yr[jo + c] += v * xr[io + c];
        }
      }
    }
  }
}

/** Largest |a_ij| over the stored entries (the max-norm of the full matrix). */
export function maxAbsEntry(a: SymmetricCsc): number {
  let m = 0;
  for (let p = 0; p < a.colPtr[a.n]; p++) {
    const v = Math.abs(a.values[p]);
    if (v > m) m = v;
  }
  return m;
}

/** ‖A‖₁ = max_j Σ_i |a_ij| of the full symmetric matrix stored as its lower triangle (= ‖A‖∞). */
export function symOneNorm(a: SymmetricCsc): number {
  const colSum = new Float64Array(a.n);
  // each stored a_ij (i > j) adds to columns j and i; the diagonal once
  for (let j = 0; j < a.n; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      const i = a.rowIdx[p];
      const v = Math.abs(a.values[p]);
      colSum[j] += v;
      if (i !== j) colSum[i] += v;
    }
  }
  let best = 0;
  for (let j = 0; j < a.n; j++) if (colSum[j] > best) best = colSum[j];
  return best;
}
