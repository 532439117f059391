/**
 * Reads every Harwell–Boeing BCSSTRUC matrix in ../shared/reference/structural (NIST Matrix
 * Market edition). Expected sizes and stored nonzero counts: the table in that directory's
 * README.md (computed there with scipy.io.mmread). Skipped with a message when absent.
 */
import { describe, expect, it } from 'vitest';
import { existsSync, readdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { readMatrixMarket, readStiffnessAndMass } from '../../src/io/matrix-market-reader.js';

const repoRoot = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const dir = join(resolve(repoRoot, '../shared'), 'reference/structural');
const present = existsSync(dir);
if (!present) console.warn(`skipping BCSSTRUC reader checks: ${dir} is absent`);

// source: ../shared/reference/structural/README.md table (n, nnz stored, nnz full)
const table: Record<string, [number, number, number]> = {
  bcsstk01: [48, 224, 400],
  bcsstm01: [48, 24, 24],
  bcsstk08: [1074, 7017, 12960],
  bcsstm08: [1074, 1074, 1074],
  bcsstk11: [1473, 17857, 34241],
  bcsstm11: [1473, 1473, 1473],
  bcsstk26: [1922, 16129, 30336],
  bcsstm26: [1922, 1922, 1922],
};

describe.skipIf(!present)('BCSSTRUC reference matrices', () => {
  it('every .mtx file in the directory is in the README table', () => {
    const files = readdirSync(dir).filter((f) => f.endsWith('.mtx')).map((f) => f.replace(/\.mtx$/, ''));
    expect(files.sort()).toEqual(Object.keys(table).sort());
  });

  it.each(Object.entries(table))('%s: size and nonzero counts match the README', async (name, [n, stored, full]) => {
    const { matrix, summary } = await readMatrixMarket(join(dir, `${name}.mtx`));
    expect(matrix.n).toBe(n);
    expect(summary.storedNonzeros).toBe(stored);
    expect(summary.entriesInFile).toBe(stored);
    expect(summary.fullNonzeros).toBe(full);
    expect(summary.duplicatesSummed).toBe(0);
    expect(summary.negativeDiagonalCount).toBe(0);
  });

  it('BCSSTM01 has 24 zero diagonal entries (README: singular mass, 24 of 48 zero)', async () => {
    const { summary } = await readMatrixMarket(join(dir, 'bcsstm01.mtx'));
    expect(summary.field).toBe('integer');
    expect(summary.zeroDiagonalCount).toBe(24);
  });

  it('BCSSTM08 diagonal range 0.175 .. 1.44e6 (README)', async () => {
    const { summary } = await readMatrixMarket(join(dir, 'bcsstm08.mtx'));
    expect(summary.diagonalMin).toBeCloseTo(0.175, 3);
    expect(summary.diagonalMax / 1.44e6).toBeCloseTo(1, 2);
  });

  it('K/M pairs have matching sizes', async () => {
    const { stiffness, mass } = await readStiffnessAndMass(join(dir, 'bcsstk26.mtx'), join(dir, 'bcsstm26.mtx'));
    expect(stiffness.matrix.n).toBe(mass.matrix.n);
  });
});
