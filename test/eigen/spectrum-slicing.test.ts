/**
 * Many modes at once (spectrum slicing: 40 per shift) against a dense reference from the
 * general-purpose library ml-matrix (CholeskyDecomposition of M, EigenvalueDecomposition of
 * L⁻¹KL⁻ᵀ), on a small generated cantilever where dense is cheap.
 */
import { describe, expect, it } from 'vitest';
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { buildCantilever } from '../../fixtures/generator/cantilever.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';
import { solveModes } from '../../src/eigen/solve-modes.js';

function dense(a: SymmetricCsc): Matrix {
  const m = Matrix.zeros(a.n, a.n);
  // mirror the stored lower triangle
  for (let j = 0; j < a.n; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      m.set(a.rowIdx[p], j, a.values[p]);
      m.set(j, a.rowIdx[p], a.values[p]);
    }
  }
  return m;
}

/** Eigenvalues of (K, M) via ml-matrix: M = LLᵀ, eig(L⁻¹ K L⁻ᵀ). */
function denseEigenvalues(k: SymmetricCsc, m: SymmetricCsc): number[] {
  const l = new CholeskyDecomposition(dense(m)).lowerTriangularMatrix;
  const x = solveLower(l, dense(k));
  const c = solveLower(l, x.transpose()).transpose();
  const sym = c.add(c.transpose()).mul(0.5);
  return new EigenvalueDecomposition(sym, { assumeSymmetric: true }).realEigenvalues.sort((a, b) => a - b);
}

/** L⁻¹ B by forward substitution, column by column. */
function solveLower(l: Matrix, b: Matrix): Matrix {
  const n = l.rows;
  const out = b.clone();
  for (let c = 0; c < b.columns; c++) {
    for (let i = 0; i < n; i++) {
      let s = out.get(i, c);
      for (let k = 0; k < i; k++) s -= l.get(i, k) * out.get(k, c);
      out.set(i, c, s / l.get(i, i));
    }
  }
  return out;
}

describe('spectrum slicing vs ml-matrix dense eigenvalues', () => {
  it('100 lowest modes of a 120-DOF cantilever in three slices: values, Sturm count, orthogonality', () => {
    const model = buildCantilever({ lengthM: 2, elements: 20, widthM: 0.04, depthM: 0.06 });
    const r = solveModes(model.stiffness, model.mass, { count: 100 });
    const ref = denseEigenvalues(model.stiffness, model.mass); // ml-matrix reference
    expect(r.eigenvalues.length).toBe(100);
    let worst = 0;
    for (let i = 0; i < 100; i++) worst = Math.max(worst, Math.abs(r.eigenvalues[i] - ref[i]) / ref[i]);
    expect(worst).toBeLessThan(1e-8);
    expect(r.sturm.ok).toBe(true);
    expect(r.shifts.length).toBeGreaterThanOrEqual(4);
    expect(r.orthogonality.massMaxDeviation).toBeLessThan(1e-10);
    expect(Math.max(...r.residuals)).toBeLessThan(1e-10);
    expect(r.warnings.filter((w) => w.startsWith('slice check'))).toEqual([]);
  });
});
