/**
 * `modalgate merge <reports…>`: join the JSON reports of `check --shard k/n` jobs (or of any
 * checks of one config) into one JUnit XML, Markdown, HTML and JSON report, print the console
 * summary and exit as `check` would: 0 pass, 1 a rule failed, 2 a shard errored, a report is
 * missing or unreadable, or the reports do not belong together (pipeline/merge-reports.ts).
 * Under GitHub Actions the Markdown summary goes to the job summary too, as with `check`.
 */
import { readFileSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Command } from 'commander';
import { checkWritableTarget } from '../io/config-loader.js';
import { mergeReports, type ShardReport } from '../pipeline/merge-reports.js';
import type { CheckReport, ProblemReport } from '../pipeline/result-types.js';
import { formatConsole } from '../report/console-reporter.js';
import type { CheckOutcome } from './check.js';
import { writeReports, writeStepSummary } from './write-reports.js';
import { shownPath, withShownPaths } from './ci-output.js';
import { EXIT_BAD_INPUT, EXIT_PASS, EXIT_RULE_FAILED, runAction } from './run-action.js';

/** A JSON report larger than this is refused (a real one is a few MB at most; our choice). */
const REPORT_MAX_BYTES = 512 * 2 ** 20;

export interface MergeOptions {
  junit?: string;
  json?: string;
  markdown?: string;
  markdownAll?: boolean;
  html?: string;
  quiet?: boolean;
  /** Append the Markdown summary to this file (GITHUB_STEP_SUMMARY), cut to 1 MiB, as `check` does. */
  stepSummary?: string;
  cwd?: string;
  print?: (text: string) => void;
  printError?: (line: string) => void;
}

export function registerMerge(program: Command): void {
  program
    .command('merge')
    .description('merge the JSON reports of check --shard jobs into one report; exit 0 pass, 1 a rule failed, 2 an error')
    .argument('<reports...>', 'JSON reports (check --json) of the shards')
    .option('--junit <file>', 'write the merged JUnit XML here')
    .option('--json <file>', 'write the merged JSON report here')
    .option('--markdown <file>', 'write the merged Markdown summary here')
    .option('--markdown-all', 'Markdown: list every mode of the baseline comparison, not only the flagged ones')
    .option('--html <file>', 'write the merged HTML report here')
    .option('-q, --quiet', 'print only failures, errors and the verdict')
    .action(runAction(async (files: string[], opts: MergeOptions) => (await runMerge(files, { ...opts, stepSummary: process.env.GITHUB_STEP_SUMMARY || undefined })).code));
}

export async function runMerge(files: string[], opts: MergeOptions): Promise<CheckOutcome> {
  const cwd = opts.cwd ?? process.cwd();
  const targets: CheckOutcome['written'] = {};
  for (const kind of ['junit', 'json', 'markdown', 'html'] as const) {
    const p = opts[kind];
    if (p) targets[kind] = resolve(cwd, p);
  }
  for (const p of Object.values(targets)) if (p) checkWritableTarget(p, p);
  const parts: ShardReport[] = [];
  let unreadable: ProblemReport | undefined;
  for (const file of files) {
    const read = readReport(resolve(cwd, file), file);
    if ('problem' in read) unreadable ??= read.problem;
    else parts.push(read);
  }
  const report = mergeReports(parts, unreadable);
  const print = opts.print ?? ((t: string) => process.stdout.write(t));
  print(formatConsole(withShownPaths(report, cwd), { quiet: opts.quiet }));
  const { written, failures } = await writeReports(report, targets, opts.markdownAll, cwd);
  await writeStepSummary(report, written, failures, opts, cwd);
  const labels: Record<string, string> = { junit: 'JUnit XML', json: 'JSON report', markdown: 'Markdown summary', html: 'HTML report' };
  if (!opts.quiet) for (const [kind, p] of Object.entries(written)) print(`${labels[kind]}: ${shownPath(p, cwd)}\n`);
  const printError = opts.printError ?? ((l: string) => process.stderr.write(l));
  if (report.problem) printError(`modalgate: ${report.problem.message}\n`);
  else if (failures.length > 0) printError(`modalgate: ${failures.map((f) => f.message).join('; ')}\n`);
  let code = report.verdict === 'pass' ? EXIT_PASS : report.verdict === 'fail' ? EXIT_RULE_FAILED : EXIT_BAD_INPUT;
  if (failures.length > 0) code = EXIT_BAD_INPUT;
  return { code, report, written };
}

/** Strings the JSON reporter wrote for non-finite numbers, turned back into numbers. */
const NON_FINITE: Record<string, number> = { Infinity: Infinity, '-Infinity': -Infinity, NaN: NaN };
/** Keys whose values are text, never a number written as a string. */
const TEXT_KEYS = new Set(['name', 'message', 'ruleId', 'description', 'file', 'where', 'hostname', 'configPath', 'configHash', 'timestamp']);

function readReport(path: string, shown: string): ShardReport | { problem: ProblemReport } {
  const bad = (reason: string) => ({ problem: { kind: 'input' as const, file: path, message: `${shown}: ${reason}` } });
  let text: string;
  try {
    const st = statSync(path);
    if (!st.isFile()) return bad('is not a regular file (expected a JSON report of modalgate check --json)');
    if (st.size > REPORT_MAX_BYTES) return bad(`is ${st.size} bytes; a report may hold at most ${REPORT_MAX_BYTES / 2 ** 20} MiB`);
    text = readFileSync(path, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    return bad(code === 'ENOENT' ? 'no such file (did that shard write its report?)' : `cannot be read (${code ?? 'I/O error'})`);
  }
  let doc: unknown;
  try {
    doc = JSON.parse(text, (key, value: unknown) => (typeof value === 'string' && !TEXT_KEYS.has(key) && Object.hasOwn(NON_FINITE, value) ? NON_FINITE[value] : value));
  } catch (e) {
    return bad(`is not valid JSON: ${(e as Error).message}`);
  }
  const r = doc as Partial<CheckReport> & { reportVersion?: unknown };
  if (r === null || typeof r !== 'object' || r.tool?.name !== 'modalgate' || !Array.isArray(r.models)) return bad('is not a modalgate JSON report (no tool "modalgate" and models list)');
  if (r.reportVersion !== 1) return bad(`has report version ${String(r.reportVersion)}; this modalgate reads version 1`);
  for (const [i, m] of r.models.entries()) {
    if (!m || typeof m.name !== 'string' || !['pass', 'fail', 'error'].includes(m.verdict) || !Array.isArray(m.rules)) return bad(`models[${i}]: not a model report (name, verdict and rules expected)`);
  }
  delete r.reportVersion;
  return { file: shown, report: r as CheckReport };
}
