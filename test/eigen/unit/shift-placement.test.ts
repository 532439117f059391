/**
 * src/eigen/shift-placement.ts on its own:
 *  - the diagonal ratios K_jj/M_jj are Rayleigh quotients of unit vectors, so
 *    λ₁ ≤ min_j K_jj/M_jj and max_j K_jj/M_jj ≤ λ_n (Rayleigh quotient bounds; Parlett, The
 *    Symmetric Eigenvalue Problem, ch. 1 — from memory), checked against ml-matrix eigenvalues;
 *  - the first guess σ₁ = −FIRST_SHIFT_FRACTION · min ratio lies below every eigenvalue of a positive
 *    semi-definite pencil;
 *  - judgeShift's window (header): |σ| ≤ 0.1 λ_N (λ₆ when fewer are wanted), and with rigid-body
 *    modes |σ| ≥ 1e-3 λ_e;
 *    the better shift −0.01 λ_e (or −0.01 λ₁ without rigid-body modes). The window is common
 *    practice as the header says; the numbers here are the header's own.
 */
import { describe, expect, it } from 'vitest';
import { diagonalScale, FIRST_SHIFT_FRACTION, firstShiftGuess, judgeShift, RIGID_BODY_FRACTION } from '../../../src/eigen/shift-placement.js';
import { chain, denseGeneralized, diagonalMatrix, fixedFreeEigenvalues, freeFreeEigenvalues, sparseOf } from './pencils.js';
import { hexGridPair } from '../../sparse/fe-like-matrices.js';

describe('diagonalScale and the first shift', () => {
  it('brackets the spectrum: λ₁ ≤ min K_jj/M_jj and max K_jj/M_jj ≤ λ_n (ml-matrix eigenvalues)', () => {
    const p = hexGridPair(1, 1, 2, 9);
    const ref = denseGeneralized(p).values;
    const s = diagonalScale(p.stiffness, p.mass);
    expect(ref[0]).toBeLessThanOrEqual(s.minRatio);
    expect(s.maxRatio).toBeLessThanOrEqual(ref[ref.length - 1]);
    expect(FIRST_SHIFT_FRACTION).toBe(1e-5);
    expect(firstShiftGuess(s)).toBeCloseTo(-FIRST_SHIFT_FRACTION * s.minRatio, 20);
    expect(firstShiftGuess(s)).toBeLessThan(ref[0]);
  });

  it('on the fixed–free chain: min ratio k/m·1 at the free end, max 2k/m; both bracket the closed form', () => {
    const p = chain(10, 4, 2, true);
    const s = diagonalScale(p.stiffness, p.mass);
    // K_jj = 2k except the free end (k); M_jj = m
    expect(s).toEqual({ minRatio: 2, maxRatio: 4 });
    const exact = fixedFreeEigenvalues(10, 4, 2);
    expect(exact[0]).toBeLessThan(s.minRatio);
    expect(exact[9]).toBeGreaterThan(s.maxRatio);
  });

  it('skips massless DOFs and DOFs without stiffness, and falls back to 1 when nothing is left', () => {
    const k = sparseOf(3, [[0, 0, 6], [1, 1, 8], [2, 2, 0]]);
    expect(diagonalScale(k, diagonalMatrix([2, 0, 1]))).toEqual({ minRatio: 3, maxRatio: 3 });
    expect(diagonalScale(k, diagonalMatrix([0, 0, 0]))).toEqual({ minRatio: 1, maxRatio: 1 });
  });
});

describe('judgeShift', () => {
  const fixedFree = Float64Array.from(fixedFreeEigenvalues(20, 1, 1));
  const freeFree = Float64Array.from(freeFreeEigenvalues(20, 1, 1));
  const scale = { minRatio: 1, maxRatio: 4 };

  it('accepts the first guess below a fixed–free spectrum (no rigid-body mode)', () => {
    const v = judgeShift(-1e-6, fixedFree, 5, scale);
    expect(v.acceptable).toBe(true);
    expect(v.rigidBodyCount).toBe(0);
  });

  it('refuses a shift further than 0.1 λ_N below and proposes −0.01 λ₁', () => {
    const lambdaN = fixedFree[7];
    const v = judgeShift(-0.11 * lambdaN, fixedFree, 8, scale);
    expect(v.acceptable).toBe(false);
    // base = max(λ₁, 1e-3 λ_e) = λ₁; better = min(−0.01 λ₁, λ₁ − 0.01 λ₁)
    expect(v.better).toBeCloseTo(-0.01 * fixedFree[0], 15);
    expect(judgeShift(-0.09 * lambdaN, fixedFree, 8, scale).acceptable).toBe(true);
  });

  it('for fewer than six wanted modes judges "too far" against λ₆ (the header, SHIFT_REACH)', () => {
    const lambda6 = fixedFree[5];
    expect(judgeShift(-0.5 * fixedFree[1], fixedFree, 2, scale).acceptable).toBe(true);
    expect(judgeShift(-0.09 * lambda6, fixedFree, 2, scale).acceptable).toBe(true);
    expect(judgeShift(-0.11 * lambda6, fixedFree, 2, scale).acceptable).toBe(false);
  });

  it('refuses a shift closer to 0 than 1e-3 λ_e when a rigid-body mode is wanted, and proposes −0.01 λ_e', () => {
    // free–free: λ₁ = 0 (closed form), λ₂ = λ_e
    const lambdaE = freeFree[1];
    const v = judgeShift(-1e-6 * lambdaE, freeFree, 4, scale);
    expect(v.acceptable).toBe(false);
    expect(v.rigidBodyCount).toBe(1);
    expect(v.better).toBeCloseTo(-0.01 * lambdaE, 15);
    expect(judgeShift(-2e-3 * lambdaE, freeFree, 4, scale).acceptable).toBe(true);
  });

  it('counts estimates within RIGID_BODY_FRACTION · max ratio as rigid-body (zero) eigenvalues', () => {
    const zero = RIGID_BODY_FRACTION * scale.maxRatio;
    const est = Float64Array.from([-0.5 * zero, 0.9 * zero, 0.2 * zero, 0.5, 1]);
    expect(judgeShift(-0.01, est, 5, scale).rigidBodyCount).toBe(3);
  });

  it('has nothing to judge when every estimate is a zero: acceptable, shift unchanged', () => {
    const v = judgeShift(-0.3, Float64Array.from([0, 0, 0]), 3, scale);
    expect(v).toEqual({ acceptable: true, better: -0.3, rigidBodyCount: 3 });
  });
});
