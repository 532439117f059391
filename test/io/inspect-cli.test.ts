/**
 * End to end: `inspect` on every file of the bad-input corpus, through the command's action
 * wrapped by runAction (what the CLI runs), sets exit code 2 and prints exactly one stderr line
 * naming file:line; the compiled CLI (`node dist/src/cli/main.js inspect …`), spawned on a
 * sample of the corpus (each spawn costs ~0.3 s of CPU), does the same and prints no stack
 * trace; on good files it prints the facts and exits 0.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { execFile, execFileSync } from 'node:child_process';
import { existsSync, readFileSync, readdirSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { runAction } from '../../src/cli/run-action.js';
import { inspectMatrix } from '../../src/cli/inspect.js';

const here = dirname(fileURLToPath(import.meta.url));
const repoRoot = resolve(here, '../..');
const mainJs = join(repoRoot, 'dist/src/cli/main.js');
const corpus = join(here, 'bad-inputs');
const good = join(here, 'good-inputs');
interface Case { file: string; kind: 'matrix' | 'dofmap'; line: number; says: string }
const cases = JSON.parse(readFileSync(join(corpus, 'manifest.json'), 'utf8')) as Case[];

/** True when some source the inspect command runs is newer than its compiled file. */
function distIsStale(): boolean {
  if (!existsSync(mainJs)) return true;
  for (const dir of ['src/cli', 'src/io', 'src/model', 'src/sparse']) {
    for (const f of readdirSync(join(repoRoot, dir))) {
      if (!f.endsWith('.ts')) continue;
      const js = join(repoRoot, 'dist', dir, f.replace(/\.ts$/, '.js'));
      if (!existsSync(js) || statSync(js).mtimeMs < statSync(join(repoRoot, dir, f)).mtimeMs) return true;
    }
  }
  return false;
}

function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((done) => {
    execFile(process.execPath, [mainJs, ...args], { cwd: repoRoot, env: { ...process.env, MODALGATE_DEBUG: '' } }, (err, stdout, stderr) => {
      done({ code: err ? ((err as { code?: number }).code ?? -1) : 0, stdout, stderr });
    });
  });
}

/** Run many CLI calls, a few at a time (the machine is shared). */
async function runAll(list: string[][], parallel = 3): Promise<{ code: number; stdout: string; stderr: string }[]> {
  const out: { code: number; stdout: string; stderr: string }[] = new Array(list.length);
  let next = 0;
  const worker = async (): Promise<void> => {
    while (next < list.length) {
      const k = next++;
      out[k] = await run(list[k]);
    }
  };
  await Promise.all(Array.from({ length: parallel }, worker));
  return out;
}

function argsOf(c: Case): [string, string | undefined] {
  return c.kind === 'matrix'
    ? [join('test/io/bad-inputs', c.file), undefined]
    : [join('test/io/good-inputs/k3.mtx'), join('test/io/bad-inputs', c.file)];
}

describe('modalgate inspect (compiled CLI)', () => {
  beforeAll(() => {
    // build dist/ when it is missing or older than the sources
    if (distIsStale()) {
      try {
        execFileSync(process.execPath, [join(repoRoot, 'node_modules/typescript/bin/tsc'), '-p', repoRoot], { stdio: 'pipe' });
      } catch {
        // type errors elsewhere still emit JavaScript; the checks below tell whether it works
      }
    }
  });

  it('every corpus file through the command action: exit code 2, one stderr line with file:line', async () => {
    const written: string[] = [];
    const write = process.stderr.write;
    const saved = process.exitCode;
    process.stderr.write = ((chunk: string) => written.push(chunk) > 0) as typeof process.stderr.write;
    try {
      for (const c of cases) {
        written.length = 0;
        process.exitCode = 0;
        const [matrix, dofs] = argsOf(c);
        await runAction(inspectMatrix)(matrix, { dofs });
        const text = written.join('');
        expect({ file: c.file, code: process.exitCode }).toEqual({ file: c.file, code: 2 });
        expect(text.split('\n').filter((l) => l !== ''), c.file).toHaveLength(1);
        expect(text, c.file).toContain(`${join('test/io/bad-inputs', c.file)}:${c.line}: `);
      }
    } finally {
      process.stderr.write = write;
      process.exitCode = saved;
    }
  });

  it('spawned CLI on a sample of the corpus: exit 2, one stderr line with file:line, no stack trace', async () => {
    const sample = cases.filter((c, k) => k % 10 === 0 || c.file === 'truncated.mtx.gz');
    const argv = sample.map((c) =>
      c.kind === 'matrix' ? ['inspect', join('test/io/bad-inputs', c.file)] : ['inspect', join('test/io/good-inputs/k3.mtx'), '--dofs', join('test/io/bad-inputs', c.file)],
    );
    const results = await runAll(argv);
    results.forEach((r, k) => {
      const c = sample[k];
      const where = `${join('test/io/bad-inputs', c.file)}:${c.line}: `;
      expect({ file: c.file, code: r.code }).toEqual({ file: c.file, code: 2 });
      const lines = r.stderr.split('\n').filter((l) => l !== '');
      expect(lines, c.file).toHaveLength(1);
      expect(lines[0], c.file).toContain(where);
      expect(r.stderr, c.file).not.toMatch(/^\s+at /m);
      expect(r.stdout, c.file).toBe('');
    });
  });

  it('good files: exit 0 and the facts, as text and as JSON with a DOF map', async () => {
    const [k, kd] = await runAll([
      ['inspect', join(good, 'k3.mtx')],
      ['inspect', join(good, 'k3.mtx'), '--dofs', join(good, 'dofs3.csv'), '--json'],
    ]);
    expect(k.code).toBe(0);
    expect(k.stdout).toContain('3 × 3');
    expect(k.stdout).toMatch(/nonzeros\s+4 stored \(lower triangle\), 5 in the full matrix/);
    expect(kd.code).toBe(0);
    const json = JSON.parse(kd.stdout) as { n: number; bandwidth: number; storedNonzeros: number };
    expect(json).toMatchObject({ n: 3, bandwidth: 1, storedNonzeros: 4 });
  });
});
