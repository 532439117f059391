/**
 * The helper thread's runtime, main-thread side: starting the one helper, posting a job and
 * waiting for its answer synchronously, and the shared arrays jobs work on. It knows no job but
 * its own two (ping, collect); the kinds live next to the code that posts them:
 *
 *   split-factor.ts        the two-thread LDLᵀ (factor, descendants, panel, dropWorkspace)
 *   split-solve.ts         the two-thread block solve (forward, backward)
 *   separator-jobs.ts      multilevel separator runs of the ordering (separatorRuns)
 *   block-product-jobs.ts  the eigen layer's basis products (transposeTimes, addTimesSmall,
 *                          timesSmallInPlace, symMultiply)
 *
 * and helper-worker.ts, the helper itself, hands each job to its kind's handler.
 *
 * Synchronisation: the job is posted on a MessagePort with an id; this thread works, then blocks
 * in Atomics.wait until the helper writes that id into the shared flag after posting its answer;
 * the answer is read with receiveMessageOnPort. Nothing needs the event loop, so the callers'
 * APIs stay synchronous.
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

let helper: Helper | null | undefined;

/** Threads the parallel kernels may use here (1 or 2). */
export function availableThreads(): number {
  if (process.env.MODALGATE_THREADS === '1') return 1;
  if (availableParallelism() < 2) return 1;
  return workerBuilt ? 2 : 1;
}

/** The helper thread, started on first use; null when there is none (one thread, or it did not start). */
export function startHelper(): Helper | null {
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
    throw new Error(`parallel factorization helper ${r?.kind === 'failed' ? `failed: ${(r as Failed).message}` : 'gave no result'}`);
  }
  return r as R;
}

/** Runs `body` on the helper while `mine` runs here; returns the helper's answer, of kind `expect`. */
export function alongside<R extends Answer = Answer, J extends Job = Job>(h: Helper, body: J, mine: () => void, expect: R['kind'] = 'done'): R {
  const wait = postJob(h, body);
  mine();
  return expectAnswer<R>(wait(), expect);
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

/** A full collection on both threads at once (the helper also drops the workspaces it keeps between jobs). */
export function collectBoth(h: Helper): void {
  alongside(h, { kind: 'collect' }, collectHere);
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
