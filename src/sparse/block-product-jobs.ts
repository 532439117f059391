/**
 * Block products on shared arrays that the helper thread (helper-thread.ts) runs on a share of
 * the rows or columns while this thread runs the rest: the eigen layer's basis products
 * (src/eigen/shared-block-products.ts) and the split product with a shared matrix.
 */
import { addTimesSmall, timesSmallInPlace, transposeTimes } from '../dense/block-ops.js';
import { symMultiplyColumns, type SymmetricCsc } from './csc.js';
import { alongside, availableThreads, inSharedMemory, sharedCopy, sharedScratch, startHelper, type Answer } from './helper-thread.js';

/** Block products on shared arrays that the helper runs on a share of the rows or columns. */
export type BlockProductJob =
  | { kind: 'transposeTimes'; a: Float64Array; b: Float64Array; rows: number; p: number; q: number; out: Float64Array; rowFrom: number; rowTo: number }
  | { kind: 'addTimesSmall'; c: Float64Array; a: Float64Array; rows: number; p: number; s: Float64Array; q: number; alpha: number; rowFrom: number; rowTo: number }
  | { kind: 'timesSmallInPlace'; a: Float64Array; rows: number; p: number; s: Float64Array; q: number; rowFrom: number; rowTo: number }
  | { kind: 'symMultiply'; a: SymmetricCsc; x: Float64Array; k: number; y: Float64Array; colFrom: number; colTo: number };

/**
 * Runs `job` (see src/eigen/shared-block-products.ts) on the helper while `mine` runs here;
 * false (and `mine` not run) when there is no helper.
 */
export function runSplit(job: BlockProductJob, mine: () => void): boolean {
  const h = startHelper();
  if (h === null) return false;
  alongside(h, job, mine);
  return true;
}

/** Products below this many multiply-adds stay on this thread (our choice, about 1 ms of work). */
export const SPLIT_MIN_WORK = 2e6;

const sharedMatrices = new WeakMap<SymmetricCsc, SymmetricCsc>();
const productX = sharedScratch();
const productY = sharedScratch();

/** A copy of `a` in shared memory (made once per matrix), or null without a helper thread. */
export function sharedMatrix(a: SymmetricCsc): SymmetricCsc | null {
  if (availableThreads() < 2) return null;
  let s = sharedMatrices.get(a);
  if (s === undefined) {
    s = { n: a.n, colPtr: sharedCopy(a.colPtr), rowIdx: sharedCopy(a.rowIdx), values: sharedCopy(a.values) };
    sharedMatrices.set(a, s);
  }
  return s;
}

/**
 * Y = A X (A from sharedMatrix, X n×k) with the stored columns split between the threads at half
 * the nonzeros; each thread sums into its own output and the helper's is added here. False when
 * it did not run (small product, no helper).
 */
export function splitSymMultiplyBlock(a: SymmetricCsc, x: Float64Array, k: number, y: Float64Array): boolean {
  const n = a.n;
  const nnz = a.colPtr[n];
  if (nnz * k < SPLIT_MIN_WORK || !(a.values.buffer instanceof SharedArrayBuffer)) return false;
  const h = startHelper();
  if (h === null) return false;
  // X staged in shared memory unless it is there already; the helper's partial Y apart
  const xs = inSharedMemory(x, n * k, productX);
  const ys = productY(n * k).fill(0);
  // the column where half of the stored entries lie before
  let lo = 0;
  let hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (a.colPtr[mid] < nnz / 2) lo = mid + 1;
    else hi = mid;
  }
  alongside(h, { kind: 'symMultiply', a, x: xs, k, y: ys, colFrom: lo, colTo: n }, () => {
    y.fill(0, 0, n * k);
    symMultiplyColumns(a, xs, k, y, 0, lo);
  });
  for (let i = 0; i < n * k; i++) y[i] += ys[i];
  return true;
}

const DONE: Answer = { kind: 'done' };

/** The helper's handlers of these jobs (helper-worker.ts). */
export const blockProductHandlers = {
  transposeTimes(job: Extract<BlockProductJob, { kind: 'transposeTimes' }>): Answer {
    transposeTimes(job.a, job.b, job.rows, job.p, job.q, job.out, job.rowFrom, job.rowTo);
    return DONE;
  },
  addTimesSmall(job: Extract<BlockProductJob, { kind: 'addTimesSmall' }>): Answer {
    addTimesSmall(job.c, job.a, job.rows, job.p, job.s, job.q, job.alpha, job.rowFrom, job.rowTo);
    return DONE;
  },
  symMultiply(job: Extract<BlockProductJob, { kind: 'symMultiply' }>): Answer {
    symMultiplyColumns(job.a, job.x, job.k, job.y, job.colFrom, job.colTo);
    return DONE;
  },
  timesSmallInPlace(job: Extract<BlockProductJob, { kind: 'timesSmallInPlace' }>): Answer {
    timesSmallInPlace(job.a, job.rows, job.p, job.s, job.q, job.rowFrom, job.rowTo);
    return DONE;
  },
};
