/**
 * A save interrupted by SIGTERM or SIGINT leaves nothing behind: a child process (the built
 * modules in dist/) starts saving a baseline large enough to take a while (50 000 DOFs × 5
 * modes) and signals itself 200 ms in. Expected: it ends by that signal, before the commit (no
 * JSON), and the directory holds no `.tmp` file, no lock and no data file of the killed save.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { ensureBuilt, repoRoot } from '../cli/built-cli.js';

let work: string;
beforeAll(() => {
  ensureBuilt();
  work = mkdtempSync(join(tmpdir(), 'modalgate-kill-'));
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

function script(dir: string, signal: string): string {
  const store = pathToFileURL(join(repoRoot, 'dist/src/model/baseline-store.js')).href;
  return `
import { saveBaseline } from ${JSON.stringify(store)};
const n = 50000, m = 5;
const shapes = new Float64Array(n * m).map((_v, k) => Math.sin(k));
const eigenvalues = Float64Array.from([1, 2, 3, 4, 5]);
const modes = { n, eigenvalues, frequenciesHz: eigenvalues.map((l) => Math.sqrt(l) / (2 * Math.PI)), shapes, residuals: new Float64Array(m),
  sturm: { shift: 6, countBelow: 5, modesReturned: 5, ok: true }, orthogonality: { massMaxDeviation: 0, stiffnessMaxDeviation: 0 }, method: 'lanczos' };
const mass = { n, colPtr: Int32Array.from({ length: n + 1 }, (_v, k) => k), rowIdx: Int32Array.from({ length: n }, (_v, k) => k), values: new Float64Array(n).fill(1) };
setTimeout(() => process.kill(process.pid, ${JSON.stringify(signal)}), 200);
await saveBaseline(${JSON.stringify(dir)}, { model: 'big', modes, mass });
console.log('finished');
`;
}

function runChild(code: string): Promise<{ code: number | null; signal: string | null; stdout: string }> {
  return new Promise((done) => {
    const child = spawn(process.execPath, ['--input-type=module', '-e', code], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.on('exit', (c, s) => done({ code: c, signal: s, stdout }));
  });
}

describe('a save killed mid-way', () => {
  for (const signal of ['SIGTERM', 'SIGINT']) {
    it(`leaves no temporary file, lock or data file on ${signal}`, async () => {
      const dir = join(work, signal);
      const r = await runChild(script(dir, signal));
      expect(r.stdout).not.toContain('finished');
      expect(r.signal).toBe(signal);
      expect(existsSync(join(dir, 'big.baseline.json'))).toBe(false);
      expect(existsSync(dir) ? readdirSync(dir) : []).toEqual([]);
    }, 60_000);
  }
});
