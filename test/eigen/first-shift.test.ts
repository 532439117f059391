/**
 * The first shift of the modes solve (src/eigen/shift-placement.ts) on small hexahedral solids,
 * counted, not timed: when σ₁ lies in the window of shift-placement.ts the solve needs exactly two
 * factorizations (the iteration's at σ₁ and the Sturm count's after λ_N), which is what any good
 * first shift gives; a badly placed σ₁ costs a third (the restart at σ₂).
 *
 * The window is judged against eigenvalues from ml-matrix (dense generalized eigen of the same
 * pencil, a general-purpose library): with rigid-body modes 1e-3 λ_e ≤ |σ₁| ≤ 0.1 λ_N, without
 * them |σ₁| ≤ 0.1 λ_N (the header of shift-placement.ts; common practice). The free-free box is
 * coarse, so min K_jj/M_jj is only a few hundred λ_e: the earlier σ₁ = −1e-6 · min K_jj/M_jj fell
 * below 1e-3 λ_e there, as on the bench's 975-DOF bar, and the solve restarted.
 */
import { describe, expect, it } from 'vitest';
import { buildHexBox } from '../../fixtures/generator/hex-solid.js';
import { STEEL } from '../../fixtures/generator/sections.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { diagonalScale, firstShiftGuess } from '../../src/eigen/shift-placement.js';
import { denseGeneralized } from './unit/pencils.js';

const COUNT = 12;

describe('first shift: two factorizations when σ₁ is in the window', () => {
  it('free-free hex bar (6 rigid-body modes): σ₁ in [1e-3 λ_e, 0.1 λ_N], no restart, 2 factorizations', () => {
    const m = buildHexBox({ sizeM: [0.6, 0.1, 0.1], elements: [12, 2, 2], material: STEEL });
    const exact = denseGeneralized(m).values;
    const scale = diagonalScale(m.stiffness, m.mass);
    // ml-matrix: six zeros (rounding), then λ_e
    const zero = 1e-8 * exact[exact.length - 1];
    expect(exact.slice(0, 6).every((v) => Math.abs(v) < zero)).toBe(true);
    const lambdaE = exact[6];
    const lambdaN = exact[COUNT - 1];
    // the old guess −1e-6 · min K_jj/M_jj would sit below the floor on this coarse bar
    expect(1e-6 * scale.minRatio).toBeLessThan(1e-3 * lambdaE);
    const r = solveModes(m.stiffness, m.mass, { count: COUNT, coordinates: m.coordinates });
    expect((r.diagnostics ?? []).some((d) => /badly placed/.test(d))).toBe(false);
    expect(r.shifts.length).toBe(2);
    const sigma1 = firstShiftGuess(scale);
    expect(r.shifts[0]).toBe(sigma1);
    expect(Math.abs(sigma1)).toBeGreaterThanOrEqual(1e-3 * lambdaE);
    expect(Math.abs(sigma1)).toBeLessThanOrEqual(0.1 * lambdaN);
    expect(r.sturm.ok).toBe(true);
    for (let i = 6; i < COUNT; i++) expect(Math.abs(r.eigenvalues[i] - exact[i]) / exact[i]).toBeLessThan(1e-9);
  });

  it('the same bar clamped at one end: σ₁ within 0.1 λ_N, no restart, 2 factorizations', () => {
    const m = buildHexBox({ sizeM: [0.6, 0.1, 0.1], elements: [12, 2, 2], material: STEEL, clampFace: 'xMin' });
    const exact = denseGeneralized(m).values;
    const sigma1 = firstShiftGuess(diagonalScale(m.stiffness, m.mass));
    expect(Math.abs(sigma1)).toBeLessThanOrEqual(0.1 * exact[COUNT - 1]);
    const r = solveModes(m.stiffness, m.mass, { count: COUNT, coordinates: m.coordinates });
    expect((r.diagnostics ?? []).some((d) => /badly placed/.test(d))).toBe(false);
    expect(r.shifts.length).toBe(2);
    expect(r.sturm.ok).toBe(true);
    for (let i = 0; i < COUNT; i++) expect(Math.abs(r.eigenvalues[i] - exact[i]) / exact[i]).toBeLessThan(1e-9);
  });
});
