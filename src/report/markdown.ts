/**
 * Markdown summary of `check` (`--markdown <file>`), sized for a pull-request comment or a CI job
 * summary: the verdict, then per model its failing rules and, when it was compared with a
 * baseline, a table — mode, baseline Hz, current Hz, change %, MAC, status. By default only the
 * interesting rows are shown (modes some regression rule flagged; when none, the mode with the
 * largest frequency change); `allModes` shows every pair and every unpaired mode.
 * Everything shown was computed before: statuses come from the rules' `details.flagged`.
 * Text taken from the user's files (model names, file names, messages that quote them) is
 * escaped so it renders as text on GitHub and GitLab: `&`, `<`, `>` as entities (no raw HTML
 * such as <script>), Markdown punctuation with a backslash, file names in a code span whose
 * fence is longer than any backtick run inside.
 */
import type { RuleResult } from '../rules/engine.js';
import { flaggedModes as flaggedModesOf, type FlaggingRule } from '../pipeline/rule-details.js';
import { signedText } from './change-text.js';
import type { ComparisonFacts, ModePair } from '../model/comparison-facts.js';
import type { CheckReport, ModelReport } from '../pipeline/result-types.js';
import { changesMarkdown } from './markdown-changes.js';

export interface MarkdownOptions {
  /** Show every mode of the comparison, not only the flagged ones. */
  allModes?: boolean;
}

/** Status word of each regression rule when it flags a mode. */
const FLAG_LABEL: Record<FlaggingRule, string> = {
  'frequency-drift': 'drift',
  'mode-shape-match': 'shape changed',
  'mode-swap': 'swapped',
  'new-or-lost-modes': 'unpaired',
};

const VERDICT_WORD = { pass: 'PASS', fail: 'FAIL', error: 'ERROR' } as const;

export function formatMarkdown(report: CheckReport, options: MarkdownOptions = {}): string {
  const out: string[] = [`## modalgate: ${VERDICT_WORD[report.verdict]}`, ''];
  if (report.problem) out.push(`**Error:** ${inline(report.problem.message)}`, '');
  for (const m of report.models) out.push(...modelSection(m, options));
  out.push(`<sub>${inline(report.caution)}</sub>`, '');
  return out.join('\n');
}

function modelSection(m: ModelReport, options: MarkdownOptions): string[] {
  const out = [`### ${inline(m.name)}: ${VERDICT_WORD[m.verdict]}`, ''];
  if (m.problem) out.push(`**Error:** ${inline(m.problem.message)}`, '');
  const failing = m.rules.filter((r) => r.status === 'fail' || r.status === 'error');
  for (const r of failing) out.push(`- \`${r.ruleId}\` ${r.status === 'error' ? 'error' : r.severity === 'warning' ? 'warning' : 'failed'}: ${inline(r.message)}`);
  if (failing.length > 0) out.push('');
  const facts = m.comparison;
  if (facts) out.push(...comparisonTable(facts, m.rules, options));
  out.push(...changesMarkdown(m.changes));
  const skipped = m.rules.find((r) => r.ruleId in FLAG_LABEL && r.status === 'skip');
  if (!facts && skipped) out.push(`No baseline comparison: ${inline(skipped.message.replace(/^not evaluated: /, ''))}`, '');
  return out;
}

interface Row {
  mode: string;
  baselineHz: number | null;
  currentHz: number | null;
  changePercent: number | null;
  mac: number | null;
  /** Part of a near-repeated group: `mac` is the subspace share. */
  repeated?: boolean;
  status: string[];
}

function comparisonTable(facts: ComparisonFacts, rules: RuleResult[], options: MarkdownOptions): string[] {
  const flags = flaggedModes(rules);
  const rows: Row[] = facts.pairs.map((p) => ({ ...pairRow(p), status: [...(flags.baseline.get(p.baselineMode) ?? []), ...(flags.current.get(p.currentMode) ?? [])] }));
  const paired = new Set(facts.pairs.map((p) => p.baselineMode));
  const pairedCurrent = new Set(facts.pairs.map((p) => p.currentMode));
  // unpaired baseline and current modes (flagged ones always, the rest only with allModes)
  for (const u of facts.lostModes) {
    const status = flags.baseline.get(u.mode) ?? [];
    if (!paired.has(u.mode)) rows.push({ mode: `${u.mode} → none`, baselineHz: u.hz, currentHz: null, changePercent: null, mac: null, status: status.length > 0 ? ['lost'] : ['unpaired, above the compared range'] });
  }
  for (const u of facts.newModes) {
    const status = flags.current.get(u.mode) ?? [];
    if (!pairedCurrent.has(u.mode)) rows.push({ mode: `none → ${u.mode}`, baselineHz: null, currentHz: u.hz, changePercent: null, mac: null, status: status.length > 0 ? ['new'] : ['unpaired, above the compared range'] });
  }
  const flagged = rows.filter((r) => r.status.length > 0 && !r.status[0].startsWith('unpaired,'));
  let shown = options.allModes ? rows : flagged;
  if (!options.allModes && flagged.length === 0) shown = largestChange(rows);
  const weighting = facts.settings.weighting === 'mass' ? 'mass-weighted MAC' : 'MAC';
  const out = [
    `Compared with baseline ${codeSpan(facts.baseline.file)} (saved ${inline(String(facts.baseline.createdAt))}): ${facts.pairs.length} paired modes, ${facts.baseline.dofsCompared} DOFs, ${weighting}.`,
    '',
  ];
  if (facts.shapesNotCompared) out.push(`Shapes not compared (${inline(facts.shapesNotCompared)}): modes paired by frequency order.`, '');
  else if (facts.baseline.dofsAdded > 0 || facts.baseline.dofsRemoved > 0 || facts.baseline.renumbered) {
    out.push(`DOFs matched by ${facts.baseline.numberingCheck}: ${facts.baseline.dofsAdded} added, ${facts.baseline.dofsRemoved} removed${facts.baseline.renumbered ? ', renumbered' : ''}.`, '');
  }
  if (shown.length === 0) return [...out, 'No modes to show.', ''];
  out.push('| mode | baseline Hz | current Hz | change % | MAC | status |', '|---|---:|---:|---:|---:|---|');
  for (const r of shown) out.push(`| ${r.mode} | ${hz(r.baselineHz)} | ${hz(r.currentHz)} | ${percent(r.changePercent)} | ${r.mac === null ? '—' : r.mac.toFixed(3)} | ${r.status.length > 0 ? [...new Set(r.status)].join(', ') : 'ok'} |`);
  out.push('');
  if (shown.some((r) => r.repeated)) out.push('MAC of near-repeated modes (and rigid-body modes) is the group\'s subspace MAC: the smallest cos² of the principal angles between the baseline group\'s span and its partners\' span.', '');
  if (!options.allModes) {
    const note = flagged.length === 0 ? `No mode flagged; showing the largest frequency change of ${rows.length} rows.` : `Showing the ${flagged.length} flagged of ${rows.length} rows.`;
    out.push(note, '');
  }
  return out;
}

function pairRow(p: ModePair): Omit<Row, 'status'> {
  const mode = p.baselineMode === p.currentMode ? String(p.baselineMode) : `${p.baselineMode} → ${p.currentMode}`;
  return { mode, baselineHz: p.baselineHz, currentHz: p.currentHz, changePercent: p.changePercent, mac: p.correlation, repeated: p.repeated };
}

function largestChange(rows: Row[]): Row[] {
  const withChange = rows.filter((r) => r.changePercent !== null);
  if (withChange.length === 0) return [];
  return [withChange.reduce((a, b) => (Math.abs(b.changePercent!) > Math.abs(a.changePercent!) ? b : a))];
}

/** Labels per baseline mode and per current mode from the failing regression rules' details. */
function flaggedModes(rules: RuleResult[]): { baseline: Map<number, string[]>; current: Map<number, string[]> } {
  const baseline = new Map<number, string[]>(), current = new Map<number, string[]>();
  for (const r of rules) {
    const label = (FLAG_LABEL as Record<string, string | undefined>)[r.ruleId];
    if (!label || r.status !== 'fail') continue;
    for (const f of flaggedModesOf(r)) {
      if (f.baselineMode !== undefined) baseline.set(f.baselineMode, [...(baseline.get(f.baselineMode) ?? []), label]);
      else if (f.currentMode !== undefined) current.set(f.currentMode, [...(current.get(f.currentMode) ?? []), label]);
    }
  }
  return { baseline, current };
}

function hz(x: number | null): string {
  return x === null ? '—' : String(Number(x.toPrecision(6)));
}

function percent(x: number | null): string {
  return x === null ? '—' : signedText(x);
}

/** One line of plain text, safe inside a heading, table cell or list item. */
export function inline(text: string): string {
  return text
    .replace(/\s*[\r\n]\s*/g, ' ')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/[\\`*_[\]|~#!]/g, (c) => `\\${c}`);
}

/** Literal text (a file name) as a code span: HTML and Markdown inside it are not interpreted. */
export function codeSpan(text: string): string {
  const one = text.replace(/[\r\n]+/g, ' ');
  const longest = Math.max(0, ...(one.match(/`+/g) ?? []).map((r) => r.length));
  const fence = '`'.repeat(longest + 1);
  const pad = one.startsWith('`') || one.endsWith('`') ? ' ' : '';
  return `${fence}${pad}${one}${pad}${fence}`;
}
