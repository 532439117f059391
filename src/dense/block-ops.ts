/**
 * Products of thin blocks (rows×p, rows ≫ p, column-major, leading dimension rows) with each other
 * and with small p×q matrices: the dense arithmetic of block eigen-solvers outside the sparse
 * operator.
 *
 *   transposeTimes:       C = AᵀB          (p×q inner products, rows-long)
 *   gram:                 G = AᵀA          (symmetric, half the products)
 *   timesSmall:           C = A S          (rows×q, S p×q)
 *   addTimesSmall:        C ← C + α A S
 *   columnNorms, scaleColumns, axpy, copyColumns: column bookkeeping.
 *
 * Rows are processed in chunks of ROW_CHUNK so the chunk of every column stays in cache while all
 * products over it are formed; inner loops run down contiguous columns and are blocked 2×2
 * (inner products) or 4-wide (combinations) to reuse each load.
 */

const ROW_CHUNK = 1024;

/** C = AᵀB, A rows×p, B rows×q; C p×q (written to `out` when given); only rows [rowFrom, rowTo) of A and B when given. */
export function transposeTimes(
  a: Float64Array,
  b: Float64Array,
  rows: number,
  p: number,
  q: number,
  out: Float64Array = new Float64Array(p * q),
  rowFrom = 0,
  rowTo = rows,
): Float64Array {
  out.fill(0, 0, p * q);
  for (let r0 = rowFrom; r0 < rowTo; r0 += ROW_CHUNK) {
    const r1 = Math.min(rowTo, r0 + ROW_CHUNK);
    // C(i, j) += A(r0:r1, i)ᵀ B(r0:r1, j) for all i, j
    for (let j = 0; j < q; j += 2) {
      const twoJ = j + 1 < q;
      for (let i = 0; i < p; i += 2) {
        dots2x2(a, b, rows, r0, r1, i, j, i + 1 < p, twoJ, out, p);
      }
    }
  }
  return out;
}

/** G = AᵀA (p×p symmetric, both triangles filled). */
export function gram(
  a: Float64Array,
  rows: number,
  p: number,
  out: Float64Array = new Float64Array(p * p),
): Float64Array {
  out.fill(0, 0, p * p);
  for (let r0 = 0; r0 < rows; r0 += ROW_CHUNK) {
    const r1 = Math.min(rows, r0 + ROW_CHUNK);
    // G(i, j) += A(r0:r1, i)ᵀ A(r0:r1, j) for i ≤ j (2×2 tiles on or above the diagonal)
    for (let j = 0; j < p; j += 2) {
      const twoJ = j + 1 < p;
      for (let i = 0; i <= j; i += 2) dots2x2(a, a, rows, r0, r1, i, j, i + 1 < p, twoJ, out, p);
    }
  }
  // mirror the upper triangle into the lower
  for (let j = 0; j < p; j++) {
    for (let i = j + 1; i < p; i++) out[j * p + i] = out[i * p + j];
  }
  return out;
}

/** out(i:i+1, j:j+1) += A(r0:r1, i:i+1)ᵀ B(r0:r1, j:j+1), the second row/column only if present. */
function dots2x2(
  a: Float64Array,
  b: Float64Array,
  rows: number,
  r0: number,
  r1: number,
  i: number,
  j: number,
  twoI: boolean,
  twoJ: boolean,
  out: Float64Array,
  ld: number,
): void {
  const a0 = i * rows;
  const a1 = twoI ? a0 + rows : a0;
  const b0 = j * rows;
  const b1 = twoJ ? b0 + rows : b0;
  let s00 = 0;
  let s10 = 0;
  let s01 = 0;
  let s11 = 0;
  // four inner products sharing the loads
  for (let r = r0; r < r1; r++) {
    const x0 = a[a0 + r];
    const x1 = a[a1 + r];
    const y0 = b[b0 + r];
    const y1 = b[b1 + r];
    s00 += x0 * y0;
    s10 += x1 * y0;
    s01 += x0 * y1;
    s11 += x1 * y1;
  }
  out[j * ld + i] += s00;
  if (twoI) out[j * ld + i + 1] += s10;
  if (twoJ) {
    out[(j + 1) * ld + i] += s01;
    if (twoI) out[(j + 1) * ld + i + 1] += s11;
  }
}

/** C = A S, A rows×p, S p×q (column-major, leading dimension p); C rows×q. */
export function timesSmall(
  a: Float64Array,
  rows: number,
  p: number,
  s: Float64Array,
  q: number,
  out: Float64Array = new Float64Array(rows * q),
): Float64Array {
  out.fill(0, 0, rows * q);
  addTimesSmall(out, a, rows, p, s, q, 1);
  return out;
}

/** C ← C + α A S, C rows×q, A rows×p, S p×q, on rows [rowFrom, rowTo) (all by default). C must not overlap A. */
export function addTimesSmall(
  c: Float64Array,
  a: Float64Array,
  rows: number,
  p: number,
  s: Float64Array,
  q: number,
  alpha = 1,
  rowFrom = 0,
  rowTo = rows,
): void {
  for (let r0 = rowFrom; r0 < rowTo; r0 += ROW_CHUNK) {
    const r1 = Math.min(rowTo, r0 + ROW_CHUNK);
    for (let j = 0; j < q; j++) {
      const cj = j * rows;
      // C(r0:r1, j) += α Σ_l S(l, j) A(r0:r1, l), four columns of A per pass
      let l = 0;
      for (; l + 3 < p; l += 4) {
        const s0 = alpha * s[j * p + l];
        const s1 = alpha * s[j * p + l + 1];
        const s2 = alpha * s[j * p + l + 2];
        const s3 = alpha * s[j * p + l + 3];
        const c0 = l * rows;
        const c1 = c0 + rows;
        const c2 = c1 + rows;
        const c3 = c2 + rows;
        for (let r = r0; r < r1; r++) {
          c[cj + r] += s0 * a[c0 + r] + s1 * a[c1 + r] + s2 * a[c2 + r] + s3 * a[c3 + r];
        }
      }
      for (; l < p; l++) {
        const sl = alpha * s[j * p + l];
        if (sl === 0) continue;
        const cl = l * rows;
        for (let r = r0; r < r1; r++) c[cj + r] += sl * a[cl + r];
      }
    }
  }
}

/**
 * A(:, 0:q) ← A S in place (A rows×p, S p×q, q ≤ p), on rows [rowFrom, rowTo): each row of the
 * result depends only on the same row of A, so the rows are done a chunk at a time through a
 * small buffer and written back over the first q columns.
 */
export function timesSmallInPlace(a: Float64Array, rows: number, p: number, s: Float64Array, q: number, rowFrom = 0, rowTo = rows): void {
  if (q > p) throw new RangeError(`timesSmallInPlace: ${q} result columns exceed the ${p} of A`);
  const buf = new Float64Array(ROW_CHUNK * q);
  for (let r0 = rowFrom; r0 < rowTo; r0 += ROW_CHUNK) {
    const r1 = Math.min(rowTo, r0 + ROW_CHUNK);
    const len = r1 - r0;
    buf.fill(0, 0, len * q);
    // buf(:, j) = Σ_l S(l, j) A(r0:r1, l)
    for (let j = 0; j < q; j++) {
      const bj = j * len;
      let l = 0;
      // four columns of A per pass
      for (; l + 3 < p; l += 4) {
        const s0 = s[j * p + l], s1 = s[j * p + l + 1], s2 = s[j * p + l + 2], s3 = s[j * p + l + 3];
        const a0 = l * rows + r0, a1 = a0 + rows, a2 = a1 + rows, a3 = a2 + rows;
        for (let r = 0; r < len; r++) buf[bj + r] += s0 * a[a0 + r] + s1 * a[a1 + r] + s2 * a[a2 + r] + s3 * a[a3 + r];
      }
      for (; l < p; l++) {
        const sl = s[j * p + l];
        const al = l * rows + r0;
        for (let r = 0; r < len; r++) buf[bj + r] += sl * a[al + r];
      }
    }
    for (let j = 0; j < q; j++) a.set(buf.subarray(j * len, (j + 1) * len), j * rows + r0);
  }
}

/** y ← y + α x over `length` entries (offsets allow columns of blocks). */
export function axpy(
  y: Float64Array,
  alpha: number,
  x: Float64Array,
  length = y.length,
  yAt = 0,
  xAt = 0,
): void {
  // y_i += α x_i
  for (let i = 0; i < length; i++) y[yAt + i] += alpha * x[xAt + i];
}

/** ‖A(:, j)‖₂ for each column j of the rows×cols block A. */
export function columnNorms(a: Float64Array, rows: number, cols: number): Float64Array {
  const norms = new Float64Array(cols);
  for (let j = 0; j < cols; j++) {
    const cj = j * rows;
    let s = 0;
    // Σ_i a_ij²
    for (let i = 0; i < rows; i++) s += a[cj + i] * a[cj + i];
    norms[j] = Math.sqrt(s);
  }
  return norms;
}

/** A(:, j) ← f_j A(:, j). */
export function scaleColumns(a: Float64Array, rows: number, factors: ArrayLike<number>): void {
  for (let j = 0; j < factors.length; j++) {
    const f = factors[j];
    const cj = j * rows;
    // a_ij *= f_j
    for (let i = 0; i < rows; i++) a[cj + i] *= f;
  }
}

/** The columns `columns` (in that order) of the rows×? block A, as a new rows×columns.length block. */
export function copyColumns(a: Float64Array, rows: number, columns: ArrayLike<number>): Float64Array {
  const out = new Float64Array(rows * columns.length);
  // out(:, k) = A(:, columns[k])
  for (let k = 0; k < columns.length; k++) {
    out.set(a.subarray(columns[k] * rows, columns[k] * rows + rows), k * rows);
  }
  return out;
}
