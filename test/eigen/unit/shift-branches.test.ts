/**
 * The shift branches of the front door (src/eigen/solve-modes.ts with shift-placement.ts), each
 * reached by a small pencil built to reach it, checked against the closed-form spectra of spring
 * chains (discrete wave equation, pencils.ts):
 *  - abandoned shift: a short free–free chain makes the first guess σ₁ = −1e-5 · min K_jj/M_jj closer
 *    to 0 than 1e-3 λ_e, so the first pass is abandoned and the solve runs again at −0.01 λ_e;
 *  - abandoned shift, the other side of the window: on a long fixed–free chain λ₁ is far below
 *    every K_jj/M_jj, so σ₁ lies further below than 0.1 λ₆ and the solve runs again at −0.01 λ₁;
 *  - moved shift: K = K₀ + αM with K₀ a free–free chain and α chosen so that λ₁ = α equals σ₁
 *    exactly: K − σ₁M is singular, the factor meets a tiny pivot and σ is moved down;
 *  - rank(M) bound: more modes asked than M has finite eigenvalues are capped, with a warning.
 */
import { describe, expect, it } from 'vitest';
import { solveModes } from '../../../src/eigen/solve-modes.js';
import { diagonalScale, FIRST_SHIFT_FRACTION, firstShiftGuess } from '../../../src/eigen/shift-placement.js';
import { chain, denseFiniteEigenvaluesReversed, diagonalMatrix, fixedFreeEigenvalues, freeFreeEigenvalues, maxRelativeError, sparseOf, type Pencil } from './pencils.js';

describe('abandoned shift: σ₁ too close to the rigid-body eigenvalue', () => {
  // short: min K_jj/M_jj = 1 is only 58 λ_e (λ_e = 4 sin²(π/48)), so σ₁ = −1e-5 sits at 6e-4 λ_e
  const n = 24;
  const p = chain(n, 1, 1, false);
  const exact = freeFreeEigenvalues(n, 1, 1);

  for (const method of ['lanczos', 'subspace'] as const) {
    it(`${method}: solves again at −0.01 λ_e and still returns the closed-form spectrum`, () => {
      const sigma1 = firstShiftGuess(diagonalScale(p.stiffness, p.mass));
      // σ₁ = −1e-5 (min ratio 1 at the chain's ends) against 1e-3 λ_e ≈ 1.7e-5: too close
      expect(Math.abs(sigma1)).toBeLessThan(1e-3 * exact[1]);
      const r = solveModes(p.stiffness, p.mass, { count: 4, method });
      expect(r.diagnostics?.some((d) => /badly placed for this spectrum; solved again at/.test(d))).toBe(true);
      expect(r.shifts[0]).toBeCloseTo(sigma1, 15);
      // the second shift −0.01 λ_e, from the first pass's estimate of λ_e
      expect(r.shifts[1] / (-0.01 * exact[1])).toBeCloseTo(1, 3);
      expect(Math.abs(r.eigenvalues[0])).toBeLessThan(1e-10);
      expect(maxRelativeError(r.eigenvalues.subarray(1), exact.slice(1, 4))).toBeLessThan(1e-9);
      expect(r.sturm.ok).toBe(true);
    });
  }
});

describe('abandoned shift: σ₁ too far below λ_N', () => {
  it('solves again at −0.01 λ₁ on a fixed–free chain of 3000 (closed form)', () => {
    const n = 3000;
    const p = chain(n, 1, 1, true);
    const exact = fixedFreeEigenvalues(n, 1, 1);
    const sigma1 = firstShiftGuess(diagonalScale(p.stiffness, p.mass));
    // σ₁ = −1e-5 against 0.1 λ₆ ≈ 3.3e-6 (one mode wanted: judged against λ₆, shift-placement.ts): too far
    expect(Math.abs(sigma1)).toBeGreaterThan(0.1 * exact[5]);
    const r = solveModes(p.stiffness, p.mass, { count: 1 });
    expect(r.diagnostics?.some((d) => /badly placed/.test(d))).toBe(true);
    expect(r.shifts[1] / (-0.01 * exact[0])).toBeCloseTo(1, 3);
    expect(maxRelativeError(r.eigenvalues, exact.slice(0, 1))).toBeLessThan(1e-9);
    expect(r.sturm.ok).toBe(true);
  });
});

describe('moved shift: σ₁ sits exactly on an eigenvalue', () => {
  const n = 20;
  const base = chain(n, 1, 1, false);
  // α with α = −c · (1 + α) = σ₁ of K₀ + αI (c = FIRST_SHIFT_FRACTION; min ratio 1 + α at the chain's ends)
  const alpha = -FIRST_SHIFT_FRACTION / (1 + FIRST_SHIFT_FRACTION);
  const entries: [number, number, number][] = [];
  for (let j = 0; j < n; j++) {
    for (let q = base.stiffness.colPtr[j]; q < base.stiffness.colPtr[j + 1]; q++) {
      const i = base.stiffness.rowIdx[q];
      entries.push([i, j, base.stiffness.values[q] + (i === j ? alpha : 0)]);
    }
  }
  const p: Pencil = { stiffness: sparseOf(n, entries), mass: base.mass };

  it('meets a tiny pivot, moves σ down with a warning, and returns λ_j = free–free λ_j + α', () => {
    const sigma1 = firstShiftGuess(diagonalScale(p.stiffness, p.mass));
    expect(sigma1 / alpha).toBeCloseTo(1, 12);
    const r = solveModes(p.stiffness, p.mass, { count: 3 });
    expect(r.warnings.some((w) => /met \d+ tiny pivot\(s\); moved to/.test(w))).toBe(true);
    // moved below σ₁, by 1e-3 of its size (solve-modes.ts)
    expect(r.shifts[0]).toBeLessThan(sigma1);
    expect(r.shifts[0] / sigma1).toBeCloseTo(1.001, 6);
    const expected = freeFreeEigenvalues(n, 1, 1).slice(0, 3).map((v) => v + alpha);
    expect(Math.abs(r.eigenvalues[0] - alpha)).toBeLessThan(1e-12);
    expect(maxRelativeError(r.eigenvalues.subarray(1), expected.slice(1))).toBeLessThan(1e-9);
  });
});

describe('rank(M) bound at the front door', () => {
  it('caps a request above rank(M) at the finite eigenvalues, with a warning (reversed pencil, ml-matrix)', () => {
    const masses = [1, 0, 1, 0, 2, 0, 1, 0, 1, 0];
    const p: Pencil = { stiffness: chain(10, 1, 1, true).stiffness, mass: diagonalMatrix(masses) };
    const r = solveModes(p.stiffness, p.mass, { count: 8 });
    expect(r.rankMassBound).toBe(5);
    expect(r.warnings.some((w) => /asked for 8 modes but M has rank at most 5/.test(w))).toBe(true);
    expect(r.eigenvalues.length).toBe(5);
    expect(maxRelativeError(r.eigenvalues, denseFiniteEigenvaluesReversed(p))).toBeLessThan(1e-9);
    expect(r.sturm.ok).toBe(true);
  });
});
