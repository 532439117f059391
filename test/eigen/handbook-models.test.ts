/**
 * Generated models (fixtures/generator) against handbook values and structural facts:
 *  - Euler–Bernoulli cantilever f₁ = (βL)²/(2πL²)·√(EI/(ρA)), βL₁ = 1.87510407, and free-free
 *    beam βL₁ = 4.73004074 — Blevins, Formulas for Natural Frequency and Mode Shape (1979),
 *    Table 8-1 [S], roots [V] as listed in docs/sources.md §7;
 *  - a square section bends alike about both axes: every bending frequency comes twice (common practice);
 *  - a free-free 3-D body has exactly 6 rigid-body modes (common practice; ECSS-E-ST-32-03C quoted
 *    via docs/sources.md §1a [S]: rigid/elastic frequency ratio < 1e-4);
 *  (the unfastened-anchor mast is checked on the committed demo files, demo-models.test.ts)
 *  - every model: Sturm count, residuals ≤ 1e-10, ‖ΦᵀMΦ − I‖ ≤ 1e-10, both methods agree.
 */
import { describe, expect, it } from 'vitest';
import { buildCantilever } from '../../fixtures/generator/cantilever.js';
import { buildHexBox } from '../../fixtures/generator/hex-solid.js';
import { rectangularSection, STEEL } from '../../fixtures/generator/sections.js';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import type { ModesResult } from '../../src/eigen/modes-types.js';

const BETA_L_CLAMPED_FREE = 1.87510407; // Blevins Table 8-1 [S], docs/sources.md §7 [V]
const BETA_L_FREE_FREE = 4.73004074; // Blevins Table 8-1 [S], docs/sources.md §7 [V]

function eulerBernoulliHz(betaL: number, lengthM: number, widthM: number, depthM: number): number {
  const s = rectangularSection(widthM, depthM);
  const ei = STEEL.youngPa * Math.min(s.iyM4, s.izM4);
  const rhoA = STEEL.densityKgM3 * s.areaM2;
  return (betaL * betaL) / (2 * Math.PI * lengthM * lengthM) * Math.sqrt(ei / rhoA);
}

function expectVerified(r: ModesResult): void {
  expect(r.sturm.ok).toBe(true);
  expect(r.sturm.countBelow).toBe(r.sturm.modesReturned);
  expect(Math.max(...r.residuals)).toBeLessThanOrEqual(1e-10);
  expect(r.orthogonality.massMaxDeviation).toBeLessThanOrEqual(1e-10);
}

function solveBoth(m: GeneratedModel, count: number): { lanczos: ModesResult; subspace: ModesResult } {
  const lanczos = solveModes(m.stiffness, m.mass, { count, method: 'lanczos', coordinates: m.coordinates });
  const subspace = solveModes(m.stiffness, m.mass, { count, method: 'subspace', coordinates: m.coordinates });
  return { lanczos, subspace };
}

/**
 * Both methods give the same spectrum: 1e-9 relative for elastic modes; rigid-body values are
 * rounding noise (≈ ε·λ_max), so for them only |λ| ≤ 1e-10 of the largest is compared.
 */
function expectAgree(a: ModesResult, b: ModesResult): void {
  const scale = Math.max(...Array.from(a.eigenvalues, Math.abs));
  for (let i = 0; i < a.eigenvalues.length; i++) {
    const rigid = Math.max(Math.abs(a.eigenvalues[i]), Math.abs(b.eigenvalues[i])) <= 1e-10 * scale;
    if (!rigid) expect(Math.abs(a.eigenvalues[i] - b.eigenvalues[i])).toBeLessThanOrEqual(1e-9 * Math.abs(a.eigenvalues[i]));
  }
}

describe('clamped-free beam vs Euler–Bernoulli (Blevins Table 8-1 via docs/sources.md §7)', () => {
  it('first bending frequency converges, error falling ≥ 4× per mesh doubling', () => {
    const exact = eulerBernoulliHz(BETA_L_CLAMPED_FREE, 2, 0.04, 0.06);
    const errors = [2, 4, 8].map((elements) => {
      const m = buildCantilever({ lengthM: 2, elements, widthM: 0.04, depthM: 0.06 });
      const r = solveModes(m.stiffness, m.mass, { count: 3, coordinates: m.coordinates });
      expectVerified(r);
      return Math.abs(r.frequenciesHz[0] - exact) / exact;
    });
    expect(errors[2]).toBeLessThan(1e-4);
    expect(errors[0] / errors[1]).toBeGreaterThanOrEqual(4);
    expect(errors[1] / errors[2]).toBeGreaterThanOrEqual(4);
  });

  it('square section: both bending directions found, each frequency twice', () => {
    const m = buildCantilever({ lengthM: 1, elements: 16, widthM: 0.05 });
    const { lanczos, subspace } = solveBoth(m, 4);
    const exact = eulerBernoulliHz(BETA_L_CLAMPED_FREE, 1, 0.05, 0.05);
    const f = lanczos.frequenciesHz;
    expect(Math.abs(f[0] - exact) / exact).toBeLessThan(1e-5);
    expect(Math.abs(f[1] - f[0]) / f[0]).toBeLessThan(1e-9);
    expect(Math.abs(f[3] - f[2]) / f[2]).toBeLessThan(1e-9);
    // second bending root βL₂ = 4.69409113 (Blevins Table 8-1 [S])
    expect(Math.abs(f[2] / f[0] - (4.69409113 / BETA_L_CLAMPED_FREE) ** 2)).toBeLessThan(1e-3);
    expectVerified(lanczos);
    expectVerified(subspace);
    expectAgree(lanczos, subspace);
  });
});

describe('free-free models: exactly 6 rigid-body modes, then the first elastic one', () => {
  function rigidCount(r: ModesResult): number {
    const firstElastic = Math.max(...Array.from(r.frequenciesHz, Math.abs));
    // ECSS-E-ST-32-03C ratio criterion < 1e-4 (docs/sources.md §1a [S])
    return Array.from(r.frequenciesHz).filter((f) => Math.abs(f) < 1e-4 * firstElastic).length;
  }

  it('free-free beam frame: 6 rigid-body modes, mode 7 = Euler–Bernoulli free-free βL = 4.73004074', () => {
    const m = buildCantilever({ lengthM: 2, elements: 16, widthM: 0.04, depthM: 0.06, clamped: false });
    const { lanczos, subspace } = solveBoth(m, 7);
    expect(rigidCount(lanczos)).toBe(6);
    const exact = eulerBernoulliHz(BETA_L_FREE_FREE, 2, 0.04, 0.06);
    expect(Math.abs(lanczos.frequenciesHz[6] - exact) / exact).toBeLessThan(1e-4);
    expectVerified(lanczos);
    expectVerified(subspace);
    expectAgree(lanczos, subspace);
  });

  it('free-free hex solid: 6 rigid-body modes and the 7th elastic, both methods', () => {
    const m = buildHexBox({ sizeM: [0.4, 0.1, 0.1], elements: [8, 2, 2], material: STEEL });
    const { lanczos, subspace } = solveBoth(m, 10);
    expect(rigidCount(lanczos)).toBe(6);
    expect(lanczos.frequenciesHz[6]).toBeGreaterThan(1e4 * Math.abs(lanczos.frequenciesHz[5]));
    expectVerified(lanczos);
    expectVerified(subspace);
    expectAgree(lanczos, subspace);
  });
});
