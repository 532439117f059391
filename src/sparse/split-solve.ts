/**
 * Two-thread block solves on a factor made by split-factor.ts, and their jobs for the helper
 * thread (helper-thread.ts): the two parts' sweeps run at once, the top's between them.
 */
import type { SupernodalFactor } from './numeric-ldlt.js';
import type { SupernodalStructure } from './symbolic.js';
import type { SubtreeSplit } from './subtree-split.js';
import type { FactorStorage } from './simd-sweep-kernels.js';
import { backwardSweepRanges, diagonalSolve, forwardSweepRanges, sweepWorkspace } from './triangular-solve.js';
import { alongside, sharedInt32, sharedScratch, startHelper, type Answer } from './helper-thread.js';

/** The factor and the block X (n × columns, in pivot order) a sweep job works on, all shared. */
interface SweepParts {
  structure: SupernodalStructure;
  values: Float64Array;
  d: Float64Array;
  storage?: FactorStorage;
  x: Float64Array;
  columns: number;
  ranges: [number, number][];
}

/** The forward sweep over the helper's part; its updates of the top's rows go to acc (index, count as in RowRedirect). */
export interface ForwardJob extends SweepParts {
  kind: 'forward';
  index: Int32Array;
  count: number;
  acc: Float64Array;
}

/** The backward sweep over the helper's part. */
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
  /** The helper's accumulator for the top's rows, reused from solve to solve. */
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
 * X ← (L D Lᵀ)⁻¹ X in pivot order on two threads: forward sweeps over the two parts at once
 * (their updates of the top's rows kept apart and added afterwards), the top's forward sweep,
 * D⁻¹, the top's backward sweep, then the parts' backward sweeps at once (they only read the
 * top's rows). False when it did not run (no helper, factor or X not in shared memory).
 */
export function splitSolveInPlace(f: SupernodalFactor, x: Float64Array, k: number, plan: SplitSolve): boolean {
  if (!(f.values.buffer instanceof SharedArrayBuffer) || !(x.buffer instanceof SharedArrayBuffer)) return false;
  const h = startHelper();
  if (h === null) return false;
  const { split, index, count, topColumns } = plan;
  const n = f.structure.n;
  const ws = sweepWorkspace(f, k);
  const mine = new Float64Array(count * k);
  const theirs = plan.helperAcc(count * k).fill(0);
  const common = { structure: f.structure, values: f.values, d: f.d, storage: f.storage, x, columns: k };
  alongside(h, { ...common, kind: 'forward', ranges: split.parts[1], index, count, acc: theirs } satisfies ForwardJob, () => {
    forwardSweepRanges(f, x, k, ws, split.parts[0], { index, count, acc: mine });
  });
  // the parts' updates of the top's rows, in a fixed order
  for (let c = 0; c < k; c++) {
    for (let t = 0; t < count; t++) x[c * n + topColumns[t]] += mine[c * count + t] + theirs[c * count + t];
  }
  forwardSweepRanges(f, x, k, ws, split.top);
  diagonalSolve(f, x, k);
  backwardSweepRanges(f, x, k, ws, split.top);
  alongside(h, { ...common, kind: 'backward', ranges: split.parts[1] } satisfies BackwardJob, () => backwardSweepRanges(f, x, k, ws, split.parts[0]));
  return true;
}

const DONE: Answer = { kind: 'done' };

/** The helper's handlers of these jobs (helper-worker.ts). */
export const solveJobHandlers = {
  forward(job: ForwardJob): Answer {
    const f = { structure: job.structure, values: job.values, d: job.d, storage: job.storage };
    forwardSweepRanges(f, job.x, job.columns, sweepWorkspace(f, job.columns, 1), job.ranges, { index: job.index, count: job.count, acc: job.acc });
    return DONE;
  },
  backward(job: BackwardJob): Answer {
    const f = { structure: job.structure, values: job.values, d: job.d, storage: job.storage };
    backwardSweepRanges(f, job.x, job.columns, sweepWorkspace(f, job.columns, 1), job.ranges);
    return DONE;
  },
};
