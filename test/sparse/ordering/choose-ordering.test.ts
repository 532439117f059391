import { describe, expect, it } from 'vitest';
import { countFactorNonzeros } from '../../../src/sparse/column-counts.js';
import { chooseOrdering } from '../../../src/sparse/ordering/choose-ordering.js';
import { buildHexBox } from '../../../fixtures/generator/hex-solid.js';
import { STEEL } from '../../../fixtures/generator/sections.js';
import { adjacencyOfPencil } from '../../../src/sparse/ordering/adjacency-graph.js';
import { exactFactorNonzeros } from './exact-fill.js';
import { expectPermutation } from './ordering-helpers.js';

describe('chooseOrdering', () => {
  const model = buildHexBox({ sizeM: [1, 0.8, 0.6], elements: [9, 7, 5], material: STEEL, clampFace: 'xMin' });
  const { stiffness, mass, coordinates } = model;

  it('with auto computes every candidate and keeps the least predicted fill', () => {
    const r = chooseOrdering(stiffness, mass, { ordering: 'auto', coordinates, nodeOfDof: model.dofMap.node, dissectionMinFlops: 0 });
    expectPermutation(r.perm, stiffness.n);
    expect(r.candidates.map((c) => c.name)).toEqual(['natural', 'amd', 'coordinate-bisection', 'nested-dissection']);
    expect(r.skipped).toBeUndefined();
    expect(r.predictedNnzL).toBe(Math.min(...r.candidates.map((c) => c.nnzL)));
    expect(r.candidates.find((c) => c.name === r.name)!.nnzL).toBe(r.predictedNnzL);
    // every DOF of a node is one supervariable: 10·8·6 nodes less the clamped face
    expect(r.supervariables).toBe(10 * 8 * 6 - 8 * 6);
  });

  it('with auto leaves the graph dissection out when the best cheap ordering factors in few flops', () => {
    const r = chooseOrdering(stiffness, mass, { ordering: 'auto', coordinates, nodeOfDof: model.dofMap.node });
    expectPermutation(r.perm, stiffness.n);
    expect(r.candidates.map((c) => c.name)).toEqual(['natural', 'amd', 'coordinate-bisection']);
    expect(r.skipped).toMatch(/nested dissection not computed: \w[\w-]* needs [0-9.e+]+ flops, below 2e\+10/);
    expect(r.predictedNnzL).toBe(Math.min(...r.candidates.map((c) => c.nnzL)));
    // the threshold counts the flops of the best cheap candidate: just above them, the dissection runs
    const again = chooseOrdering(stiffness, mass, { ordering: 'auto', coordinates, nodeOfDof: model.dofMap.node, dissectionMinFlops: 1 });
    expect(again.candidates.map((c) => c.name)).toContain('nested-dissection');
  });

  it('predicts nnz(L) exactly: equals an independent symbolic count on the union pattern', () => {
    const r = chooseOrdering(stiffness, mass, { ordering: 'amd' });
    // two different counters: row-subtree climbing (test helper) and column counts (src)
    expect(r.predictedNnzL).toBe(exactFactorNonzeros(adjacencyOfPencil(stiffness, mass), r.perm));
    // the union pattern of K and M holds that of K, so its fill is at least that of K alone
    expect(r.predictedNnzL).toBeGreaterThanOrEqual(countFactorNonzeros(stiffness, r.perm));
  });

  it('gives the chosen ordering far less fill than natural order on a small hex solid', () => {
    const r = chooseOrdering(stiffness, mass, { coordinates });
    const natural = r.candidates.find((c) => c.name === 'natural')!.nnzL;
    expect(r.predictedNnzL).toBeLessThan(0.6 * natural);
  });

  it('honours a requested ordering and uses the given predictor', () => {
    const r = chooseOrdering(stiffness, mass, { ordering: 'nested-dissection', predictNnzL: () => 42 });
    expect(r.name).toBe('nested-dissection');
    expect(r.predictedNnzL).toBe(42);
    expectPermutation(r.perm, stiffness.n);
    const natural = chooseOrdering(stiffness, undefined, { ordering: 'natural' });
    expect(Array.from(natural.perm.subarray(0, 5))).toEqual([0, 1, 2, 3, 4]);
  });

  it('refuses coordinate bisection without coordinates, and coordinates of the wrong length', () => {
    expect(() => chooseOrdering(stiffness, mass, { ordering: 'coordinate-bisection' })).toThrow(/coordinates/);
    expect(() => chooseOrdering(stiffness, mass, { coordinates: new Float64Array(3) })).toThrow(/coordinates/);
  });
});
