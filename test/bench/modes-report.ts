/**
 * The modes bench's printout (modes-bench.ts): one block per model with the goals and the change
 * against the previous history entry of that model, the fixed-cost line and a closing summary
 * table. Memory is printed in decimal MB and GB (10⁶ and 10⁹ bytes) from /usr/bin/time's KiB.
 */
import { entryLabel, type HistoryEntry } from './bench-history.js';
import type { Measured, OursRun, ScipyRun } from './modes-runners.js';

/** Ours against SciPy (wall time and peak RSS of the whole process), and the fixed cost (CPU s). */
export const GOALS = { timeRatio: 0.5, memoryRatio: 0.6, fixedCostCpuS: 0.5 } as const;

export interface ModelResult {
  name: string;
  description: string;
  dofs: number;
  loadAverage: number[];
  /** Our run, or why it failed. */
  ours: OursRun | string;
  /** SciPy's faster run, if any finished. */
  scipy: ScipyRun | undefined;
  /** Every SciPy run tried, or why it did not finish. */
  scipyRuns: (ScipyRun | string)[];
  maxRelativeDifference?: number;
  goalWallS?: number;
  goalPeakBytes?: number;
  previous?: HistoryEntry;
}

export interface FixedCostResult {
  name: string;
  dofs: number;
  loadAverage: number[];
  runs: Measured[];
  /** The run of median CPU time. */
  median: Measured;
  goalCpuS: number;
  previous?: HistoryEntry;
}

const mb = (kb: number): string => `${((kb * 1024) / 1e6).toFixed(0)} MB`;
const gb = (kb: number): string => `${((kb * 1024) / 1e9).toFixed(2)} GB`;
const s = (x: number): string => `${x.toFixed(2)} s`;
const verdict = (value: number, goal: number): string => (value <= goal ? 'met' : 'MISSED');
const ratio = (a: number, b: number): number => a / b;

/** A field of a previous entry, e.g. get(prev, 'ratios', 'time'); undefined when absent. */
function get(entry: HistoryEntry | undefined, ...keys: string[]): number | undefined {
  let v: unknown = entry;
  for (const k of keys) v = v !== null && typeof v === 'object' ? (v as Record<string, unknown>)[k] : undefined;
  return typeof v === 'number' ? v : undefined;
}

/** "   was 0.66× at abc1234, 2026-12-05", or '' without a previous value. */
function was(entry: HistoryEntry | undefined, value: number | undefined, format: (x: number) => string): string {
  return entry && value !== undefined ? `   was ${format(value)} at ${entryLabel(entry)}` : '';
}

function oursLines(o: OursRun, prev: HistoryEntry | undefined): string[] {
  const solves = o.solves === undefined ? 'solves not reported' : `${o.solves} solves`;
  const sturm = `Sturm ${o.sturmOk ? 'ok' : 'FAILED'} (${o.sturmLine})`;
  const before = prev && get(prev, 'ours', 'wallS') !== undefined ? `   was ${s(get(prev, 'ours', 'wallS')!)}, ${mb(get(prev, 'ours', 'peakRssKb') ?? NaN)} at ${entryLabel(prev)}` : '';
  return [
    `  ours     ${s(o.wallS)} wall (solve ${s(o.solveS)}, CPU ${s(o.cpuS)}), peak ${mb(o.peakRssKb)}, ${solves}, ${sturm}, largest residual ${o.maxResidual.toExponential(1)}${before}`,
    `           ${o.phases}`,
  ];
}

function scipyLine(r: ModelResult): string {
  const tried = r.scipyRuns.map((x) => (typeof x === 'string' ? x : `${x.ordering} ${s(x.wallS)}`)).join(', ');
  if (!r.scipy) return `  SciPy    not run${tried ? `: ${tried}` : ' (python3 with scipy not found, or no ordering chosen)'}`;
  const c = r.scipy;
  const solves = c.solves === undefined ? 'solves not reported' : `${c.solves} ARPACK solves`;
  return `  SciPy    ${s(c.wallS)} wall (solve ${s(c.solveS)}, CPU ${s(c.cpuS)}), peak ${mb(c.peakRssKb)}, ${solves}, ${c.orderingName}; tried: ${tried}`;
}

/** One model's block. */
export function formatModel(r: ModelResult): string {
  const head = `\n${r.name} — ${r.dofs.toLocaleString('en-US')} DOFs, ${r.description} (load ${r.loadAverage.join(' ')} at start)`;
  if (typeof r.ours === 'string') return `${head}\n  ${r.ours}`;
  const o = r.ours;
  const prev = r.previous;
  const lines = [head, ...oursLines(o, prev), scipyLine(r)];
  if (r.scipy) {
    const time = ratio(o.wallS, r.scipy.wallS), memory = ratio(o.peakRssKb, r.scipy.peakRssKb);
    const x = (v: number): string => `${v.toFixed(2)}×`;
    lines.push(
      `  time     ${x(time)} SciPy's wall time (goal ≤ ${GOALS.timeRatio}×: ${verdict(time, GOALS.timeRatio)}; solve only ${x(ratio(o.solveS, r.scipy.solveS))})${was(prev, get(prev, 'ratios', 'time'), x)}`,
      `  memory   ${x(memory)} SciPy's peak RSS (goal ≤ ${GOALS.memoryRatio}×: ${verdict(memory, GOALS.memoryRatio)})${was(prev, get(prev, 'ratios', 'memory'), x)}`,
      `  eigenvalues: largest relative difference from SciPy ${r.maxRelativeDifference?.toExponential(1) ?? '—'} (elastic modes)`,
    );
  }
  if (r.goalWallS !== undefined || r.goalPeakBytes !== undefined) {
    const parts: string[] = [];
    if (r.goalWallS !== undefined) parts.push(`${s(o.wallS)} wall (goal ≤ ${r.goalWallS} s: ${verdict(o.wallS, r.goalWallS)})`);
    if (r.goalPeakBytes !== undefined) parts.push(`peak ${gb(o.peakRssKb)} (goal ≤ ${r.goalPeakBytes / 1e9} GB: ${verdict(o.peakRssKb * 1024, r.goalPeakBytes)})`);
    lines.push(`  absolute ${parts.join(', ')}`);
  }
  return lines.join('\n');
}

/** The fixed-cost line. */
export function formatFixedCost(r: FixedCostResult): string {
  const m = r.median;
  const failed = r.runs.find((x) => x.status !== 0);
  const all = r.runs.map((x) => x.cpuS.toFixed(2)).join(', ');
  const note = failed ? `; check exited ${failed.status}: ${failed.stderr.split('\n').pop()}` : '';
  return (
    `\n${r.name} — ${r.dofs.toLocaleString('en-US')} DOFs, \`modalgate check\` end to end (20 modes, rules, JUnit and JSON reports; load ${r.loadAverage.join(' ')} at start)\n` +
    `  CPU ${s(m.cpuS)} user+sys (median of ${r.runs.length}: ${all}), wall ${s(m.wallS)}, peak ${mb(m.peakRssKb)}; goal ≤ ${r.goalCpuS} s CPU: ${verdict(m.cpuS, r.goalCpuS)}${note}` +
    was(r.previous, get(r.previous, 'check', 'cpuS'), s)
  );
}

/** The closing table, one line per model, and the fixed cost. */
export function formatSummary(results: readonly ModelResult[], fixed: FixedCostResult | undefined): string {
  const head = ['model', 'DOFs', 'ours s', 'SciPy s', 'time×', 'ours MB', 'SciPy MB', 'memory×', 'solves ours/ARPACK', 'Sturm', 'max rel diff'];
  const rows = results.map((r) => {
    if (typeof r.ours === 'string') return [r.name, String(r.dofs), 'failed', '', '', '', '', '', '', '', ''];
    const o = r.ours, c = r.scipy;
    const mark = (v: number, goal: number): string => `${v.toFixed(2)}${v <= goal ? '' : ' !'}`;
    return [
      r.name,
      String(r.dofs),
      o.wallS.toFixed(1),
      c ? c.wallS.toFixed(1) : '—',
      c ? mark(o.wallS / c.wallS, GOALS.timeRatio) : '—',
      ((o.peakRssKb * 1024) / 1e6).toFixed(0),
      c ? ((c.peakRssKb * 1024) / 1e6).toFixed(0) : '—',
      c ? mark(o.peakRssKb / c.peakRssKb, GOALS.memoryRatio) : '—',
      `${o.solves ?? '?'}/${c ? (c.solves ?? '?') : '—'}`,
      o.sturmOk ? 'ok' : 'FAILED',
      r.maxRelativeDifference?.toExponential(1) ?? '—',
    ];
  });
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((row) => row[i].length)));
  const line = (cells: string[]): string => cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
  const out = ['\nsummary (wall time and peak RSS of each whole process; "!" marks a ratio above its goal: time ≤ 0.5×, memory ≤ 0.6×)'];
  if (rows.length > 0) out.push(line(head), ...rows.map(line));
  if (fixed) out.push(`fixed cost (${fixed.name}, ${fixed.dofs} DOFs, check end to end): ${s(fixed.median.cpuS)} CPU, goal ≤ ${fixed.goalCpuS} s: ${verdict(fixed.median.cpuS, fixed.goalCpuS)}`);
  return out.join('\n');
}
