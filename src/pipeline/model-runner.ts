/**
 * Runs the models of `modalgate check` on a worker thread (model-worker.ts), one at a time, so that
 * the main thread can stop one: on SIGINT/SIGTERM and when a model exceeds its time limit. A
 * stopped worker is terminated outright (V8 ends its JavaScript wherever it is, even inside a
 * solve), the model gets an error report that says why, and the next model starts a new worker.
 * Where the compiled worker is not available (the TypeScript sources under the test runner), the
 * models run on this thread and cannot be stopped early. Nothing here prints: progress and the
 * stack traces of caught exceptions go to the caller's callbacks.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { ConfigOverrides } from './load-config.js';
import type { ModelJob } from './job-types.js';
import { problemOf, stackOf } from './problem.js';
import type { PhaseTimes } from './analyze-model.js';
import { junitTimestamp, type ModelReport, type ProblemReport } from './result-types.js';
import type { ModelWorkerInput, ModelWorkerMessage, ModelWorkerRequest } from './model-worker.js';

const workerFile = fileURLToPath(new URL('./model-worker.js', import.meta.url));
const canIsolate = import.meta.url.endsWith('.js') && existsSync(workerFile);

export interface RunModelOptions {
  /** Wall-clock limit for this model, milliseconds (none when undefined). */
  timeLimitMs?: number;
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

export class ModelRunner {
  private worker: Worker | undefined;
  private nextId = 1;

  constructor(
    private readonly configPath: string,
    private readonly overrides: ConfigOverrides,
  ) {}

  run(job: ModelJob, options: RunModelOptions = {}): RunningModel {
    const onStack = options.onCaughtErrorStack;
    if (!canIsolate) {
      const onCaughtError = onStack ? (e: unknown) => onStack(stackOf(e)) : undefined;
      // loaded here only: the main thread of an isolated run never needs the solver
      const report = import('./analyze-model.js').then(({ analyzeModel }) => analyzeModel(job, { onProgress: options.onProgress, onPhases: options.onPhases, onCaughtError }));
      return { report, stop: () => {} };
    }
    const worker = (this.worker ??= this.start());
    const id = this.nextId++;
    const started = new Date();
    const t0 = performance.now();
    let lastStage = 'reading';
    let settle: (r: ModelReport) => void = () => {};
    const report = new Promise<ModelReport>((resolve) => (settle = resolve));
    let done = false;
    const stopped = (problem: ProblemReport): ModelReport => ({
      name: job.name,
      verdict: 'error',
      timestamp: junitTimestamp(started),
      timeMs: performance.now() - t0,
      ruleSets: job.ruleSets,
      rules: [],
      problem,
    });
    const onMessage = (m: ModelWorkerMessage): void => {
      if (m.id !== id) return;
      if (m.kind === 'progress') {
        lastStage = m.message;
        options.onProgress?.(m.message);
      } else if (m.kind === 'phases') options.onPhases?.(m.times);
      else if (m.kind === 'caught') onStack?.(m.stack);
      else finish(m.kind === 'report' ? m.report : stopped(m.problem));
    };
    const onExit = (code: number): void => finish(stopped({ kind: 'internal', message: `internal error: the worker thread checking ${job.name} ended (code ${code}) without a report` }));
    const onError = (e: Error): void => {
      onStack?.(stackOf(e));
      finish(stopped(problemOf(e)));
    };
    const finish = (r: ModelReport): void => {
      if (done) return;
      done = true;
      if (timer) clearTimeout(timer);
      worker.off('message', onMessage).off('exit', onExit).off('error', onError);
      settle(r);
    };
    const stop = (why: ProblemReport): void => {
      if (done) return;
      finish(stopped(why));
      this.worker = undefined;
      void worker.terminate();
    };
    const timer =
      options.timeLimitMs !== undefined
        ? setTimeout(() => {
            const spent = (performance.now() - t0) / 1000;
            stop({ kind: 'limit', message: `${job.name}: stopped at the time limit of ${formatSeconds(options.timeLimitMs! / 1000)} (--time-limit) after ${formatSeconds(spent)}; last stage: ${lastStage}` });
          }, options.timeLimitMs)
        : undefined;
    worker.on('message', onMessage).on('exit', onExit).on('error', onError);
    worker.postMessage({ kind: 'check', id, modelName: job.name, sendStacks: onStack !== undefined } satisfies ModelWorkerRequest);
    return { report, stop };
  }

  /** Ends the worker (between runs it holds no work). */
  async close(): Promise<void> {
    const w = this.worker;
    this.worker = undefined;
    if (w) await w.terminate();
  }

  private start(): Worker {
    const input: ModelWorkerInput = { configPath: this.configPath, overrides: this.overrides };
    const w = new Worker(workerFile, { workerData: input });
    w.unref();
    return w;
  }
}

function formatSeconds(s: number): string {
  return s >= 10 ? `${s.toFixed(0)} s` : `${s.toFixed(1)} s`;
}
