/**
 * src/eigen/rayleigh-ritz.ts on its own, against ml-matrix's dense generalized eigenpairs
 * (general-purpose library) and the closed-form spectrum of the fixed–free spring chain:
 *  - on an M-orthonormal basis of the whole space the Ritz values are the eigenvalues;
 *  - on a basis of an invariant subspace they are exactly its eigenvalues, residuals at rounding;
 *  - on any subspace of dimension k, θ_i ≥ λ_i (Courant–Fischer minimax, Parlett, The Symmetric
 *    Eigenvalue Problem, ch. 10–11 — from memory);
 *  - the residual norms equal ‖K x − θ M x‖ formed directly; X is M-orthonormal; KX and MX are
 *    the products of X.
 */
import { describe, expect, it } from 'vitest';
import { rayleighRitz } from '../../../src/eigen/rayleigh-ritz.js';
import { mOrthonormalize } from '../../../src/eigen/m-orthonormalize.js';
import { symMultiplyBlock } from '../../../src/sparse/csc.js';
import { blockOf, chain, denseGeneralized, fixedFreeEigenvalues, massOrthonormality, maxRelativeError, pseudoRandomBlock } from './pencils.js';
import { hexGridPair } from '../../sparse/fe-like-matrices.js';

const times = (a: Parameters<typeof symMultiplyBlock>[0]) => (x: Float64Array, k: number) => symMultiplyBlock(a, x, k, new Float64Array(a.n * k));

describe('Rayleigh–Ritz', () => {
  it('on the whole space returns every eigenvalue of the fixed–free chain (closed form)', () => {
    const n = 12;
    const p = chain(n, 3, 2, true);
    const basis = mOrthonormalize(pseudoRandomBlock(n, n, 3), n, n, times(p.mass));
    expect(basis.count).toBe(n);
    const ritz = rayleighRitz(basis, n, times(p.stiffness));
    // λ_j = (4k/m) sin²((2j−1)π/(2(2n+1))): discrete wave equation (pencils.ts)
    expect(maxRelativeError(ritz.values, fixedFreeEigenvalues(n, 3, 2))).toBeLessThan(1e-12);
    expect(Math.max(...ritz.residualNorms)).toBeLessThan(1e-12);
  });

  it('on an invariant subspace returns its eigenvalues exactly (ml-matrix eigenpairs)', () => {
    const p = hexGridPair(1, 1, 2, 3);
    const n = p.stiffness.n;
    const ref = denseGeneralized(p);
    // a mixed basis of span(φ₂, φ₅, φ₉)
    const phi = [ref.vectors[2], ref.vectors[5], ref.vectors[9]];
    const mixed = blockOf([
      phi[0].map((v, r) => v + 2 * phi[1][r]),
      phi[1].map((v, r) => v - phi[2][r]),
      phi[2].map((v, r) => 0.5 * v + phi[0][r]),
    ]);
    const basis = mOrthonormalize(mixed, 3, n, times(p.mass));
    const ritz = rayleighRitz(basis, n, times(p.stiffness));
    expect(maxRelativeError(ritz.values, [ref.values[2], ref.values[5], ref.values[9]])).toBeLessThan(1e-10);
    for (let i = 0; i < 3; i++) expect(ritz.residualNorms[i] / ritz.stiffnessNorms[i]).toBeLessThan(1e-10);
  });

  it('gives θ_i ≥ λ_i on a random subspace (minimax), with consistent residuals and products', () => {
    const p = hexGridPair(2, 1, 1, 5);
    const n = p.stiffness.n;
    const k = 6;
    const ref = denseGeneralized(p);
    const basis = mOrthonormalize(pseudoRandomBlock(n, k, 17), k, n, times(p.mass));
    const ritz = rayleighRitz(basis, n, times(p.stiffness));
    for (let i = 0; i < k; i++) expect(ritz.values[i]).toBeGreaterThanOrEqual(ref.values[i] * (1 - 1e-12));
    // ascending
    for (let i = 1; i < k; i++) expect(ritz.values[i]).toBeGreaterThanOrEqual(ritz.values[i - 1]);
    expect(massOrthonormality(p.mass, ritz.vectors, k).self).toBeLessThan(1e-12);
    const kx = times(p.stiffness)(ritz.vectors, k);
    const mx = times(p.mass)(ritz.vectors, k);
    for (let i = 0; i < k; i++) {
      let rr = 0;
      let xx = 0;
      let dk = 0;
      let dm = 0;
      // ‖Kx − θMx‖ formed directly; KX and MX as returned
      for (let r = i * n; r < (i + 1) * n; r++) {
        rr += (kx[r] - ritz.values[i] * mx[r]) ** 2;
        xx += ritz.vectors[r] ** 2;
        dk = Math.max(dk, Math.abs(kx[r] - ritz.stiffnessVectors[r]));
        dm = Math.max(dm, Math.abs(mx[r] - ritz.massVectors[r]));
      }
      expect(ritz.residualNorms[i]).toBeCloseTo(Math.sqrt(rr), 10);
      expect(ritz.vectorNorms[i]).toBeCloseTo(Math.sqrt(xx), 12);
      expect(dk).toBeLessThan(1e-10 * ritz.stiffnessNorms[i]);
      expect(dm).toBeLessThan(1e-12);
      expect(ritz.residualNorms[i]).toBeGreaterThan(0);
    }
  });
});
