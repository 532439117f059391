import { describe, expect, it } from 'vitest';
import { buildMast, MAST_BASE_NODES } from '../../fixtures/generator/mast.js';
import { buildCantilever } from '../../fixtures/generator/cantilever.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { applyConstraints, constrainedDofMask, removeDofs } from '../../src/model/constraints.js';
import { parseDofNumbers } from '../../src/io/dof-number-file.js';
import { InputError } from '../../src/io/errors.js';
import { denseOf } from './helpers.js';
import { computeGeometry } from '../../src/model/compute-geometry.js';

describe('constraint sets', () => {
  const beam = buildCantilever({ lengthM: 1, elements: 4, clamped: false });

  it('the reduced K and M are the kept rows and columns of the dense matrices', () => {
    const reduced = applyConstraints(beam.stiffness, beam.mass, beam.dofMap, [{ nodes: [1], components: ['all'] }, { nodeRange: [3, 3], components: ['uy', 'rz'] }]);
    expect(reduced.removedDofs.length).toBe(8);
    const kFull = denseOf(beam.stiffness);
    const kRed = denseOf(reduced.stiffness);
    const mFull = denseOf(beam.mass);
    const mRed = denseOf(reduced.mass);
    // entry-by-entry: K_FF(r, s) = K(kept[r], kept[s])
    for (let r = 0; r < reduced.keptDofs.length; r++) {
      for (let s = 0; s < reduced.keptDofs.length; s++) {
        expect(kRed.get(r, s)).toBe(kFull.get(reduced.keptDofs[r], reduced.keptDofs[s]));
        expect(mRed.get(r, s)).toBe(mFull.get(reduced.keptDofs[r], reduced.keptDofs[s]));
      }
    }
    // the reduced DOF map names original nodes and components
    for (let r = 0; r < reduced.keptDofs.length; r++) {
      expect(reduced.dofMap!.node[r]).toBe(beam.dofMap.node[reduced.keptDofs[r]]);
      expect(reduced.dofMap!.component[r]).toBe(beam.dofMap.component[reduced.keptDofs[r]]);
      expect(reduced.reducedIndex[reduced.keptDofs[r]]).toBe(r);
    }
    for (const d of reduced.removedDofs) expect(reduced.reducedIndex[d]).toBe(-1);
  });

  it('selectors: translations, rotations and DOF numbers', () => {
    const t = constrainedDofMask(beam.stiffness.n, beam.dofMap, [{ nodes: [2], components: ['translations'] }]);
    const r = constrainedDofMask(beam.stiffness.n, beam.dofMap, [{ nodes: [2], components: ['rotations'] }]);
    const d = constrainedDofMask(beam.stiffness.n, undefined, [{ dofs: [1, 5, 30] }]);
    expect(t.reduce((a, b) => a + b, 0)).toBe(3);
    expect(r.reduce((a, b) => a + b, 0)).toBe(3);
    expect([...d].flatMap((v, i) => (v ? [i + 1] : []))).toEqual([1, 5, 30]);
  });

  it('bad constraint sets are input errors with one plain sentence', () => {
    const n = beam.stiffness.n;
    expect(() => constrainedDofMask(n, beam.dofMap, [{ nodes: [77] }])).toThrow(/no DOF of the DOF map belongs to the listed nodes/);
    expect(() => constrainedDofMask(n, undefined, [{ nodes: [1] }])).toThrow(InputError);
    expect(() => constrainedDofMask(n, beam.dofMap, [{ dofs: [n + 1] }])).toThrow(/outside 1\.\./);
    expect(() => constrainedDofMask(n, beam.dofMap, [{ nodes: [1], components: ['uw' as 'ux'] }])).toThrow(/unknown component "uw"/);
    expect(() => constrainedDofMask(n, beam.dofMap, [{}])).toThrow(/needs nodes, nodeRange, region or dofs/);
  });

  it('DOF number files: whitespace, commas, comments; a bad token names its line', () => {
    expect(parseDofNumbers('# held DOFs\n1 2, 3\n\n10 % tail\n', 'held.txt')).toEqual([1, 2, 3, 10]);
    try {
      parseDofNumbers('1\n2\nx3\n', 'held.txt');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).line).toBe(3);
    }
  });

  it('removing nothing returns the same matrices', () => {
    const same = removeDofs(beam.stiffness, beam.mass, beam.dofMap, new Uint8Array(beam.stiffness.n));
    expect(Array.from(same.stiffness.values)).toEqual(Array.from(beam.stiffness.values));
    expect(same.keptDofs.length).toBe(beam.stiffness.n);
  });
});

describe('free-free mast clamped through constraint sets = the clamped mast', () => {
  it('gives the same lowest 8 frequencies (1e-9 relative)', () => {
    // Reference: the generator's separately built clamped mast (DOFs removed at assembly).
    const free = buildMast({ base: 'free' });
    const clamped = buildMast({ base: 'clamped' });
    const reduced = applyConstraints(free.stiffness, free.mass, free.dofMap, [{ name: 'base clamp', nodes: MAST_BASE_NODES, components: ['all'] }]);
    expect(reduced.stiffness.n).toBe(clamped.stiffness.n);
    const a = solveModes(reduced.stiffness, reduced.mass, { count: 8 });
    const b = solveModes(clamped.stiffness, clamped.mass, { count: 8 });
    for (let i = 0; i < 8; i++) expect(Math.abs(a.frequenciesHz[i] - b.frequenciesHz[i]) / b.frequenciesHz[i]).toBeLessThan(1e-9);
  });
});

describe('geometry facts of a model reduced by constraint sets', () => {
  it('mass properties describe the whole model; the model is marked supported; DOF numbers are original', () => {
    const beam = buildCantilever({ lengthM: 1, elements: 4, clamped: false });
    const reduced = applyConstraints(beam.stiffness, beam.mass, beam.dofMap, [{ name: 'root', nodes: [1] }]);
    const facts = computeGeometry({
      stiffness: reduced.stiffness,
      mass: reduced.mass,
      dofMap: reduced.dofMap!,
      originalDofs: reduced.keptDofs,
      constraints: { sets: ['root'], removedDofs: reduced.removedDofs.length, keptDofs: reduced.keptDofs.length },
      unconstrained: { mass: beam.mass, dofMap: beam.dofMap },
    });
    // Source: the generator's Σ ρ·A·L (the held root node's mass is part of the model).
    expect(Math.abs(facts.massProperties.totalMass - beam.structuralMassKg) / beam.structuralMassKg).toBeLessThan(1e-12);
    expect(facts.supported!.reason).toMatch(/root/);
    expect(facts.freeRigidBodyMotions).toBe(0);
    // residual DOFs are named by their original numbers (node 1 held: original DOFs 1..6 are gone)
    for (const r of facts.rigidBodyEnergy.largestResiduals) expect(r.dof).toBeGreaterThan(6);
  });
});
