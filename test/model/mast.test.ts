/**
 * The demo mast scenarios (fixtures/generator/mast.ts), solved with the project's own eigensolver:
 * free-free rigid-body checks and the unfastened guy anchor.
 */
import { describe, expect, it } from 'vitest';
import { buildMast, MAST_ANCHOR_NODES } from '../../fixtures/generator/mast.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { computeGeometry } from '../../src/model/compute-geometry.js';
import { rigidBodyVectorsAboutCenterOfMass } from '../../src/model/mass-properties.js';
import { largestPrincipalAngle } from './helpers.js';

describe('free-free mast', () => {
  const mast = buildMast({ base: 'free' });
  const modes = solveModes(mast.stiffness, mast.mass, { count: 10, coordinates: mast.coordinates });
  const facts = computeGeometry({ stiffness: mast.stiffness, mass: mast.mass, dofMap: mast.dofMap, modes });

  it('six rigid-body vectors: strain energy ≤ 1e-10 relative to ½ λ₇ rᵀMr, spanning the six computed near-zero modes (≤ 1e-6 rad)', () => {
    // Free-free 3-D model: six rigid-body modes (ECSS-E-ST-32-03C "first six", [S] docs/sources.md §1a).
    expect(facts.nearZeroModes).toBe(6);
    expect(facts.freeRigidBodyMotions).toBe(6);
    for (const d of facts.rigidBodyEnergy.directions) expect(Math.abs(d.relativeEnergy!)).toBeLessThan(1e-10);
    const { rigid } = rigidBodyVectorsAboutCenterOfMass(mast.dofMap, mast.mass);
    const angle = largestPrincipalAngle(rigid.vectors, 6, modes.shapes.subarray(0, 6 * mast.stiffness.n), 6, mast.mass);
    expect(angle).toBeLessThan(1e-6);
    expect(facts.mechanisms!.mechanisms).toBe(0);
  });

  it('total mass equals Σ ρAL of the members plus the lumped masses', () => {
    // Source: the generator's exact Σ ρ·A·L + point masses (independent of the mass matrix).
    for (const m of facts.massProperties.translationalMass) expect(Math.abs(m - mast.structuralMassKg) / mast.structuralMassKg).toBeLessThan(1e-12);
  });
});

describe('clamped mast with one guy anchor left unfastened', () => {
  it('the near-zero mode is a mechanism whose kinetic energy is at the loose anchor first', () => {
    const loose = MAST_ANCHOR_NODES[1];
    const mast = buildMast({ base: 'clamped', guyed: true, looseAnchors: [loose] });
    const modes = solveModes(mast.stiffness, mast.mass, { count: 6, coordinates: mast.coordinates });
    const facts = computeGeometry({ stiffness: mast.stiffness, mass: mast.mass, dofMap: mast.dofMap, modes });
    expect(facts.nearZeroModes).toBeGreaterThanOrEqual(1);
    expect(facts.freeRigidBodyMotions).toBe(0);
    expect(facts.mechanisms!.mechanisms).toBe(facts.nearZeroModes);
    expect(facts.mechanisms!.nodes[0].node).toBe(loose);
  });
});
