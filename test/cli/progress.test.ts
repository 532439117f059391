/**
 * CI-native output of `modalgate check`: outside a TTY one plain line per model with the time of
 * each phase (on stdout, so that stderr stays the one error line of an exit 2), none under
 * --quiet and none for a model that could not be read; the Markdown summary appended to the file
 * GITHUB_STEP_SUMMARY names, cut at a line boundary to the 1 MiB a job summary may hold
 * (GitHub's documented limit for a step summary); report paths relative to the working directory.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureBuilt, repoRoot, runCli } from './built-cli.js';
import { fitStepSummary, phaseLine, shownPath } from '../../src/cli/ci-output.js';
import { runCheck } from '../../src/cli/check.js';

const models = join(repoRoot, 'test/config/models');
const tiny = `stiffness: ${models}/tiny.stiffness.mtx, mass: ${models}/tiny.mass.mtx, ruleSets: [supported], rules: { first-elastic-frequency: { minHz: 0.1 } }`;
const PHASES = /^(\S+): read \d+(\.\d+)? s · order \d+(\.\d+)? s · factor \d+(\.\d+)? s · iterate \d+(\.\d+)? s · verify \d+(\.\d+)? s · rules \d+(\.\d+)? s$/;
let work: string;

beforeAll(() => {
  ensureBuilt();
  work = mkdtempSync(join(tmpdir(), 'modalgate-progress-'));
  writeFileSync(join(work, 'two.yaml'), `reports: { junit: out/junit.xml }\nmodels:\n  - { name: first, ${tiny} }\n  - { name: second, ${tiny} }\n`);
  writeFileSync(join(work, 'broken.mass.mtx'), '%%MatrixMarket matrix coordinate real symmetric\n3 3 2\n1 1 1\n0 2 1\n');
  writeFileSync(join(work, 'bad.yaml'), `models:\n  - { name: broken, stiffness: ${models}/tiny.stiffness.mtx, mass: broken.mass.mtx, ruleSets: [supported], rules: { first-elastic-frequency: { minHz: 0.1 } } }\n`);
}, 120_000);
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('phase lines', () => {
  it('formats the phases that ran, in seconds', () => {
    expect(phaseLine('mast', { readMs: 200, orderMs: 100, factorMs: 400, iterateMs: 1100, verifyMs: 300, rulesMs: 50 })).toBe('mast: read 0.2 s · order 0.1 s · factor 0.4 s · iterate 1.1 s · verify 0.3 s · rules 0.05 s');
    // modes not solved: only read and rules
    expect(phaseLine('m', { readMs: 12_345, rulesMs: 1 })).toBe('m: read 12 s · rules 0.00 s');
  });

  it('the built CLI outside a TTY prints one line per model on stdout, nothing more on stderr', async () => {
    const summary = join(work, 'summary.md');
    const r = await runCli(['check', '-c', 'two.yaml'], work, { GITHUB_STEP_SUMMARY: summary });
    expect(r.code, r.stderr).toBe(0);
    expect(r.stderr).toBe('');
    const lines = r.stdout.split('\n').filter((l) => PHASES.test(l));
    expect(lines.map((l) => l.match(PHASES)![1])).toEqual(['first', 'second']);
    // the report path relative to the working directory
    expect(r.stdout).toContain(`JUnit XML: ${join('out', 'junit.xml')}\n`);
    expect(r.stdout).not.toContain(work);
    // the job summary is the Markdown summary
    const md = readFileSync(summary, 'utf8');
    expect(md).toContain('first');
    expect(md).toContain('second');
    expect(md.length).toBeGreaterThan(100);
  }, 120_000);

  it('--quiet keeps only the verdict', async () => {
    const r = await runCli(['check', '-c', 'two.yaml', '-q'], work);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout.trim()).toBe('modalgate: PASS — 2 model(s) checked, every error-severity rule passed.');
  }, 120_000);

  it('a model that could not be read gets no phase line: exit 2, one stderr line', async () => {
    const r = await runCli(['check', '-c', 'bad.yaml'], work);
    expect(r.code).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stdout.split('\n').filter((l) => PHASES.test(l) || /: read /.test(l))).toEqual([]);
  }, 120_000);

  it('runCheck prints phase lines only when asked (phaseLines), and appends to the step summary', async () => {
    let printed = '';
    const summary = join(work, 'in-process.md');
    writeFileSync(summary, '# earlier step\n');
    const out = await runCheck({ config: join(work, 'two.yaml'), cwd: work, phaseLines: true, stepSummary: summary, print: (t) => (printed += t), printError: () => {} });
    expect(out.code).toBe(0);
    expect(printed.split('\n').filter((l) => PHASES.test(l))).toHaveLength(2);
    const md = readFileSync(summary, 'utf8');
    expect(md.startsWith('# earlier step\n')).toBe(true);
    printed = '';
    await runCheck({ config: join(work, 'two.yaml'), cwd: work, print: (t) => (printed += t), printError: () => {} });
    expect(printed.split('\n').filter((l) => PHASES.test(l))).toEqual([]);
  }, 120_000);
});

describe('step summary size', () => {
  it('is kept whole under the limit', () => {
    expect(fitStepSummary('a\nb\n', 'r.md', 100)).toBe('a\nb\n');
  });
  it('is cut at a line boundary, with a line saying so and naming the full report', () => {
    const text = Array.from({ length: 50 }, (_, i) => `| line ${i} | ${'é'.repeat(10)} |`).join('\n') + '\n';
    const cut = fitStepSummary(text, 'reports/summary.md', 600);
    expect(Buffer.byteLength(cut)).toBeLessThanOrEqual(600);
    const lines = cut.trimEnd().split('\n');
    expect(lines.at(-1)).toMatch(/^_The summary was cut here .*the full report is reports\/summary\.md\._$/);
    // every kept line is a whole line of the original
    for (const l of lines.slice(0, -2)) expect(text).toContain(`${l}\n`);
    expect(cut).not.toContain('\uFFFD');
  });
  it('the 1 MiB default limit', () => {
    // GitHub documentation, "Workflow commands for GitHub Actions", adding a job summary: at most 1 MiB per step (from memory)
    const big = 'x'.repeat(1023) + '\n';
    const cut = fitStepSummary(big.repeat(2048), undefined);
    expect(Buffer.byteLength(cut)).toBeLessThanOrEqual(1024 * 1024);
    expect(cut).toContain('write the full report with --markdown');
  });
});

describe('shown paths', () => {
  it('relative inside the working directory, absolute outside', () => {
    expect(shownPath('/w/reports/x.xml', '/w')).toBe(join('reports', 'x.xml'));
    expect(shownPath('/elsewhere/x.xml', '/w')).toBe('/elsewhere/x.xml');
  });
});

describe('paths in the texts people read', () => {
  it('JUnit, Markdown and the console show paths under the working directory relative to it; JSON keeps them absolute', async () => {
    const dir = join(work, 'rel');
    const { cpSync } = await import('node:fs');
    cpSync(models, join(dir, 'models'), { recursive: true });
    writeFileSync(join(dir, 'modalgate.yaml'), `models:\n  - { name: m, stiffness: models/tiny.stiffness.mtx, mass: models/tiny.mass.mtx, dofs: models/tiny.dofs.csv, ruleSets: [supported], rules: { first-elastic-frequency: { minHz: 0.1 } } }\n`);
    let printed = '';
    const out = await runCheck({ cwd: dir, junit: 'r/j.xml', json: 'r/r.json', markdown: 'r/s.md', print: (t) => (printed += t), printError: () => {} });
    expect(out.code).toBe(0);
    const junit = readFileSync(join(dir, 'r/j.xml'), 'utf8');
    expect(junit).toContain(`<property name="stiffness.file" value="${join('models', 'tiny.stiffness.mtx')}"`);
    expect(junit).not.toContain(dir);
    expect(readFileSync(join(dir, 'r/s.md'), 'utf8')).not.toContain(dir);
    expect(printed).not.toContain(dir);
    expect(JSON.parse(readFileSync(join(dir, 'r/r.json'), 'utf8')).models[0].stats.stiffnessFile).toBe(join(dir, 'models/tiny.stiffness.mtx'));
  }, 120_000);
});
