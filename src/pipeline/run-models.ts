/**
 * Checks a list of model jobs, up to `jobs` at once (`check --jobs`), on the model runner's
 * workers. Models start in the order given; the reports come back in that order whatever the
 * order in which they finish. Each model's worker gets its solver threads (job-threads.ts), and
 * with more than one model at once each gets its share of the memory limit (the limit is the
 * process's). `stopAll` stops every running model (its report says why) and starts no other.
 * A small model checked alone runs on this thread (runsHere).
 */
import { stiffnessDofs } from '../io/matrix-market-reader.js';
import { availableParallelism } from 'node:os';
import type { ModelJob } from './job-types.js';
import { ONE_THREAD_BELOW_DOFS, solverThreads, threadsForModel, userThreadCap } from './job-threads.js';
import { ModelRunner, type RunModelOptions, type RunningModel } from './model-runner.js';
import type { ModelReport, ProblemReport } from './result-types.js';

export interface RunModelsSettings {
  /** Models at once (at most; never more than the jobs). */
  jobs: number;
  /** Wall-clock limit per model, milliseconds. */
  timeLimitMs?: number;
  /** The callbacks of one model (progress, phases, caught stacks). */
  callbacks?: (job: ModelJob) => Pick<RunModelOptions, 'onProgress' | 'onPhases' | 'onCaughtErrorStack'>;
  /** Called as each model ends, in the order they end. */
  onFinished?: (job: ModelJob, report: ModelReport) => void;
  /** Cores to share out (default: os.availableParallelism()). */
  cores?: number;
  /** The user's cap on solver threads (default: MODALGATE_THREADS of this process). */
  threadCap?: number;
}

export interface ModelBatch {
  /** One entry per job, in the jobs' order; undefined for a model never started (stopped before its turn). */
  reports: Promise<(ModelReport | undefined)[]>;
  stopAll(why: ProblemReport): void;
}

export function runModels(jobs: ModelJob[], settings: RunModelsSettings): ModelBatch {
  const isolated = ModelRunner.isolates;
  // models on this thread (no compiled worker) run one at a time
  const atOnce = isolated ? Math.max(1, Math.min(settings.jobs, jobs.length)) : 1;
  const runner = new ModelRunner(atOnce);
  const share = solverThreads(settings.cores ?? availableParallelism(), atOnce, settings.threadCap ?? userThreadCap(process.env.MODALGATE_THREADS));
  const reports: (ModelReport | undefined)[] = new Array<ModelReport | undefined>(jobs.length).fill(undefined);
  const running = new Set<RunningModel>();
  let stopping: ProblemReport | undefined;
  let next = 0;
  const lane = async (): Promise<void> => {
    while (!stopping && next < jobs.length) {
      const i = next++;
      const job = withMemoryShare(jobs[i], atOnce);
      const dofs = isolated ? await stiffnessDofs(job.stiffnessPath) : undefined;
      if (stopping) break;
      const here = !isolated || runsHere(dofs, atOnce, settings.timeLimitMs);
      const run = runner.run(job, { timeLimitMs: settings.timeLimitMs, threads: here ? undefined : threadsForModel(share, dofs), here, ...settings.callbacks?.(job) });
      running.add(run);
      const report = sharedLimitNote(await run.report, atOnce);
      running.delete(run);
      reports[i] = report;
      settings.onFinished?.(job, report);
    }
  };
  const all = Promise.all(Array.from({ length: atOnce }, lane)).then(async () => {
    await runner.close();
    return reports;
  });
  return {
    reports: all,
    stopAll: (why) => {
      stopping = why;
      for (const r of running) r.stop(why);
    },
  };
}

/**
 * A model runs on this thread, not on a worker, when it is checked alone (one at a time), under no
 * time limit (a timer cannot fire during a synchronous solve) and below ONE_THREAD_BELOW_DOFS (so
 * a signal waits at most for one short step), or when its size line cannot be read (it will fail
 * on reading). It spares the worker's start and second copy of the modules.
 */
export function runsHere(dofs: number | undefined, atOnce: number, timeLimitMs: number | undefined): boolean {
  return atOnce === 1 && timeLimitMs === undefined && (dofs === undefined || dofs < ONE_THREAD_BELOW_DOFS);
}


/** The job with 1/`share` of its memory limit (the limit holds for the whole process). */
function withMemoryShare(job: ModelJob, share: number): ModelJob {
  const limit = job.solve.memoryLimitBytes;
  if (share <= 1 || limit === undefined) return job;
  return { ...job, solve: { ...job.solve, memoryLimitBytes: Math.floor(limit / share) } };
}

/** A model refused at its share of --max-memory says so. */
function sharedLimitNote(report: ModelReport, share: number): ModelReport {
  const p = report.problem;
  if (share <= 1 || p?.kind !== 'limit' || !p.message.includes('(--max-memory)')) return report;
  return { ...report, problem: { ...p, message: p.message.replace('(--max-memory)', `(its 1/${share} share of --max-memory, ${share} models at once with --jobs)`) } };
}
