/**
 * Two-thread LDLᵀ factorization and block solves, behind the same synchronous interface as the
 * serial ones.
 *
 * Factorization: the supernodal tree is split (subtree-split.ts) into two sets of disjoint
 * subtrees; a helper thread (factor-worker.ts) factors one set while this thread factors the
 * other, then this thread factors the top (their common ancestors), applying the updates the
 * subtrees still owe through the shared `nextRow` record. Both threads write disjoint blocks of
 * the same SharedArrayBuffer-backed arrays, so nothing is copied or merged but the pivot counts.
 * Solves use the same split: the two parts' sweeps run at once, the top's between them.
 *
 * Synchronisation: the job is posted on a MessagePort with an id; this thread works, then blocks
 * in Atomics.wait until the helper writes that id into the shared flag after posting its result;
 * the result is read with receiveMessageOnPort. Nothing needs the event loop, so the API stays
 * synchronous.
 *
 * The helper is one module-wide thread, started on first use and unref'd (it never keeps the
 * process alive). It is used only where the compiled worker file exists next to this module
 * (not when the sources run untranspiled, as under the test runner), when the machine has at
 * least two cores, and unless MODALGATE_THREADS=1. A helper that does not answer a first ping
 * within 10 s is dropped and everything runs serially.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { MessageChannel, Worker, receiveMessageOnPort, type MessagePort } from 'node:worker_threads';
import {
  applyDescendant,
  factorSupernodes,
  factorValues,
  panelUpdateRows,
  rowsBefore,
  type RecycledValues,
  type SupernodalFactor,
  type SupernodeCooperation,
  type UpdateWorkspace,
} from './numeric-ldlt.js';
import type { MonitorState, PivotMonitor } from './pivot-monitor.js';
import type { SupernodalStructure } from './symbolic.js';
import type { SubtreeSplit } from './subtree-split.js';
import type { FactorStorage } from './simd-sweep-kernels.js';
import type { WeightedGraph } from './ordering/coarsen-graph.js';
import { symMultiplyColumns, type SymmetricCsc } from './csc.js';
import { backwardSweepRanges, diagonalSolve, forwardSweepRanges, sweepWorkspace } from './triangular-solve.js';

/** What a job asks the helper to do. */
export type JobBody =
  | { kind: 'ping' }
  | { kind: 'collect' }
  /** Drop the workspace kept for the jobs of one factorization (it views that factor's memory). */
  | { kind: 'dropWorkspace' }
  | { kind: 'separatorRuns'; graph: WeightedGraph; seeds: number[] }
  | {
      kind: 'factor';
      structure: SupernodalStructure;
      shift: number;
      tolerance: number;
      diagonalScale: number;
      values: Float64Array;
      d: Float64Array;
      storage?: FactorStorage;
      nextRow: Int32Array;
      dirty: boolean;
      ranges: [number, number][];
    }
  | {
      kind: 'forward';
      structure: SupernodalStructure;
      values: Float64Array;
      d: Float64Array;
      storage?: FactorStorage;
      x: Float64Array;
      columns: number;
      ranges: [number, number][];
      index: Int32Array;
      count: number;
      acc: Float64Array;
    }
  | { kind: 'backward'; structure: SupernodalStructure; values: Float64Array; d: Float64Array; storage?: FactorStorage; x: Float64Array; columns: number; ranges: [number, number][] }
  | BlockProductJob
  | {
      kind: 'descendants';
      structure: SupernodalStructure;
      values: Float64Array;
      d: Float64Array;
      storage?: FactorStorage;
      sn: number;
      /** (dn, start, stop) triples. */
      list: Int32Array;
      /** The helper's share: target columns ≥ fromColumn. */
      fromColumn: number;
    }
  | { kind: 'panel'; structure: SupernodalStructure; values: Float64Array; d: Float64Array; storage?: FactorStorage; sn: number; c0: number; c1: number; from: number; to: number };

/** A job as posted: its body, the shared flag and the id the helper writes into it when done. */
export type HelperJob = JobBody & { flag: Int32Array; id: number };

export type HelperResult =
  | { kind: 'pong' }
  | { kind: 'factored'; monitor: MonitorState }
  | { kind: 'separators'; wheres: Uint8Array[] }
  | { kind: 'done' }
  | { kind: 'failed'; message: string };

const workerUrl = new URL('./factor-worker.js', import.meta.url);
/** The compiled helper exists next to this module (not when the sources run untranspiled). */
const workerBuilt = existsSync(fileURLToPath(workerUrl));

interface Helper {
  port: MessagePort;
  flag: Int32Array;
}

let helper: Helper | null | undefined;

/** Threads the parallel kernels may use here (1 or 2). */
export function availableThreads(): number {
  if (process.env.MODALGATE_THREADS === '1') return 1;
  if (availableParallelism() < 2) return 1;
  return workerBuilt ? 2 : 1;
}

function startHelper(): Helper | null {
  if (helper !== undefined) return helper;
  helper = null;
  if (availableThreads() < 2) return null;
  const { port1, port2 } = new MessageChannel();
  const worker = new Worker(workerUrl, { workerData: { port: port2 }, transferList: [port2] });
  worker.unref();
  port1.unref();
  // an error after start-up shows as a failed job; before it, as a missing pong
  worker.on('error', () => {});
  const candidate = { port: port1, flag: new Int32Array(new SharedArrayBuffer(4)) };
  const reply = postJob(candidate, { kind: 'ping' })(10_000);
  if (reply?.kind !== 'pong') {
    void worker.terminate();
    return null;
  }
  helper = candidate;
  return helper;
}

let lastJobId = 0;

/**
 * Posts a job, returns a function that waits for its result. Jobs carry an id that the helper
 * writes into the flag and its answer: an answer to an earlier job whose wait was abandoned (this
 * thread threw during its own share) is skipped, never taken for this one's.
 */
function postJob(h: Helper, body: JobBody): (timeoutMs?: number) => HelperResult | undefined {
  const id = (lastJobId = (lastJobId % 0x3fffffff) + 1);
  const job: HelperJob = { ...body, flag: h.flag, id };
  h.port.postMessage(job);
  return (timeoutMs = Infinity) => {
    const deadline = performance.now() + timeoutMs;
    // the flag holds the id of the last finished job
    for (let seen = Atomics.load(h.flag, 0); seen !== id; seen = Atomics.load(h.flag, 0)) {
      const left = deadline - performance.now();
      if (left <= 0 || Atomics.wait(h.flag, 0, seen, left) === 'timed-out') return undefined;
    }
    for (;;) {
      const got = receiveMessageOnPort(h.port)?.message as (HelperResult & { id?: number }) | undefined;
      if (got === undefined || got.id === id) return got;
    }
  };
}

/** Runs `body` on the helper while `mine` runs here; returns the helper's result, of kind `expect`. */
function alongside<K extends HelperResult['kind']>(h: Helper, body: JobBody, mine: () => void, expect: K): Extract<HelperResult, { kind: K }> {
  const wait = postJob(h, body);
  mine();
  const r = wait();
  if (r?.kind !== expect) failed(r);
  return r as Extract<HelperResult, { kind: K }>;
}

let collector: (() => void) | undefined;

/**
 * A full collection on this thread. Shared arrays are returned to the system only when every
 * thread has dropped them, and the collector does not count them as pressure: without this, dead
 * Krylov bases and factors outlive their use by a whole factorization.
 */
function collectHere(): void {
  if (collector === undefined) {
    setFlagsFromString('--expose-gc');
    collector = runInNewContext('gc') as () => void;
  }
  collector();
}

/** A zeroed Float64Array in shared memory. */
export function sharedBlock(length: number): Float64Array {
  return new Float64Array(new SharedArrayBuffer(8 * Math.max(1, length)), 0, length);
}

function sharedInt32(length: number): Int32Array {
  return new Int32Array(new SharedArrayBuffer(4 * Math.max(1, length)), 0, length);
}

/**
 * A shared block that grows on demand and is handed out again and again: shared memory is
 * reclaimed late by the collector, so blocks used once per call would pile up.
 */
export function sharedScratch(): (length: number) => Float64Array {
  let block = sharedBlock(0);
  return (length) => {
    if (block.length < length) block = sharedBlock(length);
    return block.subarray(0, length);
  };
}

/** The first `length` entries of `x`, copied into `scratch` unless they are in shared memory already. */
export function inSharedMemory(x: Float64Array, length: number, scratch: (length: number) => Float64Array): Float64Array {
  if (x.buffer instanceof SharedArrayBuffer) return x;
  const copy = scratch(length);
  copy.set(x.subarray(0, length));
  return copy;
}

function shared<T extends Float64Array | Int32Array>(a: T): T {
  const out = (a instanceof Float64Array ? sharedBlock(a.length) : sharedInt32(a.length)) as T;
  out.set(a);
  return out;
}

/** The structure with every array moved to shared memory (the helper reads it without a copy). */
export function shareStructure(s: SupernodalStructure): SupernodalStructure {
  const { pair } = s;
  return {
    ...s,
    perm: shared(s.perm),
    pair: { n: pair.n, colPtr: shared(pair.colPtr), rowIdx: shared(pair.rowIdx), stiffness: shared(pair.stiffness), mass: shared(pair.mass) },
    superStart: shared(s.superStart),
    superOf: shared(s.superOf),
    rowPtr: shared(s.rowPtr),
    rows: shared(s.rows),
    valuePtr: shared(s.valuePtr),
  };
}

function failed(r: HelperResult | undefined): never {
  throw new Error(`parallel factorization helper ${r?.kind === 'failed' ? `failed: ${r.message}` : 'gave no result'}`);
}

/**
 * LDLᵀ on two threads along `split` (two parts); null when no helper thread is available, so the
 * caller factors serially. `s` must come from shareStructure.
 */
export function parallelSupernodalLdlt(s: SupernodalStructure, shift: number, monitor: PivotMonitor, split: SubtreeSplit, recycled?: RecycledValues): SupernodalFactor | null {
  const h = startHelper();
  if (h === null || split.parts.length !== 2) return null;
  // before the factor's large allocation: let both threads drop the shared arrays of earlier work
  alongside(h, { kind: 'collect' }, collectHere, 'done');
  const { values, storage, dirty } = factorValues(s, recycled, sharedBlock);
  const d = sharedBlock(s.n);
  const nextRow = sharedInt32(s.supernodes);
  const out = { values, d, nextRow, dirty, ...(storage ? { storage } : {}) };
  const job: JobBody = { kind: 'factor', structure: s, shift, tolerance: monitor.tolerance, diagonalScale: monitor.diagonalScale, ...out, ranges: split.parts[1] };
  const theirs = alongside(h, job, () => factorSupernodes(s, shift, monitor, out, split.parts[0]), 'factored');
  monitor.merge(theirs.monitor);
  factorSupernodes(s, shift, monitor, out, split.top, [...split.parts[0], ...split.parts[1]], cooperation(h, s, values, d, storage));
  // the helper lets go of this factor's memory, so a released factor is not kept alive by it
  alongside(h, { kind: 'dropWorkspace' }, () => {}, 'done');
  return { structure: s, values, d, ...(storage ? { storage } : {}) };
}

/** Supernodes of the top with at least this many rows and columns share their work (our choice). */
const SHARE_MIN_ROWS = 512;
const SHARE_MIN_COLUMNS = 128;
/** Panel updates of fewer rows stay on this thread. */
const SHARE_MIN_PANEL_ROWS = 256;

/**
 * How the top's large supernodes are shared: descendants' updates split at the target column
 * where the estimated work (per target column: the updating rows at and below it times the
 * descendant's columns) is halved, panel updates split by rows.
 */
function cooperation(h: Helper, s: SupernodalStructure, values: Float64Array, d: Float64Array, storage: FactorStorage | undefined): SupernodeCooperation {
  const inMemory = storage ? { storage } : {};
  const { superStart, rowPtr, valuePtr } = s;
  return {
    wants: (sn) => rowPtr[sn + 1] - rowPtr[sn] >= SHARE_MIN_ROWS && superStart[sn + 1] - superStart[sn] >= SHARE_MIN_COLUMNS,
    descendants(sn, list, count, map, work) {
      const f = superStart[sn];
      const nc = superStart[sn + 1] - f;
      const perColumn = new Float64Array(nc);
      let total = 0;
      // a descendant's row at position p inside S costs (rows from p down) × (its columns) in that target column
      for (let t = 0; t < count; t++) {
        const dn = list[3 * t];
        const rd = rowPtr[dn];
        const nrd = rowPtr[dn + 1] - rd;
        const ncd = superStart[dn + 1] - superStart[dn];
        for (let p = list[3 * t + 1]; p < list[3 * t + 2]; p++) {
          const cost = (nrd - p) * ncd;
          perColumn[s.rows[rd + p] - f] += cost;
          total += cost;
        }
      }
      // split where half of the work lies left
      let mid = 0;
      for (let acc = 0; mid < nc && acc + perColumn[mid] <= total / 2; mid++) acc += perColumn[mid];
      const fromColumn = f + mid;
      const triples = list.slice(0, 3 * count);
      const job: JobBody = { kind: 'descendants', structure: s, values, d, ...inMemory, sn, list: triples, fromColumn };
      alongside(h, job, () => {
        // this thread: target columns before fromColumn
        for (let t = 0; t < count; t++) {
          const dn = triples[3 * t];
          const start = triples[3 * t + 1];
          const split = rowsBefore(s, dn, start, fromColumn);
          if (split > start) applyDescendant(s, dn, sn, start, triples[3 * t + 2], values, d, map, work, 0, split - start);
        }
      }, 'done');
    },
    panel(sn, c0, c1, work) {
      const f = superStart[sn];
      const nr = rowPtr[sn + 1] - rowPtr[sn];
      const v0 = valuePtr[sn];
      const rows = nr - c0;
      if (rows < SHARE_MIN_PANEL_ROWS) {
        panelUpdateRows(values, v0, nr, c0, c1, f, d, work, 0, rows);
        return;
      }
      // this thread: the top half with the panel's diagonal block; the helper: the rows below
      const split = Math.max(c1 - c0, rows >> 1);
      const job: JobBody = { kind: 'panel', structure: s, values, d, ...inMemory, sn, c0, c1, from: split, to: rows };
      alongside(h, job, () => panelUpdateRows(values, v0, nr, c0, c1, f, d, work, 0, split), 'done');
    },
  };
}

/** The helper's share of a shared supernode's descendant updates (called in the helper). */
export function helperDescendants(job: Extract<JobBody, { kind: 'descendants' }>, map: Int32Array, work: UpdateWorkspace): void {
  const s = job.structure;
  const sn = job.sn;
  const r0 = s.rowPtr[sn];
  const nr = s.rowPtr[sn + 1] - r0;
  // local position of each row of S
  for (let i = 0; i < nr; i++) map[s.rows[r0 + i]] = i;
  for (let t = 0; 3 * t < job.list.length; t++) {
    const dn = job.list[3 * t];
    const start = job.list[3 * t + 1];
    const stop = job.list[3 * t + 2];
    const split = rowsBefore(s, dn, start, job.fromColumn);
    if (stop > split) applyDescendant(s, dn, sn, start, stop, job.values, job.d, map, work, split - start, stop - start);
  }
}

/** The helper's share of a panel update (called in the helper). */
export function helperPanel(job: Extract<JobBody, { kind: 'panel' }>, work: UpdateWorkspace): void {
  const s = job.structure;
  const nr = s.rowPtr[job.sn + 1] - s.rowPtr[job.sn];
  panelUpdateRows(job.values, s.valuePtr[job.sn], nr, job.c0, job.c1, s.superStart[job.sn], job.d, work, job.from, job.to);
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
  alongside(h, { ...common, kind: 'forward', ranges: split.parts[1], index, count, acc: theirs }, () => {
    forwardSweepRanges(f, x, k, ws, split.parts[0], { index, count, acc: mine });
  }, 'done');
  // the parts' updates of the top's rows, in a fixed order
  for (let c = 0; c < k; c++) {
    for (let t = 0; t < count; t++) x[c * n + topColumns[t]] += mine[c * count + t] + theirs[c * count + t];
  }
  forwardSweepRanges(f, x, k, ws, split.top);
  diagonalSolve(f, x, k);
  backwardSweepRanges(f, x, k, ws, split.top);
  alongside(h, { ...common, kind: 'backward', ranges: split.parts[1] }, () => backwardSweepRanges(f, x, k, ws, split.parts[0]), 'done');
  return true;
}

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
  alongside(h, job, mine, 'done');
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
    s = { n: a.n, colPtr: shared(a.colPtr), rowIdx: shared(a.rowIdx), values: shared(a.values) };
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
  }, 'done');
  for (let i = 0; i < n * k; i++) y[i] += ys[i];
  return true;
}

/**
 * Starts independent multilevel separator runs (src/sparse/ordering/multilevel-bisection.ts) with
 * the given seeds on the helper thread and returns a function that waits for their labellings, in
 * seed order; null without a helper (the caller runs them here). The graph is copied.
 */
export function startSeparatorRuns(graph: WeightedGraph, seeds: number[], threads: number): (() => Uint8Array[]) | null {
  if (threads < 2 || seeds.length === 0) return null;
  const h = startHelper();
  if (h === null) return null;
  const wait = postJob(h, { kind: 'separatorRuns', graph, seeds });
  return () => {
    const r = wait();
    if (r?.kind !== 'separators') failed(r);
    return r.wheres;
  };
}
