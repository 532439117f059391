/**
 * End to end through the built CLI (`node dist/src/cli/main.js check`): save a baseline of the
 * demo `mast`, then check the changed mast (`mast-thin-brace`: one bracing tube 10 % thinner, made
 * by fixtures/generator) under the same model name against it.
 *  - the frequencies in the comparison equal independent solveModes runs on both models (1e-9)
 *    and the SciPy dense references of fixtures/demo/reference-frequencies.json (scipy.linalg.eigh,
 *    outside the project; 10 significant digits stored, so 1e-8);
 *  - the change per tracked mode equals the change computed from those independent runs (1e-9);
 *  - frequency-drift fails (exit 1) when its limit is set below the observed change;
 *  - the same mast with its DOFs renumbered (order reversed) and every node id changed (+1000),
 *    K, M and DOF map consistently: DOFs match by node and component, MAC ≈ 1 on every pair and
 *    drift 0 — a renumbering is not a change (exit 0);
 *  - the free-free mast (18 more DOFs: the base node's) against the supported one: shapes are
 *    compared on the 666 DOFs both have, 18 added; without its DOF map the modes pair by
 *    frequency order, frequency-drift still judges (exit 1) and the shape rules skip with the reason;
 *  - a missing baseline directory: exit 0, the baseline rules skip with the reason, a warning on
 *    the console and in the JSON report (`baselineWarning`);
 *  - a 20 % heavier mast (K and M both × 1.2: same frequencies, mass × 1.2 since rᵀ(1.2M)r =
 *    1.2 rᵀMr): frequency-drift passes, mass-drift fails (exit 1) with the change +20 %;
 *  - a save that fails (a directory where the JSON goes): exit 2, the error names the file and
 *    the cause, and the rule results stay in the JSON report.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureBuilt, repoRoot, runCli, runMany } from '../cli/built-cli.js';
import { readStiffnessAndMass } from '../../src/io/matrix-market-reader.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import type { ComparisonFacts } from '../../src/model/comparison-facts.js';
import { readDofMap } from '../../src/io/dof-map-reader.js';
import { writeDofMap } from '../../src/io/dof-map-writer.js';
import { writeSymmetricMatrixMarket } from '../../src/io/matrix-market-writer.js';
import { permuteSymmetric } from '../../src/sparse/permute.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';

const demo = join(repoRoot, 'fixtures/demo');
let work: string;

/** A config with one model named `mast` made of the demo files `<base>.*`. */
function config(name: string, base: string, extra = '', dofsPath = `${demo}/${base}.dofs.csv`): string {
  const path = join(work, name);
  writeFileSync(path, `models:\n  - { name: mast, stiffness: ${demo}/${base}.stiffness.mtx, mass: ${demo}/${base}.mass.mtx, dofs: ${dofsPath}, count: 12${extra} }\n`);
  return path;
}

/** A config with one model named `mast` made of the given files. */
function configOf(name: string, files: { stiffness: string; mass: string; dofs: string }, extra = ''): string {
  const path = join(work, name);
  writeFileSync(path, `models:\n  - { name: mast, stiffness: ${files.stiffness}, mass: ${files.mass}, dofs: ${files.dofs}, count: 12${extra} }\n`);
  return path;
}

const scaled = (a: SymmetricCsc, f: number): SymmetricCsc => ({ ...a, values: a.values.map((v) => v * f) });

/** The demo mast renumbered (DOF order reversed, node ids + 1000) and the mast 20 % heavier (K and M × 1.2). */
async function writeVariants(): Promise<void> {
  const { stiffness, mass } = await readStiffnessAndMass(join(demo, 'mast.stiffness.mtx'), join(demo, 'mast.mass.mtx'));
  const map = await readDofMap(join(demo, 'mast.dofs.csv'), stiffness.matrix.n);
  const n = map.n;
  const perm = Int32Array.from({ length: n }, (_v, k) => n - 1 - k); // new DOF k = old DOF n−1−k (its own inverse)
  await writeSymmetricMatrixMarket(join(work, 'renum.stiffness.mtx'), permuteSymmetric(stiffness.matrix, perm));
  await writeSymmetricMatrixMarket(join(work, 'renum.mass.mtx'), permuteSymmetric(mass.matrix, perm));
  const pick = <T extends Int32Array | Uint8Array | Float64Array>(a: T): T => a.map((_v, k) => a[perm[k]]) as T;
  await writeDofMap(join(work, 'renum.dofs.csv'), { n, node: pick(map.node).map((id) => id + 1000), component: pick(map.component), x: pick(map.x), y: pick(map.y), z: pick(map.z) });
  await writeSymmetricMatrixMarket(join(work, 'heavy.stiffness.mtx'), scaled(stiffness.matrix, 1.2));
  await writeSymmetricMatrixMarket(join(work, 'heavy.mass.mtx'), scaled(mass.matrix, 1.2));
}

async function independentHz(base: string): Promise<Float64Array> {
  const { stiffness, mass } = await readStiffnessAndMass(join(demo, `${base}.stiffness.mtx`), join(demo, `${base}.mass.mtx`));
  return solveModes(stiffness.matrix, mass.matrix, { count: 12 }).frequenciesHz;
}

beforeAll(async () => {
  ensureBuilt();
  work = mkdtempSync(join(tmpdir(), 'modalgate-baseline-'));
  await writeVariants();
  const saved = await runCli(['check', '-c', config('mast.yaml', 'mast', ', rules: { matrix-finite: error }'), '--save-baseline', join(work, 'base')]);
  expect(saved.code, saved.stderr + saved.stdout).toBe(0);
  expect(saved.stdout).toContain(`baseline of mast saved: ${join(work, 'base/mast.baseline.json')}`);
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('check --baseline on the demo mast and its thin-brace change', () => {
  it('reports drift per tracked mode that matches independent solves, and fails a tight limit', async () => {
    const base = join(work, 'base');
    const noMap = join(work, 'nomap.yaml');
    writeFileSync(noMap, `models:\n  - { name: mast, stiffness: ${demo}/mast-free.stiffness.mtx, mass: ${demo}/mast-free.mass.mtx, count: 12 }\n`);
    const [pass, tight, otherCount, withoutMap] = await runMany([
      ['check', '-c', config('thin.yaml', 'mast-thin-brace'), '--baseline', base, '--json', join(work, 'thin.json'), '--markdown', join(work, 'thin.md')],
      ['check', '-c', config('tight.yaml', 'mast-thin-brace', ', rules: { frequency-drift: { maxChangePercent: 0.3 } }'), '--baseline', base],
      ['check', '-c', config('free.yaml', 'mast-free'), '--baseline', base, '--json', join(work, 'free.json')],
      ['check', '-c', noMap, '--baseline', base, '--json', join(work, 'nomap.json')],
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
    const free = JSON.parse(readFileSync(join(work, 'free.json'), 'utf8')).models[0].comparison as ComparisonFacts;
    expect(otherCount.code).not.toBe(2);
    expect(free.baseline).toMatchObject({ numberingCheck: 'node and component', dofsCompared: 666, dofsAdded: 18, dofsRemoved: 0 });
    expect(free.pairedBy).toBe('shapes');
    // other DOF count and no DOF map now: pairs by frequency order, frequency-drift still judges (the free mast's frequencies moved: exit 1)
    expect(withoutMap.code, withoutMap.stdout + withoutMap.stderr).toBe(1);
    const reason = 'the baseline has 666 DOFs and the model now 684, and the model has no DOF map now, so DOFs cannot be matched and the shapes cannot be compared';
    expect(withoutMap.stdout).toMatch(/mast\s+frequency-drift\s+FAIL\s+\d+ of \d+ paired modes changed by more than ± 5 %/);
    expect(withoutMap.stdout).toContain(`Modes paired by frequency order: ${reason}.`);
    const nm = JSON.parse(readFileSync(join(work, 'nomap.json'), 'utf8')).models[0];
    expect(nm.comparison.pairedBy).toBe('frequency order');
    expect(nm.rules.find((r: { ruleId: string }) => r.ruleId === 'mode-shape-match')).toMatchObject({ status: 'skip', message: `not evaluated: ${reason}.` });
  });
});

describe.concurrent('baselines that survive ordinary change', () => {
  it('a renumbered mast (DOF order and node ids) compares as the same model: MAC ≈ 1, drift 0', async () => {
    const files = { stiffness: join(work, 'renum.stiffness.mtx'), mass: join(work, 'renum.mass.mtx'), dofs: join(work, 'renum.dofs.csv') };
    const run = await runCli(['check', '-c', configOf('renum.yaml', files), '--baseline', join(work, 'base'), '--json', join(work, 'renum.json')]);
    expect(run.code, run.stdout + run.stderr).toBe(0);
    const kf = JSON.parse(readFileSync(join(work, 'renum.json'), 'utf8')).models[0].comparison as ComparisonFacts;
    // node ids changed too (some new ids are old ids of other nodes): the DOFs match by position
    expect(kf.baseline).toMatchObject({ numberingCheck: 'position and component', dofsCompared: 666, dofsAdded: 0, dofsRemoved: 0, renumbered: true });
    expect(kf.pairs).toHaveLength(12);
    for (const p of kf.pairs) {
      expect(p.correlation!).toBeGreaterThan(1 - 1e-8);
      expect(Math.abs(p.changePercent!)).toBeLessThan(1e-7);
      if (p.group === null) expect(p.mac!).toBeGreaterThan(1 - 1e-8);
    }
    expect(kf.swaps).toEqual([]);
    // every DOF stored and compared: off-pair mass-weighted MAC is (φ_iᵀMφ_j)² ≈ 0 (M-orthogonality)
    expect(kf.baseline).toMatchObject({ selection: 'all', energyShareKept: 1 });
    const grouped = new Set(kf.groupMatches.flatMap((g) => g.baselineModes));
    let offPair = 0;
    for (let i = 0; i < 12; i++) for (let j = 0; j < 12; j++) if (i !== j && !grouped.has(i + 1)) offPair = Math.max(offPair, kf.mac.values[i * 12 + j]);
    expect(offPair).toBeLessThan(1e-6);
  });
  it('a missing baseline directory skips the baseline rules with a warning (exit 0)', async () => {
    const nowhere = join(work, 'nowhere');
    const run = await runCli(['check', '-c', config('missing.yaml', 'mast'), '--baseline', nowhere, '--json', join(work, 'missing.json')]);
    expect(run.code, run.stdout + run.stderr).toBe(0);
    const warning = `baseline directory ${nowhere} not found: the baseline rules are skipped (a new project has none until a run with check --save-baseline)`;
    expect(run.stdout).toContain(`warning: mast: ${warning}`);
    const model = JSON.parse(readFileSync(join(work, 'missing.json'), 'utf8')).models[0];
    expect(model.baselineWarning).toBe(warning);
    const baselineRules = model.rules.filter((r: { ruleId: string }) => ['frequency-drift', 'mode-shape-match', 'mode-swap', 'new-or-lost-modes', 'mass-drift'].includes(r.ruleId));
    expect(baselineRules).toHaveLength(5);
    for (const r of baselineRules) expect(r).toMatchObject({ status: 'skip', message: `not evaluated: ${warning}.` });
  });
  it('a 20 % heavier mast fails mass-drift although no frequency moved', async () => {
    const files = { stiffness: join(work, 'heavy.stiffness.mtx'), mass: join(work, 'heavy.mass.mtx'), dofs: join(demo, 'mast.dofs.csv') };
    const run = await runCli(['check', '-c', configOf('heavy.yaml', files), '--baseline', join(work, 'base'), '--json', join(work, 'heavy.json')]);
    expect(run.code, run.stdout + run.stderr).toBe(1);
    expect(run.stdout).toMatch(/mast\s+mass-drift\s+FAIL\s+mass properties differ from the baseline: total mass [\d.]+ → [\d.]+ \(\+20 %, allowed ± 1 %\)/);
    const rules = JSON.parse(readFileSync(join(work, 'heavy.json'), 'utf8')).models[0].rules as { ruleId: string; status: string; details: Record<string, number> }[];
    const mass = rules.find((r) => r.ruleId === 'mass-drift')!;
    expect(mass.status).toBe('fail');
    expect(mass.details.massChangePercent).toBeCloseTo(20, 9);
    expect(mass.details.centerShift).toBeLessThan(1e-9);
    expect(rules.find((r) => r.ruleId === 'frequency-drift')!.status).toBe('pass');
  });
  it('a failed save keeps the rule results, names the file and the cause, and exits 2', async () => {
    const target = join(work, 'blocked');
    mkdirSync(join(target, 'mast.baseline.json'), { recursive: true });
    const run = await runCli(['check', '-c', config('blocked.yaml', 'mast', ', ruleSets: [supported], rules: { first-elastic-frequency: { minHz: 0.1 } }'), '--save-baseline', target, '--json', join(work, 'blocked.json')]);
    expect(run.code).toBe(2);
    const model = JSON.parse(readFileSync(join(work, 'blocked.json'), 'utf8')).models[0];
    expect(model.problem.message).toContain(`${target}: could not save the baseline of model "mast": EISDIR`);
    expect(model.problem.message).toContain(join(target, 'mast.baseline.json'));
    expect(model.rules.length).toBeGreaterThan(3);
    expect(model.rules.every((r: { status: string }) => r.status === 'pass' || r.status === 'skip')).toBe(true);
    expect(run.stdout).toContain('could not save the baseline of model "mast"');
    expect(readdirSync(target)).toEqual(['mast.baseline.json']);
  });
});
