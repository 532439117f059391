/**
 * The typed library API (src/index.ts): test/api/example.ts, compiled by the project's tsc, run
 * on the 3-DOF fixed–free spring chain of test/config/models/tiny.* (unit masses, k = 100 N/m);
 * the checked result against the handbook frequencies of a fixed–free chain; and the package's
 * `exports` / `types` entries pointing at the built JavaScript and its declarations.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { XMLValidator } from 'fast-xml-parser';
import { runExample } from './example.js';
import { checkModels } from '../../src/index.js';
import { ensureBuilt, repoRoot } from '../cli/built-cli.js';

const modelsDir = join(repoRoot, 'test/config/models');
// fixed–free chain of N = 3 unit masses and springs k = 100 N/m:
// λ_j = (4k/m) sin²((2j−1)π / (2(2N+1))), docs/sources.md §7 [V]
const chainHz = [1, 2, 3].map((j) => Math.sqrt(400 * Math.sin(((2 * j - 1) * Math.PI) / 14) ** 2) / (2 * Math.PI));

describe('library API', () => {
  it('the typed example runs every exported function on the tiny chain', async () => {
    const r = await runExample(modelsDir);
    expect(r.dofs).toBe(3);
    expect(r.nodes).toBe(3);
    expect(r.frequenciesHz).toHaveLength(2);
    r.frequenciesHz.forEach((f, i) => expect(Math.abs(f - chainHz[i]) / chainHz[i]).toBeLessThan(1e-10));
    // the check: one model, passed, three modes at the handbook frequencies
    expect(r.report.verdict).toBe('pass');
    expect(r.report.problem).toBeUndefined();
    expect(r.report.models.map((m) => [m.name, m.verdict])).toEqual([['chain', 'pass']]);
    const modes = r.report.models[0].modes!;
    expect(modes).toHaveLength(3);
    modes.forEach((m, i) => expect(Math.abs(m.frequencyHz - chainHz[i]) / chainHz[i]).toBeLessThan(1e-10));
    expect(r.report.models[0].rules.length).toBeGreaterThan(5);
    expect(r.phases.chain.readMs).toBeGreaterThanOrEqual(0);
    expect(r.phases.chain.iterateMs).toBeGreaterThanOrEqual(0);
    // the reporters
    expect(XMLValidator.validate(r.texts.junit)).toBe(true);
    expect(r.texts.junit).toContain('classname="modalgate.chain"');
    expect(JSON.parse(r.texts.json).models[0].name).toBe('chain');
    expect(r.texts.markdown).toContain('chain');
    expect(r.texts.html).toMatch(/^<!DOCTYPE html>/i);
    expect(r.texts.console).toMatch(/pass\s+chain/);
  });

  it('a bad config or an unknown model is a problem in the report, not a throw', async () => {
    const bad = await checkModels({ models: [{ name: 'x', stiffness: 'missing.mtx', mass: 'tiny.mass.mtx', rules: { 'eigen-residul': 'error' } }] }, modelsDir);
    expect(bad.verdict).toBe('error');
    expect(bad.problem?.kind).toBe('input');
    expect(bad.problem?.message).toContain(join(modelsDir, '(config object)'));
    const unknown = await checkModels({ models: [{ name: 'x', stiffness: 'tiny.stiffness.mtx', mass: 'tiny.mass.mtx', ruleSets: ['supported'], rules: { 'first-elastic-frequency': { minHz: 0.1 } } }] }, modelsDir, { models: ['y'] });
    expect(unknown.problem?.message).toContain('no model named y');
  });

  it('package.json: exports and types name the built entry and its declarations', () => {
    const pkg = JSON.parse(readFileSync(join(repoRoot, 'package.json'), 'utf8'));
    expect(pkg.exports['.']).toEqual({ types: './dist/src/index.d.ts', import: './dist/src/index.js' });
    expect(pkg.types).toBe('./dist/src/index.d.ts');
    expect(pkg.files).toContain('dist/src/**/*.d.ts');
    ensureBuilt();
    expect(existsSync(join(repoRoot, 'dist/src/index.d.ts'))).toBe(true);
    // the package by its own name (Node resolves a package's self-reference through "exports")
    const r = spawnSync(process.execPath, ['--input-type=module', '-e', "const m = await import('modalgate'); console.log(Object.keys(m).sort().join(','))"], { cwd: repoRoot, encoding: 'utf8' });
    expect(r.stderr).toBe('');
    expect(r.stdout.trim()).toBe('checkModels,formatConsole,formatHtml,formatJson,formatJunit,formatMarkdown,readDofMap,readMatrixMarket,solveModes');
  }, 120_000);
});
