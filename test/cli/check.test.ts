/**
 * End to end: the compiled `modalgate check`, `rules` and `init` on small configs — exit codes
 * 0 / 1 / 2, the bad-config corpus (exit 2, one stderr line naming the config), the JUnit file
 * written even when the check cannot run, and JUnit validity against junit-10.xsd.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureBuilt, repoRoot, runCli, runMany } from './built-cli.js';
import { badCases } from '../config/bad-configs.js';
import { structuralProblems, xmllintValidate } from '../report/junit-validation.js';
import { formatRules } from '../../src/cli/rules.js';
import { STARTER_CONFIG, writeStarterConfig } from '../../src/cli/init.js';
import { loadConfig } from '../../src/pipeline/load-config.js';
import { runCheck } from '../../src/cli/check.js';

let work: string;

beforeAll(() => {
  ensureBuilt();
  work = mkdtempSync(join(tmpdir(), 'modalgate-check-'));
  for (const d of ['good', 'models', 'rulesets']) cpSync(join(repoRoot, 'test/config', d), join(work, d), { recursive: true });
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

async function junitOf(path: string): Promise<string> {
  const xml = readFileSync(path, 'utf8');
  expect(structuralProblems(xml)).toEqual([]);
  const lint = await xmllintValidate(xml); // junit-10.xsd (jenkinsci/xunit-plugin, MIT)
  expect(lint.ok, lint.output).toBe(true);
  return xml;
}

describe('modalgate check', () => {
  it('exits 1 when a rule fails, writes JUnit and JSON from the config, resolved next to it', async () => {
    const r = await runCli(['check'], join(work, 'good'));
    expect(r.code, r.stderr).toBe(1);
    expect(r.stdout).toMatch(/tiny-free\s+rigid-body-modes\s+FAIL\s+0 modes below 0.005 Hz, expected 6/);
    const xml = await junitOf(join(work, 'good/out/junit.xml'));
    expect(xml).toMatch(/<testsuites name="modalgate" tests="24" failures="1" errors="0"/);
    const json = JSON.parse(readFileSync(join(work, 'good/out/report.json'), 'utf8'));
    expect(json.verdict).toBe('fail');
    // fixed–free chain of 3 unit masses and springs 100 N/m: λ₁ = (4k/m) sin²(π/14), docs/sources.md §7 [V]
    const exactHz = Math.sqrt(400 * Math.sin(Math.PI / 14) ** 2) / (2 * Math.PI);
    expect(Math.abs(json.models[0].modes[0].frequencyHz - exactHz) / exactHz).toBeLessThan(1e-10);
  });
  it('exits 0 when the selected models pass; command-line report paths win', async () => {
    const r = await runCli(['check', '--config', 'good/modalgate.yaml', '--model', 'tiny', '--junit', 'cli/j.xml', '--quiet'], work);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout.trim()).toBe('modalgate: PASS — 1 model(s) checked, every error-severity rule passed.');
    expect(await junitOf(join(work, 'cli/j.xml'))).toContain('tests="10" failures="0" errors="0"');
  });
  it('exits 2 on an unknown --model name', async () => {
    const r = await runCli(['check', '--config', 'good/modalgate.yaml', '--model', 'nope'], work);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('no model named nope (models: tiny, tiny-free)');
  });
  it('exits 2 on an unreadable matrix, checks the other models, and reports an <error>', async () => {
    writeFileSync(join(work, 'models/broken.mass.mtx'), '%%MatrixMarket matrix coordinate real symmetric\n3 3 2\n1 1 1\n0 2 1\n');
    writeFileSync(
      join(work, 'good/broken.yaml'),
      'models:\n  - { name: ok, stiffness: ../models/tiny.stiffness.mtx, mass: ../models/tiny.mass.mtx, ruleSets: [supported], rules: { first-elastic-frequency: { minHz: 0.1 } } }\n  - { name: broken, stiffness: ../models/tiny.stiffness.mtx, mass: ../models/broken.mass.mtx, ruleSets: [supported], rules: { first-elastic-frequency: { minHz: 0.1 } } }\n',
    );
    const r = await runCli(['check', '--config', 'good/broken.yaml', '--junit', 'broken/j.xml'], work);
    expect(r.code).toBe(2);
    expect(r.stdout).toMatch(/✔ pass\s+ok/);
    expect(r.stdout).toMatch(/broken\s+model-input\s+error\s+.*broken\.mass\.mtx:4/);
    const xml = await junitOf(join(work, 'broken/j.xml'));
    expect(xml).toContain('<testcase name="model-input" classname="modalgate.broken"');
    expect(xml).toContain('type="input-error"');
  });
  it('writes the JUnit <error> even when the config is broken, at the path the config names', async () => {
    writeFileSync(join(work, 'good/typo.yaml'), 'reports: { junit: typo/junit.xml }\nmodels:\n  - { name: a, stiffness: ../models/tiny.stiffness.mtx, mass: ../models/tiny.mass.mtx, rules: { eigen-residul: error } }\n');
    const r = await runCli(['check', '--config', 'good/typo.yaml'], work);
    expect(r.code).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain(join(work, 'good/typo.yaml'));
    const xml = await junitOf(join(work, 'good/typo/junit.xml'));
    expect(xml).toContain('did you mean &quot;eigen-residual&quot;?');
  });
  it('the bad-config corpus exits 2 with one error line naming the config file, and a JUnit <error>', async () => {
    const cases = badCases();
    expect(cases.length).toBeGreaterThanOrEqual(12);
    // every case through the check command's own function (what the CLI action runs) ...
    for (const [i, c] of cases.entries()) {
      const errors: string[] = [];
      const junit = join(work, 'bad', `${i}.xml`);
      const out = await runCheck({ config: c.path, junit, print: () => {}, printError: (l) => errors.push(l) });
      expect(out.code, c.file).toBe(2);
      expect(errors.join('').trim().split('\n'), c.file).toHaveLength(1);
      expect(errors[0], c.file).toContain(c.path);
      expect(readFileSync(junit, 'utf8'), c.file).toContain('<error message=');
    }
    // ... and a sample through the built CLI (each spawn costs ~0.3 s of CPU on a shared machine)
    const sample = [cases[0], cases[4], cases[11]];
    const runs = await runMany(sample.map((c) => ['check', '--config', c.path]));
    runs.forEach((r, i) => {
      expect(r.code, sample[i].file).toBe(2);
      const lines = r.stderr.trim().split('\n');
      expect(lines).toHaveLength(1);
      expect(lines[0]).toContain(sample[i].path);
      expect(lines[0]).not.toMatch(/\bat .*\.js:\d+/);
    });
  });
});

describe('modalgate rules and init', () => {
  it('rules lists every rule with its defaults and the built-in rule sets', async () => {
    const text = formatRules();
    for (const id of ['rigid-body-modes', 'first-elastic-frequency', 'conditioning', 'diagonal-sanity']) expect(text).toContain(`\n${id}\n`);
    expect(text).toMatch(/cutoffHz\s+number > 0\s+default 0.005/);
    expect(text).toMatch(/maxPivotDrop\s+number > 1\s+default 1e7/);
    expect(text).toMatch(/handoff-audit\s+Strict/);
    const j = await runCli(['rules', '--json']);
    expect(j.code).toBe(0);
    expect(JSON.parse(j.stdout).rules.length).toBeGreaterThanOrEqual(12);
  });
  it('init writes a starter config, refuses to overwrite it, and --force replaces it', async () => {
    const dir = join(work, 'init');
    cpSync(join(work, 'models'), join(dir, 'model'), { recursive: true });
    const target = join(dir, 'modalgate.yaml');
    expect(writeStarterConfig(target, false)).toContain('next:');
    expect(readFileSync(target, 'utf8')).toBe(STARTER_CONFIG);
    const again = await runCli(['init'], dir);
    expect(again.code).toBe(2);
    expect(again.stderr).toContain('already exists; not overwritten (use --force');
    expect(writeStarterConfig(target, true)).toContain('wrote');
    // the starter loads and names the files it expects the user to provide
    expect(() => loadConfig(target)).toThrow(/models\[0\]\.stiffness: file not found/);
  });
});
