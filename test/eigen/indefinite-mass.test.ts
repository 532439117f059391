/**
 * Input that cannot be solved is refused, by `modes` as by `check`; a solve that fell short is
 * never "complete".
 *
 *  - screening (src/model/screen-pencil.ts): a negative 2×2 principal minor m_ij² > m_ii·m_jj
 *    proves M indefinite (every principal submatrix of a positive semi-definite matrix is
 *    positive semi-definite: common practice, e.g. Horn & Johnson, Matrix Analysis, §7.1 — from
 *    memory); consistent beam masses and the demo models pass it;
 *  - an indefinite M whose 2×2 minors are all fine, [[1, .9, −.9], [.9, 1, .9], [−.9, .9, 1]]
 *    (x = (1, −1, 1) gives xᵀMx = 3 − 5.4 < 0, worked by hand), is caught by the solver;
 *  - exit codes of `modes`: 2 for input that cannot be solved (one line naming the file),
 *    1 for solved but not verified, 0 for verified.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildCantilever } from '../../fixtures/generator/cantilever.js';
import { negativeMinor, screenPencil } from '../../src/model/screen-pencil.js';
import { readStiffnessAndMass } from '../../src/io/matrix-market-reader.js';
import { incompleteness, solveModes } from '../../src/eigen/solve-modes.js';
import { IndefiniteMassError } from '../../src/eigen/modes-types.js';
import { formatModesTable, verified } from '../../src/cli/modes.js';
import { fakeModes, sparseFromDense } from '../rules/fake-model.js';
import { ensureBuilt, repoRoot, runCli } from '../cli/built-cli.js';

const K3 = '%%MatrixMarket matrix coordinate real symmetric\n3 3 5\n1 1 2\n2 1 -1\n2 2 2\n3 2 -1\n3 3 2\n';
const M_MINOR = '%%MatrixMarket matrix coordinate real symmetric\n3 3 4\n1 1 1\n2 1 2\n2 2 1\n3 3 1\n';
const M_HIDDEN = '%%MatrixMarket matrix coordinate real symmetric\n3 3 6\n1 1 1\n2 1 0.9\n3 1 -0.9\n2 2 1\n3 2 0.9\n3 3 1\n';
const M_NEGATIVE_DIAGONAL = '%%MatrixMarket matrix coordinate real symmetric\n3 3 3\n1 1 1\n2 2 -1\n3 3 1\n';

let work: string;
beforeAll(() => {
  ensureBuilt();
  work = mkdtempSync(join(tmpdir(), 'modalgate-indefinite-'));
  writeFileSync(join(work, 'K.mtx'), K3);
  writeFileSync(join(work, 'M-minor.mtx'), M_MINOR);
  writeFileSync(join(work, 'M-hidden.mtx'), M_HIDDEN);
  writeFileSync(join(work, 'M-negdiag.mtx'), M_NEGATIVE_DIAGONAL);
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('screening of the pencil', () => {
  it('finds the negative 2×2 minor and names rows and file', async () => {
    const { stiffness, mass } = await readStiffnessAndMass(join(work, 'K.mtx'), join(work, 'M-minor.mtx'));
    expect(negativeMinor(mass.matrix)).toMatchObject({ i: 1, j: 0, mij: 2 });
    const b = screenPencil(stiffness.summary, mass.summary, mass.matrix);
    expect(b?.file).toBe(join(work, 'M-minor.mtx'));
    expect(b?.reason).toMatch(/^M is indefinite: rows 1 and 2 have m_ij² > m_ii·m_jj/);
  });

  it('passes consistent beam masses and every demo model (no false refusal)', async () => {
    const beam = buildCantilever({ lengthM: 2, elements: 10, widthM: 0.04, depthM: 0.06 });
    expect(negativeMinor(beam.mass)).toBeNull();
    for (const name of ['mast', 'mast-free', 'mast-guyed', 'bracket']) {
      const demo = join(repoRoot, 'fixtures/demo');
      const gz = name === 'bracket' ? '.gz' : '';
      const { stiffness, mass } = await readStiffnessAndMass(join(demo, `${name}.stiffness.mtx${gz}`), join(demo, `${name}.mass.mtx${gz}`));
      expect(screenPencil(stiffness.summary, mass.summary, mass.matrix)).toBeNull();
    }
  });

  it('the solver refuses an indefinite M that the minors miss', () => {
    const k = sparseFromDense([[2, -1, 0], [-1, 2, -1], [0, -1, 2]]);
    const m = sparseFromDense([[1, 0.9, -0.9], [0.9, 1, 0.9], [-0.9, 0.9, 1]]);
    expect(negativeMinor(m)).toBeNull();
    expect(() => solveModes(k, m, { count: 2 })).toThrow(IndefiniteMassError);
  });
});

describe('modes: exit codes', () => {
  it('indefinite M (negative minor): exit 2, one line naming the mass file, no JSON', async () => {
    const json = join(work, 'minor.json');
    const r = await runCli(['modes', '--stiffness', join(work, 'K.mtx'), '--mass', join(work, 'M-minor.mtx'), '--count', '2', '--json', json]);
    expect(r.code).toBe(2);
    const lines = r.stderr.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(new RegExp(`^modalgate: ${join(work, 'M-minor.mtx').replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}: M is indefinite: rows 1 and 2`));
    expect(r.stdout).not.toMatch(/complete/);
    expect(existsSync(json)).toBe(false);
  });

  it('indefinite M the solver catches: exit 2, one line naming the mass file', async () => {
    const r = await runCli(['modes', '--stiffness', join(work, 'K.mtx'), '--mass', join(work, 'M-hidden.mtx'), '--count', '2']);
    expect(r.code).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/M-hidden\.mtx: M is not positive semi-definite: the solve met a motion with negative kinetic energy/);
  });

  it('negative M diagonal: refused as check refuses it (exit 2, names the file)', async () => {
    const r = await runCli(['modes', '--stiffness', join(work, 'K.mtx'), '--mass', join(work, 'M-negdiag.mtx'), '--count', '1']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/M-negdiag\.mtx: M has negative diagonal entries/);
  });

  it('check on the same indefinite M: the modes rules error naming the file, exit 2', async () => {
    const cfg = join(work, 'modalgate.yaml');
    writeFileSync(cfg, `defaults: { count: 2, ruleSets: [supported] }\nmodels:\n  - name: bad\n    stiffness: K.mtx\n    mass: M-minor.mtx\n    rules:\n      first-elastic-frequency: { minHz: 0.01 }\n`);
    const r = await runCli(['check', '--config', cfg, '--json', join(work, 'check.json')], work);
    expect(r.code, r.stdout + r.stderr).toBe(2);
    const doc = JSON.parse(readFileSync(join(work, 'check.json'), 'utf8'));
    const rule = doc.models[0].rules.find((x: { ruleId: string }) => x.ruleId === 'modes-complete');
    expect(rule.status).toBe('error');
    expect(rule.message).toMatch(/M-minor\.mtx: M is indefinite/);
  });

  it('a verified solve: exit 0, JSON verified true', async () => {
    const beam = buildCantilever({ lengthM: 2, elements: 6, widthM: 0.04, depthM: 0.06 });
    const { writeSymmetricMatrixMarket } = await import('../../src/io/matrix-market-writer.js');
    await writeSymmetricMatrixMarket(join(work, 'bK.mtx'), beam.stiffness);
    await writeSymmetricMatrixMarket(join(work, 'bM.mtx'), beam.mass);
    const json = join(work, 'beam.json');
    const r = await runCli(['modes', '--stiffness', join(work, 'bK.mtx'), '--mass', join(work, 'bM.mtx'), '--count', '3', '--json', json]);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/largest eigenpair residual ‖Kφ − λMφ‖ \/ \(‖Kφ‖ \+ \|λ\|‖Mφ‖\): .*, within 1e-8/);
    const doc = JSON.parse(readFileSync(json, 'utf8'));
    expect(doc.verified).toBe(true);
    expect(doc.residualMeasure).toMatch(/^eigenpair residual/);
  });
});

describe('a solve that fell short is never complete', () => {
  it('fewer modes than asked, non-finite eigenvalues or shift: a reason, never null', () => {
    expect(incompleteness(new Float64Array(0), 2, NaN)).toBe('only 0 of 2 modes were found');
    expect(incompleteness(Float64Array.of(1, NaN), 2, 3)).toBe('the solve produced non-finite eigenvalues');
    expect(incompleteness(Float64Array.of(1, 2), 2, NaN)).toBe('the Sturm check shift is not a finite number');
    expect(incompleteness(Float64Array.of(1, 2), 2, 3)).toBeNull();
  });

  it('a result whose Sturm check failed is "NOT VERIFIED" and not verified (modes exits 1 on it)', () => {
    const r = fakeModes(1, Float64Array.of(4, 9));
    r.sturm = { shift: NaN, countBelow: 0, modesReturned: 2, ok: false, note: 'only 0 of 2 modes were found' };
    expect(verified(r)).toBe(false);
    expect(formatModesTable(r)).toMatch(/— NOT VERIFIED\n {2}note: only 0 of 2 modes were found/);
    const good = fakeModes(1, Float64Array.of(4, 9));
    expect(verified(good)).toBe(true);
    good.residuals[1] = 1e-6;
    expect(verified(good)).toBe(false);
    expect(formatModesTable(good)).toMatch(/ABOVE 1e-8/);
  });
});
