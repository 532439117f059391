/**
 * Column bookkeeping for thin column-major blocks (n×a, a ≪ n) and a repeatable random start
 * block. Products of blocks are the dense layer's kernels in src/dense/block-ops.ts.
 */
import { seededUniform } from '../dense/seeded-random.js';

/** Columns [from, to) of an n-row block, copied. */
export function columns(x: Float64Array, n: number, from: number, to: number): Float64Array {
  return x.slice(from * n, to * n);
}

/** A deterministic pseudo-random n×k block in [−0.5, 0.5), so runs repeat exactly. */
export function randomBlock(n: number, k: number, seed: number): Float64Array {
  const x = new Float64Array(n * k);
  const u = seededUniform(seed);
  // one uniform number per entry
  for (let i = 0; i < x.length; i++) x[i] = u() - 0.5;
  return x;
}
