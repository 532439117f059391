/**
 * `modalgate check`: load the config, check each model (read → solve → rules), write the JUnit
 * and JSON reports atomically and print the console summary. Exit 0 pass, 1 a rule at severity
 * error failed, 2 bad input/config or internal error — in that case too the JUnit file is written
 * (with an <error>) whenever its path is known from the options or the config.
 */
import { existsSync, statSync } from 'node:fs';
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
import { formatMarkdown } from '../report/markdown.js';
import { formatHtml } from '../report/html-reporter.js';
import { EXIT_BAD_INPUT, EXIT_PASS, EXIT_RULE_FAILED, runAction } from './run-action.js';

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
    .action(runAction(async (opts: CheckOptions) => (await runCheck(opts)).code));
}

export async function runCheck(opts: CheckOptions): Promise<CheckOutcome> {
  const cwd = opts.cwd ?? process.cwd();
  const started = new Date();
  const t0 = performance.now();
  const cliPaths = { junit: opts.junit ? resolve(cwd, opts.junit) : undefined, json: opts.json ? resolve(cwd, opts.json) : undefined, markdown: opts.markdown ? resolve(cwd, opts.markdown) : undefined, html: opts.html ? resolve(cwd, opts.html) : undefined };
  const baselineDirs = { baselineDir: opts.baseline ? resolve(cwd, opts.baseline) : undefined, saveBaselineDir: opts.saveBaseline ? resolve(cwd, opts.saveBaseline) : undefined };
  let configPath: string | undefined;
  let config: LoadedConfig | undefined;
  let problem: ProblemReport | undefined;
  const models: ModelReport[] = [];
  try {
    for (const p of [cliPaths.junit, cliPaths.json, cliPaths.markdown, cliPaths.html]) if (p) checkWritableTarget(p, p);
    checkBaselineDirs(baselineDirs);
    configPath = findConfig(opts.config, cwd);
    config = loadConfig(configPath, baselineDirs);
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
    markdown: cliPaths.markdown,
    html: cliPaths.html ?? config?.reports.html,
  };
  const print = opts.print ?? ((t: string) => process.stdout.write(t));
  print(formatConsole(report, { quiet: opts.quiet }));
  const written = writeReports(report, targets, opts.markdownAll);
  const labels: Record<string, string> = { junit: 'JUnit XML', json: 'JSON report', markdown: 'Markdown summary', html: 'HTML report' };
  for (const [kind, p] of Object.entries(written)) if (!opts.quiet) print(`${labels[kind]}: ${p}\n`);
  for (const m of models) {
    if (m.baselineWarning) print(`warning: ${m.name}: ${m.baselineWarning}\n`);
    if (m.baselineNotSaved) print(`warning: ${m.baselineNotSaved}\n`);
    if (m.baselineSaved && !opts.quiet) print(`baseline of ${m.name} saved: ${m.baselineSaved.json}\n`);
  }
  if (problem) (opts.printError ?? ((l: string) => process.stderr.write(l)))(`modalgate: ${problem.message}\n`);
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

function writeReports(report: CheckReport, targets: CheckOutcome['written'], markdownAll = false): CheckOutcome['written'] {
  const written: CheckOutcome['written'] = {};
  if (targets.junit) {
    writeFileAtomic(targets.junit, formatJunit(report));
    written.junit = targets.junit;
  }
  if (targets.json) {
    writeFileAtomic(targets.json, formatJson(report));
    written.json = targets.json;
  }
  if (targets.markdown) {
    writeFileAtomic(targets.markdown, formatMarkdown(report, { allModes: markdownAll }));
    written.markdown = targets.markdown;
  }
  if (targets.html) {
    writeFileAtomic(targets.html, formatHtml(report));
    written.html = targets.html;
  }
  return written;
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
