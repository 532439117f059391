/**
 * The helper threads' runtime, main-thread side: starting the pool of helpers, posting jobs and
 * waiting for their answers synchronously, and the shared arrays jobs work on. It knows no job
 * but its own two (ping, collect); the kinds live next to the code that posts them:
 *
 *   split-factor.ts        the N-thread LDLᵀ (factor, descendants, panel, dropWorkspace)
 *   split-solve.ts         the N-thread block solve (forward, backward)
 *   separator-jobs.ts      multilevel separator runs of the ordering (separatorRuns)
 *   block-product-jobs.ts  the eigen layer's basis products (transposeTimes, addTimesSmall,
 *                          timesSmallInPlace, symMultiply, symMultiplyKernel)
 *
 * and helper-worker.ts, the helper itself, hands each job to its kind's handler.
 *
 * Threads. The numeric work runs on N threads: this one and N − 1 helpers, where
 * N = min(os.availableParallelism(), MODALGATE_THREADS when it is a positive integer), read from
 * this thread's environment at first use and fixed from then on (a model's worker thread gets
 * its own environment: `check --jobs` gives each model worker its share of the cores there).
 * MODALGATE_THREADS=1 keeps everything on this thread. setThreadCount overrides N (tests and
 * benchmarks: it may exceed the cores, which then run the threads in turn).
 *
 * Synchronisation: each helper has its own message port and shared flag. A job is posted with an
 * id; this thread does its own share, then blocks in Atomics.wait until the helper writes that id
 * into its flag after posting its answer; the answer is read with receiveMessageOnPort. Nothing
 * needs the event loop, so the callers' APIs stay synchronous. Which thread does which share is
 * fixed by the caller before anything runs, and partial results are combined in helper order,
 * so results never depend on timing.
 *
 * The helpers are module-wide threads, started on first use and unref'd (they never keep the
 * process alive). They are used only where the compiled worker file exists next to this module
 * (not when the sources run untranspiled, as under the test runner). A helper that does not
 * answer a first ping within 10 s is dropped, and no further helper is started.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { MessageChannel, Worker, receiveMessageOnPort, type MessagePort } from 'node:worker_threads';

/** A job: its kind names the helper's handler (helper-worker.ts); the rest is its data (structured-cloned, shared arrays shared). */
export interface Job {
  kind: string;
}

/** A job as posted: the shared flag and the id the helper writes into it when done. */
export type PostedJob = Job & { flag: Int32Array; id: number };

/** What the helper answers: `done`, a kind-specific answer, or `failed` with the exception's message. */
export interface Answer {
  kind: string;
}
export interface Failed extends Answer {
  kind: 'failed';
  message: string;
}

const workerUrl = new URL('./helper-worker.js', import.meta.url);
/** The compiled helper exists next to this module (not when the sources run untranspiled). */
const workerBuilt = existsSync(fileURLToPath(workerUrl));

export interface Helper {
  port: MessagePort;
  flag: Int32Array;
}

/** Started helpers, in order: helper i runs the share of thread i + 1. */
const pool: Helper[] = [];
/** A helper did not start: no further one is tried. */
let poolBroken = false;
/** N from the environment, read at first use. */
let fromEnvironment: number | undefined;
/** N set by setThreadCount. */
let override: number | undefined;

/** A MODALGATE_THREADS value as a cap: a whole number ≥ 1 (spaces around allowed), else undefined (no cap). */
export function threadCapOf(raw: string | undefined): number | undefined {
  const t = raw?.trim() ?? '';
  return /^[0-9]+$/.test(t) && Number(t) >= 1 ? Number(t) : undefined;
}

/** min(cores, MODALGATE_THREADS when a positive integer). */
function environmentThreads(): number {
  const cores = Math.max(1, availableParallelism());
  return Math.min(cores, threadCapOf(process.env.MODALGATE_THREADS) ?? Infinity);
}

/** Threads the parallel kernels may use here (N ≥ 1: this thread and N − 1 helpers). */
export function availableThreads(): number {
  if (!workerBuilt) return 1;
  const wanted = override ?? (fromEnvironment ??= environmentThreads());
  // after a helper failed to start: only the threads there are
  return poolBroken ? Math.min(wanted, 1 + pool.length) : wanted;
}

/**
 * A model below this many DOFs is solved on this thread alone, in every command and the library:
 * starting a helper (about 0.1 s of CPU for its isolate and modules, measured on the 975-DOF
 * check1k model) and feeding it cost more than its share of so small a solve saves.
 */
export const ONE_THREAD_BELOW_DOFS = 5000;

/**
 * Runs `solve` (synchronous: nothing else runs meanwhile) with N = 1 when the model has fewer
 * than ONE_THREAD_BELOW_DOFS DOFs, otherwise with N as it is. Every solve goes through here
 * (eigen/solve-modes.ts solveModes, behind the commands, the pipeline and the library).
 */
export function withThreadsForDofs<T>(dofs: number, solve: () => T): T {
  if (dofs >= ONE_THREAD_BELOW_DOFS) return solve();
  const before = override;
  override = 1;
  try {
    return solve();
  } finally {
    override = before;
  }
}

/**
 * Sets N from now on (any count ≥ 1, also above the cores), or back to the environment's with
 * undefined. For tests and benchmarks; objects made before (solvers, bases) keep their split.
 */
export function setThreadCount(threads: number | undefined): void {
  override = threads === undefined ? undefined : Math.max(1, Math.floor(threads));
}

/** Helpers started but not yet answered: each with the wait for its first ping. */
const launched: { helper: Helper; worker: Worker; pong: (timeoutMs?: number) => Answer | undefined }[] = [];

/** Starts the missing helpers up to `count` (counting those launched) without waiting for them. */
function launchHelpers(count: number): void {
  while (!poolBroken && pool.length + launched.length < count) {
    const { port1, port2 } = new MessageChannel();
    const worker = new Worker(workerUrl, { workerData: { port: port2 }, transferList: [port2] });
    worker.unref();
    port1.unref();
    // an error after start-up shows as a failed job; before it, as a missing pong
    worker.on('error', () => {});
    const helper = { port: port1, flag: new Int32Array(new SharedArrayBuffer(4)) };
    launched.push({ helper, worker, pong: postJob(helper, { kind: 'ping' }) });
  }
}

/**
 * Starts the helpers a solve of a model with `dofs` DOFs will use (none below
 * ONE_THREAD_BELOW_DOFS) and returns at once: their threads load their modules while this one
 * reads the matrices, instead of when the first factorization waits for them (about 0.15 s of
 * wall time on a mid-size model, measured on a 26k-DOF part).
 */
export function prestartHelpers(dofs: number): void {
  if (!workerBuilt || dofs < ONE_THREAD_BELOW_DOFS) return;
  launchHelpers(availableThreads() - 1);
}

/**
 * The first `count` helpers, started on first use (all missing ones at once, with those
 * prestarted), each waited for until its first answer; fewer when one did not start.
 */
export function startHelpers(count: number): Helper[] {
  if (!workerBuilt) return [];
  launchHelpers(count);
  const deadline = performance.now() + 10_000;
  // in launch order, so helper i is always the same thread
  while (launched.length > 0 && (pool.length < count || poolBroken)) {
    const { helper, worker, pong } = launched.shift()!;
    const reply = poolBroken ? undefined : pong(Math.max(0, deadline - performance.now()));
    if (reply?.kind === 'pong') pool.push(helper);
    else {
      poolBroken = true;
      void worker.terminate();
    }
  }
  return pool.slice(0, count);
}

let lastJobId = 0;

/**
 * Posts a job, returns a function that waits for its answer. Jobs carry an id that the helper
 * writes into the flag and its answer: an answer to an earlier job whose wait was abandoned (this
 * thread threw during its own share) is skipped, never taken for this one's.
 */
export function postJob<J extends Job>(h: Helper, body: J): (timeoutMs?: number) => Answer | undefined {
  const id = (lastJobId = (lastJobId % 0x3fffffff) + 1);
  const job: PostedJob = { ...body, flag: h.flag, id };
  h.port.postMessage(job);
  return (timeoutMs = Infinity) => {
    const deadline = performance.now() + timeoutMs;
    // the flag holds the id of the last finished job
    for (let seen = Atomics.load(h.flag, 0); seen !== id; seen = Atomics.load(h.flag, 0)) {
      const left = deadline - performance.now();
      if (left <= 0 || Atomics.wait(h.flag, 0, seen, left) === 'timed-out') return undefined;
    }
    for (;;) {
      const got = receiveMessageOnPort(h.port)?.message as (Answer & { id?: number }) | undefined;
      if (got === undefined || got.id === id) return got;
    }
  };
}

/** The answer `r` if it is of kind `expect`; otherwise throws (the helper failed, or gave none). */
export function expectAnswer<R extends Answer>(r: Answer | undefined, expect: R['kind']): R {
  if (r?.kind !== expect) {
    throw new Error(`helper thread ${r?.kind === 'failed' ? `failed: ${(r as Failed).message}` : 'gave no result'}`);
  }
  return r as R;
}

/**
 * Runs bodies[i] on helpers[i] (every one posted first) while `mine` runs here; returns their
 * answers in helper order, each of kind `expect`.
 */
export function alongsideAll<R extends Answer = Answer, J extends Job = Job>(helpers: Helper[], bodies: J[], mine: () => void, expect: R['kind'] = 'done'): R[] {
  const waits = bodies.map((body, i) => postJob(helpers[i], body));
  mine();
  return waits.map((wait) => expectAnswer<R>(wait(), expect));
}

let collector: (() => void) | undefined;

/**
 * A full collection on this thread. Shared arrays are returned to the system only when every
 * thread has dropped them, and the collector does not count them as pressure: without this, dead
 * Krylov bases and factors can outlive their use by a whole factorization. Measured (peak RSS,
 * `/usr/bin/time -f %M`, built CLI `modes`, one run each on a loaded 2-core machine, 2026-12):
 * a clamped 25 857-DOF hex box (test/bench modes-bench hexSolid), 80 modes, 3 factorizations:
 * 547 MB with the collections, 579 MB without; a free-free 96 000-DOF hex box, 20 modes,
 * 2 factorizations: 1 438–1 458 MB with, 1 429–1 448 MB without (two runs each, no difference).
 * Kept for that small gain where a solve factors more than twice (not measured on longer solves).
 */
function collectHere(): void {
  if (collector === undefined) {
    setFlagsFromString('--expose-gc');
    collector = runInNewContext('gc') as () => void;
  }
  collector();
}

/** A full collection on this thread and the given helpers at once (they also drop the workspaces they keep between jobs). */
export function collectAll(helpers: Helper[]): void {
  alongsideAll(helpers, helpers.map(() => ({ kind: 'collect' })), collectHere);
}

/** A zeroed Float64Array in shared memory. */
export function sharedBlock(length: number): Float64Array {
  return new Float64Array(new SharedArrayBuffer(8 * Math.max(1, length)), 0, length);
}

/** A zeroed Int32Array in shared memory. */
export function sharedInt32(length: number): Int32Array {
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

/** A copy of `a` in shared memory. */
export function sharedCopy<T extends Float64Array | Int32Array>(a: T): T {
  const out = (a instanceof Float64Array ? sharedBlock(a.length) : sharedInt32(a.length)) as T;
  out.set(a);
  return out;
}
