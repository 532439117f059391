/**
 * The products of a thin block with the large Krylov basis V (n × m, m up to a few hundred)
 * that dominate the dense work of block Lanczos — P = VᵀX, X ← X + α V S and the restart
 * V ← V S in place — split by rows into near-equal shares, one per thread (N of the sparse
 * layer's helper threads, src/sparse/block-product-jobs.ts over helper-thread.ts), when V lives
 * in shared memory (basisBlock) and the product is large enough to pay for the hand-over. The
 * small operands are copied into shared staging blocks (unless they are in shared memory
 * already, as basisOperand's blocks are); each thread sums its rows, the partial P are added in
 * share order (so a given N gives the same bits on every run), the helpers' rows of X are copied
 * back. Otherwise the plain kernels of src/dense/block-ops.ts run here.
 *
 * With helper threads the basis is allocated in a shared WebAssembly memory where the SIMD
 * kernels are available (src/dense/simd-block-kernels.ts: the basis, then one staging region per
 * thread): block-ops.ts then runs these products as WebAssembly SIMD kernels over it,
 * bit-identical to its plain loops, each thread in its own staging region (the jobs carry the
 * memory and the region). On one thread the basis is an ordinary array whose rows block-ops.ts
 * stages for the kernels.
 */
import { addTimesSmall, timesSmallInPlace, transposeTimes } from '../dense/block-ops.js';
import { homeOf, kernelBlock } from '../dense/simd-block-kernels.js';
import { availableThreads, inSharedMemory, sharedBlock, sharedScratch } from '../sparse/helper-thread.js';
import { addPartials, productShares, runShares, shareBounds, type BlockProductJob } from '../sparse/block-product-jobs.js';

/** Shared staging blocks for the small operands, reused from call to call. */
const stage = sharedScratch();
const stageOut = sharedScratch();
/** The block behind basisOperand. */
const operand = sharedScratch();

/**
 * An n×m basis block: when helper threads may work on it, in shared memory — a SIMD kernel block
 * (with a staging region for each of the N threads) where the kernels are available. On one
 * thread an ordinary array: shared memory is no pressure for the collector, so dead bases would
 * outlive their use (tet26k, one thread: peak RSS 336–347 MB with kernel blocks against 311 MB);
 * block-ops.ts then stages the basis's rows into its scratch memory for the kernels.
 */
export function basisBlock(length: number): Float64Array {
  if (availableThreads() < 2) return new Float64Array(length);
  return kernelBlock(length, availableThreads()) ?? sharedBlock(length);
}

/**
 * A copy of the first `length` entries of X to be projected against the basis (X ← X − V S after
 * P = VᵀX): in a shared block reused from call to call when helper threads may take shares of
 * those products, so neither has to stage X (a full copy for VᵀX, the helpers' rows of X in and
 * out for X − V S); a plain copy otherwise. Valid until the next call.
 */
export function basisOperand(x: Float64Array, length: number): Float64Array {
  const copy = availableThreads() >= 2 ? operand(length) : new Float64Array(length);
  copy.set(x.subarray(0, length));
  return copy;
}

/** Shares of a product of `work` multiply-adds on `a`: 1 unless `a` is shared and the work large. */
function sharesFor(a: Float64Array, work: number): number {
  return a.buffer instanceof SharedArrayBuffer ? productShares(work) : 1;
}

/** P = AᵀB (A rows×p in shared memory: the basis; B rows×q), p×q. */
export function basisTransposeTimes(a: Float64Array, b: Float64Array, rows: number, p: number, q: number): Float64Array {
  const shares = sharesFor(a, rows * p * q);
  if (shares < 2) return transposeTimes(a, b, rows, p, q);
  const bs = inSharedMemory(b, rows * q, stage);
  const home = homeOf(a);
  const theirs = stageOut((shares - 1) * p * q);
  const bounds = shareBounds(rows, shares);
  const mine = new Float64Array(p * q);
  const jobs: BlockProductJob[] = [];
  for (let t = 1; t < shares; t++) {
    jobs.push({ kind: 'transposeTimes', a, b: bs, rows, p, q, out: theirs.subarray((t - 1) * p * q, t * p * q), rowFrom: bounds[t], rowTo: bounds[t + 1], home, region: t });
  }
  const ran = runShares(jobs, () => {
    transposeTimes(a, bs, rows, p, q, mine, 0, bounds[1]);
  });
  if (!ran) return transposeTimes(a, b, rows, p, q);
  addPartials(mine, theirs, shares, p * q);
  return mine;
}

/** C ← C + α A S (A rows×p in shared memory: the basis; S p×q; C rows×q). */
export function basisAddTimesSmall(c: Float64Array, a: Float64Array, rows: number, p: number, s: Float64Array, q: number, alpha = 1): void {
  const shares = sharesFor(a, rows * p * q);
  if (shares < 2) {
    addTimesSmall(c, a, rows, p, s, q, alpha);
    return;
  }
  const shared = c.buffer instanceof SharedArrayBuffer;
  const cs = shared ? c : stageOut(rows * q);
  const bounds = shareBounds(rows, shares);
  const mid = bounds[1];
  // the helpers' rows of C, staged when C is not shared
  if (!shared) for (let j = 0; j < q; j++) cs.set(c.subarray(j * rows + mid, (j + 1) * rows), j * rows + mid);
  const ss = inSharedMemory(s, p * q, stage);
  const home = homeOf(a);
  const jobs: BlockProductJob[] = [];
  for (let t = 1; t < shares; t++) jobs.push({ kind: 'addTimesSmall', c: cs, a, rows, p, s: ss, q, alpha, rowFrom: bounds[t], rowTo: bounds[t + 1], home, region: t });
  const ran = runShares(jobs, () => {
    addTimesSmall(c, a, rows, p, s, q, alpha, 0, mid);
  });
  if (!ran) {
    // no helpers after all (runShares ran nothing): every row here
    addTimesSmall(c, a, rows, p, s, q, alpha);
    return;
  }
  if (!shared) for (let j = 0; j < q; j++) c.set(cs.subarray(j * rows + mid, (j + 1) * rows), j * rows + mid);
}

/** A(:, 0:q) ← A S in place (A rows×p, the basis; q ≤ p): a restart without a second basis. */
export function basisTimesSmallInPlace(a: Float64Array, rows: number, p: number, s: Float64Array, q: number): void {
  const shares = sharesFor(a, rows * p * q);
  if (shares < 2) {
    timesSmallInPlace(a, rows, p, s, q);
    return;
  }
  const ss = inSharedMemory(s, p * q, stage);
  const bounds = shareBounds(rows, shares);
  const jobs: BlockProductJob[] = [];
  const home = homeOf(a);
  for (let t = 1; t < shares; t++) jobs.push({ kind: 'timesSmallInPlace', a, rows, p, s: ss, q, rowFrom: bounds[t], rowTo: bounds[t + 1], home, region: t });
  const ran = runShares(jobs, () => timesSmallInPlace(a, rows, p, s, q, 0, bounds[1]));
  // no helpers after all (runShares ran nothing): every row here
  if (!ran) timesSmallInPlace(a, rows, p, s, q);
}

/** C = A S (A rows×p shared basis, S p×q). */
export function basisTimesSmall(a: Float64Array, rows: number, p: number, s: Float64Array, q: number): Float64Array {
  const c = new Float64Array(rows * q);
  basisAddTimesSmall(c, a, rows, p, s, q, 1);
  return c;
}
