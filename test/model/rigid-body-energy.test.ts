import { describe, expect, it } from 'vitest';
import { buildHexBox } from '../../fixtures/generator/hex-solid.js';
import { buildCantilever } from '../../fixtures/generator/cantilever.js';
import { STEEL } from '../../fixtures/generator/sections.js';
import { computeGeometry } from '../../src/model/compute-geometry.js';
import { rigidBodyVectorsAboutCenterOfMass } from '../../src/model/mass-properties.js';
import { denseModes, largestPrincipalAngle } from './helpers.js';

describe('rigid-body energy of free-free models', () => {
  const models = {
    'hex box (3 DOF nodes)': buildHexBox({ sizeM: [0.3, 0.2, 0.5], elements: [2, 2, 3], material: STEEL }),
    'beam frame (6 DOF nodes)': buildCantilever({ lengthM: 2, elements: 8, widthM: 0.05, depthM: 0.08, clamped: false }),
  };
  for (const [name, model] of Object.entries(models)) {
    it(`${name}: the six rigid-body vectors have strain energy ≤ 1e-10 relative and span the near-zero modes (angle ≤ 1e-6)`, () => {
      // Reference modes: dense eigen-decomposition with ml-matrix (outside the project).
      const modes = denseModes(model.stiffness, model.mass, 12);
      const facts = computeGeometry({ stiffness: model.stiffness, mass: model.mass, dofMap: model.dofMap, modes });
      expect(facts.nearZeroModes).toBe(6);
      expect(facts.rigidBodyEnergy.referenceSource).toBe('first-elastic-mode');
      expect(facts.rigidBodyEnergy.referenceEigenvalue).toBe(modes.eigenvalues[6]);
      for (const d of facts.rigidBodyEnergy.directions) expect(Math.abs(d.relativeEnergy!)).toBeLessThan(1e-10);
      const { rigid } = rigidBodyVectorsAboutCenterOfMass(model.dofMap, model.mass);
      // Free-free 3-D model: six rigid-body modes (ECSS-E-ST-32-03C "first six", [S] docs/sources.md §1a).
      const angle = largestPrincipalAngle(rigid.vectors, 6, modes.shapes.subarray(0, 6 * model.stiffness.n), 6, model.mass);
      expect(angle).toBeLessThan(1e-6);
      expect(facts.mechanisms!.mechanisms).toBe(0);
      expect(facts.mechanisms!.freeRigidBodyMotions).toBe(6);
      expect(facts.supported).toBeNull();
      expect(facts.freeRigidBodyMotions).toBe(6);
    });
  }

  for (const [name, model] of Object.entries(models)) {
    it(`${name}: without modes the reference is a smooth-field Ritz value, an upper bound of λ₇ within a factor 10`, () => {
      // Courant–Fischer: a Rayleigh–Ritz value over fields M-orthogonal to the rigid-body space is ≥ λ₇
      // (reference λ₇ from the dense ml-matrix solve).
      const lambda7 = denseModes(model.stiffness, model.mass, 7).eigenvalues[6];
      const facts = computeGeometry({ stiffness: model.stiffness, mass: model.mass, dofMap: model.dofMap });
      expect(facts.rigidBodyEnergy.referenceSource).toBe('smooth-field-estimate');
      const estimate = facts.rigidBodyEnergy.referenceEigenvalue;
      expect(estimate).toBeGreaterThanOrEqual(lambda7 * (1 - 1e-9));
      expect(estimate).toBeLessThan(10 * lambda7);
      expect(Math.abs(facts.rigidBodyEnergy.maxRelativeEnergy)).toBeLessThan(1e-10);
      expect(facts.participation).toBeNull();
      expect(facts.mechanisms).toBeNull();
    });
  }
});

describe('unintended grounding: a spring to ground at one node', () => {
  const free = buildHexBox({ sizeM: [0.3, 0.2, 0.5], elements: [2, 2, 3], material: STEEL });
  const groundedNode = free.nodes.ids[17];
  const model = buildHexBox({
    sizeM: [0.3, 0.2, 0.5],
    elements: [2, 2, 3],
    material: STEEL,
    springs: [{ node: groundedNode, component: 1, stiffness: 1e6 }],
  });

  it('raises the rigid-body energy far above 1e-8 and names the grounded node first', () => {
    const modes = denseModes(model.stiffness, model.mass, 12);
    const facts = computeGeometry({ stiffness: model.stiffness, mass: model.mass, dofMap: model.dofMap, modes, expectedRigidBodyModes: 6 });
    // λ_ref is mode 7 (the first truly elastic one), not the low grounding mode
    expect(facts.rigidBodyEnergy.referenceEigenvalue).toBe(modes.eigenvalues[6]);
    expect(facts.rigidBodyEnergy.maxRelativeEnergy).toBeGreaterThan(1e-8);
    const top = facts.rigidBodyEnergy.largestResiduals[0];
    expect(top.node).toBe(groundedNode);
    expect(top.component).toBe('uy');
    // a unit y translation stretches only the spring: strain energy ½ k · 1² (Hooke's law)
    const uy = facts.rigidBodyEnergy.directions.find((d) => d.direction === 'uy')!;
    expect(Math.abs(uy.strainEnergy - 0.5e6) / 0.5e6).toBeLessThan(1e-6);
    expect(facts.rigidBodyEnergy.largestResiduals.length).toBeLessThanOrEqual(10);
    // the spring removes one free rigid motion (the one it stretches)
    expect(facts.freeRigidBodyMotions).toBe(5);
  });

  it('without modes it is caught too (against the stiffness/mass scale)', () => {
    const facts = computeGeometry({ stiffness: model.stiffness, mass: model.mass, dofMap: model.dofMap });
    expect(facts.rigidBodyEnergy.maxRelativeEnergy).toBeGreaterThan(1e-8);
    expect(facts.rigidBodyEnergy.largestResiduals[0].node).toBe(groundedNode);
  });
});
