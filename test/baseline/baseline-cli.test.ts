/**
 * End to end through the built CLI (`node dist/src/cli/main.js check`): save a baseline of the
 * demo `mast`, then check the changed mast (`mast-thin-brace`: one bracing tube 10 % thinner, made
 * by fixtures/generator) under the same model name against it.
 *  - the frequencies in the comparison equal independent solveModes runs on both models (1e-9)
 *    and the SciPy dense references of fixtures/demo/reference-frequencies.json (scipy.linalg.eigh,
 *    outside the project; 10 significant digits stored, so 1e-8);
 *  - the change per tracked mode equals the change computed from those independent runs (1e-9);
 *  - frequency-drift fails (exit 1) when its limit is set below the observed change;
 *  - a baseline saved for another DOF numbering (other DOF count; same count with two nodes'
 *    ids exchanged) stops the model with exit 2 and a sentence naming the baseline file.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureBuilt, repoRoot, runCli, runMany } from '../cli/built-cli.js';
import { readStiffnessAndMass } from '../../src/io/matrix-market-reader.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import type { ComparisonFacts } from '../../src/model/comparison-facts.js';

const demo = join(repoRoot, 'fixtures/demo');
let work: string;

/** A config with one model named `mast` made of the demo files `<base>.*`. */
function config(name: string, base: string, extra = '', dofsPath = `${demo}/${base}.dofs.csv`): string {
  const path = join(work, name);
  writeFileSync(path, `models:\n  - { name: mast, stiffness: ${demo}/${base}.stiffness.mtx, mass: ${demo}/${base}.mass.mtx, dofs: ${dofsPath}, count: 12${extra} }\n`);
  return path;
}

async function independentHz(base: string): Promise<Float64Array> {
  const { stiffness, mass } = await readStiffnessAndMass(join(demo, `${base}.stiffness.mtx`), join(demo, `${base}.mass.mtx`));
  return solveModes(stiffness.matrix, mass.matrix, { count: 12 }).frequenciesHz;
}

beforeAll(async () => {
  ensureBuilt();
  work = mkdtempSync(join(tmpdir(), 'modalgate-baseline-'));
  const saved = await runCli(['check', '-c', config('mast.yaml', 'mast', ', rules: { matrix-finite: error }'), '--save-baseline', join(work, 'base')]);
  expect(saved.code, saved.stderr + saved.stdout).toBe(0);
  expect(saved.stdout).toContain(`baseline of mast saved: ${join(work, 'base/mast.baseline.json')}`);
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('check --baseline on the demo mast and its thin-brace change', () => {
  it('reports drift per tracked mode that matches independent solves, and fails a tight limit', async () => {
    const swapped = readFileSync(join(demo, 'mast.dofs.csv'), 'utf8').replace(/^(\d+),(4|5),/gm, (_l, dof: string, node: string) => `${dof},${node === '4' ? 5 : 4},`);
    writeFileSync(join(work, 'renumbered.dofs.csv'), swapped);
    const base = join(work, 'base');
    const [pass, tight, otherCount, renumbered] = await runMany([
      ['check', '-c', config('thin.yaml', 'mast-thin-brace'), '--baseline', base, '--json', join(work, 'thin.json'), '--markdown', join(work, 'thin.md')],
      ['check', '-c', config('tight.yaml', 'mast-thin-brace', ', rules: { frequency-drift: { maxChangePercent: 0.3 } }'), '--baseline', base],
      ['check', '-c', config('free.yaml', 'mast-free'), '--baseline', base],
      ['check', '-c', config('renumbered.yaml', 'mast', '', join(work, 'renumbered.dofs.csv')), '--baseline', base],
    ], repoRoot, 2);
    expect(pass.code, pass.stderr + pass.stdout).toBe(0);
    const facts = JSON.parse(readFileSync(join(work, 'thin.json'), 'utf8')).models[0].comparison as ComparisonFacts;
    const [before, after] = [await independentHz('mast'), await independentHz('mast-thin-brace')];
    const reference = JSON.parse(readFileSync(join(demo, 'reference-frequencies.json'), 'utf8')).models;
    expect(facts.pairs).toHaveLength(12);
    let largest = 0;
    for (const p of facts.pairs) {
      const f0 = before[p.baselineMode - 1], f1 = after[p.currentMode - 1];
      expect(Math.abs(p.baselineHz - f0) / f0).toBeLessThan(1e-9);
      expect(Math.abs(p.currentHz - f1) / f1).toBeLessThan(1e-9);
      // SciPy dense reference (scipy.linalg.eigh), 10 significant digits
      expect(Math.abs(p.baselineHz - reference.mast.frequenciesHz[p.baselineMode - 1]) / f0).toBeLessThan(1e-8);
      expect(Math.abs(p.currentHz - reference['mast-thin-brace'].frequenciesHz[p.currentMode - 1]) / f1).toBeLessThan(1e-8);
      expect(Math.abs(p.changePercent! - (100 * (f1 - f0)) / f0)).toBeLessThan(1e-9);
      expect(p.correlation).toBeGreaterThan(0.99);
      largest = Math.max(largest, Math.abs(p.changePercent!));
    }
    expect(largest).toBeGreaterThan(0.3);
    expect(facts.mac.values).toHaveLength(144);
    expect(readFileSync(join(work, 'thin.md'), 'utf8')).toMatch(/\| mode \| baseline Hz \| current Hz \| change % \| MAC \| status \|/);
    expect(tight.code, tight.stderr + tight.stdout).toBe(1);
    expect(tight.stdout).toMatch(/mast\s+frequency-drift\s+FAIL\s+\d+ of 12 paired modes changed by more than ± 0.3 %/);
    expect(otherCount.code).toBe(2);
    expect(otherCount.stdout).toContain(`${join(base, 'mast.baseline.json')}: was saved for 666 DOFs but the model now has 684 DOFs`);
    expect(renumbered.code).toBe(2);
    expect(renumbered.stdout).toContain(`${join(base, 'mast.baseline.json')}: was saved with a different DOF numbering`);
  });
});
