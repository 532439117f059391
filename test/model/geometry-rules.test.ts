import { describe, expect, it } from 'vitest';
import { buildHexBox } from '../../fixtures/generator/hex-solid.js';
import { buildCantilever } from '../../fixtures/generator/cantilever.js';
import { STEEL } from '../../fixtures/generator/sections.js';
import { rigidBodyEnergy } from '../../src/rules/rigid-body-energy.js';
import { totalMass } from '../../src/rules/total-mass.js';
import { centerOfMass } from '../../src/rules/center-of-mass.js';
import { massConsistency } from '../../src/rules/mass-consistency.js';
import { massParticipation } from '../../src/rules/mass-participation.js';
import { denseModes } from './helpers.js';
import { geometryContext as contextOf } from '../rules/geometry-context.js';
import { runRule as run } from '../rules/rule-tester.js';

const size = [0.3, 0.2, 0.5] as const;
const free = buildHexBox({ sizeM: size, elements: [2, 2, 3], material: STEEL });
const massKg = STEEL.densityKgM3 * size[0] * size[1] * size[2]; // ρ·V

describe('rigid-body-energy rule', () => {
  it('passes on the free-free block', () => {
    const r = run(rigidBodyEnergy, contextOf(free, denseModes(free.stiffness, free.mass, 10)));
    expect(r.status).toBe('pass');
  });

  it('fails on a block grounded by a spring at one node and names that node first (message and details)', () => {
    const node = free.nodes.ids[22];
    const grounded = buildHexBox({ sizeM: size, elements: [2, 2, 3], material: STEEL, springs: [{ node, component: 0, stiffness: 5e5 }] });
    const r = run(rigidBodyEnergy, contextOf(grounded, denseModes(grounded.stiffness, grounded.mass, 10), 6));
    expect(r.status).toBe('fail');
    expect(r.message).toMatch(new RegExp(`grounded near node ${node} ux`));
    const list = r.details!.largestResiduals as { node: number }[];
    expect(list[0].node).toBe(node);
    expect(list.length).toBeLessThanOrEqual(10);
  });

  it('skips a supported model with the reason', () => {
    const beam = buildCantilever({ lengthM: 1, elements: 6 });
    const r = run(rigidBodyEnergy, contextOf(beam, denseModes(beam.stiffness, beam.mass, 6)));
    expect(r.status).toBe('skip');
    expect(r.message).toMatch(/supported/);
  });

  it('skips without geometry facts', () => {
    const c = contextOf(free);
    delete c.geometry;
    expect(run(rigidBodyEnergy, c).status).toBe('skip');
  });
});

describe('mass rules', () => {
  const context = contextOf(free);
  it('total-mass: ρ·V passes, 2 % off fails at 1 %', () => {
    // Source: m = ρ V for the homogeneous block.
    expect(run(totalMass, context, { expected: massKg }).status).toBe('pass');
    const r = run(totalMass, context, { expected: massKg * 1.02 });
    expect(r.status).toBe('fail');
    expect(r.message).toMatch(/differs from the expected/);
  });

  it('center-of-mass: the block centre passes, a point 1 cm away fails at 5 mm', () => {
    // Source: centroid of a homogeneous cuboid = its centre.
    const centre: [number, number, number] = [size[0] / 2, size[1] / 2, size[2] / 2];
    expect(run(centerOfMass, context, { expected: centre, maxDistance: 1e-9 }).status).toBe('pass');
    expect(run(centerOfMass, context, { expected: [centre[0] + 0.01, centre[1], centre[2]], maxDistance: 0.005 }).status).toBe('fail');
  });

  it('mass-consistency: passes on a complete mass matrix, fails and names uz when uz mass is missing', () => {
    expect(run(massConsistency, context).status).toBe('pass');
    const uzDofs = new Set(Array.from(free.dofMap.component).flatMap((c, i) => (c === 2 && i % 5 === 0 ? [i] : [])));
    const values = free.mass.values.slice();
    for (let j = 0; j < free.mass.n; j++) {
      for (let p = free.mass.colPtr[j]; p < free.mass.colPtr[j + 1]; p++) if (uzDofs.has(j) || uzDofs.has(free.mass.rowIdx[p])) values[p] = 0;
    }
    const damaged = { ...free, mass: { ...free.mass, values } };
    const r = run(massConsistency, contextOf(damaged));
    expect(r.status).toBe('fail');
    expect(r.message).toMatch(/uz lacks mass/);
  });
});

describe('mass-participation rule', () => {
  const beam = buildCantilever({ lengthM: 2, elements: 12, widthM: 0.05, depthM: 0.08 });
  const all = denseModes(beam.stiffness, beam.mass);
  it('the first bending mode alone carries ~61 % in uy: fails 0.9, passes 0.6', () => {
    // Source: cantilever first-mode effective mass ≈ 0.613 of the beam (see participation.test.ts).
    const one = denseModes(beam.stiffness, beam.mass, 2); // first bending pair (y and z)
    const c = contextOf(beam, one);
    expect(run(massParticipation, c, { directions: ['uy'] }).status).toBe('fail');
    expect(run(massParticipation, c, { directions: ['uy'], minFraction: 0.6 }).status).toBe('pass');
  });

  it('all modes carry all the mass; maxHz limits the modes counted', () => {
    const c = contextOf(beam, all);
    expect(run(massParticipation, c, { directions: ['uy', 'uz'] }).status).toBe('pass');
    const r = run(massParticipation, c, { directions: ['uy'], maxHz: all.frequenciesHz[0] * 1.01 });
    expect(r.status).toBe('fail');
    expect((r.details!.modesConsidered as number)).toBeLessThanOrEqual(2);
  });

  it('skips a free-free model', () => {
    expect(run(massParticipation, contextOf(free, denseModes(free.stiffness, free.mass, 10))).status).toBe('skip');
  });
});
