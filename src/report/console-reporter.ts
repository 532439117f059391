/**
 * Console output of `check`: one line per model, then a compact table of failures, errors and
 * warnings, then the verdict and the caution sentence. Colour follows FORCE_COLOR (chalk's own
 * detection) and NO_COLOR (https://no-color.org: present and non-empty turns colour off).
 * `quiet` keeps only the table and the verdict line.
 */
import { Chalk, type ChalkInstance } from 'chalk';
import type { RuleResult } from '../rules/engine.js';
import { formatNumber } from '../rules/utils/message.js';
import type { CheckReport, ModelReport } from '../pipeline/result-types.js';
import { ruleCounts } from '../pipeline/result-types.js';
import { firstElasticDetails, rigidBodyModeCount } from '../pipeline/rule-details.js';

export interface ConsoleOptions {
  quiet?: boolean;
  /** chalk colour level 0..3; by default from the environment. */
  colorLevel?: 0 | 1 | 2 | 3;
}

/** Colour level from the environment: FORCE_COLOR wins, then NO_COLOR, then terminal detection. */
export function colorLevelFromEnv(env: NodeJS.ProcessEnv = process.env): 0 | 1 | 2 | 3 | undefined {
  if (env.FORCE_COLOR !== undefined) return undefined; // chalk reads FORCE_COLOR itself
  if (env.NO_COLOR !== undefined && env.NO_COLOR !== '') return 0;
  return undefined;
}

export function formatConsole(report: CheckReport, options: ConsoleOptions = {}): string {
  const level = options.colorLevel ?? colorLevelFromEnv();
  const c = level === undefined ? new Chalk() : new Chalk({ level });
  const out: string[] = [];
  if (!options.quiet) for (const m of report.models) out.push(modelLine(m, c), ...changeLine(m, c));
  const rows = report.models.flatMap((m) => m.rules.filter(notable).map((r) => ({ m, r })));
  const problems = report.models.filter((m) => m.problem);
  if (rows.length > 0 || problems.length > 0) {
    if (!options.quiet && out.length > 0) out.push('');
    out.push(...table(rows, problems, c));
  }
  if (!options.quiet && out.length > 0) out.push('');
  out.push(verdictLine(report, c));
  if (!options.quiet) out.push(c.dim(report.caution));
  return `${out.join('\n')}\n`;
}

function notable(r: RuleResult): boolean {
  return r.status === 'fail' || r.status === 'error';
}

function modelLine(m: ModelReport, c: ChalkInstance): string {
  const mark = m.verdict === 'pass' ? c.green('✔ pass ') : m.verdict === 'fail' ? c.red('✖ FAIL ') : c.red.bold('✖ ERROR');
  const parts = [`${mark} ${c.bold(m.name)}`];
  if (m.stats) parts.push(m.stats.solvedDofs === undefined || m.stats.solvedDofs === m.stats.dofs ? `${m.stats.dofs} DOFs` : `${m.stats.dofs} DOFs exported, ${m.stats.solvedDofs} solved`);
  if (m.solve) parts.push(`${m.solve.modesReturned} modes`);
  const first = firstElastic(m);
  if (first !== null) parts.push(`first elastic ${formatNumber(first)} Hz`);
  const k = ruleCounts(m.rules);
  const counts = [`${k.passed}/${k.total} rules passed`];
  if (k.failed) counts.push(c.red(`${k.failed} failed`));
  if (k.errors) counts.push(c.red(`${k.errors} errors`));
  if (k.warnings) counts.push(c.yellow(`${k.warnings} warnings`));
  if (k.skipped) counts.push(`${k.skipped} skipped`);
  parts.push(counts.join(', '));
  parts.push(c.dim(`${(m.timeMs / 1000).toFixed(1)} s`));
  return parts.join('  ');
}

/** "  changed since the baseline: 3 nodes in 1 region, largest nodes 5, 1003 near (…); 0 added, 0 removed" */
function changeLine(m: ModelReport, c: ChalkInstance): string[] {
  const map = m.changes?.changeMap;
  if (!map || map.nodes.length === 0) return [];
  const top = map.regions[0];
  const largest = top ? `, largest ${top.label}` : '';
  return [c.dim(`    changed since the baseline: ${map.changedNodes} nodes in ${map.regions.length} region(s)${largest}; ${map.addedNodes} added, ${map.removedNodes} removed`)];
}

function firstElastic(m: ModelReport): number | null {
  const frequencyHz = firstElasticDetails(m.rules.find((x) => x.ruleId === 'first-elastic-frequency')).frequencyHz;
  if (frequencyHz !== undefined) return frequencyHz;
  const count = rigidBodyModeCount(m.rules.find((x) => x.ruleId === 'rigid-body-modes'));
  if (count !== undefined && m.modes && count < m.modes.length) return m.modes[count].frequencyHz;
  return null;
}

function table(rows: { m: ModelReport; r: RuleResult }[], problems: ModelReport[], c: ChalkInstance): string[] {
  const cells = [
    ...problems.map((m) => [m.name, m.problem!.kind === 'input' ? 'model-input' : `model-${m.problem!.kind}`, 'error', m.problem!.message]),
    ...rows.map(({ m, r }) => [m.name, r.ruleId, r.severity === 'warning' ? 'warning' : r.status === 'error' ? 'error' : 'FAIL', r.message]),
  ];
  const w0 = Math.max(5, ...cells.map((x) => x[0].length));
  const w1 = Math.max(4, ...cells.map((x) => x[1].length));
  const w2 = 7;
  const head = c.bold(`${'model'.padEnd(w0)}  ${'rule'.padEnd(w1)}  ${'status'.padEnd(w2)}  message`);
  return [
    head,
    ...cells.map(([model, rule, status, message]) => {
      const s = status.padEnd(w2);
      const colored = status === 'warning' ? c.yellow(s) : c.red(s);
      return `${model.padEnd(w0)}  ${rule.padEnd(w1)}  ${colored}  ${message}`;
    }),
  ];
}

function verdictLine(report: CheckReport, c: ChalkInstance): string {
  const n = report.models.length;
  const failed = report.models.filter((m) => m.verdict === 'fail').length;
  const errored = report.models.filter((m) => m.verdict === 'error').length;
  if (report.verdict === 'pass') return c.green.bold(`modalgate: PASS — ${n} model(s) checked, every error-severity rule passed.`);
  if (report.verdict === 'fail') return c.red.bold(`modalgate: FAIL — ${failed} of ${n} model(s) failed a rule.`);
  if (report.problem) return c.red.bold('modalgate: ERROR — the check could not run (the reason follows on stderr).');
  // every model is counted: an error elsewhere does not hide a failed rule
  const passed = n - failed - errored;
  const parts = [passed > 0 ? `${passed} passed` : '', failed > 0 ? `${failed} failed` : '', `${errored} error (could not be checked)`].filter((x) => x !== '');
  return c.red.bold(`modalgate: ERROR — ${n} model(s): ${parts.join(', ')}.`);
}
