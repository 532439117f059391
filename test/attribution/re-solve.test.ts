/**
 * Attribution against exact re-solves on generated models: a lattice mast (beam frame) with one
 * bracing member stiffened, and a hexahedral cantilever with one slice of elements stiffened,
 * each by 0.1 %, 1 % and 10 %. Both sides are solved by solveModes; the first-order estimate
 * δλ_est = φᵀ(K₁ − λM₁)φ misses the exact shift by a term of second order in the change
 * (first-order perturbation theory, Fox & Kapoor 1968, docs/sources.md §2b), so its error
 * shrinks about 100 times per decade of the change. The mast's bending pairs are repeated
 * eigenvalues (three-fold symmetry): they are estimated with the degenerate form of the theory
 * (the eigenvalues of Φ_gᵀ(K₁ − λ̄M₁)Φ_g over the pair) and must show the same order.
 */
import { describe, expect, it } from 'vitest';
import { buildFrame, buildHexBox, dofOfNode, hexElementMatrices, mastMembers, STEEL, MAST_THIN_BRACE, type GeneratedModel } from '../../fixtures/generator/index.js';
import { HEX_CORNERS } from '../../fixtures/generator/elements/hex8.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { assembleSymmetric, TripletList } from '../../src/sparse/assemble.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';
import { explainAgainst, type TestModel } from './chain-helpers.js';

const CHANGES = [1e-3, 1e-2, 1e-1];

/** The 4-panel mast, base clamped, with the member MAST_THIN_BRACE's modulus scaled by (1 + change). */
function mast(change: number): GeneratedModel {
  const { nodes, members, pointMasses } = mastMembers({ base: 'clamped', panels: 4 });
  const changed = members.map((m) => (m.name === MAST_THIN_BRACE ? { ...m, material: { ...m.material, youngPa: m.material.youngPa * (1 + change) } } : m));
  return buildFrame({ nodes, members: changed, pointMasses, supports: [{ nodes: [1, 2, 3], kind: 'clamp' }], firstInteriorNodeId: 1001 });
}

/** A steel hex cantilever 0.4 × 0.1 × 0.06 m (8 × 2 × 2 elements, x = 0 clamped) with cells i = 3 stiffened by (1 + change). */
const HEX = { sizeM: [0.4, 0.1, 0.06] as const, elements: [8, 2, 2] as const };
function hexCantilever(change: number): TestModel & { model: GeneratedModel } {
  const model = buildHexBox({ sizeM: HEX.sizeM, elements: HEX.elements, material: STEEL, clampFace: 'xMin' });
  if (change === 0) return { ...model, model };
  const [nx, ny] = HEX.elements;
  const h = HEX.sizeM.map((s, a) => s / HEX.elements[a]);
  const extra = { ...STEEL, youngPa: STEEL.youngPa * change };
  const t = new TripletList();
  const k = model.stiffness;
  // K₀'s stored entries, then change · K_e of every cell in the slice i = 3
  for (let j = 0; j < k.n; j++) for (let p = k.colPtr[j]; p < k.colPtr[j + 1]; p++) t.push(k.rowIdx[p], j, k.values[p]);
  for (let cj = 0; cj < HEX.elements[1]; cj++) for (let ck = 0; ck < HEX.elements[2]; ck++) {
    const corners = HEX_CORNERS.map(([a, b, c]) => [3 + (a + 1) / 2, cj + (b + 1) / 2, ck + (c + 1) / 2]);
    const xyz = corners.flatMap(([i, jj, kk]) => [i * h[0], jj * h[1], kk * h[2]]);
    const ids = corners.map(([i, jj, kk]) => 1 + i + (nx + 1) * (jj + (ny + 1) * kk));
    const ke = hexElementMatrices(xyz, extra).stiffness;
    const dofs = ids.flatMap((id) => [0, 1, 2].map((c) => dofOfNode(model, id, c)));
    for (let r = 0; r < 24; r++) for (let c = 0; c < 24; c++) if (dofs[r] >= 0 && dofs[c] >= 0 && dofs[r] >= dofs[c]) t.push(dofs[r], dofs[c], ke[24 * r + c]);
  }
  const stiffness: SymmetricCsc = assembleSymmetric(k.n, t).matrix;
  return { stiffness, mass: model.mass, dofMap: model.dofMap, model };
}

async function errorsByChange(build: (change: number) => TestModel, count: number, changedNodes: number[], grouped = new Set<number>()): Promise<Map<number, number[]>> {
  const before = build(0);
  const beforeModes = solveModes(before.stiffness, before.mass, { count });
  const errors = new Map<number, number[]>();
  for (const change of CHANGES) {
    const after = build(change);
    const afterModes = solveModes(after.stiffness, after.mass, { count });
    const { changes, comparison } = await explainAgainst(before, beforeModes, after, afterModes);
    const a = changes.attribution!;
    expect(changes.changeMap!.regions).toHaveLength(1);
    const region = changes.changeMap!.regions[0];
    const inRegion = (id: number): boolean => region.nodeRanges.some(([lo, hi]) => id >= lo && id <= hi);
    expect(changedNodes.every(inRegion)).toBe(true);
    for (const m of a.modes) {
      if (Math.abs(m.estimatedDelta) < 1e-9 * m.eigenvalue) continue;
      // the top region is the changed one, and it carries the change
      expect(m.regions[0].region).toBe(0);
      expect(m.regions[0].share).toBeGreaterThan(0.999);
      expect(inRegion(m.topNodes[0].node)).toBe(true);
      if (m.group) grouped.add(m.baselineMode);
      const pair = comparison!.pairs.find((p) => p.baselineMode === m.baselineMode)!;
      expect(pair.currentMode).toBe(m.currentMode);
      const list = errors.get(m.baselineMode) ?? [];
      list.push(Math.abs(m.estimatedDelta - m.measuredDelta) / m.eigenvalue);
      errors.set(m.baselineMode, list);
    }
  }
  return errors;
}

function expectQuadratic(name: string, errors: Map<number, number[]>): void {
  expect(errors.size).toBeGreaterThan(0);
  for (const [mode, e] of errors) {
    // relative error |δλ_est − δλ_exact| / λ for changes of 0.1 %, 1 %, 10 %
    console.log(`${name} mode ${mode}: estimate error / λ at ${CHANGES.map((c, k) => `${c * 100} %: ${e[k].toExponential(2)}`).join(', ')}; ratios per decade ${(e[1] / e[0]).toFixed(1)}, ${(e[2] / e[1]).toFixed(1)}`);
    expect(e).toHaveLength(3);
    expect(e[1] / e[0]).toBeGreaterThan(50);
    expect(e[1] / e[0]).toBeLessThan(200);
    expect(e[2] / e[1]).toBeGreaterThan(50);
    expect(e[2] / e[1]).toBeLessThan(200);
  }
}

describe('attribution against exact re-solves (error of second order in the change)', () => {
  it('a lattice mast with one bracing member stiffened: error ratio near 100 per decade, the member is the top region', async () => {
    // the member's end node 5 (node 1 is clamped) and its interior node are in the changed region
    const grouped = new Set<number>();
    const errors = await errorsByChange(mast, 8, [5], grouped);
    expect(grouped.size).toBeGreaterThanOrEqual(2); // at least one repeated pair, estimated as a group
    expectQuadratic('mast', errors);
  });

  it('a hex cantilever with one slice of elements stiffened: error ratio near 100 per decade, the slice is the top region', async () => {
    const [nx, ny] = HEX.elements;
    const slice = [3, 4].flatMap((i) => [0, 1, 2].flatMap((j) => [0, 1, 2].map((k) => 1 + i + (nx + 1) * (j + (ny + 1) * k))));
    const errors = await errorsByChange(hexCantilever, 6, slice);
    expectQuadratic('hex', errors);
  });
});
