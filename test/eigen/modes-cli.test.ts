/**
 * `modalgate modes` end to end (compiled dist/src/cli/main.js): table, --json shape, --shapes
 * file, exit codes. The model is a generated cantilever whose first frequency is checked
 * against Euler–Bernoulli (Blevins Table 8-1 via docs/sources.md §7, βL₁ = 1.87510407).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { buildCantilever } from '../../fixtures/generator/cantilever.js';
import { rectangularSection, STEEL } from '../../fixtures/generator/sections.js';
import { writeSymmetricMatrixMarket } from '../../src/io/matrix-market-writer.js';

const repoRoot = path.resolve(import.meta.dirname, '../..');
const cli = path.join(repoRoot, 'dist/src/cli/main.js');
const work = mkdtempSync(path.join(tmpdir(), 'modalgate-modes-'));
const kFile = path.join(work, 'beam.stiffness.mtx');
const mFile = path.join(work, 'beam.mass.mtx');

function run(args: string[]): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

beforeAll(async () => {
  // build once if needed; tsc emits even when another area has a type error, so its status is not checked
  if (!existsSync(cli)) spawnSync('npx', ['tsc', '-p', repoRoot], { cwd: repoRoot, stdio: 'ignore' });
  const m = buildCantilever({ lengthM: 2, elements: 10, widthM: 0.04, depthM: 0.06 });
  await writeSymmetricMatrixMarket(kFile, m.stiffness);
  await writeSymmetricMatrixMarket(mFile, m.mass);
}, 120_000);

describe('modalgate modes', () => {
  it('prints the table, writes --json and --shapes, exits 0', () => {
    const json = path.join(work, 'modes.json');
    const shapes = path.join(work, 'shapes.mtx');
    const r = run(['modes', '--stiffness', kFile, '--mass', mFile, '--count', '4', '--json', json, '--shapes', shapes]);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/frequency Hz/);
    expect(r.stdout).toMatch(/Sturm count/);
    const doc = JSON.parse(readFileSync(json, 'utf8'));
    // which kernels ran is part of the solve's diagnostics (SIMD where WebAssembly SIMD is present, plain loops otherwise)
    expect(['simd', 'plain']).toContain(doc.factor.kernels.factor);
    expect(['simd', 'plain']).toContain(doc.factor.kernels.sweeps);
    for (const key of ['eigenvalues', 'frequenciesHz', 'residuals', 'sturm', 'orthogonality', 'timings']) expect(doc).toHaveProperty(key);
    expect(doc.eigenvalues).toHaveLength(4);
    expect(doc.sturm).toMatchObject({ countBelow: 4, modesReturned: 4, ok: true });
    // Euler–Bernoulli cantilever, weak axis (Blevins Table 8-1 [S], docs/sources.md §7)
    const s = rectangularSection(0.04, 0.06);
    const exact = (1.87510407 ** 2 / (2 * Math.PI * 4)) * Math.sqrt((STEEL.youngPa * Math.min(s.iyM4, s.izM4)) / (STEEL.densityKgM3 * s.areaM2));
    expect(Math.abs(doc.frequenciesHz[0] - exact) / exact).toBeLessThan(1e-4);
    const lines = readFileSync(shapes, 'utf8').split('\n');
    expect(lines[0]).toBe('%%MatrixMarket matrix array real general');
    expect(lines.find((l) => !l.startsWith('%'))).toMatch(/^\d+ 4$/);
  });

  it('--max-hz returns every mode below the cutoff with a Sturm proof at the cutoff', () => {
    const json = path.join(work, 'cut.json');
    const r = run(['modes', '--stiffness', kFile, '--mass', mFile, '--max-hz', '200', '--method', 'subspace', '--json', json]);
    expect(r.status).toBe(0);
    const doc = JSON.parse(readFileSync(json, 'utf8'));
    expect(doc.sturm.ok).toBe(true);
    expect(doc.sturm.countBelow).toBe(doc.eigenvalues.length);
    expect(Math.max(...doc.frequenciesHz)).toBeLessThan(200);
  });

  it('bad input exits 2 with one line', () => {
    const bad = run(['modes', '--stiffness', kFile, '--mass', mFile, '--count', '0']);
    expect(bad.status).toBe(2);
    expect(bad.stderr.trim().split('\n')).toHaveLength(1);
    expect(run(['modes', '--stiffness', kFile, '--mass', mFile, '--method', 'qr']).status).toBe(2);
    expect(run(['modes', '--stiffness', path.join(work, 'missing.mtx'), '--mass', mFile]).status).toBe(2);
  });
});
