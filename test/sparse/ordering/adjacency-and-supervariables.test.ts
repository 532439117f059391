import { describe, expect, it } from 'vitest';
import { assembleSymmetric, TripletList } from '../../../src/sparse/assemble.js';
import { adjacencyOfPencil } from '../../../src/sparse/ordering/adjacency-graph.js';
import { expandOrdering, findSupervariables, type Supervariables } from '../../../src/sparse/ordering/supervariables.js';
import { buildHexBox } from '../../../fixtures/generator/hex-solid.js';
import { buildFrame } from '../../../fixtures/generator/frame-builder.js';
import { circularHollowSection, STEEL } from '../../../fixtures/generator/sections.js';
import { gridPattern } from './grid-patterns.js';
import { expectPermutation } from './ordering-helpers.js';

function symmetricFromEntries(n: number, entries: [number, number][]) {
  const t = new TripletList();
  for (let i = 0; i < n; i++) t.push(i, i, 1);
  for (const [i, j] of entries) t.push(i, j, 1);
  return assembleSymmetric(n, t).matrix;
}

describe('adjacencyOfPencil', () => {
  it('is the union pattern of K and M without self loops, sorted and symmetric', () => {
    // K couples 0-1, 1-2; M couples 0-1 (again) and 3-0: the union has edges 0-1, 1-2, 0-3
    const k = symmetricFromEntries(4, [[1, 0], [2, 1]]);
    const m = symmetricFromEntries(4, [[1, 0], [3, 0]]);
    const g = adjacencyOfPencil(k, m);
    const lists = Array.from({ length: 4 }, (_, v) => Array.from(g.adj.subarray(g.ptr[v], g.ptr[v + 1])));
    expect(lists).toEqual([[1, 3], [0, 2], [1], [0]]);
  });

  it('gives each node of a 27-point grid its 26 neighbours in the interior', () => {
    const { matrix } = gridPattern(3, 3, 3, 1);
    const g = adjacencyOfPencil(matrix);
    const centre = 13; // node (1,1,1)
    expect(g.ptr[centre + 1] - g.ptr[centre]).toBe(26);
  });
});

function expectGroupsWithinNodes(sv: Supervariables, nodeOfDof: Int32Array): void {
  let mixed = 0;
  // every supervariable's members carry one node id
  for (let s = 0; s < sv.count; s++) {
    for (let p = sv.memberPtr[s] + 1; p < sv.memberPtr[s + 1]; p++) {
      if (nodeOfDof[sv.members[p]] !== nodeOfDof[sv.members[sv.memberPtr[s]]]) mixed++;
    }
  }
  expect(mixed).toBe(0);
}

describe('findSupervariables', () => {
  it('finds the 3 DOFs of every node of a 3-DOF-per-node solid pattern', () => {
    const { matrix } = gridPattern(5, 4, 3, 3);
    const sv = findSupervariables(adjacencyOfPencil(matrix));
    expect(sv.count).toBe(5 * 4 * 3);
    expect(Array.from(new Set(sv.weight))).toEqual([3]);
    // every supervariable is the three consecutive DOFs of one node
    for (let s = 0; s < sv.count; s++) {
      const m = Array.from(sv.members.subarray(sv.memberPtr[s], sv.memberPtr[s + 1]));
      expect(m[1] - m[0]).toBe(1);
      expect(m[2] - m[0]).toBe(2);
      expect(m[0] % 3).toBe(0);
    }
  });

  it('groups the DOFs of each node of a generated hex solid by DOF map or coordinates', () => {
    // the generator drops exact zeros inside node blocks, so DOFs of a node differ in pattern
    const model = buildHexBox({ sizeM: [0.4, 0.3, 0.2], elements: [4, 3, 2], material: STEEL });
    const graph = adjacencyOfPencil(model.stiffness, model.mass);
    for (const options of [{ nodeOfVertex: model.dofMap.node }, { coordinates: model.coordinates }]) {
      const sv = findSupervariables(graph, options);
      expect(sv.count).toBe(5 * 4 * 3);
      expect(Array.from(new Set(sv.weight))).toEqual([3]);
      expectGroupsWithinNodes(sv, model.dofMap.node);
    }
  });

  it('never merges DOFs of different nodes from the pattern alone', () => {
    const model = buildHexBox({ sizeM: [0.4, 0.3, 0.2], elements: [4, 3, 2], material: STEEL });
    const sv = findSupervariables(adjacencyOfPencil(model.stiffness, model.mass));
    expect(sv.count).toBeLessThan(model.stiffness.n);
    expectGroupsWithinNodes(sv, model.dofMap.node);
  });

  it('finds the 6 DOFs of each beam node of a generated frame from its DOF map', () => {
    // a three-member portal: 4 nodes, 6 DOF each, no supports
    const section = circularHollowSection(0.1, 0.005);
    const model = buildFrame({
      nodes: [
        { id: 1, x: 0, y: 0, z: 0 },
        { id: 2, x: 0, y: 0, z: 3 },
        { id: 3, x: 4, y: 0, z: 3 },
        { id: 4, x: 4, y: 0, z: 0 },
      ],
      members: [
        { kind: 'beam', nodes: [1, 2], section, material: STEEL },
        { kind: 'beam', nodes: [2, 3], section, material: STEEL },
        { kind: 'beam', nodes: [3, 4], section, material: STEEL },
      ],
    });
    const sv = findSupervariables(adjacencyOfPencil(model.stiffness, model.mass), { nodeOfVertex: model.dofMap.node });
    expect(sv.count).toBe(4);
    expect(Array.from(sv.weight)).toEqual([6, 6, 6, 6]);
  });

  it('keeps vertices apart when their neighbourhoods differ only slightly', () => {
    // path 0-1-2-3: closed neighbourhoods {0,1}, {0,1,2}, {1,2,3}, {2,3} are all different
    const sv = findSupervariables(adjacencyOfPencil(symmetricFromEntries(4, [[1, 0], [2, 1], [3, 2]])));
    expect(sv.count).toBe(4);
  });

  it('expands an ordering of supervariables member by member into a permutation', () => {
    const { matrix } = gridPattern(4, 4, 3, 3);
    const sv = findSupervariables(adjacencyOfPencil(matrix));
    const reversed = Int32Array.from({ length: sv.count }, (_, k) => sv.count - 1 - k);
    const perm = expandOrdering(sv, reversed);
    expectPermutation(perm, matrix.n);
    expect(Array.from(perm.subarray(0, 3))).toEqual([matrix.n - 3, matrix.n - 2, matrix.n - 1]);
  });
});
