/**
 * End to end through the compiled CLI (dist/): the 10⁹-order header is refused quickly and in
 * little memory by inspect, modes and check (exit 2, one stderr line naming file:line, a JUnit
 * <error> in check); a broken stdout pipe keeps the run's exit code; config files that are not
 * regular files, or a YAML alias bomb, are input errors naming the file; a non-finite value in K
 * makes `check` fail matrix-finite naming file:line instead of stopping at the reader.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { execFile, execFileSync, spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureBuilt, mainJs } from '../cli/built-cli.js';

const work = mkdtempSync(join(tmpdir(), 'modalgate-hardening-cli-'));
const BANNER = '%%MatrixMarket matrix coordinate real symmetric\n';
const hasTime = existsSync('/usr/bin/time');

function file(name: string, content: string): string {
  const p = join(work, name);
  writeFileSync(p, content);
  return p;
}

interface Run { code: number; stdout: string; stderr: string; maxRssKb?: number }

/** Peak RSS under 200 MB (the bound), measured by /usr/bin/time; without it, said, not skipped silently. */
function expectSmallPeak(r: Run): void {
  if (!hasTime) return void console.warn('no /usr/bin/time here: the peak memory of this run is not checked');
  expect(r.maxRssKb, 'peak RSS not measured').toBeDefined();
  expect(r.maxRssKb!).toBeLessThan(200_000);
}

/** Run the CLI; with /usr/bin/time, also its peak resident memory (kB, from `%M`). */
function run(args: string[]): Promise<Run> {
  const [cmd, argv] = hasTime ? ['/usr/bin/time', ['-f', 'MAXRSS_KB=%M', process.execPath, mainJs, ...args]] : [process.execPath, [mainJs, ...args]];
  return new Promise((done) => {
    execFile(cmd, argv as string[], { cwd: work, env: { ...process.env, MODALGATE_DEBUG: '' }, timeout: 60_000 }, (err, stdout, stderr) => {
      const m = /MAXRSS_KB=(\d+)\s*$/.exec(stderr);
      const rest = m ? stderr.slice(0, m.index) : stderr;
      const code = err ? ((err as { code?: number }).code ?? -1) : 0;
      done({ code, stdout, stderr: rest.replace(/Command exited with non-zero status \d+\n/, ''), maxRssKb: m ? Number(m[1]) : undefined });
    });
  });
}

function oneLine(r: Run): string {
  const lines = r.stderr.trim().split('\n');
  expect(lines).toHaveLength(1);
  expect(r.stderr).not.toMatch(/\n\s+at /);
  return lines[0];
}

beforeAll(() => ensureBuilt(), 240_000);

describe('a 10⁹ × 10⁹ header of 114 bytes', () => {
  const huge = () => file('huge.mtx', `${BANNER}1000000000 1000000000 3\n1 1 1.0\n2 2 1.0\n3 3 1.0\n`);
  const small = () => file('m3.mtx', `${BANNER}3 3 3\n1 1 1.0\n2 2 1.0\n3 3 1.0\n`);

  it('inspect: exit 2 at the size line, quickly, in little memory', async () => {
    const p = huge();
    const t0 = performance.now();
    const r = await run(['inspect', p]);
    expect(performance.now() - t0).toBeLessThan(10_000);
    expect(r.code).toBe(2);
    expect(oneLine(r)).toMatch(new RegExp(`^modalgate: ${p}:2: the size line declares 1000000000 × 1000000000 with 3 entries; .*needs at least [\\d.]+ GB`));
    // loose: Node itself takes ~50 MB; the old reader took 4 GB here
    expectSmallPeak(r);
  });

  it('modes: exit 2 naming the stiffness file (K read first, header only)', async () => {
    const p = huge();
    const r = await run(['modes', '--stiffness', p, '--mass', small()]);
    expect(r.code).toBe(2);
    expect(oneLine(r)).toContain(`${p}:2: `);
    expectSmallPeak(r);
  });

  it('check: exit 2, JUnit <error> naming the file', async () => {
    const k = huge();
    const cfg = file('huge.yaml', `models:\n  - name: huge\n    stiffness: ${k}\n    mass: ${small()}\n    ruleSets: [supported]\n    rules:\n      first-elastic-frequency: { minHz: 1 }\n`);
    const junit = join(work, 'huge-junit.xml');
    const r = await run(['check', '-c', cfg, '--junit', junit, '--quiet']);
    expect(r.code).toBe(2);
    expect(r.stderr).not.toMatch(/\n\s+at /);
    const xml = readFileSync(junit, 'utf8');
    expect(xml).toMatch(/<error [^>]*message="[^"]*huge\.mtx:2: the size line declares/);
    expectSmallPeak(r);
  });
});

describe('config files and output pipes', () => {
  it('check -c /dev/zero and a FIFO: exit 2, "not a regular file", no hang', async () => {
    const r = await run(['check', '-c', '/dev/zero']);
    expect(r.code).toBe(2);
    expect(oneLine(r)).toContain('/dev/zero: is not a regular file');
    const fifo = join(work, 'config.fifo');
    execFileSync('mkfifo', [fifo]);
    const f = await run(['check', '-c', fifo]);
    expect(f.code).toBe(2);
    expect(oneLine(f)).toContain(`${fifo}: is not a regular file`);
  });

  it('a YAML alias bomb is an input error naming the config file', async () => {
    const levels = ['a: &a [x, x, x, x, x, x, x, x, x]'];
    for (let i = 1; i < 9; i++) {
      const prev = String.fromCharCode(96 + i);
      const cur = String.fromCharCode(97 + i);
      levels.push(`${cur}: &${cur} [*${prev}, *${prev}, *${prev}, *${prev}, *${prev}, *${prev}, *${prev}, *${prev}, *${prev}]`);
    }
    const cfg = file('bomb.yaml', `${levels.join('\n')}\nmodels: []\n`);
    const r = await run(['check', '-c', cfg]);
    expect(r.code).toBe(2);
    const line = oneLine(r);
    expect(line).toContain(`${cfg}: `);
    expect(line).not.toContain('internal error');
  });

  it('a closed stdout (EPIPE) stops the writing and keeps the exit code of the run', async () => {
    // `modalgate rules` prints a long table and exits 0; the reader of its stdout goes away at once
    const code = await new Promise<{ code: number | null; stderr: string }>((done) => {
      const child = spawn(process.execPath, [mainJs, 'rules'], { cwd: work, stdio: ['ignore', 'pipe', 'pipe'] });
      child.stdout.destroy();
      let stderr = '';
      child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
      child.on('close', (c) => done({ code: c, stderr }));
    });
    expect(code.stderr).not.toMatch(/EPIPE|\n\s+at /);
    expect(code.code).toBe(0);
  });
});

describe('non-finite values in check', () => {
  it('K with a nan: the run goes on, matrix-finite fails naming file:line; the solve is skipped', async () => {
    const k = file('k-nan.mtx', `${BANNER}3 3 3\n1 1 4.0\n2 2 nan\n3 3 4.0\n`);
    const m = file('m-ok.mtx', `${BANNER}3 3 3\n1 1 1.0\n2 2 1.0\n3 3 1.0\n`);
    const cfg = file('nan.yaml', `models:\n  - name: nan-model\n    stiffness: ${k}\n    mass: ${m}\n    count: 2\n    ruleSets: [supported]\n    rules:\n      first-elastic-frequency: { minHz: 0.001 }\n`);
    const junit = join(work, 'nan-junit.xml');
    const r = await run(['check', '-c', cfg, '--junit', junit, '--quiet']);
    // exit 2: the rules that need the modes are errors ("not evaluated"), as for any unsolvable model
    expect(r.code).toBe(2);
    const xml = readFileSync(junit, 'utf8');
    // the JUnit text shows paths relative to the working directory: the file is named by its name and line
    expect(xml).toMatch(/<failure [^>]*message="[^"]*k-nan\.mtx:4 \(2, 2\)[^"]*" type="matrix-finite"/);
    expect(xml).toContain('the modes were not solved because');
  });
});
