/**
 * Constraint sets by coordinates: a clamped face selected by a plane gives the same held DOFs, and
 * the same modes to 1e-12, as the same face listed node by node; a box and a cylinder select what
 * their definitions say (plain geometry, checked node by node against the DOF map's coordinates).
 */
import { describe, expect, it } from 'vitest';
import { buildHexBox, STEEL } from '../../fixtures/generator/index.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { applyConstraints, constrainedDofMask } from '../../src/model/constraints.js';
import { InputError } from '../../src/io/errors.js';

describe('constraint sets by region', () => {
  // a free-free steel block 0.4 × 0.2 × 0.2 m
  const block = buildHexBox({ sizeM: [0.4, 0.2, 0.2], elements: [8, 4, 4], material: STEEL });
  const map = block.dofMap;
  const n = block.stiffness.n;
  const faceNodes = [...new Set(Array.from({ length: n }, (_, i) => i).filter((i) => map.x[i] === 0).map((i) => map.node[i]))];

  it('the plane x = 0 holds exactly the face listed node by node, and the modes agree to 1e-12', () => {
    const byPlane = constrainedDofMask(n, map, [{ region: { plane: { axis: 'x', at: 0 } } }]);
    const byNodes = constrainedDofMask(n, map, [{ nodes: faceNodes }]);
    expect(Array.from(byPlane)).toEqual(Array.from(byNodes));
    expect(byPlane.reduce((a, b) => a + b, 0)).toBe(3 * 5 * 5);
    const a = applyConstraints(block.stiffness, block.mass, map, [{ region: { plane: { axis: 'x', at: 0 } } }]);
    const b = applyConstraints(block.stiffness, block.mass, map, [{ nodes: faceNodes }]);
    const fa = solveModes(a.stiffness, a.mass, { count: 6 }).eigenvalues;
    const fb = solveModes(b.stiffness, b.mass, { count: 6 }).eigenvalues;
    for (let i = 0; i < 6; i++) expect(Math.abs(fa[i] - fb[i]) / fb[i]).toBeLessThan(1e-12);
    // clamped on a face: no rigid-body mode is left
    expect(fa[0]).toBeGreaterThan(1e3);
  });

  it('a box selects the nodes inside it (with the tolerance); components narrow the DOFs', () => {
    const mask = constrainedDofMask(n, map, [{ region: { box: { min: [0.35, 0, 0], max: [0.4, 0.2, 0.05] } }, components: ['uz'] }]);
    for (let i = 0; i < n; i++) {
      const inside = map.x[i] >= 0.35 - 1e-9 && map.z[i] <= 0.05 + 1e-9;
      expect(mask[i], `DOF ${i + 1}`).toBe(inside && map.component[i] === 2 ? 1 : 0);
    }
  });

  it('a cylinder selects the nodes on its surface within its axial span', () => {
    // the grid is 0.05 m: the nodes at distance 0.05 from the line along x through (·, 0.1, 0.1) are (y, z) = (0.05, 0.1), (0.15, 0.1), (0.1, 0.05), (0.1, 0.15)
    const mask = constrainedDofMask(n, map, [{ region: { cylinder: { axis: 'x', through: [0, 0.1, 0.1], radius: 0.05, from: 0.1, to: 0.2 } }, components: ['translations'] }]);
    let held = 0;
    for (let i = 0; i < n; i++) {
      const r = Math.hypot(map.y[i] - 0.1, map.z[i] - 0.1);
      const on = Math.abs(r - 0.05) < 1e-9 && map.x[i] >= 0.1 - 1e-9 && map.x[i] <= 0.2 + 1e-9;
      expect(mask[i], `DOF ${i + 1}`).toBe(on ? 1 : 0);
      held += mask[i];
    }
    // 4 nodes around the axis at x = 0.1, 0.15, 0.2, three translations each
    expect(held).toBe(4 * 3 * 3);
  });

  it('a region that holds no node is an input error naming the set', () => {
    expect(() => constrainedDofMask(n, map, [{ name: 'far plane', region: { plane: { axis: 'x', at: 5 } } }])).toThrow(InputError);
    expect(() => constrainedDofMask(n, map, [{ name: 'far plane', region: { plane: { axis: 'x', at: 5 } } }])).toThrow(/no node of the DOF map lies in the region/);
  });
});
