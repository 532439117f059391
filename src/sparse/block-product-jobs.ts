/**
 * Block products on shared arrays that the helper threads (helper-thread.ts) run on shares of
 * the rows or columns while this thread runs the first share: the eigen layer's basis products
 * (src/eigen/shared-block-products.ts) and the split product with a shared matrix.
 */
import { addTimesSmall, timesSmallInPlace, transposeTimes } from '../dense/block-ops.js';
import { adoptHome, type BlockHome } from '../dense/simd-block-kernels.js';
import { symMultiplyColumns, type SymmetricCsc } from './csc.js';
import { alongsideAll, availableThreads, inSharedMemory, sharedCopy, sharedScratch, startHelpers, type Answer } from './helper-thread.js';
import { gatherRegions, KERNEL_COLUMNS, kernelMatrix, regionProduct, stageColumns, type KernelMatrix } from './sym-product-kernel.js';

/**
 * Where a basis product's block A lives when it is a SIMD kernel block (its memory, so the helper
 * can run the kernels there, and the helper's staging region in it), else undefined.
 */
interface JobPlace {
  home?: BlockHome;
  region: number;
}

/** Block products on shared arrays that a helper runs on a share of the rows or columns. */
export type BlockProductJob =
  | ({ kind: 'transposeTimes'; a: Float64Array; b: Float64Array; rows: number; p: number; q: number; out: Float64Array; rowFrom: number; rowTo: number } & JobPlace)
  | ({ kind: 'addTimesSmall'; c: Float64Array; a: Float64Array; rows: number; p: number; s: Float64Array; q: number; alpha: number; rowFrom: number; rowTo: number } & JobPlace)
  | ({ kind: 'timesSmallInPlace'; a: Float64Array; rows: number; p: number; s: Float64Array; q: number; rowFrom: number; rowTo: number } & JobPlace)
  | { kind: 'symMultiply'; a: SymmetricCsc; x: Float64Array; k: number; y: Float64Array; colFrom: number; colTo: number }
  | { kind: 'symMultiplyKernel'; home: KernelMatrix; w: number; colFrom: number; colTo: number; region: number };

/** Products below this many multiply-adds stay on this thread (our choice, about 1 ms of work). */
export const SPLIT_MIN_WORK = 2e6;

/**
 * Shares a product of `work` multiply-adds is split into: 1 (this thread alone) below
 * SPLIT_MIN_WORK, else one per thread (N of helper-thread.ts) but no more than make shares of
 * SPLIT_MIN_WORK (at least two), and at most `most`.
 */
export function productShares(work: number, most = Infinity): number {
  if (work < SPLIT_MIN_WORK) return 1;
  return Math.max(1, Math.min(availableThreads(), most, Math.max(2, Math.floor(work / SPLIT_MIN_WORK))));
}

/** bounds[t] … bounds[t + 1] − 1: share t of `rows` rows in `shares` near-equal shares. */
export function shareBounds(rows: number, shares: number): number[] {
  return Array.from({ length: shares + 1 }, (_, t) => Math.round((t * rows) / shares));
}

/**
 * Runs jobs[i] on helper i while `mine` (share 0) runs here; false (and nothing run) when there
 * are fewer helpers than jobs.
 */
export function runShares(jobs: BlockProductJob[], mine: () => void): boolean {
  const helpers = startHelpers(jobs.length);
  if (helpers.length < jobs.length) return false;
  alongsideAll(helpers, jobs, mine);
  return true;
}

/**
 * Shares of Y = A X: the partial outputs of the helpers (n × k each) are held at once, and the
 * sparse product is bound by memory bandwidth, so more shares buy little (our choice).
 */
const SYM_MULTIPLY_MOST_SHARES = 4;

/** The shared matrix of each matrix (made once), and the kernel memory of those that live in one. */
const sharedMatrices = new WeakMap<SymmetricCsc, SymmetricCsc>();
const homes = new WeakMap<SymmetricCsc, KernelMatrix>();
const productX = sharedScratch();
const productY = sharedScratch();

/**
 * The matrix in shared memory (made once per matrix), or null without helper threads: placed in
 * a shared WebAssembly memory for the SIMD product kernel (sym-product-kernel.ts) where it is
 * available, else copied into SharedArrayBuffers. Either is the one extra copy of the matrix,
 * kept as long as `a` is.
 */
export function sharedMatrix(a: SymmetricCsc): SymmetricCsc | null {
  const threads = availableThreads();
  if (threads < 2) return null;
  let s = sharedMatrices.get(a);
  if (s === undefined) {
    const placed = kernelMatrix(a, Math.min(threads, SYM_MULTIPLY_MOST_SHARES));
    if (placed !== null) {
      s = placed.matrix;
      homes.set(s, placed.home);
    } else {
      s = { n: a.n, colPtr: sharedCopy(a.colPtr), rowIdx: sharedCopy(a.rowIdx), values: sharedCopy(a.values) };
    }
    sharedMatrices.set(a, s);
  }
  return s;
}

/** bounds[t]: the first stored column with t/shares of the nonzeros before it (bounds[shares] = n). */
function columnBounds(a: SymmetricCsc, shares: number): number[] {
  const n = a.n;
  const nnz = a.colPtr[n];
  const bounds = [0];
  for (let t = 1; t < shares; t++) {
    let lo = bounds[t - 1];
    let hi = n;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (a.colPtr[mid] < (t * nnz) / shares) lo = mid + 1;
      else hi = mid;
    }
    bounds.push(lo);
  }
  bounds.push(n);
  return bounds;
}

/**
 * Y = A X (A from sharedMatrix, X n×k) with the stored columns split between the threads at equal
 * shares of the nonzeros; each thread sums into its own output and the helpers' are added here in
 * helper order. With the SIMD kernel (A in a kernel memory) always true, the product on this
 * thread alone when it is small; otherwise false when it did not run (small product, no helper).
 */
export function splitSymMultiplyBlock(a: SymmetricCsc, x: Float64Array, k: number, y: Float64Array): boolean {
  const home = homes.get(a);
  if (home !== undefined) {
    kernelSymMultiplyBlock(a, home, x, k, y);
    return true;
  }
  const n = a.n;
  const nnz = a.colPtr[n];
  const shares = productShares(nnz * k, SYM_MULTIPLY_MOST_SHARES);
  if (shares < 2 || !(a.values.buffer instanceof SharedArrayBuffer)) return false;
  // X staged in shared memory unless it is there already; each helper's partial Y apart
  const xs = inSharedMemory(x, n * k, productX);
  const ys = productY((shares - 1) * n * k).fill(0);
  const bounds = columnBounds(a, shares);
  const jobs: BlockProductJob[] = [];
  for (let t = 1; t < shares; t++) jobs.push({ kind: 'symMultiply', a, x: xs, k, y: ys.subarray((t - 1) * n * k, t * n * k), colFrom: bounds[t], colTo: bounds[t + 1] });
  const ran = runShares(jobs, () => {
    y.fill(0, 0, n * k);
    symMultiplyColumns(a, xs, k, y, 0, bounds[1]);
  });
  if (!ran) return false;
  addPartials(y, ys, shares, n * k);
  return true;
}

/**
 * Y = A X through the SIMD kernel, KERNEL_COLUMNS columns of X at a time as csc.ts slices them:
 * the slice's columns in threes are staged row-major in A's memory, thread t computes the stored
 * columns of its share into its region Y_t, and Y is Y_0 + Y_1 + … added here in thread order
 * (the same split for a given N on every run); the one or two columns a slice has left over go
 * through csc.ts's own loop here, whose order of summation the kernel does not follow. So with
 * one share the product is bit-identical to csc.ts symMultiplyBlock (small models give the same
 * bits on any N, as before the kernel).
 */
function kernelSymMultiplyBlock(a: SymmetricCsc, home: KernelMatrix, x: Float64Array, k: number, y: Float64Array): void {
  const n = a.n;
  const shares = Math.min(home.regions, productShares(a.colPtr[n] * Math.min(k, KERNEL_COLUMNS), SYM_MULTIPLY_MOST_SHARES));
  const bounds = columnBounds(a, shares);
  for (let c0 = 0; c0 < k; c0 += KERNEL_COLUMNS) {
    const w = Math.min(KERNEL_COLUMNS, k - c0);
    // (a single column is csc.ts symMultiply, which sums as the kernel does)
    const threes = k === 1 ? 1 : w - (w % 3);
    if (threes > 0) {
      stageColumns(home, x, c0, threes);
      const jobs: BlockProductJob[] = [];
      for (let t = 1; t < shares; t++) jobs.push({ kind: 'symMultiplyKernel', home, w: threes, colFrom: bounds[t], colTo: bounds[t + 1], region: t });
      const ran = shares > 1 && runShares(jobs, () => regionProduct(home, threes, 0, bounds[1], 0));
      // no helpers after all (runShares ran nothing): every column here
      if (!ran) regionProduct(home, threes, 0, n, 0);
      gatherRegions(home, threes, y, c0, ran ? bounds.slice(0, shares) : [0]);
    }
    if (threes < w) {
      // the columns left over, by the plain loop on this thread
      const left = y.subarray((c0 + threes) * n, (c0 + w) * n).fill(0);
      symMultiplyColumns(a, x.subarray((c0 + threes) * n, (c0 + w) * n), w - threes, left, 0, n);
    }
  }
}

/**
 * out[0, len) += the helpers' partial results (shares 1 … shares − 1, each `len` long in
 * `partials`), in share order: a fixed order, so the sum does not depend on timing.
 */
export function addPartials(out: Float64Array, partials: Float64Array, shares: number, len: number): void {
  for (let t = 1; t < shares; t++) {
    const o = (t - 1) * len;
    for (let i = 0; i < len; i++) out[i] += partials[o + i];
  }
}

const DONE: Answer = { kind: 'done' };

/** The helper's handlers of these jobs (helper-worker.ts). */
export const blockProductHandlers = {
  transposeTimes(job: Extract<BlockProductJob, { kind: 'transposeTimes' }>): Answer {
    if (job.home) adoptHome(job.a, job.home);
    transposeTimes(job.a, job.b, job.rows, job.p, job.q, job.out, job.rowFrom, job.rowTo, job.region);
    return DONE;
  },
  addTimesSmall(job: Extract<BlockProductJob, { kind: 'addTimesSmall' }>): Answer {
    if (job.home) adoptHome(job.a, job.home);
    addTimesSmall(job.c, job.a, job.rows, job.p, job.s, job.q, job.alpha, job.rowFrom, job.rowTo, job.region);
    return DONE;
  },
  symMultiply(job: Extract<BlockProductJob, { kind: 'symMultiply' }>): Answer {
    symMultiplyColumns(job.a, job.x, job.k, job.y, job.colFrom, job.colTo);
    return DONE;
  },
  symMultiplyKernel(job: Extract<BlockProductJob, { kind: 'symMultiplyKernel' }>): Answer {
    regionProduct(job.home, job.w, job.colFrom, job.colTo, job.region);
    return DONE;
  },
  timesSmallInPlace(job: Extract<BlockProductJob, { kind: 'timesSmallInPlace' }>): Answer {
    if (job.home) adoptHome(job.a, job.home);
    timesSmallInPlace(job.a, job.rows, job.p, job.s, job.q, job.rowFrom, job.rowTo, job.region);
    return DONE;
  },
};
