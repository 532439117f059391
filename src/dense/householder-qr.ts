/**
 * Thin Householder QR of a tall block: A = Q R with A rows×cols (rows ≥ cols), Q rows×cols with
 * orthonormal columns, R cols×cols upper triangular.
 *
 *   H_{cols−1} ⋯ H₁ H₀ A = [R; 0],   H_k = I − τ_k v_k v_kᵀ,   Q = H₀ H₁ ⋯ H_{cols−1} (:, 0:cols)
 *
 * Reflector k is built from A(k:rows, k) after the earlier ones are applied and maps it to
 * (β, 0, …, 0); v_k(0) = 1 is implicit, v_k(1:) is kept below the diagonal of the work array.
 *
 * Rank-deficient columns: a column already in the span of the earlier ones gives |R_kk| ≈ 0. Q is
 * still orthonormal (a product of reflectors always is), and its column k is then some unit vector
 * orthogonal to the earlier ones. Columns with |R_kk| ≤ rankTolerance·max_j‖A(:, j)‖ are reported
 * as `tinyColumns`; rank = cols − tinyColumns.length. (No column pivoting: the count reveals
 * columns that depend on earlier ones, which is what block orthogonalization needs.)
 */
import { householderVector } from './tridiagonalize.js';

export interface HouseholderQr {
  rows: number;
  cols: number;
  /** rows×cols: R on and above the diagonal, v_k(1:) below it (column-major). */
  factors: Float64Array;
  /** τ_k of each reflector (0 = identity). */
  tau: Float64Array;
  /** Columns k with |R_kk| ≤ tolerance·max column norm of A. */
  tinyColumns: Int32Array;
  rank: number;
  /** min_k |R_kk| (0 for cols = 0: nothing to be small). */
  minAbsDiagonal: number;
}

export interface ThinQr {
  /** rows×cols, orthonormal columns. */
  q: Float64Array;
  /** cols×cols upper triangular. */
  r: Float64Array;
  tinyColumns: Int32Array;
  rank: number;
  minAbsDiagonal: number;
}

const DEFAULT_RANK_TOLERANCE = 1e-12;

/** Householder factorization of A (rows×cols column-major, rows ≥ cols); A is not modified. */
export function householderQr(
  a: Float64Array,
  rows: number,
  cols: number,
  rankTolerance = DEFAULT_RANK_TOLERANCE,
): HouseholderQr {
  if (cols > rows) throw new Error(`householderQr: need rows ≥ cols, got ${rows}×${cols}`);
  const f = Float64Array.from(a.subarray(0, rows * cols));
  const tau = new Float64Array(cols);
  const scale = maxColumnNorm(f, rows, cols);
  for (let k = 0; k < cols; k++) {
    const at = k * rows + k;
    tau[k] = householderVector(f, at, rows - k);
    // apply H_k to the remaining columns k+1..cols−1
    for (let j = k + 1; j < cols; j++) reflect(f, at, rows - k, tau[k], f, j * rows + k);
  }
  const tiny: number[] = [];
  let minAbs = cols === 0 ? 0 : Infinity;
  // diagonal of R against the rank tolerance
  for (let k = 0; k < cols; k++) {
    const d = Math.abs(f[k * rows + k]);
    minAbs = Math.min(minAbs, d);
    if (d <= rankTolerance * scale) tiny.push(k);
  }
  return {
    rows,
    cols,
    factors: f,
    tau,
    tinyColumns: Int32Array.from(tiny),
    rank: cols - tiny.length,
    minAbsDiagonal: minAbs,
  };
}

/** Explicit thin Q (rows×cols) and R (cols×cols) of A. */
export function thinQr(
  a: Float64Array,
  rows: number,
  cols: number,
  rankTolerance = DEFAULT_RANK_TOLERANCE,
): ThinQr {
  const qr = householderQr(a, rows, cols, rankTolerance);
  return {
    q: formThinQ(qr),
    r: upperFactor(qr),
    tinyColumns: qr.tinyColumns,
    rank: qr.rank,
    minAbsDiagonal: qr.minAbsDiagonal,
  };
}

/** R (cols×cols, column-major) from the factorization. */
function upperFactor(qr: HouseholderQr): Float64Array {
  const { rows, cols, factors } = qr;
  const r = new Float64Array(cols * cols);
  // R(0:j, j) = factors(0:j, j)
  for (let j = 0; j < cols; j++) {
    for (let i = 0; i <= j; i++) r[j * cols + i] = factors[j * rows + i];
  }
  return r;
}

/** Q(:, 0:cols) = H₀ ⋯ H_{cols−1} [I; 0], accumulated backwards. */
function formThinQ(qr: HouseholderQr): Float64Array {
  const { rows, cols } = qr;
  const q = new Float64Array(rows * cols);
  // [I; 0]
  for (let j = 0; j < cols; j++) q[j * rows + j] = 1;
  for (let k = cols - 1; k >= 0; k--) {
    // H_k touches rows k.. and (going backwards) only columns k.. are not yet unit vectors
    for (let j = k; j < cols; j++) reflect(qr.factors, k * rows + k, rows - k, qr.tau[k], q, j * rows + k);
  }
  return q;
}

/** B ← Qᵀ B with the full rows×rows Q = H₀ ⋯ H_{cols−1}; B is rows×bCols. */
export function applyQTransposed(qr: HouseholderQr, b: Float64Array, bCols: number): void {
  const { rows, cols } = qr;
  // Qᵀ = H_{cols−1} ⋯ H₀: apply H₀ first
  for (let k = 0; k < cols; k++) {
    for (let j = 0; j < bCols; j++) reflect(qr.factors, k * rows + k, rows - k, qr.tau[k], b, j * rows + k);
  }
}

/** B ← Q B with the full rows×rows Q; B is rows×bCols. */
export function applyQ(qr: HouseholderQr, b: Float64Array, bCols: number): void {
  const { rows, cols } = qr;
  // Q = H₀ ⋯ H_{cols−1}: apply H_{cols−1} first
  for (let k = cols - 1; k >= 0; k--) {
    for (let j = 0; j < bCols; j++) reflect(qr.factors, k * rows + k, rows - k, qr.tau[k], b, j * rows + k);
  }
}

/**
 * y ← (I − τ v vᵀ) y for the length-m segment y = target[yAt ..], v = (1, v[vAt+1 ..]).
 */
function reflect(
  v: Float64Array,
  vAt: number,
  m: number,
  tau: number,
  target: Float64Array,
  yAt: number,
): void {
  if (tau === 0) return;
  // w = vᵀ y
  let w = target[yAt];
  for (let i = 1; i < m; i++) w += v[vAt + i] * target[yAt + i];
  w *= tau;
  if (w === 0) return;
  // y −= τ (vᵀy) v
  target[yAt] -= w;
  for (let i = 1; i < m; i++) target[yAt + i] -= w * v[vAt + i];
}

function maxColumnNorm(a: Float64Array, rows: number, cols: number): number {
  let worst = 0;
  // max_j ‖A(:, j)‖₂
  for (let j = 0; j < cols; j++) {
    let s = 0;
    for (let i = 0; i < rows; i++) s += a[j * rows + i] * a[j * rows + i];
    worst = Math.max(worst, Math.sqrt(s));
  }
  return worst;
}
