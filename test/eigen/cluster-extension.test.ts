/**
 * A requested count that ends inside a cluster of equal eigenvalues: the solver returns the whole
 * cluster, says so (ModesResult.clusterExtension, the Sturm note), the Sturm count equals the
 * modes returned, and `modes` and the modes-complete rule agree.
 *
 * Outside references:
 *  - square-section cantilever: every bending frequency comes as a pair (common practice), the
 *    pairs at Euler–Bernoulli f = (βL)²/(2πL²)·√(EI/(ρA)), βL = 1.87510407, 4.69409113,
 *    7.85475744 (Blevins, Formulas for Natural Frequency and Mode Shape (1979), Table 8-1, via
 *    docs/sources.md §7), and the whole spectrum from ml-matrix dense eigen (test/generator/dense-reference.ts);
 *  - the demo mast (fixtures/demo/): its reference spectrum from numpy/scipy offline
 *    (fixtures/demo/reference-frequencies.json, made by fixtures/generator/demo_frequencies.py).
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildCantilever } from '../../fixtures/generator/cantilever.js';
import { rectangularSection, STEEL } from '../../fixtures/generator/sections.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { CLUSTER_RELATIVE_TOLERANCE } from '../../src/eigen/verification.js';
import { modesComplete } from '../../src/rules/modes-complete.js';
import { cleanSummary } from '../rules/fake-model.js';
import { generalizedEigenvalues } from '../generator/dense-reference.js';
import { ensureBuilt, repoRoot, runCli } from '../cli/built-cli.js';

const BETA_L = [1.87510407, 4.69409113, 7.85475744]; // Blevins Table 8-1, via docs/sources.md §7

describe('square-section cantilever: counts that split each bending pair', () => {
  const lengthM = 2;
  const model = buildCantilever({ lengthM, elements: 20, widthM: 0.05 });
  const dense = generalizedEigenvalues(model.stiffness, model.mass); // ml-matrix, outside the project
  const section = rectangularSection(0.05, 0.05);
  const ebHz = BETA_L.map((b) => ((b * b) / (2 * Math.PI * lengthM * lengthM)) * Math.sqrt((STEEL.youngPa * section.izM4) / (STEEL.densityKgM3 * section.areaM2)));

  it('the reference spectrum is in pairs at the Euler–Bernoulli frequencies (check of the test model)', () => {
    for (let p = 0; p < 3; p++) {
      const hz = [dense[2 * p], dense[2 * p + 1]].map((l) => Math.sqrt(l) / (2 * Math.PI));
      expect(Math.abs(hz[0] / ebHz[p] - 1)).toBeLessThan(0.005);
      expect(Math.abs(dense[2 * p + 1] - dense[2 * p])).toBeLessThanOrEqual(CLUSTER_RELATIVE_TOLERANCE * dense[2 * p]);
    }
  });

  // modes 7–8 are the fourth bending pair (βL = 10.99554073, same table); torsion lies just above it
  for (let count = 1; count <= 8; count++) {
    it(`count ${count}: ${count % 2 === 1 ? 'the pair partner is returned too and said' : 'no extension'}; Sturm count = modes returned; modes-complete passes`, () => {
      const r = solveModes(model.stiffness, model.mass, { count, coordinates: model.coordinates });
      // the expected count from the dense reference: the requested ones plus those equal to λ_count
      let expected = count;
      while (Math.abs(dense[expected] - dense[count - 1]) <= CLUSTER_RELATIVE_TOLERANCE * dense[count - 1]) expected++;
      expect(expected).toBe(count % 2 === 1 ? count + 1 : count);
      expect(r.eigenvalues.length).toBe(expected);
      // the dense reduction L⁻¹KL⁻ᵀ carries rounding of order ε·λ_max, a few 1e-9 of these λ
      r.eigenvalues.forEach((l, i) => expect(Math.abs(l - dense[i])).toBeLessThanOrEqual(1e-7 * dense[i]));
      expect(r.sturm.ok).toBe(true);
      expect(r.sturm.countBelow).toBe(expected);
      expect(r.sturm.modesReturned).toBe(expected);
      const outcome = modesComplete.evaluate(
        { modelName: 'square', stiffness: model.stiffness, mass: model.mass, stiffnessSummary: cleanSummary('K', model.stiffness.n), massSummary: cleanSummary('M', model.stiffness.n), modes: r },
        {},
      );
      expect(outcome.status).toBe('pass');
      if (expected > count) {
        expect(r.clusterExtension).toMatchObject({ requested: count, returned: expected, relativeTolerance: CLUSTER_RELATIVE_TOLERANCE, rigidBody: false });
        expect(r.sturm.note).toMatch(new RegExp(`${count} mode\\(s\\) requested; mode ${count} \\(.* Hz\\) is repeated, so 1 more mode\\(s\\) equal to it`));
        expect(outcome.message).toMatch(new RegExp(`is ${expected}, equal to the ${expected} modes returned: no mode was missed \\(${count} requested; mode ${count} at .* Hz is repeated, so 1 more mode\\(s\\) of its cluster were returned\\)`));
        expect(outcome.details?.clusterExtension).toEqual(r.clusterExtension);
      } else {
        expect(r.clusterExtension).toBeUndefined();
        expect(outcome.message).toMatch(/no mode was missed\.$/);
      }
    });
  }

  it('a free-free beam asked for fewer than its six rigid-body modes gets all six (one zero cluster)', () => {
    const free = buildCantilever({ lengthM, elements: 20, widthM: 0.05, clamped: false });
    const r = solveModes(free.stiffness, free.mass, { count: 2, coordinates: free.coordinates });
    expect(r.eigenvalues.length).toBe(6); // a free body in 3-D has 6 rigid-body modes (common practice)
    expect(r.clusterExtension).toMatchObject({ requested: 2, returned: 6, rigidBody: true });
    expect(r.sturm).toMatchObject({ ok: true, countBelow: 6, modesReturned: 6 });
  });
});

describe('the README example config on the bundled mast, count 20 (ends inside a bending pair)', () => {
  let work: string;
  beforeAll(() => {
    ensureBuilt();
    work = mkdtempSync(join(tmpdir(), 'modalgate-cluster-'));
  });
  afterAll(() => rmSync(work, { recursive: true, force: true }));

  it('modes: 21 modes, "complete", the note, exit 0, JSON clusterExtension', async () => {
    const demo = join(repoRoot, 'fixtures/demo');
    const json = join(work, 'mast.json');
    const r = await runCli(['modes', '--stiffness', join(demo, 'mast.stiffness.mtx'), '--mass', join(demo, 'mast.mass.mtx'), '--count', '20', '--json', json]);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/Sturm count at σ = [0-9.]+: 21 eigenvalue\(s\) below, 21 mode\(s\) returned — complete/);
    expect(r.stdout).toMatch(/note: 20 mode\(s\) requested; mode 20 \(63\.23\d* Hz\) is repeated, so 1 more mode\(s\) equal to it \(relative 1e-8\) were returned to complete the cluster: 21 modes/);
    const doc = JSON.parse(readFileSync(json, 'utf8'));
    expect(doc.clusterExtension).toMatchObject({ requested: 20, returned: 21, relativeTolerance: 1e-8 });
    expect(doc.sturm).toMatchObject({ countBelow: 21, modesReturned: 21, ok: true });
    expect(doc.verified).toBe(true);
    // reference spectrum, numpy/scipy offline (fixtures/demo/reference-frequencies.json, lowest 12)
    const ref = JSON.parse(readFileSync(join(demo, 'reference-frequencies.json'), 'utf8')).models.mast.frequenciesHz as number[];
    ref.forEach((hz, i) => expect(Math.abs(doc.frequenciesHz[i] - hz)).toBeLessThanOrEqual(1e-6 * hz));
    // modes 20 and 21: the mast's bending pair (its section has two equal bending planes, common practice)
    expect(Math.abs(doc.eigenvalues[20] - doc.eigenvalues[19])).toBeLessThanOrEqual(1e-8 * doc.eigenvalues[19]);
  }, 60_000);

  it('check: no false modes-complete failure; the message says the cluster was completed; JSON solve.clusterExtension; the free mast keeps its re-solve note out of the warnings', async () => {
    const text = readFileSync(join(repoRoot, 'fixtures/demo/modalgate.yaml'), 'utf8')
      .replace('count: 12 ', 'count: 20 ')
      .replace(/\$schema: .*\n/, '')
      .replace(/(stiffness|mass|dofs): (\S+)/g, (_m, k: string, f: string) => `${k}: ${join(repoRoot, 'fixtures/demo', f)}`);
    writeFileSync(join(work, 'modalgate.yaml'), text);
    const only = ['--model', 'mast', '--model', 'mast-free', '--model', 'mast-guyed'];
    const r = await runCli(['check', '--config', join(work, 'modalgate.yaml'), ...only, '--json', join(work, 'check.json')], work);
    expect(r.code, r.stdout + r.stderr).toBe(0);
    expect(r.stdout).not.toMatch(/modes-complete\s+FAIL/);
    const doc = JSON.parse(readFileSync(join(work, 'check.json'), 'utf8'));
    expect(doc.models).toHaveLength(only.length / 2);
    for (const m of doc.models) {
      const rule = m.rules.find((x: { ruleId: string }) => x.ruleId === 'modes-complete');
      expect(rule.status).toBe('pass');
      expect(rule.message).toMatch(/is 21, equal to the 21 modes returned: no mode was missed \(20 requested; mode 20 at .* Hz is repeated, so 1 more mode\(s\) of its cluster were returned\)/);
      expect(m.solve.clusterExtension).toMatchObject({ requested: 20, returned: 21 });
      expect(m.solve.warnings.join('\n')).not.toMatch(/badly placed/);
    }
    const free = doc.models.find((m: { name: string }) => m.name === 'mast-free');
    expect((free.solve.diagnostics ?? []).join('\n')).toMatch(/badly placed for this spectrum; solved again/);
  }, 120_000);
});
