/** Shared helpers for the dense-kernel tests: seeded random matrices and column-major arithmetic. */
import { Matrix } from 'ml-matrix';
import { seededUniform } from '../../src/dense/seeded-random.js';

/** Deterministic uniform numbers in [−1, 1), so failures reproduce. */
export function seededRandom(seed: number): () => number {
  const u = seededUniform(seed);
  return () => u() * 2 - 1;
}

/** Random symmetric n×n, column-major. */
export function randomSymmetric(n: number, seed: number): Float64Array {
  const rnd = seededRandom(seed);
  const a = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    for (let i = j; i < n; i++) a[j * n + i] = a[i * n + j] = rnd();
  }
  return a;
}

/** Random rows×cols, column-major. */
export function randomBlock(rows: number, cols: number, seed: number): Float64Array {
  const rnd = seededRandom(seed);
  return Float64Array.from({ length: rows * cols }, () => rnd());
}

/** C = A B for column-major A (r×k), B (k×c). */
export function multiply(a: Float64Array, b: Float64Array, r: number, k: number, c: number): Float64Array {
  const out = new Float64Array(r * c);
  for (let j = 0; j < c; j++) {
    for (let p = 0; p < k; p++) {
      const bpj = b[j * k + p];
      for (let i = 0; i < r; i++) out[j * r + i] += a[p * r + i] * bpj;
    }
  }
  return out;
}

/** Aᵀ for column-major r×c A. */
export function transposed(a: Float64Array, r: number, c: number): Float64Array {
  const t = new Float64Array(r * c);
  for (let j = 0; j < c; j++) for (let i = 0; i < r; i++) t[i * c + j] = a[j * r + i];
  return t;
}

/** max |(XᵀBX − I)_ij| for column-major X (n×k), B n×n or identity when null. */
export function orthogonalityError(x: Float64Array, n: number, k: number, b: Float64Array | null = null): number {
  const bx = b ? multiply(b, x, n, n, k) : x;
  const g = multiply(transposed(x, n, k), bx, k, n, k);
  let worst = 0;
  for (let j = 0; j < k; j++) for (let i = 0; i < k; i++) worst = Math.max(worst, Math.abs(g[j * k + i] - (i === j ? 1 : 0)));
  return worst;
}

/** max over columns of ‖A x_j − λ_j B x_j‖₂ (B = I when null). */
export function maxResidual(
  a: Float64Array,
  n: number,
  values: Float64Array,
  x: Float64Array,
  b: Float64Array | null = null,
): number {
  const ax = multiply(a, x, n, n, n);
  const bx = b ? multiply(b, x, n, n, n) : x;
  let worst = 0;
  for (let j = 0; j < values.length; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += (ax[j * n + i] - values[j] * bx[j * n + i]) ** 2;
    worst = Math.max(worst, Math.sqrt(s));
  }
  return worst;
}

/** max |a_ij| */
export function maxAbs(a: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i]));
  return m;
}

/** ml-matrix Matrix from column-major data. */
export function toMatrix(a: Float64Array, r: number, c: number): Matrix {
  const m = new Matrix(r, c);
  for (let j = 0; j < c; j++) for (let i = 0; i < r; i++) m.set(i, j, a[j * r + i]);
  return m;
}

/** Column-major data from an ml-matrix Matrix. */
export function fromMatrix(m: Matrix): Float64Array {
  const out = new Float64Array(m.rows * m.columns);
  for (let j = 0; j < m.columns; j++) for (let i = 0; i < m.rows; i++) out[j * m.rows + i] = m.get(i, j);
  return out;
}

/** Random orthogonal n×n (Q of a QR of a random matrix, via modified Gram–Schmidt twice). */
export function randomOrthogonal(n: number, seed: number): Float64Array {
  const q = randomBlock(n, n, seed);
  for (let pass = 0; pass < 2; pass++) {
    for (let j = 0; j < n; j++) {
      for (let i = 0; i < j; i++) {
        let d = 0;
        for (let r = 0; r < n; r++) d += q[i * n + r] * q[j * n + r];
        for (let r = 0; r < n; r++) q[j * n + r] -= d * q[i * n + r];
      }
      let s = 0;
      for (let r = 0; r < n; r++) s += q[j * n + r] ** 2;
      s = Math.sqrt(s);
      for (let r = 0; r < n; r++) q[j * n + r] /= s;
    }
  }
  return q;
}

/** Q diag(λ) Qᵀ for orthogonal Q. */
export function withSpectrum(q: Float64Array, lambda: number[]): Float64Array {
  const n = lambda.length;
  const ql = new Float64Array(n * n);
  for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) ql[j * n + i] = q[j * n + i] * lambda[j];
  const a = multiply(ql, transposed(q, n, n), n, n, n);
  for (let j = 0; j < n; j++) for (let i = j + 1; i < n; i++) a[i * n + j] = a[j * n + i];
  return a;
}
