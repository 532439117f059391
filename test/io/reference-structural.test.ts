/**
 * Reads every Harwell–Boeing BCSSTRUC matrix in test/reference/structural (NIST Matrix Market
 * edition, gzipped). Expected sizes and stored nonzero counts: the table in test/reference/README.md
 * (computed with scipy.io.mmread).
 */
import { describe, expect, it } from 'vitest';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { readMatrixMarket, readStiffnessAndMass } from '../../src/io/matrix-market-reader.js';
import { structuralDir } from '../reference/reference-data.js';

const dir = structuralDir;

// source: test/reference/README.md table (n, nnz stored, nnz full)
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

describe('BCSSTRUC reference matrices', () => {
  it('every .mtx file in the directory is in the README table', () => {
    const files = readdirSync(dir).filter((f) => f.endsWith('.mtx.gz')).map((f) => f.replace(/\.mtx\.gz$/, ''));
    expect(files.sort()).toEqual(Object.keys(table).sort());
  });

  it.each(Object.entries(table))('%s: size and nonzero counts match the README', async (name, [n, stored, full]) => {
    const { matrix, summary } = await readMatrixMarket(join(dir, `${name}.mtx.gz`));
    expect(matrix.n).toBe(n);
    expect(summary.storedNonzeros).toBe(stored);
    expect(summary.entriesInFile).toBe(stored);
    expect(summary.fullNonzeros).toBe(full);
    expect(summary.duplicatesSummed).toBe(0);
    expect(summary.negativeDiagonalCount).toBe(0);
  });

  it('BCSSTM01 has 24 zero diagonal entries (README: singular mass, 24 of 48 zero)', async () => {
    const { summary } = await readMatrixMarket(join(dir, 'bcsstm01.mtx.gz'));
    expect(summary.field).toBe('integer');
    expect(summary.zeroDiagonalCount).toBe(24);
  });

  it('BCSSTM08 diagonal range 0.175 .. 1.44e6 (README)', async () => {
    const { summary } = await readMatrixMarket(join(dir, 'bcsstm08.mtx.gz'));
    expect(summary.diagonalMin).toBeCloseTo(0.175, 3);
    expect(summary.diagonalMax / 1.44e6).toBeCloseTo(1, 2);
  });

  it('K/M pairs have matching sizes', async () => {
    const { stiffness, mass } = await readStiffnessAndMass(join(dir, 'bcsstk26.mtx.gz'), join(dir, 'bcsstm26.mtx.gz'));
    expect(stiffness.matrix.n).toBe(mass.matrix.n);
  });
});
