/**
 * The lowest 20 eigenvalues of the Harwell–Boeing BCSSTRUC structural pairs (NIST Matrix
 * Market; BCSSTK/BCSSTM 01, 08, 11, 26) against the reference values in
 * test/reference/structural/reference-eigenvalues.json.gz, computed with SciPy's ARPACK `eigsh` in
 * shift-invert mode and cross-checked with dense LAPACK (see test/reference/README.md).
 * BCSSTM01 is singular (24 massless DOFs, 24 finite eigenvalues); BCSSTM26 is badly scaled.
 */
import { describe, expect, it } from 'vitest';
import { readMatrixMarket } from '../../src/io/matrix-market-reader.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { structuralFile, structuralPairs } from '../reference/reference-data.js';

const pairs = structuralPairs();

describe('BCSSTRUC pairs vs SciPy ARPACK eigsh reference (test/reference/structural)', () => {
  for (const pair of pairs) {
    it(`${pair.name}: lowest 20 within 1e-9 relative, Sturm count, residuals, M-orthonormality`, async () => {
      const stiffness = (await readMatrixMarket(structuralFile(pair.K_file))).matrix;
      const mass = (await readMatrixMarket(structuralFile(pair.M_file))).matrix;
      const r = solveModes(stiffness, mass, { count: 20, method: 'lanczos' });
      expect(r.eigenvalues.length).toBe(20);
      // source: reference-eigenvalues.json (SciPy ARPACK eigsh, shift-invert)
      let worst = 0;
      for (let i = 0; i < 20; i++) worst = Math.max(worst, Math.abs(r.eigenvalues[i] - pair.eigenvalues[i]) / Math.abs(pair.eigenvalues[i]));
      expect(worst).toBeLessThan(1e-9);
      expect(r.sturm.ok).toBe(true);
      expect(r.sturm.countBelow).toBe(20);
      expect(Math.max(...r.residuals)).toBeLessThan(1e-9);
      expect(r.orthogonality.massMaxDeviation).toBeLessThan(1e-10);
      expect(r.orthogonality.stiffnessMaxDeviation).toBeLessThan(1e-10);
    });
  }

  it('BCSSTK01/M01 (singular M) with subspace iteration agrees with the reference', async () => {
    for (const pair of pairs.filter((p) => /01/.test(p.name))) {
      const stiffness = (await readMatrixMarket(structuralFile(pair.K_file))).matrix;
      const mass = (await readMatrixMarket(structuralFile(pair.M_file))).matrix;
      const r = solveModes(stiffness, mass, { count: 20, method: 'subspace' });
      // source: reference-eigenvalues.json (SciPy ARPACK eigsh, shift-invert)
      for (let i = 0; i < 20; i++) expect(Math.abs(r.eigenvalues[i] - pair.eigenvalues[i]) / pair.eigenvalues[i]).toBeLessThan(1e-9);
      expect(r.sturm.ok).toBe(true);
    }
  });

  it('BCSSTK01/M01: asking for more modes than rank(M) returns the 24 finite ones and says so', async () => {
    const pair = pairs.find((p) => p.name.includes('01'))!;
    const r = solveModes((await readMatrixMarket(structuralFile(pair.K_file))).matrix, (await readMatrixMarket(structuralFile(pair.M_file))).matrix, { count: 30 });
    expect(r.eigenvalues.length).toBe(24);
    expect(r.warnings.join(' ')).toMatch(/rank/);
    expect(r.sturm.ok).toBe(true);
  });
});
