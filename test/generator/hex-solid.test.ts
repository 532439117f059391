/**
 * Hexahedral solids: rigid-body modes, exact total mass, symmetry and definiteness.
 */
import { describe, expect, it } from 'vitest';
import { CholeskyDecomposition } from 'ml-matrix';
import { buildHexBox, buildHexGrid } from '../../fixtures/generator/hex-solid.js';
import { hexElementMatrices, HEX_CORNERS } from '../../fixtures/generator/elements/hex8.js';
import { buildBracket } from '../../fixtures/generator/bracket.js';
import { STEEL } from '../../fixtures/generator/sections.js';
import { symMultiply } from '../../src/sparse/csc.js';
import { denseOf, generalizedEigenvalues } from './dense-reference.js';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';

/** rᵀ M r for the unit translation r in direction `component` (0, 1, 2). */
function translationalMass(model: GeneratedModel, component: number): number {
  const r = Float64Array.from(model.dofMap.component, (c) => (c === component ? 1 : 0));
  const mr = symMultiply(model.mass, r);
  return r.reduce((s, v, i) => s + v * mr[i], 0);
}

describe('hex solid', () => {
  it('free-free box has exactly 6 eigenvalues below 1e-6·λ7', () => {
    // A free body in 3D has 6 rigid-body motions (common practice: 3 translations, 3 rotations).
    const model = buildHexBox({ sizeM: [0.3, 0.2, 0.1], elements: [3, 2, 2], material: STEEL });
    const ev = generalizedEigenvalues(model.stiffness, model.mass);
    const below = ev.filter((l) => Math.abs(l) < 1e-6 * ev[6]).length;
    expect(below).toBe(6);
  });

  it('total mass rᵀMr equals ρ·volume to 1e-12 in each direction', () => {
    // Consistent mass reproduces ∫ρ dV exactly because Σ N_a = 1 (partition of unity; from memory, e.g. Cook et al. ch. 11).
    const size = [0.3, 0.2, 0.1] as const;
    const model = buildHexBox({ sizeM: size, elements: [5, 3, 2], material: STEEL });
    const expected = STEEL.densityKgM3 * size[0] * size[1] * size[2];
    for (let c = 0; c < 3; c++) expect(Math.abs(translationalMass(model, c) / expected - 1)).toBeLessThan(1e-12);
  });

  it('bracket mass equals ρ times its hand-counted volume', () => {
    // Volume by hand from the drawing in bracket.ts (mm): wall 10×120×110 + shelf 140×120×10
    // + stepped gusset cells (10 mm thick, 20 mm grid cells with centre inside x/150 + z/110 ≤ 1):
    // cell centres xc = 20, 40, …, 140 and zc = 20, 40, …, 100; kept when zc ≤ 110·(1 − xc/150):
    // xc 20 → zc ≤ 95.3 (4 cells), 40 → ≤ 80.7 (4), 60 → ≤ 66 (3), 80 → ≤ 51.3 (2), 100 → ≤ 36.7 (1),
    // 120 → ≤ 22 (1), 140 → ≤ 7.3 (0): 15 cells of 20×10×20.
    const volumeMm3 = 10 * 120 * 110 + 140 * 120 * 10 + 15 * 20 * 10 * 20;
    const expected = STEEL.densityKgM3 * volumeMm3 * 1e-9;
    const model = buildBracket({ clamped: false });
    for (let c = 0; c < 3; c++) expect(Math.abs(translationalMass(model, c) / expected - 1)).toBeLessThan(1e-12);
  });

  it('element matrices are symmetric and the clamped assembly has positive definite K and M', () => {
    const xyz = HEX_CORNERS.flatMap(([a, b, c]) => [0.1 * (a + 1) + 0.01 * b, 0.05 * (b + 1), 0.04 * (c + 1) + 0.005 * a]);
    const { stiffness } = hexElementMatrices(xyz, STEEL);
    const scaleK = Math.max(...stiffness.map(Math.abs));
    for (let i = 0; i < 24; i++) {
      for (let j = 0; j < 24; j++) expect(Math.abs(stiffness[i * 24 + j] - stiffness[j * 24 + i])).toBeLessThan(1e-13 * scaleK);
    }
    const model = buildHexGrid({ xLinesM: [0, 0.1, 0.25], yLinesM: [0, 0.1], zLinesM: [0, 0.05, 0.1], material: STEEL, supports: [{ set: 'xMin', kind: 'clamp' }] });
    // Cholesky succeeds only for symmetric positive definite matrices (ml-matrix)
    expect(new CholeskyDecomposition(denseOf(model.mass)).isPositiveDefinite()).toBe(true);
    expect(new CholeskyDecomposition(denseOf(model.stiffness)).isPositiveDefinite()).toBe(true);
  });

  it('a spring to ground adds exactly its stiffness to one diagonal entry', () => {
    const plain = buildHexBox({ sizeM: [0.2, 0.1, 0.1], elements: [2, 1, 1], material: STEEL });
    const node = plain.nodes.ids[5];
    const sprung = buildHexBox({ sizeM: [0.2, 0.1, 0.1], elements: [2, 1, 1], material: STEEL, springs: [{ node, component: 2, stiffness: 1e7 }] });
    const dof = plain.nodes.dofOf[6 * 5 + 2];
    const a = denseOf(plain.stiffness);
    const b = denseOf(sprung.stiffness);
    for (let i = 0; i < a.rows; i++) {
      for (let j = 0; j < a.columns; j++) expect(b.get(i, j) - a.get(i, j)).toBeCloseTo(i === dof && j === dof ? 1e7 : 0, 6);
    }
  });
});
