/**
 * A slender steel cantilever meshed with 10-node tetrahedra (unstructured, shuffled numbering):
 * its first bending frequency approaches the Euler–Bernoulli value as the mesh is refined.
 */
import { describe, expect, it } from 'vitest';
import { buildTetBox } from '../../fixtures/generator/tet-bracket.js';
import { STEEL } from '../../fixtures/generator/sections.js';
import { solveModes } from '../../src/eigen/solve-modes.js';

describe('10-node tetrahedral cantilever', () => {
  it('first bending frequency converges to Euler–Bernoulli (within 0.5 % on the finest mesh)', () => {
    // Blevins, Formulas for Natural Frequency and Mode Shape (1979), single-span beams, clamped–free (docs/sources.md §7):
    // f₁ = (λ₁² / 2πL²) √(EI / m), λ₁ = 1.87510407, m = ρA per unit length.
    // Square section h × h, L/h = 20: the solid differs from the slender-beam formula by shear
    // deformation, rotary inertia and the clamp's restraint of lateral contraction, effects of
    // order (h/L)² ≈ 0.25 % (our estimate); hence 0.5 % on the finest mesh, and an error that
    // must shrink with every refinement (conforming elements approach from above: common practice).
    const L = 0.4, h = 0.02;
    const fEB = (1.87510407 ** 2 / (2 * Math.PI * L * L)) * Math.sqrt((STEEL.youngPa * h ** 4) / 12 / (STEEL.densityKgM3 * h * h));
    const errors = ([[6, 1, 1], [10, 1, 1], [20, 2, 2]] as const).map((cells) => {
      const model = buildTetBox({ sizeM: [L, h, h], cells, order: 2, clampFace: 'xMin', seed: 21 });
      const modes = solveModes(model.stiffness, model.mass, { count: 2, coordinates: model.coordinates });
      // the two bending directions have nearly equal frequencies (square section)
      expect(Math.abs(modes.frequenciesHz[1] / modes.frequenciesHz[0] - 1)).toBeLessThan(0.01);
      return modes.frequenciesHz[0] / fEB - 1;
    });
    expect(errors[0]).toBeGreaterThan(errors[1]);
    expect(errors[1]).toBeGreaterThan(errors[2]);
    expect(Math.abs(errors[2])).toBeLessThan(0.005);
  });
});
