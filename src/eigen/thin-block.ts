/**
 * Thin column-major blocks (n×a, a ≪ n) as the eigen algorithms use them: the products are the
 * dense layer's kernels (src/dense/block-ops.ts) under the argument order used here, plus
 * column bookkeeping and a repeatable random start block.
 */
import { addTimesSmall, timesSmall, transposeTimes } from '../dense/block-ops.js';

/** G = Xᵀ Y, with X n×a and Y n×b; G is a×b column-major (src/dense/block-ops.ts). */
export function crossProduct(x: Float64Array, a: number, y: Float64Array, b: number, n: number): Float64Array {
  return transposeTimes(x, y, n, a, b);
}

/** Z = X Q, with X n×a and Q a×b; Z is n×b (src/dense/block-ops.ts). */
export function blockTimes(x: Float64Array, a: number, q: Float64Array, b: number, n: number): Float64Array {
  return timesSmall(x, n, a, q, b);
}

/** Y ← Y − X H, with X n×a, H a×b, Y n×b (src/dense/block-ops.ts). */
export function subtractBlockTimes(y: Float64Array, x: Float64Array, a: number, h: Float64Array, b: number, n: number): void {
  addTimesSmall(y, x, n, a, h, b, -1);
}

/** Columns [from, to) of an n-row block, copied. */
export function columns(x: Float64Array, n: number, from: number, to: number): Float64Array {
  return x.slice(from * n, to * n);
}

/** [X Y]: the columns of X followed by those of Y. */
export function joinColumns(x: Float64Array, y: Float64Array): Float64Array {
  const z = new Float64Array(x.length + y.length);
  z.set(x, 0);
  z.set(y, x.length);
  return z;
}

/** Euclidean norm of column j of an n-row block. */
export function columnNorm(x: Float64Array, n: number, j: number): number {
  let s = 0;
  // √Σ x_rj²
  for (let r = j * n; r < (j + 1) * n; r++) s += x[r] * x[r];
  return Math.sqrt(s);
}

/** A deterministic pseudo-random n×k block in [−0.5, 0.5) (mulberry32), so runs repeat exactly. */
export function randomBlock(n: number, k: number, seed: number): Float64Array {
  const x = new Float64Array(n * k);
  let s = seed >>> 0;
  // one uniform number per entry
  for (let i = 0; i < x.length; i++) {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    x[i] = ((t ^ (t >>> 14)) >>> 0) / 4294967296 - 0.5;
  }
  return x;
}
