/**
 * `modalgate check` as a library call: a parsed config (the shape of modalgate.yaml) and the
 * folder its relative paths start from in, the typed CheckReport out. By default the models run
 * one after another on this thread (no worker, so no time limit); with `jobs` above 1, up to that
 * many at once on worker threads (run-models.ts: each gets its share of the cores and of the
 * memory limit; the report keeps the config's order). Nothing is printed or written except a
 * baseline the options ask to save. A bad config or a model that cannot be read is not thrown:
 * it is in the report (`problem`, verdict `error`), as the command line reports it.
 */
import { join, resolve } from 'node:path';
import { checkConfigObject } from '../io/config-loader.js';
import type { RawConfig } from '../io/config-types.js';
import { analyzeModel, problemOf, type PhaseTimes } from './analyze-model.js';
import { checkReport } from './check-report.js';
import { resolveConfig, selectModels } from './load-config.js';
import { availableParallelism } from 'node:os';
import { concurrentJobs } from './job-threads.js';
import { runModels } from './run-models.js';
import type { CheckReport, ModelReport, ProblemReport } from './result-types.js';

export interface CheckModelsOptions {
  /** Check only these models (by name). */
  models?: string[];
  /** Compare every model with its baseline in this folder (overrides baseline.dir of the config). */
  baselineDir?: string;
  /** Save every checked model's baseline into this folder. */
  saveBaselineDir?: string;
  /** Refuse a model whose solve is predicted to need more bytes than this (with `jobs`, each model gets its share). */
  memoryLimitBytes?: number;
  /**
   * Models checked at once (default 1: one after another on this thread); `'auto'` or 0: one per
   * core. Above 1 they run on worker threads, each with floor(cores / jobs) solver threads
   * (capped by MODALGATE_THREADS), from the compiled package only.
   */
  jobs?: number | 'auto';
  /** Progress of a long solve. */
  onProgress?: (model: string, message: string) => void;
  /** Where a model's time went, once its rules have run. */
  onPhases?: (model: string, times: PhaseTimes) => void;
}

/** The name errors give the config object: a file name in `baseDir` that is not read. */
export const CONFIG_OBJECT_NAME = '(config object)';

export async function checkModels(config: RawConfig, baseDir: string, options: CheckModelsOptions = {}): Promise<CheckReport> {
  const started = new Date();
  const t0 = performance.now();
  const models: ModelReport[] = [];
  let problem: ProblemReport | undefined;
  const where = join(resolve(baseDir), CONFIG_OBJECT_NAME);
  try {
    const loaded = resolveConfig(checkConfigObject(config, where), where, {
      baselineDir: options.baselineDir !== undefined ? resolve(baseDir, options.baselineDir) : undefined,
      saveBaselineDir: options.saveBaselineDir !== undefined ? resolve(baseDir, options.saveBaselineDir) : undefined,
      memoryLimitBytes: options.memoryLimitBytes,
    });
    const jobs = selectModels(loaded, options.models);
    const { onProgress, onPhases } = options;
    const callbacks = (job: { name: string }) => ({
      onProgress: onProgress ? (message: string) => onProgress(job.name, message) : undefined,
      onPhases: onPhases ? (times: PhaseTimes) => onPhases(job.name, times) : undefined,
    });
    const atOnce = concurrentJobs(options.jobs === 0 ? 'auto' : (options.jobs ?? 1), availableParallelism(), jobs.length);
    if (atOnce > 1) {
      for (const r of await runModels(jobs, { jobs: atOnce, callbacks }).reports) if (r) models.push(r);
    } else {
      for (const job of jobs) models.push(await analyzeModel(job, callbacks(job)));
    }
  } catch (e) {
    problem = problemOf(e);
  }
  return checkReport({ started, timeMs: performance.now() - t0, models, problem });
}
