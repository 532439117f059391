/**
 * Demo mast: the free-free tower (ground vibration test) and its clamped counterpart.
 */
import { describe, expect, it } from 'vitest';
import { buildMast, mastMembers, MAST_BASE_NODES } from '../../fixtures/generator/mast.js';
import { symMultiply, type SymmetricCsc } from '../../src/sparse/csc.js';
import { generalizedEigenvalues } from './dense-reference.js';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';

/** rᵀ M r for a unit translation in direction `component`. */
function translationalMass(model: GeneratedModel, component: number): number {
  const r = Float64Array.from(model.dofMap.component, (c) => (c === component ? 1 : 0));
  const mr = symMultiply(model.mass, r);
  return r.reduce((s, v, i) => s + v * mr[i], 0);
}

/** Entry (i, j) of a stored lower triangle (0 when absent). */
function entry(a: SymmetricCsc, i: number, j: number): number {
  const [r, c] = i >= j ? [i, j] : [j, i];
  for (let p = a.colPtr[c]; p < a.colPtr[c + 1]; p++) if (a.rowIdx[p] === r) return a.values[p];
  return 0;
}

describe('demo mast', () => {
  const free = buildMast({ base: 'free' });

  it('free-free tower (4-panel version, same builder) has exactly 6 eigenvalues below 1e-6·λ7', () => {
    // A free body in 3D has 6 rigid-body modes (common practice). Dense check on a smaller tower
    // built by the same code; the 12 m demo tower is checked by the eigen engine's tests.
    const small = buildMast({ base: 'free', panels: 4, segmentsPerMember: 1 });
    const ev = generalizedEigenvalues(small.stiffness, small.mass);
    expect(ev.filter((l) => Math.abs(l) < 1e-6 * ev[6]).length).toBe(6);
  });

  it('total mass rᵀMr equals Σ ρ·A·L over members plus the point masses (1e-12)', () => {
    // Consistent beam/rod mass reproduces ρAL per element (Hermite/linear shape functions sum to 1; from memory).
    const { nodes, members, pointMasses } = mastMembers({ base: 'free' });
    const at = new Map(nodes.map((n) => [n.id, n]));
    let expected = pointMasses.reduce((s, p) => s + p.massKg, 0);
    // Σ ρ A |b − a| over members (members split into segments keep their total length)
    for (const m of members) {
      const a = at.get(m.nodes[0])!;
      const b = at.get(m.nodes[1])!;
      expected += m.material.densityKgM3 * m.section.areaM2 * Math.hypot(b.x - a.x, b.y - a.y, b.z - a.z);
    }
    for (let c = 0; c < 3; c++) expect(Math.abs(translationalMass(free, c) / expected - 1)).toBeLessThan(1e-12);
  });

  it('clamping the base feet of the free-free tower reproduces the clamped mast exactly', () => {
    const clamped = buildMast({ base: 'clamped' });
    const removed = new Set(MAST_BASE_NODES);
    const keep: number[] = [];
    // DOFs of the free model that survive clamping the base feet
    for (let d = 0; d < free.dofMap.n; d++) if (!removed.has(free.dofMap.node[d])) keep.push(d);
    expect(keep.length).toBe(clamped.stiffness.n);
    for (let j = 0; j < keep.length; j++) {
      expect(clamped.dofMap.node[j]).toBe(free.dofMap.node[keep[j]]);
      expect(clamped.dofMap.component[j]).toBe(free.dofMap.component[keep[j]]);
      for (let p = clamped.stiffness.colPtr[j]; p < clamped.stiffness.colPtr[j + 1]; p++) {
        expect(clamped.stiffness.values[p]).toBe(entry(free.stiffness, keep[clamped.stiffness.rowIdx[p]], keep[j]));
      }
    }
    expect(clamped.stiffness.colPtr[clamped.stiffness.n]).toBeGreaterThan(0);
  });

  it('the thin-brace variant differs from the mast only around that brace', () => {
    const mast = buildMast({ base: 'clamped' });
    const thin = buildMast({ base: 'clamped', thinBrace: true });
    expect(thin.stiffness.n).toBe(mast.stiffness.n);
    // brace "diagonal face 1 panel 1" runs from leg node 1 to leg node 5 through one interior node
    const touched = new Set<number>();
    for (let d = 0; d < mast.stiffness.n; d++) {
      for (let p = mast.stiffness.colPtr[d]; p < mast.stiffness.colPtr[d + 1]; p++) {
        if (mast.stiffness.values[p] !== entry(thin.stiffness, mast.stiffness.rowIdx[p], d)) {
          touched.add(mast.dofMap.node[d]);
          touched.add(mast.dofMap.node[mast.stiffness.rowIdx[p]]);
        }
      }
    }
    expect(touched.has(5)).toBe(true);
    expect(touched.size).toBe(2); // node 5 and the brace's interior node (node 1 is clamped)
  });
});
