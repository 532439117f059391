import { describe, expect, it } from 'vitest';
import { buildCantilever } from '../../fixtures/generator/cantilever.js';
import { computeGeometry } from '../../src/model/compute-geometry.js';
import { cumulativeFractionAt } from '../../src/model/participation.js';
import { denseModes } from './helpers.js';

describe('modal participation of a clamped cantilever (20 beam elements)', () => {
  const beam = buildCantilever({ lengthM: 2, elements: 20, widthM: 0.05, depthM: 0.08 });
  // Reference modes: dense eigen-decomposition with ml-matrix (all 120 modes).
  const modes = denseModes(beam.stiffness, beam.mass);
  const facts = computeGeometry({ stiffness: beam.stiffness, mass: beam.mass, dofMap: beam.dofMap, modes });
  const p = facts.participation!;

  it('the effective masses over all modes add up to the rigid-body mass in every direction (1e-12)', () => {
    // Completeness of M-orthonormal modes: Σ_j (φ_jᵀ M r)² = rᵀ M r (linear algebra identity).
    for (let k = 0; k < 6; k++) expect(Math.abs(cumulativeFractionAt(p, k, p.modes - 1)! - 1)).toBeLessThan(1e-12);
  });

  it('bending modes in y carry the handbook effective-mass fractions 0.6131, 0.1883, 0.0647, 0.0331', () => {
    // Reference: (∫φ)² / (L ∫φ²) of the Euler–Bernoulli clamped-free mode shapes (Blevins, Formulas
    // for Natural Frequency and Mode Shape, Table 8-1 shapes [S] docs/sources.md §7), integrated by
    // test/reference/make_cantilever_effective_mass_reference.py. The fractions refer to the whole
    // beam mass ρAL; the FE sum uses the mass on free DOFs, so Γ² is divided by ρAL here.
    const reference = [0.61307609, 0.18830036, 0.06473223, 0.03308689];
    const fractions = p.effectiveMass.map((row) => row[1] / beam.structuralMassKg).filter((f) => f > 1e-3);
    reference.forEach((f, i) => expect(Math.abs(fractions[i] - f) / f).toBeLessThan(1e-2)); // discretization error grows with the mode number
    expect(Math.abs(fractions[0] - reference[0]) / reference[0]).toBeLessThan(5e-4);
  });

  it('a supported model has no near-zero modes and is marked supported', () => {
    expect(facts.nearZeroModes).toBe(0);
    expect(facts.supported).not.toBeNull();
    expect(facts.mechanisms!.mechanisms).toBe(0);
    expect(facts.freeRigidBodyMotions).toBe(0);
  });
});
