/**
 * `modalgate check`: load the config, check each model (read → solve → rules), write the JUnit
 * and JSON reports atomically and print the console summary. Exit 0 pass, 1 a rule at severity
 * error failed, 2 bad input/config or internal error — in that case too the JUnit file is written
 * (with an <error>) whenever its path is known from the options or the config.
 */
import { resolve } from 'node:path';
import type { Command } from 'commander';
import { findConfig, loadConfig, checkWritableTarget, readStructuredFile } from '../io/config-loader.js';
import type { LoadedConfig, ModelJob } from '../io/config-types.js';
import { InputError } from '../io/errors.js';
import { writeFileAtomic } from '../io/atomic-write.js';
import { packageVersion } from '../io/package-root.js';
import { analyzeModel, currentHostname, problemOf } from '../model/analyze-model.js';
import { CAUTION, junitTimestamp, runVerdict, type CheckReport, type ModelReport, type ProblemReport } from '../report/report-types.js';
import { formatJunit } from '../report/junit-reporter.js';
import { formatJson } from '../report/json-reporter.js';
import { formatConsole } from '../report/console-reporter.js';
import { EXIT_BAD_INPUT, EXIT_PASS, EXIT_RULE_FAILED, runAction } from './run-action.js';

export interface CheckOptions {
  config?: string;
  model?: string[];
  junit?: string;
  json?: string;
  quiet?: boolean;
  /** Base for relative command-line paths (default: the working directory). */
  cwd?: string;
  /** Where the console report goes (default: stdout). */
  print?: (text: string) => void;
}

export interface CheckOutcome {
  code: number;
  report: CheckReport;
  written: { junit?: string; json?: string };
}

export function registerCheck(program: Command): void {
  program
    .command('check')
    .description('check the models of a config against their rules; exit 0 pass, 1 a rule failed, 2 bad input')
    .option('-c, --config <file>', 'config file (default: modalgate.yaml, .yml or .json in the working directory)')
    .option('-m, --model <name...>', 'check only these models (by name)')
    .option('--junit <file>', 'write JUnit XML here (overrides reports.junit of the config)')
    .option('--json <file>', 'write the JSON report here (overrides reports.json of the config)')
    .option('-q, --quiet', 'print only failures, errors and the verdict')
    .action(runAction(async (opts: CheckOptions) => (await runCheck(opts)).code));
}

export async function runCheck(opts: CheckOptions): Promise<CheckOutcome> {
  const cwd = opts.cwd ?? process.cwd();
  const started = new Date();
  const t0 = performance.now();
  const cliPaths = { junit: opts.junit ? resolve(cwd, opts.junit) : undefined, json: opts.json ? resolve(cwd, opts.json) : undefined };
  let configPath: string | undefined;
  let config: LoadedConfig | undefined;
  let problem: ProblemReport | undefined;
  const models: ModelReport[] = [];
  try {
    for (const p of [cliPaths.junit, cliPaths.json]) if (p) checkWritableTarget(p, p);
    configPath = findConfig(opts.config, cwd);
    config = loadConfig(configPath);
    for (const job of selectModels(config, opts.model)) {
      const onProgress = progressPrinter(job.name);
      models.push(await analyzeModel(job, { onProgress }));
      if (onProgress) process.stderr.write('\r\x1b[K');
    }
  } catch (e) {
    problem = problemOf(e);
  }
  const report: CheckReport = {
    tool: { name: 'modalgate', version: packageVersion() },
    configPath,
    timestamp: junitTimestamp(started),
    timeMs: performance.now() - t0,
    hostname: currentHostname(),
    verdict: runVerdict(models, problem),
    caution: CAUTION,
    models,
    problem,
  };
  const targets = {
    junit: cliPaths.junit ?? config?.reports.junit ?? (config ? undefined : bestEffortReportPath(configPath, 'junit')),
    json: cliPaths.json ?? config?.reports.json ?? (config ? undefined : bestEffortReportPath(configPath, 'json')),
  };
  const print = opts.print ?? ((t: string) => process.stdout.write(t));
  print(formatConsole(report, { quiet: opts.quiet }));
  const written = writeReports(report, targets);
  for (const [kind, p] of Object.entries(written)) if (!opts.quiet) print(`${kind === 'junit' ? 'JUnit XML' : 'JSON report'}: ${p}\n`);
  if (problem) process.stderr.write(`modalgate: ${problem.message}\n`);
  const code = report.verdict === 'pass' ? EXIT_PASS : report.verdict === 'fail' ? EXIT_RULE_FAILED : EXIT_BAD_INPUT;
  return { code, report, written };
}

function selectModels(config: LoadedConfig, names: string[] | undefined): ModelJob[] {
  if (!names || names.length === 0) return config.models;
  const known = config.models.map((m) => m.name);
  for (const n of names) {
    if (!known.includes(n)) throw new InputError(config.path, `--model ${n}: no model of that name (models: ${known.join(', ')})`);
  }
  return config.models.filter((m) => names.includes(m.name));
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

function writeReports(report: CheckReport, targets: { junit?: string; json?: string }): { junit?: string; json?: string } {
  const written: { junit?: string; json?: string } = {};
  if (targets.junit) {
    writeFileAtomic(targets.junit, formatJunit(report));
    written.junit = targets.junit;
  }
  if (targets.json) {
    writeFileAtomic(targets.json, formatJson(report));
    written.json = targets.json;
  }
  return written;
}

function progressPrinter(model: string): ((message: string) => void) | undefined {
  if (!process.stderr.isTTY) return undefined;
  return (message: string) => process.stderr.write(`\r\x1b[K${model}: ${message}`);
}
