/**
 * `npm run bench -- modes`: the 20 lowest modes of each bench model through our built CLI
 * (`modalgate modes`) beside SciPy's eigsh in shift-invert mode (scipy_eigsh_bench.py: SuperLU on
 * the faster of a minimum-degree and a METIS nested-dissection ordering), on the same Matrix
 * Market files, and a fixed-cost line: a ~1k-DOF model through `modalgate check`.
 *
 * Per model it prints DOFs, each side's wall time, solve time and peak RSS (whole process, by
 * /usr/bin/time), the time and memory ratios against the goals (ours ≤ 0.5× SciPy's wall time,
 * ≤ 0.6× its peak RSS; the 300k hex also ≤ 135 s and ≤ 5 GB), the solves on each side, our
 * Sturm check, the largest relative eigenvalue difference, and the change against the previous
 * entry of the same model in test/bench/history/modes.jsonl, to which it appends one line per
 * model (see the README there).
 *
 * Environment:
 *   MODES_BENCH_MODELS=hex10k-free,tet26k-clamped   only these (names below; check1k is the fixed-cost line)
 *   MODES_BENCH_LARGE=1                              add the ~300k hex (hex300k-free) to the default list
 *   MODES_BENCH_SCIPY_ORDERINGS=nd                   SciPy's orderings to try (nd, mmd; none skips SciPy)
 *   MODES_BENCH_SCIPY_TIMEOUT=1800                   seconds before one SciPy run is stopped
 *   MODES_BENCH_HISTORY=0                            do not append to the history
 *   MODES_BENCH_KEEP=1                               keep the written model files
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { writeGeneratedModel } from '../../fixtures/generator/write-model.js';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';
import { hexBar, spaceFrame60k, tetBracket100k, tetBracket26k } from './bench-models.js';
import { appendHistory, loadAverageNow, type EntryFields, previousEntry, readHistory, runStamp, type HistoryEntry, type RunStamp } from './bench-history.js';
import { maxRelativeDifference, repoRoot, runOursCheck, runOursModes, runScipy, scipyOrderingsAvailable, type ModelFiles, type OursRun, type ScipyOrdering, type ScipyRun } from './modes-runners.js';
import { formatFixedCost, formatModel, formatSummary, GOALS, type FixedCostResult, type ModelResult } from './modes-report.js';

const MODES = 20;

interface BenchModel {
  name: string;
  build: () => GeneratedModel;
  /** Only when asked for (MODES_BENCH_LARGE=1 or by name). */
  large?: boolean;
  /** Absolute goals besides the ratios. */
  goalWallS?: number;
  goalPeakBytes?: number;
  /** SciPy's orderings tried by default (both when not given). */
  scipyOrderings?: ScipyOrdering[];
}

const MODELS: BenchModel[] = [
  { name: 'hex10k-free', build: () => hexBar([27, 10, 10], false) },
  { name: 'hex10k-clamped', build: () => hexBar([27, 10, 10], true) },
  { name: 'hex30k-free', build: () => hexBar([40, 15, 15], false) },
  { name: 'hex30k-clamped', build: () => hexBar([40, 15, 15], true) },
  { name: 'tet26k-free', build: () => tetBracket26k(false) },
  { name: 'tet26k-clamped', build: () => tetBracket26k(true) },
  { name: 'tet100k-free', build: () => tetBracket100k(false) },
  { name: 'tet100k-clamped', build: () => tetBracket100k(true) },
  { name: 'frame60k-free', build: () => spaceFrame60k(false) },
  { name: 'hex120k-free', build: () => hexBar([64, 24, 24], false) },
  // minimum degree fills far more than nested dissection on a solid this size: nd only by default
  { name: 'hex300k-free', build: () => hexBar([88, 33, 33], false), large: true, goalWallS: 135, goalPeakBytes: 5e9, scipyOrderings: ['nd'] },
];
const FIXED_COST = 'check1k';
const historyFile = path.join(repoRoot, 'test/bench/history/modes.jsonl');

/** The names to run: MODES_BENCH_MODELS, else the fixed-cost line and every model not large (unless MODES_BENCH_LARGE=1). */
function selectedNames(): string[] | string {
  const known = [FIXED_COST, ...MODELS.map((m) => m.name)];
  const asked = process.env.MODES_BENCH_MODELS?.split(',').map((s) => s.trim()).filter((s) => s !== '');
  if (asked && asked.length > 0) {
    const unknown = asked.filter((s) => !known.includes(s));
    return unknown.length > 0 ? `unknown model(s) in MODES_BENCH_MODELS: ${unknown.join(', ')}; known: ${known.join(', ')}` : asked;
  }
  const large = process.env.MODES_BENCH_LARGE === '1';
  return [FIXED_COST, ...MODELS.filter((m) => large || !m.large).map((m) => m.name)];
}

/** The orderings SciPy tries on `model`: MODES_BENCH_SCIPY_ORDERINGS, else the model's default, within what is installed. */
function scipyOrderingsFor(model: BenchModel, available: ScipyOrdering[]): ScipyOrdering[] {
  const env = process.env.MODES_BENCH_SCIPY_ORDERINGS;
  const wanted = env !== undefined ? env.split(',').map((s) => s.trim()) : (model.scipyOrderings ?? ['mmd', 'nd']);
  const chosen = available.filter((o) => wanted.includes(o));
  // a model whose only default ordering is missing falls back to what there is
  return chosen.length > 0 || env !== undefined ? chosen : available;
}

async function writeModel(dir: string, name: string, build: () => GeneratedModel): Promise<{ files: ModelFiles; dofs: number; description: string }> {
  const model = build();
  const files = await writeGeneratedModel(model, dir, name);
  return { files, dofs: model.stiffness.n, description: model.description };
}

function freeMemory(): void {
  (globalThis as { gc?: () => void }).gc?.();
}

async function benchModel(model: BenchModel, dir: string, available: ScipyOrdering[], stamp: RunStamp, history: HistoryEntry[]): Promise<ModelResult> {
  const loadAverage = loadAverageNow();
  const { files, dofs, description } = await writeModel(dir, model.name, model.build);
  freeMemory();
  const ours = runOursModes(files, MODES, path.join(dir, `${model.name}.ours.json`));
  const scipyRuns: (ScipyRun | string)[] = [];
  if (typeof ours !== 'string') {
    const timeoutS = Number(process.env.MODES_BENCH_SCIPY_TIMEOUT ?? '1800');
    for (const ordering of scipyOrderingsFor(model, available)) {
      scipyRuns.push(runScipy(files, MODES, ours.shift, ordering, path.join(dir, `${model.name}.scipy-${ordering}.json`), timeoutS));
    }
  }
  if (process.env.MODES_BENCH_KEEP !== '1') for (const f of Object.values(files)) rmSync(f, { force: true });
  const finished = scipyRuns.filter((r): r is ScipyRun => typeof r !== 'string');
  const scipy = finished.sort((a, b) => a.wallS - b.wallS)[0];
  const difference = scipy && typeof ours !== 'string' ? maxRelativeDifference(ours.eigenvalues, scipy.eigenvalues) : undefined;
  const result: ModelResult = { name: model.name, description, dofs, loadAverage, ours, scipy, scipyRuns, maxRelativeDifference: difference, goalWallS: model.goalWallS, goalPeakBytes: model.goalPeakBytes, previous: previousEntry(history, model.name) };
  console.log(formatModel(result));
  if (process.env.MODES_BENCH_HISTORY !== '0') appendHistory(historyFile, { ...stamp, ...historyFields(result) });
  return result;
}

function historyFields(r: ModelResult): EntryFields {
  const ours = typeof r.ours === 'string' ? { failed: r.ours } : oursFields(r.ours);
  const s = r.scipy;
  return {
    loadAverage: r.loadAverage,
    model: r.name,
    dofs: r.dofs,
    ours,
    scipy: s ? { ordering: s.ordering, wallS: s.wallS, solveS: round(s.solveS), cpuS: round(s.cpuS), peakRssKb: s.peakRssKb, solves: s.solves ?? null, tried: r.scipyRuns.map((x) => (typeof x === 'string' ? x : `${x.ordering} ${x.wallS} s`)) } : null,
    ratios: s && typeof r.ours !== 'string' ? { time: ratio(r.ours.wallS, s.wallS), solveTime: ratio(r.ours.solveS, s.solveS), memory: ratio(r.ours.peakRssKb, s.peakRssKb) } : null,
    maxRelativeDifference: r.maxRelativeDifference ?? null,
  };
}

function oursFields(o: OursRun): Record<string, unknown> {
  return { wallS: o.wallS, solveS: round(o.solveS), cpuS: round(o.cpuS), peakRssKb: o.peakRssKb, solves: o.solves ?? null, sturmOk: o.sturmOk, maxResidual: o.maxResidual };
}

const round = (x: number): number => Math.round(x * 1000) / 1000;
const ratio = (a: number, b: number): number => Math.round((a / b) * 1000) / 1000;

/** The fixed cost: `check` of a ~1k-DOF hex bar (975 DOFs, free-free), three runs, the median CPU time. */
async function benchFixedCost(dir: string, stamp: RunStamp, history: HistoryEntry[]): Promise<FixedCostResult> {
  const loadAverage = loadAverageNow();
  const { files, dofs } = await writeModel(dir, FIXED_COST, () => hexBar([12, 4, 4], false));
  const config = path.join(dir, `${FIXED_COST}.yaml`);
  const rel = (f: string): string => path.basename(f);
  writeFileSync(config, `defaults:\n  count: ${MODES}\n  ruleSets: [free-free]\nmodels:\n  - name: ${FIXED_COST}\n    stiffness: ${rel(files.stiffness)}\n    mass: ${rel(files.mass)}\n    dofs: ${rel(files.dofs)}\n`);
  const runs = [0, 1, 2].map(() => runOursCheck(config, path.join(dir, `${FIXED_COST}.junit.xml`), path.join(dir, `${FIXED_COST}.report.json`)));
  const sorted = [...runs].sort((a, b) => a.cpuS - b.cpuS);
  const result: FixedCostResult = { name: FIXED_COST, dofs, loadAverage, runs, median: sorted[1], goalCpuS: GOALS.fixedCostCpuS, previous: previousEntry(history, FIXED_COST) };
  console.log(formatFixedCost(result));
  if (process.env.MODES_BENCH_HISTORY !== '0') {
    const m = result.median;
    appendHistory(historyFile, { ...stamp, loadAverage, model: FIXED_COST, dofs, check: { cpuS: round(m.cpuS), runsCpuS: runs.map((r) => round(r.cpuS)), wallS: m.wallS, peakRssKb: m.peakRssKb, exitCodes: runs.map((r) => r.status) } });
  }
  return result;
}

export default async function modesBench(): Promise<void> {
  const names = selectedNames();
  if (typeof names === 'string') {
    console.log(names);
    return;
  }
  const dir = mkdtempSync(path.join(tmpdir(), 'modalgate-modes-bench-'));
  const stamp = runStamp(repoRoot);
  const history = readHistory(historyFile);
  const available = scipyOrderingsAvailable();
  console.log(`commit ${stamp.commit}${stamp.dirty ? ' (with uncommitted changes)' : ''}, ${stamp.cpu}, load ${loadAverageNow().join(' ')}; SciPy orderings installed: ${available.join(', ') || 'none (no scipy)'}`);
  let fixed: FixedCostResult | undefined;
  const results: ModelResult[] = [];
  for (const name of names) {
    if (name === FIXED_COST) fixed = await benchFixedCost(dir, stamp, history);
    else results.push(await benchModel(MODELS.find((m) => m.name === name)!, dir, available, stamp, history));
    freeMemory();
  }
  console.log(formatSummary(results, fixed));
  if (process.env.MODES_BENCH_KEEP === '1') console.log(`files in ${dir}`);
  else rmSync(dir, { recursive: true, force: true });
  if (process.env.MODES_BENCH_HISTORY !== '0') console.log(`appended to ${path.relative(repoRoot, historyFile)}`);
}
