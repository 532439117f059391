/**
 * Eigenvectors of a symmetric band matrix A (bandwidth b) for given, accurately known eigenvalues,
 * by inverse iteration:  x ← (A − σI)⁻¹ x / ‖·‖,  σ ≈ λ.
 *
 * (A − σI) is factored once per eigenvalue by band LU with partial pivoting, P(A − σI) = LU,
 * L unit lower with b sub-diagonals, U upper with 2b super-diagonals (row interchanges widen U),
 * O(n b²) work; each solve is O(n b). Row i of the work array holds columns i−b … i+2b.
 *
 * Since σ is within rounding of λ, one solve already amplifies the wanted component by about
 * 1/(ε‖A‖); the iteration stops once the growth ‖y‖∞ exceeds √(0.1/n)/(nε‖A‖) and then does two
 * more solves (the acceptance test used by LAPACK's tridiagonal inverse iteration, from memory).
 * Eigenvalues closer than 10⁻³‖A‖ form a cluster: each new vector is orthogonalized against the
 * cluster's earlier vectors (modified Gram–Schmidt) before every solve, and shifts within
 * 10ε‖A‖ of the previous shift are pushed apart by that amount so that exactly repeated
 * eigenvalues still yield independent vectors.
 */
import { seededUniform } from './seeded-random.js';
import { bandNormInf, type SymmetricBand } from './symmetric-band.js';

const EPS = 2.220446049250313e-16;
const CLUSTER_GAP = 1e-3;
const MAX_SOLVES = 8;
const EXTRA_SOLVES = 2;

interface BandLu {
  n: number;
  b: number;
  /** Row-wise windows of width 3b+1: entry (i, j) at i·(3b+1) + (j − i + b). */
  lu: Float64Array;
  pivots: Int32Array;
}

/**
 * Unit eigenvectors (n×k column-major) for the eigenvalues `values` (ascending, k of them) of the
 * band matrix. `seed` fixes the random start vectors.
 */
export function bandEigenvectors(band: SymmetricBand, values: ArrayLike<number>, seed = 1): Float64Array {
  const { n } = band;
  const k = values.length;
  const vectors = new Float64Array(n * k);
  const norm = Math.max(bandNormInf(band), Number.MIN_VALUE);
  const perturb = 10 * EPS * norm;
  const growthTarget = Math.sqrt(0.1 / n) / (n * EPS * norm);
  const uniform = seededUniform(seed);
  let clusterStart = 0;
  let prevShift = -Infinity;
  for (let j = 0; j < k; j++) {
    if (j > 0 && values[j] - values[j - 1] > CLUSTER_GAP * norm) clusterStart = j;
    let shift = values[j];
    if (j > clusterStart && shift - prevShift < perturb) shift = prevShift + perturb;
    prevShift = shift;
    const f = factorShifted(band, shift, EPS * norm);
    const x = vectors.subarray(j * n, (j + 1) * n);
    // random start in [−1, 1)
    for (let i = 0; i < n; i++) x[i] = uniform() * 2 - 1;
    let extra = -1;
    for (let it = 0; it < MAX_SOLVES && extra < EXTRA_SOLVES; it++) {
      orthogonalizeAgainst(vectors, n, clusterStart, j, x);
      normalize(x);
      solveInPlace(f, x);
      if (extra >= 0 || maxAbs(x) >= growthTarget) extra++;
    }
    orthogonalizeAgainst(vectors, n, clusterStart, j, x);
    normalize(x);
  }
  return vectors;
}

/** P(A − σI) = LU with partial pivoting; zero pivots replaced by `tiny`. */
function factorShifted(band: SymmetricBand, shift: number, tiny: number): BandLu {
  const { n, bandwidth: b, lower } = band;
  const w = 3 * b + 1;
  const lu = new Float64Array(n * w);
  const pivots = new Int32Array(n);
  // load A − σI into the row windows (both triangles from the lower band)
  for (let j = 0; j < n; j++) {
    const last = Math.min(j + b, n - 1);
    for (let i = j; i <= last; i++) {
      const v = lower[j * (b + 1) + i - j] - (i === j ? shift : 0);
      lu[i * w + j - i + b] = v;
      if (i !== j) lu[j * w + i - j + b] = v;
    }
  }
  for (let k = 0; k < n; k++) {
    const lastRow = Math.min(k + b, n - 1);
    const lastCol = Math.min(k + 2 * b, n - 1);
    // pivot: the largest |entry| of column k among rows k … k+b
    let p = k;
    for (let r = k + 1; r <= lastRow; r++) {
      if (Math.abs(lu[r * w + k - r + b]) > Math.abs(lu[p * w + k - p + b])) p = r;
    }
    pivots[k] = p;
    if (p !== k) {
      // swap rows k and p over columns k … k+2b
      for (let j = k; j <= lastCol; j++) {
        const t = lu[k * w + j - k + b];
        lu[k * w + j - k + b] = lu[p * w + j - p + b];
        lu[p * w + j - p + b] = t;
      }
    }
    if (lu[k * w + b] === 0) lu[k * w + b] = tiny;
    const pivot = lu[k * w + b];
    // eliminate column k from rows k+1 … k+b, keeping the multipliers in place
    for (let r = k + 1; r <= lastRow; r++) {
      const at = r * w + k - r + b;
      const l = lu[at] / pivot;
      lu[at] = l;
      if (l === 0) continue;
      for (let j = k + 1; j <= lastCol; j++) lu[r * w + j - r + b] -= l * lu[k * w + j - k + b];
    }
  }
  return { n, b, lu, pivots };
}

/** x ← (A − σI)⁻¹ x from the factorization. */
function solveInPlace(f: BandLu, x: Float64Array): void {
  const { n, b, lu, pivots } = f;
  const w = 3 * b + 1;
  // L y = P x, interchanges applied step by step
  for (let k = 0; k < n; k++) {
    const p = pivots[k];
    if (p !== k) {
      const t = x[k];
      x[k] = x[p];
      x[p] = t;
    }
    const xk = x[k];
    if (xk === 0) continue;
    const lastRow = Math.min(k + b, n - 1);
    for (let r = k + 1; r <= lastRow; r++) x[r] -= lu[r * w + k - r + b] * xk;
  }
  // U x = y, from the bottom
  for (let k = n - 1; k >= 0; k--) {
    const lastCol = Math.min(k + 2 * b, n - 1);
    let s = x[k];
    for (let j = k + 1; j <= lastCol; j++) s -= lu[k * w + j - k + b] * x[j];
    x[k] = s / lu[k * w + b];
  }
}

/** x ← x − Σ_{c ∈ [from, to)} (v_cᵀx) v_c, modified Gram–Schmidt against unit columns. */
function orthogonalizeAgainst(v: Float64Array, n: number, from: number, to: number, x: Float64Array): void {
  for (let c = from; c < to; c++) {
    const o = c * n;
    let d = 0;
    for (let i = 0; i < n; i++) d += v[o + i] * x[i];
    for (let i = 0; i < n; i++) x[i] -= d * v[o + i];
  }
}

function normalize(x: Float64Array): void {
  const scale = maxAbs(x);
  if (scale === 0 || !Number.isFinite(scale)) {
    // a degenerate start: fall back to a unit vector
    x.fill(0);
    x[0] = 1;
    return;
  }
  let s = 0;
  for (let i = 0; i < x.length; i++) s += (x[i] / scale) ** 2;
  const inv = 1 / (scale * Math.sqrt(s));
  for (let i = 0; i < x.length; i++) x[i] *= inv;
}

function maxAbs(x: Float64Array): number {
  let m = 0;
  for (let i = 0; i < x.length; i++) m = Math.max(m, Math.abs(x[i]));
  return m;
}
