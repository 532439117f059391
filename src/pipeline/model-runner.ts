/**
 * Runs the models of `modalgate check` on worker threads (model-worker.ts), so that the main
 * thread can stop one: on SIGINT/SIGTERM and when a model exceeds its time limit. A stopped
 * worker is terminated outright (V8 ends its JavaScript wherever it is, even inside a solve), the
 * model gets an error report that says why, and the next model starts a new worker.
 *
 * The runner keeps up to `maxWorkers` workers (one per model checked at once, `check --jobs`).
 * Each is started with the MODALGATE_THREADS its model was given (job-threads.ts) and reused for
 * the next model that gets the same count; a model with another count replaces an idle worker.
 * A job crosses to the worker as plain data (plain-job.ts).
 *
 * A model may also run on this thread (`here`, run-models.ts decides: one small model at a time and
 * no time limit), which spares the worker's start and its second copy of the modules (about
 * 0.1–0.2 s of CPU). Such a model is stopped at the next checkpoint between its steps
 * (analyze-model.ts): a signal that comes during a step (the synchronous solve of a model below
 * ONE_THREAD_BELOW_DOFS, well under a few seconds) is answered when the step ends, and an
 * exception that escapes the check becomes the model's internal error, as on a worker. Where the
 * compiled worker is not available (the TypeScript sources under the test runner), every model
 * runs on this thread, one at a time. Nothing here prints: progress and the stack traces of
 * caught exceptions go to the caller's callbacks.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { ModelJob } from './job-types.js';
import { problemOf, stackOf } from './problem.js';
import type { PhaseTimes } from './analyze-model.js';
import { junitTimestamp, type ModelReport, type ProblemReport } from './result-types.js';
import type { ModelWorkerMessage, ModelWorkerRequest } from './model-worker.js';
import { toPlainJob } from './plain-job.js';

const workerFile = fileURLToPath(new URL('./model-worker.js', import.meta.url));
const canIsolate = import.meta.url.endsWith('.js') && existsSync(workerFile);

export interface RunModelOptions {
  /** Wall-clock limit for this model, milliseconds (none when undefined). */
  timeLimitMs?: number;
  /** The worker's MODALGATE_THREADS (unset: the worker inherits this process's environment). */
  threads?: number;
  /** Run on this thread, not on a worker (stopped between steps; no time limit). */
  here?: boolean;
  onProgress?: (message: string) => void;
  /** Where the model's time went, once its rules have run (analyze-model.ts). */
  onPhases?: (times: PhaseTimes) => void;
  /** Stack traces of the exceptions the model's check caught (asked for only under MODALGATE_DEBUG). */
  onCaughtErrorStack?: (stack: string) => void;
}

/** A running model: its report when done, and a way to stop it. */
export interface RunningModel {
  report: Promise<ModelReport>;
  /** Ends the model now; its report is an error saying `why`. */
  stop(why: ProblemReport): void;
}

interface PooledWorker {
  worker: Worker;
  threads: number | undefined;
  /** Drops the worker from the idle list if it ends while idle. */
  onIdleExit?: () => void;
}

export class ModelRunner {
  private idle: PooledWorker[] = [];
  private busy = 0;
  private nextId = 1;

  /** `maxWorkers`: the most models run at once (and workers kept). */
  constructor(private readonly maxWorkers = 1) {}

  /** False when models run on this thread (no compiled worker): then they run one at a time and cannot be stopped. */
  static readonly isolates = canIsolate;

  run(job: ModelJob, options: RunModelOptions = {}): RunningModel {
    if (!canIsolate || options.here) return runHere(job, options);
    const onStack = options.onCaughtErrorStack;
    const pooled = this.take(options.threads);
    const worker = pooled.worker;
    this.busy++;
    const id = this.nextId++;
    const started = new Date();
    const t0 = performance.now();
    let lastStage = 'reading';
    let settle: (r: ModelReport) => void = () => {};
    const report = new Promise<ModelReport>((resolve) => (settle = resolve));
    let done = false;
    const stopped = (problem: ProblemReport): ModelReport => stoppedReport(job, started, t0, problem);
    const onMessage = (m: ModelWorkerMessage): void => {
      if (m.id !== id) return;
      if (m.kind === 'progress') {
        lastStage = m.message;
        options.onProgress?.(m.message);
      } else if (m.kind === 'phases') options.onPhases?.(m.times);
      else if (m.kind === 'caught') onStack?.(m.stack);
      else finish(m.kind === 'report' ? m.report : stopped(m.problem), true);
    };
    const onExit = (code: number): void => finish(stopped({ kind: 'internal', message: `internal error: the worker thread checking ${job.name} ended (code ${code}) without a report` }), false);
    const onError = (e: Error): void => {
      onStack?.(stackOf(e));
      finish(stopped(problemOf(e)), false);
    };
    /** `reusable`: the worker answered and may check the next model. */
    const finish = (r: ModelReport, reusable: boolean): void => {
      if (done) return;
      done = true;
      if (timer) clearTimeout(timer);
      worker.off('message', onMessage).off('exit', onExit).off('error', onError);
      this.busy--;
      if (reusable) this.putIdle(pooled);
      else void worker.terminate();
      settle(r);
    };
    const stop = (why: ProblemReport): void => finish(stopped(why), false);
    const timer =
      options.timeLimitMs !== undefined
        ? setTimeout(() => {
            const spent = (performance.now() - t0) / 1000;
            stop({ kind: 'limit', message: `${job.name}: stopped at the time limit of ${formatSeconds(options.timeLimitMs! / 1000)} (--time-limit) after ${formatSeconds(spent)}; last stage: ${lastStage}` });
          }, options.timeLimitMs)
        : undefined;
    worker.on('message', onMessage).on('exit', onExit).on('error', onError);
    worker.postMessage({ kind: 'check', id, job: toPlainJob(job), sendStacks: onStack !== undefined } satisfies ModelWorkerRequest);
    return { report, stop };
  }

  /** Ends every idle worker (between runs they hold no work). */
  async close(): Promise<void> {
    const idle = this.idle;
    this.idle = [];
    await Promise.all(idle.map((p) => p.worker.terminate()));
  }

  /** An idle worker with `threads`, else a new one (ending an idle worker of another count when the pool is full). */
  private take(threads: number | undefined): PooledWorker {
    const i = this.idle.findIndex((p) => p.threads === threads);
    if (i >= 0) return this.fromIdle(i);
    if (this.idle.length > 0 && this.idle.length + this.busy >= this.maxWorkers) void this.fromIdle(0).worker.terminate();
    const env = threads !== undefined ? { ...process.env, MODALGATE_THREADS: String(threads) } : process.env;
    const worker = new Worker(workerFile, { env });
    worker.unref();
    return { worker, threads };
  }

  private putIdle(p: PooledWorker): void {
    p.onIdleExit = () => {
      const i = this.idle.indexOf(p);
      if (i >= 0) this.idle.splice(i, 1);
    };
    p.worker.once('exit', p.onIdleExit);
    this.idle.push(p);
  }

  private fromIdle(i: number): PooledWorker {
    const [p] = this.idle.splice(i, 1);
    if (p.onIdleExit) p.worker.off('exit', p.onIdleExit);
    return p;
  }
}

/** The error report of a model that ended without its own: stopped, or failed outside the check. */
function stoppedReport(job: ModelJob, started: Date, t0: number, problem: ProblemReport): ModelReport {
  return { name: job.name, verdict: 'error', timestamp: junitTimestamp(started), timeMs: performance.now() - t0, ruleSets: job.ruleSets, rules: [], problem };
}

/** A model checked on this thread; `stop` takes effect at its next checkpoint (analyze-model.ts). */
function runHere(job: ModelJob, options: RunModelOptions): RunningModel {
  const onStack = options.onCaughtErrorStack;
  const onCaughtError = onStack ? (e: unknown) => onStack(stackOf(e)) : undefined;
  const started = new Date();
  const t0 = performance.now();
  let why: ProblemReport | undefined;
  const report = (async (): Promise<ModelReport> => {
    try {
      // loaded here only: a run whose models are all on workers never loads the solver on this thread
      const { analyzeModel, ModelStopped } = await import('./analyze-model.js');
      const checkpoint = async (): Promise<void> => {
        // a turn of the event loop: a signal that came during the last (synchronous) step is answered now
        await new Promise<void>((resolve) => setImmediate(resolve));
        if (why) throw new ModelStopped(why.message);
      };
      const r = await analyzeModel(job, { onProgress: options.onProgress, onPhases: options.onPhases, onCaughtError, checkpoint });
      return why ? stoppedReport(job, started, t0, why) : r;
    } catch (e) {
      if (why) return stoppedReport(job, started, t0, why);
      // an exception the check did not catch: this model's internal error, as a worker reports it
      onCaughtError?.(e);
      return stoppedReport(job, started, t0, problemOf(e));
    }
  })();
  return {
    report,
    stop: (problem) => {
      why ??= problem;
    },
  };
}

function formatSeconds(s: number): string {
  return s >= 10 ? `${s.toFixed(0)} s` : `${s.toFixed(1)} s`;
}
