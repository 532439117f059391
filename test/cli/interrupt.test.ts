/**
 * End to end, on the built CLI: a run stopped by SIGINT or SIGTERM exits 130/143 with one line and
 * still writes its JUnit file with an <error>; a run killed outright leaves its temporary files
 * only until the next run; a model over --time-limit becomes an <error> and the others go on; a
 * report that cannot be written is named with its cause while the others stand (exit 2).
 * 130 = 128 + SIGINT (2) and 143 = 128 + SIGTERM (15): the shells' convention (common practice).
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildHexBox, STEEL, writeGeneratedModel } from '../../fixtures/generator/index.js';
import { ensureBuilt, mainJs, runCli } from './built-cli.js';

let work: string;

/** Every `*.tmp` file under `dir` (any depth). */
function tempFiles(dir: string): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { recursive: true, encoding: 'utf8' }).filter((f) => f.endsWith('.tmp'));
}

/**
 * Starts `check` and sends `signal` once `ready()` holds (polled every 50 ms; a loaded machine
 * may take seconds just to start) or after `afterMs`; resolves with the exit code and output.
 */
function checkWithSignal(args: string[], signal: NodeJS.Signals, afterMs: number, ready?: () => boolean): Promise<{ code: number | null; signal: NodeJS.Signals | null; stderr: string }> {
  return new Promise((done) => {
    const child = spawn(process.execPath, [mainJs, 'check', ...args], { cwd: work, env: { ...process.env, NO_COLOR: '1', MODALGATE_DEBUG: '' } });
    let stderr = '';
    child.stderr.on('data', (d) => (stderr += String(d)));
    const started = Date.now();
    const timer = setInterval(() => {
      if ((ready ? ready() : false) || Date.now() - started >= afterMs) {
        clearInterval(timer);
        child.kill(signal);
      }
    }, 50);
    child.on('exit', (code, sig) => {
      clearInterval(timer);
      done({ code, signal: sig, stderr });
    });
  });
}

beforeAll(async () => {
  ensureBuilt();
  work = mkdtempSync(join(tmpdir(), 'modalgate-interrupt-'));
  // a free-free steel block of about 3,900 DOFs: about a second per model on this machine class
  const block = buildHexBox({ sizeM: [0.8, 0.6, 0.6], elements: [12, 9, 9], material: STEEL });
  await writeGeneratedModel(block, work, 'block');
  const model = (name: string): string => `  - name: ${name}\n    stiffness: block.stiffness.mtx\n    mass: block.mass.mtx\n    dofs: block.dofs.csv\n    ruleSets: [free-free]\n`;
  writeFileSync(join(work, 'many.yaml'), `reports: { junit: out/junit.xml, json: out/report.json }\ndefaults: { count: 12 }\nmodels:\n${Array.from({ length: 20 }, (_, i) => model(`block-${i + 1}`)).join('')}`);
  writeFileSync(join(work, 'two.yaml'), `defaults: { count: 12 }\nmodels:\n${model('first')}${model('second')}`);
}, 120_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('interruption', () => {
  it.each([
    ['SIGINT', 130, '1'],
    ['SIGTERM', 143, '1'],
    ['SIGTERM', 143, '2'],
  ] as const)('%s: exit %i, one stderr line, JUnit with an <error>, no temporary file (--jobs %s)', async (signal, exitCode, jobs) => {
    rmSync(join(work, 'out'), { recursive: true, force: true });
    // the signal goes once the first model's baseline is saved: the run is surely under way (with --jobs 2, two models are)
    const r = await checkWithSignal(['-c', 'many.yaml', '-q', '--save-baseline', 'out/baselines', '--jobs', jobs], signal, 60_000, () => existsSync(join(work, 'out/baselines/block-1.baseline.json')));
    expect(r.code, r.stderr).toBe(exitCode);
    const lines = r.stderr.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(new RegExp(`^modalgate: interrupted by ${signal}: \\d+ of 20 model\\(s\\) finished`));
    const junit = readFileSync(join(work, 'out/junit.xml'), 'utf8');
    expect(junit).toContain('type="interrupted-error"');
    const json = JSON.parse(readFileSync(join(work, 'out/report.json'), 'utf8'));
    expect(json.problem.kind).toBe('interrupted');
    // the models started, in config order (with --jobs 2 as well)
    const names = json.models.map((m: { name: string }) => m.name);
    expect(names).toEqual(Array.from({ length: names.length }, (_, i) => `block-${i + 1}`));
    expect(tempFiles(join(work, 'out'))).toEqual([]);
    // the baselines saved before the signal are whole units; no lock is left
    const left = existsSync(join(work, 'out/baselines')) ? readdirSync(join(work, 'out/baselines')) : [];
    expect(left.filter((f) => f.endsWith('.lock'))).toEqual([]);
    for (const f of left.filter((f) => f.endsWith('.baseline.json'))) {
      const unit = JSON.parse(readFileSync(join(work, 'out/baselines', f), 'utf8'));
      expect(existsSync(join(work, 'out/baselines', unit.shapes.file)), f).toBe(true);
    }
  }, 120_000);

  it('SIGKILL while saving baselines: every file left is complete, and the next run clears the temporary files', async () => {
    const baselines = join(work, 'kill-baselines');
    rmSync(baselines, { recursive: true, force: true });
    // the kill goes once a first baseline is saved (the run is surely writing); 60 s is only a fallback
    const r = await checkWithSignal(['-c', 'many.yaml', '-q', '--save-baseline', 'kill-baselines', '--junit', 'kill/junit.xml'], 'SIGKILL', 60_000, () => existsSync(join(baselines, 'block-1.baseline.json')));
    expect(r.signal).toBe('SIGKILL');
    // whatever was written is whole: every JSON file parses, and there is at least one
    const files = readdirSync(baselines, { recursive: true, encoding: 'utf8' }).filter((f) => f.endsWith('.json'));
    expect(files.length).toBeGreaterThan(0);
    for (const f of files) expect(() => JSON.parse(readFileSync(join(baselines, f), 'utf8')), f).not.toThrow();
    // a temporary file of a killed run, as a kill mid-write leaves it (its pid is above Linux's largest, 2^22: no process has it)
    const stale = `.block-2.shapes.mtx.gz.${2 ** 22 + 12345}.1700000000000.tmp`;
    writeFileSync(join(baselines, stale), 'partial');
    // the next run (one model) removes what the killed runs left
    const next = await runCli(['check', '-c', 'many.yaml', '-q', '-m', 'block-1', '--save-baseline', 'kill-baselines', '--junit', 'kill/junit.xml'], work);
    expect([0, 1], next.stderr).toContain(next.code);
    expect(tempFiles(baselines)).toEqual([]);
    expect(existsSync(join(baselines, stale))).toBe(false);
    expect(tempFiles(join(work, 'kill'))).toEqual([]);
  }, 240_000);
});

describe('--time-limit', () => {
  it('a model over the limit is an <error> naming the limit; the next model still runs', async () => {
    const r = await runCli(['check', '-c', 'two.yaml', '--time-limit', '0.2', '--junit', 'limit/junit.xml', '--json', 'limit/report.json'], work);
    expect(r.code, r.stderr).toBe(2);
    const report = JSON.parse(readFileSync(join(work, 'limit/report.json'), 'utf8'));
    expect(report.models.map((m: { name: string }) => m.name)).toEqual(['first', 'second']);
    for (const m of report.models) {
      expect(m.verdict).toBe('error');
      expect(m.problem.kind).toBe('limit');
      expect(m.problem.message).toMatch(/stopped at the time limit of 0\.2 s \(--time-limit\)/);
    }
    const junit = readFileSync(join(work, 'limit/junit.xml'), 'utf8');
    expect(junit.match(/<testcase name="model-limit"/g)).toHaveLength(2);
    expect(tempFiles(join(work, 'limit'))).toEqual([]);
  }, 120_000);

  it('with --jobs 2 each running model has its own limit', async () => {
    const r = await runCli(['check', '-c', 'two.yaml', '--time-limit', '0.2', '--jobs', '2', '--json', 'limit2/report.json'], work);
    expect(r.code, r.stderr).toBe(2);
    const report = JSON.parse(readFileSync(join(work, 'limit2/report.json'), 'utf8'));
    expect(report.models.map((m: { name: string }) => m.name)).toEqual(['first', 'second']);
    for (const m of report.models) expect(m.problem.message).toMatch(/^\w+: stopped at the time limit of 0\.2 s \(--time-limit\)/);
  }, 120_000);

  it('refuses a limit that is not a positive number (a usage error: the first line says why, then the usage)', async () => {
    const r = await runCli(['check', '-c', 'two.yaml', '--time-limit', 'soon'], work);
    expect(r.code).toBe(2);
    expect(r.stderr.split('\n')[0]).toContain("option '--time-limit <seconds>' argument 'soon' is invalid");
  }, 60_000);
});

describe('--max-memory', () => {
  it('a model whose solve is predicted above the limit is an <error> with the figure, before any numeric work', async () => {
    const r = await runCli(['check', '-c', 'two.yaml', '-m', 'first', '--max-memory', '4M', '--json', 'mem/report.json', '--junit', 'mem/junit.xml'], work);
    expect(r.code, r.stderr).toBe(2);
    const m = JSON.parse(readFileSync(join(work, 'mem/report.json'), 'utf8')).models[0];
    expect(m.problem.kind).toBe('limit');
    expect(m.problem.message).toMatch(/^the solve would need about [\d.]+ [KMG]?i?B \(a factor with .* nonzeros, predicted before any numeric work\), above the memory limit of 4\.0 MiB \(--max-memory\)$/);
    expect(readFileSync(join(work, 'mem/junit.xml'), 'utf8')).toContain('<testcase name="model-limit"');
  }, 120_000);

  it('with --jobs 2 the limit is shared: each model may use half of it, and the message says so', async () => {
    const r = await runCli(['check', '-c', 'two.yaml', '--max-memory', '8M', '--jobs', '2', '--json', 'mem2/report.json'], work);
    expect(r.code, r.stderr).toBe(2);
    const report = JSON.parse(readFileSync(join(work, 'mem2/report.json'), 'utf8'));
    expect(report.models).toHaveLength(2);
    for (const m of report.models) {
      expect(m.problem.kind).toBe('limit');
      // 8 MiB / 2 = 4 MiB
      expect(m.problem.message).toMatch(/above the memory limit of 4\.0 MiB \(its 1\/2 share of --max-memory, 2 models at once with --jobs\)$/);
    }
  }, 120_000);

  it('modes refuses the same way (exit 2, one line)', async () => {
    const r = await runCli(['modes', '--stiffness', 'block.stiffness.mtx', '--mass', 'block.mass.mtx', '--count', '5', '--max-memory', '4M'], work);
    expect(r.code).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/^modalgate: block\.stiffness\.mtx: the solve would need about .* above the memory limit of 4\.0 MiB \(--max-memory\)\n$/);
  }, 120_000);
});

/** A 64 KiB tmpfs, where this machine allows mounting one (root on Linux). */
function smallTmpfs(dir: string): boolean {
  mkdirSync(dir, { recursive: true });
  return spawnSync('mount', ['-t', 'tmpfs', '-o', 'size=64k', 'tmpfs', dir]).status === 0;
}

describe('a report that cannot be written', () => {
  const full = join(tmpdir(), `modalgate-full-${process.pid}`);
  const mounted = process.platform === 'linux' && smallTmpfs(full);
  if (!mounted) console.warn('no tmpfs could be mounted here: the ENOSPC case is not run');
  afterAll(() => {
    if (mounted) spawnSync('umount', [full]);
    rmSync(full, { recursive: true, force: true });
  });

  it.runIf(mounted)('a full disk (ENOSPC) is named with the file; the JUnit file written elsewhere keeps the rule results; exit 2', async () => {
    // fill the small tmpfs so that the HTML report cannot fit
    writeFileSync(join(full, 'filler'), Buffer.alloc(60 * 1024));
    const r = await runCli(['check', '-c', 'two.yaml', '-m', 'first', '--junit', 'nospace/junit.xml', '--html', join(full, 'report.html')], work);
    expect(r.code, r.stderr).toBe(2);
    const lines = r.stderr.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toContain(`cannot write ${join(full, 'report.html')}: ENOSPC (no space left on device)`);
    const junit = readFileSync(join(work, 'nospace/junit.xml'), 'utf8');
    expect(junit).toContain('rigid-body-modes');
    expect(tempFiles(full)).toEqual([]);
  }, 120_000);
});
