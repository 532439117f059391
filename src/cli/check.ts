/**
 * `modalgate check`: load the config, check each model (read → solve → rules), write the JUnit
 * and JSON reports atomically and print the console summary. Exit 0 pass, 1 a rule at severity
 * error failed, 2 bad input/config or internal error — in that case too the JUnit file is written
 * (with an <error>) whenever its path is known from the options or the config.
 */
import { existsSync, statSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { dirname, resolve } from 'node:path';
import type { Command } from 'commander';
import { findConfig, checkWritableTarget, readStructuredFile } from '../io/config-loader.js';
import { loadConfig, selectModels } from '../pipeline/load-config.js';
import type { LoadedConfig, ModelJob } from '../pipeline/job-types.js';
import { InputError } from '../io/errors.js';
import { removeTempFiles } from '../io/atomic-write.js';
import { problemOf, stackOf } from '../pipeline/problem.js';
import type { PhaseTimes } from '../pipeline/analyze-model.js';
import { checkReport } from '../pipeline/check-report.js';
import type { CheckReport, ModelReport, ProblemReport } from '../pipeline/result-types.js';
import { formatConsole } from '../report/console-reporter.js';
import { EXIT_BAD_INPUT, EXIT_PASS, EXIT_RULE_FAILED, debugging, printDebugStack, runAction } from './run-action.js';
import { runModels, type ModelBatch } from '../pipeline/run-models.js';
import { concurrentJobs, parseJobs } from '../pipeline/job-threads.js';
import { configDigest, parseShardSpec, shardJobs, type ShardSpec } from '../pipeline/shard.js';
import { phaseLine, shownPath, withShownPaths } from './ci-output.js';
import { writeReports, writeStepSummary } from './write-reports.js';
import { DEFAULT_MEMORY_SHARE, defaultMemoryLimitBytes, parseMemorySize, parseSeconds } from './limits.js';

/** Exit codes after SIGINT and SIGTERM (128 + the signal's number, the shells' convention). */
const EXIT_INTERRUPTED: Record<'SIGINT' | 'SIGTERM', number> = { SIGINT: 130, SIGTERM: 143 };

export interface CheckOptions {
  config?: string;
  model?: string[];
  junit?: string;
  json?: string;
  quiet?: boolean;
  /** Compare every model with its snapshot in this directory (overrides baseline.dir of the config). */
  baseline?: string;
  /** Save every checked model's snapshot into this directory. */
  saveBaseline?: string;
  /** Write the Markdown summary here. */
  markdown?: string;
  /** Markdown: every mode of the comparison, not only the flagged ones. */
  markdownAll?: boolean;
  /** Write the HTML report (with plots) here. */
  html?: string;
  /** Base for relative command-line paths (default: the working directory). */
  cwd?: string;
  /** Where the console report goes (default: stdout). */
  print?: (text: string) => void;
  /** Where the one-line error goes when the check cannot run (default: stderr). */
  printError?: (line: string) => void;
  /** Wall-clock limit per model, seconds (--time-limit); a model over it becomes a JUnit <error>. */
  timeLimit?: number;
  /** Bytes a model's solve may be predicted to need (--max-memory); above it the model is an <error>. */
  maxMemory?: number;
  /** Answer SIGINT/SIGTERM: stop the model, write the reports with an <error>, exit 130/143. */
  handleSignals?: boolean;
  /** Check only shard k of n of the models (--shard k/n), split by predicted cost or by --timings. */
  shard?: ShardSpec;
  /** Earlier run's times for the shard split: a JSON report or a map name → seconds (--timings). */
  timings?: string;
  /** Models checked at once (--jobs; `auto`: one per core); each gets its share of the cores and of --max-memory. */
  jobs?: number | 'auto';
  /** Print one plain line per model with the time of each phase (CI logs: no live progress there). */
  phaseLines?: boolean;
  /** Append the Markdown summary to this file (GITHUB_STEP_SUMMARY), cut to 1 MiB. */
  stepSummary?: string;
}

export interface CheckOutcome {
  code: number;
  report: CheckReport;
  written: { junit?: string; json?: string; markdown?: string; html?: string };
}

export function registerCheck(program: Command): void {
  program
    .command('check')
    .description('check the models of a config against their rules; exit 0 pass, 1 a rule failed, 2 bad input')
    .option('-c, --config <file>', 'config file (default: modalgate.yaml, .yml or .json in the working directory)')
    .option('-m, --model <name...>', 'check only these models (by name)')
    .option('--junit <file>', 'write JUnit XML here (overrides reports.junit of the config)')
    .option('--json <file>', 'write the JSON report here (overrides reports.json of the config)')
    .option('--baseline <dir>', 'compare each model with its saved baseline in <dir> (overrides baseline.dir of the config)')
    .option('--save-baseline <dir>', "save each model's frequencies and mode shapes as a baseline in <dir>")
    .option('--markdown <file>', 'write a Markdown summary (for a pull-request comment or CI job summary) here')
    .option('--html <file>', 'write an HTML report with plots here (overrides reports.html of the config)')
    .option('--markdown-all', 'Markdown: list every mode of the baseline comparison, not only the flagged ones')
    .option('-q, --quiet', 'print only failures, errors and the verdict')
    .option('--time-limit <seconds>', 'stop a model that runs longer than this (it becomes an <error>; the other models go on)', parseSeconds)
    .option('--max-memory <size>', `refuse a model whose solve is predicted to need more memory (e.g. 6G; default ${DEFAULT_MEMORY_SHARE * 100} % of this machine's); the limit holds for the whole process: with --jobs n each model gets 1/n of it`, parseMemorySize)
    .option('--shard <k/n>', 'check only shard k of n (1-based): the models split by predicted cost, the same way on every CI job')
    .option('--timings <file>', '--shard: split by the times of an earlier run (its JSON report, or a JSON map model → seconds)')
    .option('-j, --jobs <n>', 'check up to n models at once (auto or 0: one per core); each gets floor(cores / n) solver threads (at most MODALGATE_THREADS) and 1/n of --max-memory', '1')
    .action(
      runAction(async (opts: Omit<CheckOptions, 'shard' | 'jobs'> & { shard?: string; jobs: string }) => {
        const shard = opts.shard !== undefined ? parseShardSpec(opts.shard) : undefined;
        if (opts.shard !== undefined && !shard) {
          process.stderr.write(`modalgate: --shard ${opts.shard}: expected k/n, whole numbers with 1 ≤ k ≤ n (e.g. --shard 2/4)\n`);
          return EXIT_BAD_INPUT;
        }
        if (opts.timings !== undefined && !shard) {
          process.stderr.write('modalgate: --timings: only used to split the models, give --shard k/n with it\n');
          return EXIT_BAD_INPUT;
        }
        const jobs = parseJobs(opts.jobs);
        if (jobs === undefined) {
          process.stderr.write(`modalgate: --jobs ${opts.jobs}: expected a whole number ≥ 1, or auto (or 0) for one per core\n`);
          return EXIT_BAD_INPUT;
        }
        return (await runCheck({ ...opts, shard, jobs, handleSignals: true, maxMemory: opts.maxMemory ?? defaultMemoryLimitBytes(), phaseLines: !process.stderr.isTTY, stepSummary: process.env.GITHUB_STEP_SUMMARY || undefined })).code;
      }),
    );
}

export async function runCheck(opts: CheckOptions): Promise<CheckOutcome> {
  const cwd = opts.cwd ?? process.cwd();
  const started = new Date();
  const t0 = performance.now();
  const cliPaths = { junit: opts.junit ? resolve(cwd, opts.junit) : undefined, json: opts.json ? resolve(cwd, opts.json) : undefined, markdown: opts.markdown ? resolve(cwd, opts.markdown) : undefined, html: opts.html ? resolve(cwd, opts.html) : undefined };
  const baselineDirs = { baselineDir: opts.baseline ? resolve(cwd, opts.baseline) : undefined, saveBaselineDir: opts.saveBaseline ? resolve(cwd, opts.saveBaseline) : undefined, memoryLimitBytes: opts.maxMemory };
  let configPath: string | undefined;
  let config: LoadedConfig | undefined;
  let problem: ProblemReport | undefined;
  const models: ModelReport[] = [];
  let selected: ModelJob[] | undefined;
  /** The models this run checks (after --model and --shard). */
  let toCheck: ModelJob[] | undefined;
  const signals = opts.handleSignals ? watchSignals() : undefined;
  const print = opts.print ?? ((t: string) => process.stdout.write(t));
  try {
    for (const p of [cliPaths.junit, cliPaths.json, cliPaths.markdown, cliPaths.html]) if (p) checkWritableTarget(p, p);
    checkBaselineDirs(baselineDirs);
    configPath = findConfig(opts.config, cwd);
    config = loadConfig(configPath, baselineDirs);
    selected = selectModels(config, opts.model);
    const jobs = (toCheck = opts.shard ? await shardJobs(selected, opts.shard, opts.timings !== undefined ? resolve(cwd, opts.timings) : undefined) : selected);
    // loaded only for a run that saves baselines
    const clearStoppedSave = baselineDirs.saveBaselineDir ? (await import('../model/baseline-store.js')).clearStoppedSave : undefined;
    if (!signals?.received) {
      const atOnce = concurrentJobs(opts.jobs ?? 1, availableParallelism(), jobs.length);
      const batch = runModels(jobs, {
        jobs: atOnce,
        timeLimitMs: opts.timeLimit !== undefined ? opts.timeLimit * 1000 : undefined,
        callbacks: (job) => ({
          onProgress: progressPrinter(job.name),
          // on stdout: stderr stays the one error line of a run that ends in exit 2; the model's name starts the line
          onPhases: opts.phaseLines && !opts.quiet ? (t: PhaseTimes) => print(`${phaseLine(job.name, t)}\n`) : undefined,
          onCaughtErrorStack: debugging() ? printDebugStack : undefined,
        }),
        onFinished: (job, result) => {
          // a save cut short on the stopped worker leaves no temporary file, lock or stray data file
          if (clearStoppedSave && baselineDirs.saveBaselineDir && (result.problem?.kind === 'limit' || result.problem?.kind === 'interrupted')) clearStoppedSave(baselineDirs.saveBaselineDir, job.name);
        },
      });
      if (signals) signals.batch = batch;
      // in config order, whatever the order they finished in
      for (const r of await batch.reports) if (r) models.push(r);
      if (signals) signals.batch = undefined;
      if (process.stderr.isTTY) process.stderr.write('\r\x1b[K');
    }
  } catch (e) {
    printDebugStack(stackOf(e));
    problem = problemOf(e);
  }
  if (signals?.received) problem = interruptedProblem(signals.received, models.length, toCheck?.length ?? config?.models.length);
  const report = checkReport({ configPath, started, timeMs: performance.now() - t0, models, problem });
  if (config) report.configHash = configDigest(config.path);
  if (opts.shard && selected) report.shard = { ...opts.shard, configModels: selected.map((j) => j.name) };
  const targets = {
    junit: cliPaths.junit ?? config?.reports.junit ?? (config ? undefined : bestEffortReportPath(configPath, 'junit')),
    json: cliPaths.json ?? config?.reports.json ?? (config ? undefined : bestEffortReportPath(configPath, 'json')),
    markdown: cliPaths.markdown,
    html: cliPaths.html ?? config?.reports.html,
  };
  // temporary files of a stopped worker (it may have been writing a baseline), and of runs killed outright
  removeTempFiles(outputDirs(targets, baselineDirs), process.pid);
  print(formatConsole(withShownPaths(report, cwd), { quiet: opts.quiet }));
  if (report.shard && models.length === 0 && !problem) print(`shard ${report.shard.index}/${report.shard.count} is empty: ${report.shard.configModels.length} model(s) for ${report.shard.count} shards; it passes with nothing of its own to check.\n`);
  let { written, failures } = await writeReports(report, targets, opts.markdownAll, cwd);
  if (signals?.received && !report.problem) {
    // the signal came while the reports were written: write them again, saying so
    report.problem = problem = interruptedProblem(signals.received, models.length, models.length);
    report.verdict = 'error';
    ({ written, failures } = await writeReports(report, targets, opts.markdownAll, cwd));
  }
  signals?.dispose();
  await writeStepSummary(report, written, failures, opts, cwd);
  const labels: Record<string, string> = { junit: 'JUnit XML', json: 'JSON report', markdown: 'Markdown summary', html: 'HTML report' };
  for (const [kind, p] of Object.entries(written)) if (!opts.quiet) print(`${labels[kind]}: ${shownPath(p, cwd)}\n`);
  for (const m of models) {
    if (m.baselineWarning) print(`warning: ${m.name}: ${m.baselineWarning}\n`);
    if (m.baselineNotSaved) print(`warning: ${m.baselineNotSaved}\n`);
    if (m.baselineSaved && !opts.quiet) print(`baseline of ${m.name} saved: ${m.baselineSaved.json}\n`);
  }
  const printError = opts.printError ?? ((l: string) => process.stderr.write(l));
  if (problem) printError(`modalgate: ${problem.message}\n`);
  else if (failures.length > 0) printError(`modalgate: ${failures.map((f) => f.message).join('; ')}\n`);
  let code = report.verdict === 'pass' ? EXIT_PASS : report.verdict === 'fail' ? EXIT_RULE_FAILED : EXIT_BAD_INPUT;
  if (failures.length > 0) code = EXIT_BAD_INPUT;
  if (signals?.received) code = EXIT_INTERRUPTED[signals.received];
  return { code, report, written };
}

function interruptedProblem(signal: 'SIGINT' | 'SIGTERM', finished: number, total: number | undefined): ProblemReport {
  const of = total !== undefined ? ` of ${total}` : '';
  return { kind: 'interrupted', message: `interrupted by ${signal}: ${finished}${of} model(s) finished; the reports hold those and this error` };
}

interface SignalWatch {
  received?: 'SIGINT' | 'SIGTERM';
  batch?: ModelBatch;
  dispose(): void;
}

/** SIGINT/SIGTERM stop the running models at once; a second signal ends the process. */
function watchSignals(): SignalWatch {
  const watch: SignalWatch = { dispose: () => {} };
  const on = (signal: 'SIGINT' | 'SIGTERM') => (): void => {
    if (watch.received) process.exit(EXIT_INTERRUPTED[signal]);
    watch.received = signal;
    watch.batch?.stopAll({ kind: 'interrupted', message: `stopped by ${signal} while it was being checked` });
  };
  const onInt = on('SIGINT');
  const onTerm = on('SIGTERM');
  process.on('SIGINT', onInt);
  process.on('SIGTERM', onTerm);
  watch.dispose = () => {
    process.off('SIGINT', onInt);
    process.off('SIGTERM', onTerm);
  };
  return watch;
}

/** Every directory a run writes into (reports, baselines), for removing a stopped run's temporary files. */
function outputDirs(targets: CheckOutcome['written'], baselineDirs: { saveBaselineDir?: string }): string[] {
  const dirs = Object.values(targets).filter((p): p is string => typeof p === 'string').map((p) => dirname(p));
  if (baselineDirs.saveBaselineDir) dirs.push(baselineDirs.saveBaselineDir);
  return [...new Set(dirs)];
}

/** When the config itself is broken, still try to learn where the CI expects the report. */
function bestEffortReportPath(configPath: string | undefined, kind: 'junit' | 'json'): string | undefined {
  if (!configPath) return undefined;
  try {
    const raw = readStructuredFile(configPath) as { reports?: Record<string, unknown> } | null;
    const p = raw?.reports?.[kind];
    if (typeof p !== 'string' || p === '') return undefined;
    const abs = resolve(configPath, '..', p);
    checkWritableTarget(abs, configPath);
    return abs;
  } catch {
    return undefined;
  }
}

/**
 * Neither directory may name a file. A missing --baseline directory is no error: the baseline
 * rules skip with a warning (the first pull request of a new project has no baseline yet).
 */
function checkBaselineDirs(dirs: { baselineDir?: string; saveBaselineDir?: string }): void {
  if (dirs.baselineDir !== undefined && existsSync(dirs.baselineDir) && !statSync(dirs.baselineDir).isDirectory()) {
    throw new InputError(dirs.baselineDir, '--baseline: is a file, not a directory');
  }
  if (dirs.saveBaselineDir !== undefined && existsSync(dirs.saveBaselineDir) && !statSync(dirs.saveBaselineDir).isDirectory()) {
    throw new InputError(dirs.saveBaselineDir, '--save-baseline: is a file, not a directory');
  }
}

function progressPrinter(model: string): ((message: string) => void) | undefined {
  if (!process.stderr.isTTY) return undefined;
  return (message: string) => process.stderr.write(`\r\x1b[K${model}: ${message}`);
}
