/**
 * The regression rules and the Markdown table on comparisons of a fixed–free spring–mass chain
 * whose exact modes come from ml-matrix (outside the project, test/rules/fake-model.ts):
 *  - current = baseline modes 1, 2, 4, 5 (mode 3 left out): mode 3 has no partner, since its
 *    mass-weighted MAC with every other mode is 0 (M-orthogonality, Allemang & Brown 1982
 *    definition), and lies inside the current range → lost; current mode 4 (baseline mode 5)
 *    lies above the baseline's range → not counted as new;
 *  - current = baseline modes with 1 and 2 exchanged (shapes and frequencies): a swap;
 *  - frequency-drift on a chain with one heavier mass: change per mode = 100 (f₁ − f₀)/f₀ from the
 *    two exact solutions; fails below the observed change, passes above it.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chainContext, exactModes, springChain } from '../rules/fake-model.js';
import type { ModesResult } from '../../src/eigen/modes-types.js';
import { loadBaseline, saveBaseline } from '../../src/model/baseline-store.js';
import { compareWithBaseline } from '../../src/model/compare-baseline.js';
import type { ComparisonFacts } from '../../src/model/comparison-facts.js';
import { findRule } from '../../src/rules/registry.js';
import { runRules, type ResolvedRule } from '../../src/rules/engine.js';
import { formatMarkdown } from '../../src/report/markdown.js';
import { CAUTION, type CheckReport } from '../../src/pipeline/result-types.js';

const dir = mkdtempSync(join(tmpdir(), 'modalgate-rules-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const chain = springChain(6, 1000, [1, 1.3, 0.8, 1.1, 0.9, 1.2], 1000);
const all = exactModes(chain);

/** A ModesResult with the chosen columns (0-based) of `modes`. */
function pick(modes: ModesResult, columns: number[]): ModesResult {
  const n = modes.n;
  const shapes = new Float64Array(n * columns.length);
  columns.forEach((c, k) => shapes.set(modes.shapes.subarray(c * n, (c + 1) * n), k * n));
  return { ...modes, eigenvalues: Float64Array.from(columns, (c) => modes.eigenvalues[c]), frequenciesHz: Float64Array.from(columns, (c) => modes.frequenciesHz[c]), residuals: new Float64Array(columns.length), shapes };
}

async function compare(name: string, before: ModesResult, after: ModesResult, afterMass = chain.mass): Promise<ComparisonFacts> {
  await saveBaseline(dir, { model: name, modes: before, mass: chain.mass });
  return compareWithBaseline((await loadBaseline(dir, name))!, { modes: after, mass: afterMass });
}

function run(facts: ComparisonFacts, modes: ModesResult, options: Record<string, Record<string, unknown>> = {}) {
  const rules: ResolvedRule[] = ['frequency-drift', 'mode-shape-match', 'mode-swap', 'new-or-lost-modes'].map((id) => {
    const rule = findRule(id)!;
    return { rule, severity: 'error', options: { ...(rule.defaults as object), ...options[id] } };
  });
  return runRules({ ...chainContext(chain, modes), comparison: facts }, rules);
}

function markdownOf(facts: ComparisonFacts, results: ReturnType<typeof run>, allModes = false): string {
  const report: CheckReport = {
    tool: { name: 'modalgate', version: '0' }, timestamp: '', timeMs: 0, hostname: 'h', verdict: 'fail', caution: CAUTION,
    models: [{ name: 'chain', verdict: 'fail', timestamp: '', timeMs: 0, ruleSets: [], rules: results, comparison: facts }],
  };
  return formatMarkdown(report, { allModes });
}

describe('regression rules', () => {
  it('a left-out mode is lost; a mode above the baseline range is not new', async () => {
    const current = pick(all, [0, 1, 3, 4]);
    const facts = await compare('lost', pick(all, [0, 1, 2, 3]), current);
    expect(facts.pairs.map((p) => [p.baselineMode, p.currentMode])).toEqual([[1, 1], [2, 2], [4, 3]]);
    expect(facts.lostModes).toMatchObject([{ mode: 3, withinCompared: true }]);
    expect(facts.newModes).toMatchObject([{ mode: 4, withinCompared: false }]);
    const results = run(facts, current);
    const byId = Object.fromEntries(results.map((r) => [r.ruleId, r]));
    expect(byId['new-or-lost-modes'].status).toBe('fail');
    expect(byId['new-or-lost-modes'].message).toContain('baseline mode 3 at');
    expect(byId['mode-swap'].status).toBe('pass');
    expect(byId['frequency-drift'].measured).toBeLessThan(1e-9);
    const md = markdownOf(facts, results);
    expect(md).toMatch(/\| 3 → none \| [\d.]+ \| — \| — \| — \| lost \|/);
    expect(md).not.toContain('| 1 |');
    expect(markdownOf(facts, results, true)).toMatch(/\| 1 \| [\d.]+ \| [\d.]+ \| 0 \| 1\.000 \| ok \|/);
  });
  it('an exchanged pair is a swap, with MAC 1 on both pairs', async () => {
    // the shapes of modes 1 and 2 exchange places; frequencies stay ascending, as a solver returns them
    const current = { ...pick(all, [1, 0, 2, 3]), frequenciesHz: all.frequenciesHz.slice(0, 4), eigenvalues: all.eigenvalues.slice(0, 4) };
    const facts = await compare('swap', pick(all, [0, 1, 2, 3]), current);
    expect(facts.swaps).toEqual([{ baselineModes: [1, 2], currentModes: [2, 1], correlations: [expect.closeTo(1, 12), expect.closeTo(1, 12)] }]);
    const results = run(facts, current);
    const swap = results.find((r) => r.ruleId === 'mode-swap')!;
    expect(swap.status).toBe('fail');
    expect(swap.message).toContain('baseline modes 1 and 2 are now modes 2 and 1');
    expect(markdownOf(facts, results)).toMatch(/\| 1 → 2 \|.*swapped \|/);
  });
  it('frequency-drift measures 100 (f₁ − f₀)/f₀ per pair and fails below the observed change', async () => {
    const heavier = springChain(6, 1000, [1, 1.3, 0.8, 1.1, 0.9, 1.26], 1000);
    const after = exactModes(heavier);
    const facts = await compare('drift', all, after, heavier.mass);
    let largest = 0;
    for (const p of facts.pairs) {
      const expected = (100 * (after.frequenciesHz[p.currentMode - 1] - all.frequenciesHz[p.baselineMode - 1])) / all.frequenciesHz[p.baselineMode - 1];
      expect(p.changePercent!).toBeCloseTo(expected, 10);
      largest = Math.max(largest, Math.abs(expected));
    }
    expect(run(facts, after, { 'frequency-drift': { maxChangePercent: largest * 1.01 } })[0].status).toBe('pass');
    const tight = run(facts, after, { 'frequency-drift': { maxChangePercent: largest * 0.99 } })[0];
    expect(tight.status).toBe('fail');
    expect(tight.measured).toBeCloseTo(largest, 10);
  });
});
