/**
 * Dense Cholesky factorization A = L Lᵀ of a symmetric positive definite k×k matrix, and the
 * triangular solves that go with it, for single blocks of right-hand sides.
 *
 * Left-looking, column by column (column-major, leading dimension k):
 *
 *   L(j, j)   = √(a_jj − Σ_{p<j} L(j,p)²)
 *   L(i, j)   = (a_ij − Σ_{p<j} L(i,p) L(j,p)) / L(j, j),   i > j.
 *
 * Failure: if the pivot a_jj − Σ L(j,p)² is not > 0 (or not finite) at column j, the matrix is not
 * numerically positive definite and the result reports that column (0-based) and the pivot seen.
 * Only the lower triangle of A is read.
 */

export type CholeskyResult =
  | { ok: true; lower: Float64Array }
  | { ok: false; failedColumn: number; pivot: number };

/** Thrown by callers that need a factor and got a matrix that is not positive definite. */
export class NotPositiveDefiniteError extends Error {
  constructor(
    readonly what: string,
    readonly failedColumn: number,
    readonly pivot: number,
  ) {
    super(`${what} is not positive definite (pivot ${pivot} at column ${failedColumn})`);
    this.name = 'NotPositiveDefiniteError';
  }
}

/** L with A = LLᵀ (strict upper triangle zero), or the column where the factorization broke down. */
export function cholesky(a: Float64Array, k: number): CholeskyResult {
  const l = new Float64Array(k * k);
  // copy the lower triangle of A
  for (let j = 0; j < k; j++) {
    for (let i = j; i < k; i++) l[j * k + i] = a[j * k + i];
  }
  for (let j = 0; j < k; j++) {
    const cj = j * k;
    // L(j:k, j) −= L(j:k, p)·L(j, p) for every earlier column p
    for (let p = 0; p < j; p++) {
      const cp = p * k;
      const ljp = l[cp + j];
      if (ljp === 0) continue;
      for (let i = j; i < k; i++) l[cj + i] -= l[cp + i] * ljp;
    }
    const pivot = l[cj + j];
    if (!(pivot > 0) || !Number.isFinite(pivot)) return { ok: false, failedColumn: j, pivot };
    const root = Math.sqrt(pivot);
    l[cj + j] = root;
    // L(j+1:k, j) /= L(j, j)
    for (let i = j + 1; i < k; i++) l[cj + i] /= root;
  }
  return { ok: true, lower: l };
}

/** L, or throws NotPositiveDefiniteError naming `what`. */
export function choleskyOrThrow(a: Float64Array, k: number, what = 'matrix'): Float64Array {
  const r = cholesky(a, k);
  if (!r.ok) throw new NotPositiveDefiniteError(what, r.failedColumn, r.pivot);
  return r.lower;
}

/** B ← L⁻¹ B for the k×cols block B (column-major, leading dimension k): forward substitution. */
export function solveLower(l: Float64Array, k: number, b: Float64Array, cols: number): void {
  for (let c = 0; c < cols; c++) {
    const o = c * k;
    // x_j = (b_j − Σ_{i<j} L(j,i) x_i) / L(j,j), column-oriented: eliminate x_j from rows below
    for (let j = 0; j < k; j++) {
      const xj = (b[o + j] /= l[j * k + j]);
      if (xj === 0) continue;
      const lj = j * k;
      for (let i = j + 1; i < k; i++) b[o + i] -= l[lj + i] * xj;
    }
  }
}

/** B ← L⁻ᵀ B for the k×cols block B: back substitution with Lᵀ. */
export function solveLowerTransposed(
  l: Float64Array,
  k: number,
  b: Float64Array,
  cols: number,
): void {
  for (let c = 0; c < cols; c++) {
    const o = c * k;
    // x_j = (b_j − Σ_{i>j} L(i,j) x_i) / L(j,j), from the bottom up (a dot product down column j)
    for (let j = k - 1; j >= 0; j--) {
      const lj = j * k;
      let sum = b[o + j];
      for (let i = j + 1; i < k; i++) sum -= l[lj + i] * b[o + i];
      b[o + j] = sum / l[lj + j];
    }
  }
}

/**
 * X ← X L⁻ᵀ for a tall rows×k block X (column-major, leading dimension rows): solves Y Lᵀ = X.
 * Column j: Y(:, j) = (X(:, j) − Σ_{i<j} L(j, i) Y(:, i)) / L(j, j). This is the step that
 * turns a block with XᵀBX = LLᵀ into a B-orthonormal one (Cholesky QR).
 */
export function solveRightLowerTransposed(
  x: Float64Array,
  rows: number,
  l: Float64Array,
  k: number,
): void {
  for (let j = 0; j < k; j++) {
    const cj = j * rows;
    // subtract the earlier (already solved) columns
    for (let i = 0; i < j; i++) {
      const f = l[i * k + j];
      if (f === 0) continue;
      const ci = i * rows;
      for (let r = 0; r < rows; r++) x[cj + r] -= f * x[ci + r];
    }
    const inv = 1 / l[j * k + j];
    // scale by 1 / L(j, j)
    for (let r = 0; r < rows; r++) x[cj + r] *= inv;
  }
}
