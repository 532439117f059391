/**
 * End to end: `modalgate demo` on the committed demo models, from a working directory outside
 * the package. All models pass except the guyed mast with an unfastened anchor, whose extra
 * near-zero mode (a mechanism) fails rigid-body-modes; the demo still exits 0 and says the
 * failure is intended. The JUnit file validates against junit-10.xsd (jenkinsci/xunit-plugin).
 * `check` on the same config is the real gate and exits 1.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { XMLParser } from 'fast-xml-parser';
import { ensureBuilt, repoRoot, runCli, type CliRun } from './built-cli.js';
import { structuralProblems, xmllintValidate } from '../report/junit-validation.js';

const demoDir = join(repoRoot, 'fixtures/demo');
describe('modalgate demo', () => {
  let cwd: string;
  let run: CliRun;
  beforeAll(async () => {
    ensureBuilt();
    cwd = mkdtempSync(join(tmpdir(), 'modalgate-demo-'));
    run = await runCli(['demo'], cwd);
  });
  afterAll(() => rmSync(cwd, { recursive: true, force: true }));

  it('exits 0 and says the one failure is intended', () => {
    expect(run.code, run.stdout + run.stderr).toBe(0);
    expect(run.stdout).toContain('The failure above is intended');
    expect(run.stdout).toMatch(/mast-guyed-loose-anchor\s+rigid-body-modes\s+FAIL\s+1 mode below .*expected 0: the model has a mechanism or an unintended free part/);
    for (const m of ['mast', 'mast-free', 'mast-guyed', 'mast-thin-brace', 'bracket']) expect(run.stdout).toMatch(new RegExp(`✔ pass\\s+${m}\\s`));
  });

  it('writes ./modalgate-report/junit.xml with the expected counts, valid against junit-10.xsd', async () => {
    const xml = readFileSync(join(cwd, 'modalgate-report/junit.xml'), 'utf8');
    expect(structuralProblems(xml)).toEqual([]);
    const lint = await xmllintValidate(xml);
    expect(lint.ok, lint.output).toBe(true);
    const doc = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '', isArray: (n) => ['testsuite', 'testcase'].includes(n) }).parse(xml);
    const suites = doc.testsuites.testsuite as { name: string; failures: string; errors: string; testcase: { name: string; failure?: { type: string; message: string } }[] }[];
    expect(suites.map((s) => s.name)).toEqual(['mast', 'mast-free', 'mast-guyed', 'mast-guyed-loose-anchor', 'mast-thin-brace', 'bracket']);
    expect(doc.testsuites.failures).toBe('1');
    expect(doc.testsuites.errors).toBe('0');
    const loose = suites[3];
    expect(loose.failures).toBe('1');
    const failed = loose.testcase.filter((c) => c.failure);
    expect(failed.map((c) => c.name)).toEqual(['rigid-body-modes']);
    expect(failed[0].failure!.type).toBe('rigid-body-modes');
    expect(failed[0].failure!.message).toContain('expected 0: the model has a mechanism');
  });

  it('writes report.json with every model, the modes and the caution', () => {
    const json = JSON.parse(readFileSync(join(cwd, 'modalgate-report/report.json'), 'utf8'));
    expect(json.verdict).toBe('fail');
    expect(json.caution).toContain('qualified engineer');
    const scenario = JSON.parse(readFileSync(join(demoDir, 'scenario.json'), 'utf8'));
    for (const m of json.models) {
      expect(m.stats.dofs).toBe(scenario.models[m.name].dofCount);
      expect(m.solve.sturm.ok).toBe(true);
    }
    // elastic eigenvalues against a dense SciPy solve, scipy.linalg.eigh(K, M) (fixtures/demo/reference-frequencies.json)
    const refFile = join(demoDir, 'reference-frequencies.json');
    const ref = JSON.parse(readFileSync(refFile, 'utf8')).models as Record<string, { nearZeroEigenvalues: number; eigenvalues: number[] }>;
    for (const m of json.models as { name: string; modes: { eigenvalue: number }[] }[]) {
      const r = ref[m.name];
      for (let i = r.nearZeroEigenvalues; i < m.modes.length; i++) {
        expect(Math.abs(m.modes[i].eigenvalue - r.eigenvalues[i]) / r.eigenvalues[i], `${m.name} mode ${i + 1}`).toBeLessThan(1e-8);
      }
    }
    const loose = json.models.find((m: { name: string }) => m.name === 'mast-guyed-loose-anchor');
    expect(loose.rules.find((r: { ruleId: string }) => r.ruleId === 'rigid-body-modes')).toMatchObject({ status: 'fail', measured: scenario.models['mast-guyed-loose-anchor'].nearZeroModes, limit: 0 });
  });

  it('check on the same config is the real gate: exit 1 for the loose anchor alone', async () => {
    const r = await runCli(['check', '--config', join(demoDir, 'modalgate.yaml'), '--model', 'mast-guyed-loose-anchor', '--quiet'], cwd);
    expect(r.code).toBe(1);
    expect(r.stdout).toContain('modalgate: FAIL');
  });
});
