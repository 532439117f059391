/**
 * N-thread block solves on a factor made by split-factor.ts, and their jobs for the helper
 * threads (helper-thread.ts): the N parts' sweeps run at once, the top's between them.
 */
import type { SupernodalFactor } from './numeric-ldlt.js';
import type { SupernodalStructure } from './symbolic.js';
import type { SubtreeSplit } from './subtree-split.js';
import type { FactorStorage } from './simd-sweep-kernels.js';
import { backwardSweepRanges, diagonalSolve, forwardSweepRanges, sweepWorkspace } from './triangular-solve.js';
import { alongsideAll, sharedInt32, sharedScratch, startHelpers, type Answer } from './helper-thread.js';

/** The factor and the block X (n × columns, in pivot order) a sweep job works on, all shared; the helper's scratch region. */
interface SweepParts {
  structure: SupernodalStructure;
  values: Float64Array;
  d: Float64Array;
  storage?: FactorStorage;
  x: Float64Array;
  columns: number;
  ranges: [number, number][];
  region: number;
}

/** The forward sweep over a helper's part; its updates of the top's rows go to acc (index, count as in RowRedirect). */
export interface ForwardJob extends SweepParts {
  kind: 'forward';
  index: Int32Array;
  count: number;
  acc: Float64Array;
}

/** The backward sweep over a helper's part. */
export interface BackwardJob extends SweepParts {
  kind: 'backward';
}

/** A split of the tree prepared for solves: the top's columns numbered 0…count−1. */
export interface SplitSolve {
  split: SubtreeSplit;
  /** index[j] = position of column j among the top's columns, −1 for columns of the parts. */
  index: Int32Array;
  count: number;
  /** The top's columns, ascending. */
  topColumns: Int32Array;
  /** The helpers' accumulators for the top's rows (helper i's at i · count · k), reused from solve to solve. */
  helperAcc: (length: number) => Float64Array;
}

export function prepareSplitSolve(s: SupernodalStructure, split: SubtreeSplit): SplitSolve {
  const index = sharedInt32(s.n).fill(-1);
  const cols: number[] = [];
  // the columns of every top supernode
  for (const [lo, hi] of split.top) {
    for (let j = s.superStart[lo]; j < s.superStart[hi + 1]; j++) {
      index[j] = cols.length;
      cols.push(j);
    }
  }
  return { split, index, count: cols.length, topColumns: Int32Array.from(cols), helperAcc: sharedScratch() };
}

/**
 * X ← (L D Lᵀ)⁻¹ X in pivot order on N threads (N = the split's parts): forward sweeps over the
 * N parts at once (their updates of the top's rows kept apart, one accumulator per thread, and
 * added afterwards in part order), the top's forward sweep, D⁻¹, the top's backward sweep, then
 * the parts' backward sweeps at once (they only read the top's rows). False when it did not run
 * (too few helpers, factor or X not in shared memory).
 */
export function splitSolveInPlace(f: SupernodalFactor, x: Float64Array, k: number, plan: SplitSolve): boolean {
  if (!(f.values.buffer instanceof SharedArrayBuffer) || !(x.buffer instanceof SharedArrayBuffer)) return false;
  const { split, index, count, topColumns } = plan;
  const helpers = startHelpers(split.parts.length - 1);
  if (helpers.length !== split.parts.length - 1) return false;
  const n = f.structure.n;
  const ws = sweepWorkspace(f, k);
  const size = count * k;
  const mine = new Float64Array(size);
  const theirs = plan.helperAcc(helpers.length * size).fill(0);
  const common = { structure: f.structure, values: f.values, d: f.d, storage: f.storage, x, columns: k };
  const forward = helpers.map((_, i): ForwardJob => ({ ...common, kind: 'forward', ranges: split.parts[i + 1], region: i + 1, index, count, acc: theirs.subarray(i * size, (i + 1) * size) }));
  alongsideAll(helpers, forward, () => forwardSweepRanges(f, x, k, ws, split.parts[0], { index, count, acc: mine }));
  // the parts' updates of the top's rows, in part order
  for (let c = 0; c < k; c++) {
    for (let t = 0; t < count; t++) {
      let sum = mine[c * count + t];
      for (let i = 0; i < helpers.length; i++) sum += theirs[i * size + c * count + t];
      x[c * n + topColumns[t]] += sum;
    }
  }
  forwardSweepRanges(f, x, k, ws, split.top);
  diagonalSolve(f, x, k);
  backwardSweepRanges(f, x, k, ws, split.top);
  const backward = helpers.map((_, i): BackwardJob => ({ ...common, kind: 'backward', ranges: split.parts[i + 1], region: i + 1 }));
  alongsideAll(helpers, backward, () => backwardSweepRanges(f, x, k, ws, split.parts[0]));
  return true;
}

const DONE: Answer = { kind: 'done' };

/** The helper's handlers of these jobs (helper-worker.ts). */
export const solveJobHandlers = {
  forward(job: ForwardJob): Answer {
    const f = { structure: job.structure, values: job.values, d: job.d, storage: job.storage };
    forwardSweepRanges(f, job.x, job.columns, sweepWorkspace(f, job.columns, job.region), job.ranges, { index: job.index, count: job.count, acc: job.acc });
    return DONE;
  },
  backward(job: BackwardJob): Answer {
    const f = { structure: job.structure, values: job.values, d: job.d, storage: job.storage };
    backwardSweepRanges(f, job.x, job.columns, sweepWorkspace(f, job.columns, job.region), job.ranges);
    return DONE;
  },
};
